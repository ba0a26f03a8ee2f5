/**
 * The server's configuration, read from the environment once and validated with zod.
 * Tests build a `Config` directly (see `loadConfig(overrides)`).
 */
import { randomBytes } from 'node:crypto';
import { z } from 'zod';

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().min(1).default('./data/deckshare.db'),
  /** Secret for signing session tokens. Required in production; a random one otherwise. */
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  /** Session lifetime in minutes. */
  SESSION_MINUTES: z.coerce.number().int().min(1).max(7 * 24 * 60).default(480),
  /** Sign-in attempts allowed per e-mail address and client address in 15 minutes. */
  LOGIN_ATTEMPTS_PER_15_MIN: z.coerce.number().int().min(1).max(10000).default(10),
  /** Largest JSON body accepted. */
  JSON_LIMIT: z.string().default('512kb'),
  /** Seed the invented demo firm when the database is empty: "true" or "false". */
  SEED_DEMO: z.enum(['true', 'false']).default('true'),
  /** "true": log one line per request. */
  LOG_REQUESTS: z.enum(['true', 'false']).default('true'),
  /** Folder of the built client (served at /). */
  CLIENT_DIST: z.string().default('./dist'),
  /** Public address of the product, used in e-mailed links. */
  PUBLIC_URL: z.string().url().optional(),
  /** Folder for periodic backups; unset = no periodic backups. */
  BACKUP_DIR: z.string().trim().min(1, 'BACKUP_DIR must name a folder').optional(),
  /** Minutes between periodic backups (with BACKUP_DIR). */
  BACKUP_EVERY_MINUTES: z.coerce.number().int('BACKUP_EVERY_MINUTES must be a whole number').min(1).max(7 * 24 * 60).default(60),
  /** Periodic backups kept (the newest); older ones are deleted. */
  BACKUP_KEEP: z.coerce.number().int('BACKUP_KEEP must be a whole number').min(1).max(1000).default(7),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  port: number;
  host: string;
  databaseUrl: string;
  jwtSecret: string;
  sessionMinutes: number;
  loginAttemptsPer15Min: number;
  jsonLimit: string;
  seedDemo: boolean;
  logRequests: boolean;
  clientDist: string;
  publicUrl: string;
  /** Cookies marked Secure (production, behind HTTPS). */
  secureCookies: boolean;
  /** Periodic backups (server/backup/periodic.ts); null when BACKUP_DIR is unset. */
  backup: { dir: string; everyMinutes: number; keep: number } | null;
}

export function loadConfig(source: NodeJS.ProcessEnv = process.env, overrides: Partial<Config> = {}): Config {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  const e = parsed.data;
  if (e.NODE_ENV === 'production' && !e.JWT_SECRET) {
    throw new Error('Invalid environment:\n  JWT_SECRET: required in production (at least 32 characters)');
  }
  return {
    env: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    databaseUrl: e.DATABASE_URL,
    jwtSecret: e.JWT_SECRET ?? randomBytes(32).toString('hex'),
    sessionMinutes: e.SESSION_MINUTES,
    loginAttemptsPer15Min: e.LOGIN_ATTEMPTS_PER_15_MIN,
    jsonLimit: e.JSON_LIMIT,
    seedDemo: e.SEED_DEMO === 'true',
    logRequests: e.LOG_REQUESTS === 'true',
    clientDist: e.CLIENT_DIST,
    publicUrl: e.PUBLIC_URL ?? `http://localhost:${e.PORT}`,
    secureCookies: e.NODE_ENV === 'production',
    backup: e.BACKUP_DIR ? { dir: e.BACKUP_DIR, everyMinutes: e.BACKUP_EVERY_MINUTES, keep: e.BACKUP_KEEP } : null,
    ...overrides,
  };
}
