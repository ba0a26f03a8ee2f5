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

/** Who is signed in, or null for nobody (the session route answers 200 either way). */
export async function fetchSession(): Promise<SessionUser | null> {
  const { user } = await http.get<{ user: SessionUser | null }>('/api/auth/session');
  return user;
}

export async function changePassword(currentPassword: string, newPassword: string): Promise<SessionUser> {
  const { user } = await http.post<{ user: SessionUser }>('/api/auth/password', { currentPassword, newPassword });
  return user;
}
