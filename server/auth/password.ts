/** Password hashing (bcryptjs) and the rules a new password must meet. */
import bcrypt from 'bcryptjs';
import { randomBytes } from 'node:crypto';
import { z } from 'zod';

const COST = 10;

export const newPasswordSchema = z
  .string()
  .min(10, 'the new password must have at least 10 characters')
  .max(200, 'the new password must have at most 200 characters');

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/** A readable temporary password handed to a new user, who must change it at first sign-in. */
export function temporaryPassword(): string {
  const alphabet = 'abcdefghjkmnpqrstuvwxyzABCDEFGHJKLMNPQRSTUVWXYZ23456789';
  const bytes = randomBytes(14);
  let s = '';
  for (const b of bytes) s += alphabet[b % alphabet.length];
  return `${s.slice(0, 7)}-${s.slice(7)}`;
}
