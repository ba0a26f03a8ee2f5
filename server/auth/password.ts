/**
 * Password hashing (bcryptjs, run on the bounded worker pool of passwordPool.ts) and the rules
 * a new password must meet. The pool is shared by the whole process: `server/index.ts` sizes it
 * from the configuration with `configurePasswordHashing` and closes it at shutdown; until then
 * (scripts, tests) it starts on first use with the default size.
 */
import { randomBytes } from 'node:crypto';
import { z } from 'zod';
import { defaultPasswordHashThreads, DEFAULT_PASSWORD_HASH_QUEUE } from '../config/env.js';
import { PasswordPool, type PasswordPoolOptions } from './passwordPool.js';

const COST = 10;

/**
 * A real bcrypt hash at COST of a random password nobody knows. Sign-in compares against it
 * when the e-mail is unknown, so an unknown e-mail costs the same time as a wrong password.
 */
export const DUMMY_HASH = '$2b$10$CwTycUXWue0Thq9StjUM0uJ8.Wc0u7mjRjCqQ5o0r2e5f3y6hE4Qy';

export const newPasswordSchema = z
  .string()
  .min(10, 'the new password must have at least 10 characters')
  .max(200, 'the new password must have at most 200 characters');

let options: PasswordPoolOptions = { threads: defaultPasswordHashThreads(), queue: DEFAULT_PASSWORD_HASH_QUEUE };
let pool: PasswordPool | undefined;

function currentPool(): PasswordPool {
  pool ??= new PasswordPool(options);
  return pool;
}

/** Sets the pool's size for the rest of the process (a running pool is closed first). */
export async function configurePasswordHashing(next: PasswordPoolOptions): Promise<void> {
  options = { ...next };
  await closePasswordHashing();
}

/** Stops the worker threads; a later hash starts them again. */
export async function closePasswordHashing(): Promise<void> {
  const running = pool;
  pool = undefined;
  await running?.close();
}

/** Rejects with a 503 ApiError (Retry-After) when the pool's queue is full. */
export function hashPassword(plain: string): Promise<string> {
  return currentPool().hash(plain, COST);
}

/** Compares against `hash`, or against DUMMY_HASH when there is none (unknown e-mail). */
export function verifyPassword(plain: string, hash: string | undefined): Promise<boolean> {
  return currentPool().compare(plain, hash ?? DUMMY_HASH);
}

/** A readable temporary password handed to a new user, who must change it at first sign-in. */
export function temporaryPassword(): string {
  const alphabet = 'abcdefghjkmnpqrstuvwxyzABCDEFGHJKLMNPQRSTUVWXYZ23456789';
  const bytes = randomBytes(14);
  let s = '';
  for (const b of bytes) s += alphabet[b % alphabet.length];
  return `${s.slice(0, 7)}-${s.slice(7)}`;
}
