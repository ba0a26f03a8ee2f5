/**
 * The server's configuration, read from the environment once and validated with zod.
 * Tests build a `Config` directly (see `loadConfig(overrides)`).
 */
import { randomBytes } from 'node:crypto';
import { z } from 'zod';

/** Default storage quota per firm: 2 GB of deck versions and results (FIRM_STORAGE_QUOTA_MB). */
export const DEFAULT_FIRM_STORAGE_QUOTA_MB = 2048;
export const DEFAULT_FIRM_STORAGE_QUOTA_BYTES = DEFAULT_FIRM_STORAGE_QUOTA_MB * 1024 * 1024;

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
  /** Seed the invented demo firm when the database is empty: "true" or "false" (never in production). */
  SEED_DEMO: z.enum(['true', 'false']).default('false'),
  /** The demo users' password; a random one (printed at start) when unset. */
  DEMO_PASSWORD: z.string().min(10, 'DEMO_PASSWORD must have at least 10 characters').max(200).optional(),
  /** First administrator of an empty database (any environment): e-mail, initial password, names. */
  FIRST_ADMIN_EMAIL: z.string().trim().toLowerCase().email('FIRST_ADMIN_EMAIL must be an e-mail address').optional(),
  FIRST_ADMIN_PASSWORD: z.string().min(12, 'FIRST_ADMIN_PASSWORD must have at least 12 characters').max(200).optional(),
  FIRST_ADMIN_NAME: z.string().trim().min(1).max(200).default('Administrator'),
  FIRM_NAME: z.string().trim().min(1).max(200).optional(),
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
  /** Stored deck data (versions and their results) allowed per firm, MB. */
  FIRM_STORAGE_QUOTA_MB: z.coerce.number().int('FIRM_STORAGE_QUOTA_MB must be a whole number').min(1).max(1024 * 1024).default(DEFAULT_FIRM_STORAGE_QUOTA_MB),
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
  /** Password of the demo users when seeding; undefined: a random one. */
  demoPassword?: string;
  /** The first administrator created on an empty database, when configured. */
  firstAdmin?: { email: string; password: string; name: string; firmName: string };
  logRequests: boolean;
  clientDist: string;
  publicUrl: string;
  /** Cookies marked Secure (production, behind HTTPS). */
  secureCookies: boolean;
  /** Periodic backups (server/backup/periodic.ts); null when BACKUP_DIR is unset. */
  backup: { dir: string; everyMinutes: number; keep: number } | null;
  /** Stored deck data allowed per firm, bytes (FIRM_STORAGE_QUOTA_MB). */
  firmStorageQuotaBytes: number;
}

export function loadConfig(source: NodeJS.ProcessEnv = process.env, overrides: Partial<Config> = {}): Config {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  const e = parsed.data;
  const problems: string[] = [];
  if (e.NODE_ENV === 'production' && !e.JWT_SECRET) problems.push('JWT_SECRET: required in production (at least 32 characters)');
  if (e.NODE_ENV === 'production' && e.SEED_DEMO === 'true') {
    problems.push('SEED_DEMO: the demo firm is never seeded in production (its accounts would be open to anyone who reads the README); create the first administrator with FIRST_ADMIN_EMAIL and FIRST_ADMIN_PASSWORD');
  }
  if ((e.FIRST_ADMIN_EMAIL === undefined) !== (e.FIRST_ADMIN_PASSWORD === undefined)) {
    problems.push('FIRST_ADMIN_EMAIL and FIRST_ADMIN_PASSWORD: set both or neither');
  }
  if (e.FIRST_ADMIN_EMAIL !== undefined && e.FIRM_NAME === undefined) problems.push('FIRM_NAME: required with FIRST_ADMIN_EMAIL (the firm the first administrator belongs to)');
  if (problems.length) throw new Error(`Invalid environment:\n${problems.map((p) => `  ${p}`).join('\n')}`);
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
    demoPassword: e.DEMO_PASSWORD,
    firstAdmin:
      e.FIRST_ADMIN_EMAIL && e.FIRST_ADMIN_PASSWORD && e.FIRM_NAME
        ? { email: e.FIRST_ADMIN_EMAIL, password: e.FIRST_ADMIN_PASSWORD, name: e.FIRST_ADMIN_NAME, firmName: e.FIRM_NAME }
        : undefined,
    logRequests: e.LOG_REQUESTS === 'true',
    clientDist: e.CLIENT_DIST,
    publicUrl: e.PUBLIC_URL ?? `http://localhost:${e.PORT}`,
    secureCookies: e.NODE_ENV === 'production',
    backup: e.BACKUP_DIR ? { dir: e.BACKUP_DIR, everyMinutes: e.BACKUP_EVERY_MINUTES, keep: e.BACKUP_KEEP } : null,
    firmStorageQuotaBytes: e.FIRM_STORAGE_QUOTA_MB * 1024 * 1024,
    ...overrides,
  };
}
