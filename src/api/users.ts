/** The firm's users (admin only). */
import { http } from './http';
import type { AdminUser, NewUser, UserChanges } from './types';

export async function listUsers(): Promise<AdminUser[]> {
  const { users } = await http.get<{ users: AdminUser[] }>('/api/admin/users');
  return users;
}

/** Creates a user; the temporary password is returned once and never again. */
export async function createUser(input: NewUser): Promise<{ user: AdminUser; temporaryPassword: string }> {
  return http.post<{ user: AdminUser; temporaryPassword: string }>('/api/admin/users', input);
}

export async function updateUser(userId: number, changes: UserChanges): Promise<AdminUser> {
  const { user } = await http.patch<{ user: AdminUser }>(`/api/admin/users/${userId}`, changes);
  return user;
}

export async function resetPassword(userId: number): Promise<string> {
  const { temporaryPassword } = await http.post<{ temporaryPassword: string }>(
    `/api/admin/users/${userId}/reset-password`,
  );
  return temporaryPassword;
}
