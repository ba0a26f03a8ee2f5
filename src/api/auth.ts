/** Session endpoints: sign in, sign out, who am I, change password. */
import { http } from './http';
import type { SessionUser } from './types';

export async function login(email: string, password: string): Promise<SessionUser> {
  const { user } = await http.post<{ user: SessionUser }>('/api/auth/login', { email, password });
  return user;
}

export async function logout(): Promise<void> {
  await http.post<void>('/api/auth/logout');
}

export async function fetchMe(): Promise<SessionUser> {
  const { user } = await http.get<{ user: SessionUser }>('/api/auth/me');
  return user;
}

export async function changePassword(currentPassword: string, newPassword: string): Promise<SessionUser> {
  const { user } = await http.post<{ user: SessionUser }>('/api/auth/password', { currentPassword, newPassword });
  return user;
}
