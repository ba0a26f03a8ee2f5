/**
 * The server's configuration, read from the environment once and validated with zod.
 * Tests build a `Config` directly (see `loadConfig(overrides)`).
 */
import { randomBytes } from 'node:crypto';
import { isIP } from 'node:net';
import { availableParallelism } from 'node:os';
import { z } from 'zod';

/** Default storage quota per firm: 2 GB of deck versions and results (FIRM_STORAGE_QUOTA_MB). */
export const DEFAULT_FIRM_STORAGE_QUOTA_MB = 2048;
export const DEFAULT_FIRM_STORAGE_QUOTA_BYTES = DEFAULT_FIRM_STORAGE_QUOTA_MB * 1024 * 1024;

/** Password hashes computed at once: half the cores, at least one (one on a 2-core machine). */
export function defaultPasswordHashThreads(): number {
  return Math.max(1, Math.floor(availableParallelism() / 2));
}
export const DEFAULT_PASSWORD_HASH_QUEUE = 16;

/** Express's `trust proxy`: off, a hop count, or the proxies' addresses / CIDR ranges. */
export type TrustProxy = false | number | string[];

const PROXY_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

function isProxyAddress(entry: string): boolean {
  if (PROXY_NAMES.has(entry)) return true;
  const [address, prefix, ...rest] = entry.split('/');
  const family = isIP(address);
  if (family === 0 || rest.length > 0) return false;
  if (prefix === undefined) return true;
  const bits = Number(prefix);
  return /^\d{1,3}$/.test(prefix) && bits <= (family === 4 ? 32 : 128);
}

const trustProxySchema = z
  .string()
  .trim()
  .optional()
  .transform((raw, ctx): TrustProxy => {
    if (raw === undefined || raw === '' || raw === 'false') return false;
    if (/^\d+$/.test(raw)) return Number(raw) === 0 ? false : Number(raw);
    const entries = raw.split(',').map((e) => e.trim());
    const bad = entries.filter((e) => !isProxyAddress(e));
    if (raw === 'true' || bad.length > 0) {
      ctx.addIssue({
        code: 'custom',
        message: `must be a hop count or a comma-separated list of proxy addresses, CIDR ranges, loopback, linklocal or uniquelocal (not ${raw === 'true' ? '"true", which would trust every client' : bad.map((b) => `"${b}"`).join(', ')})`,
      });
      return z.NEVER;
    }
    return entries;
  });

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().min(1).default('./data/deckshare.db'),
  /** Secret for signing session tokens. Required in production; a random one otherwise. */
  JWT_SECRET: z.string().min(32, 'JWT_SECRET must be at least 32 characters').optional(),
  /** Session lifetime in minutes. */
  SESSION_MINUTES: z.coerce.number().int().min(1).max(7 * 24 * 60).default(480),
  /** Failed sign-ins allowed per account (e-mail address, from any client) in 15 minutes. */
  LOGIN_ATTEMPTS_PER_15_MIN: z.coerce.number().int().min(1).max(10000).default(10),
  /** Failed sign-ins allowed per client address (whatever the e-mail) in 15 minutes. */
  LOGIN_ATTEMPTS_PER_ADDRESS_PER_15_MIN: z.coerce.number().int().min(1).max(100000).default(50),
  /** Reverse proxies whose X-Forwarded-For is believed; off unless set. */
  TRUST_PROXY: trustProxySchema,
  /** Worker threads that compute password hashes. */
  PASSWORD_HASH_THREADS: z.coerce.number().int().min(1).max(64).default(defaultPasswordHashThreads),
  /** Password hashes allowed to wait for a thread; more are answered 503. */
  PASSWORD_HASH_QUEUE: z.coerce.number().int().min(0).max(10000).default(DEFAULT_PASSWORD_HASH_QUEUE),
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
  /** Worker threads of the refined-analysis pool (default: cores − 1, at least 1). */
  REFINED_THREADS: z.coerce.number().int('REFINED_THREADS must be a whole number').min(1).max(64).optional(),
  /** Longest refined (grillage) run of one version, seconds. */
  REFINED_JOB_SECONDS: z.coerce.number().positive('REFINED_JOB_SECONDS must be greater than 0').max(3600).default(60),
  /** Refined runs that may wait for a thread beyond those running. */
  REFINED_QUEUE: z.coerce.number().int('REFINED_QUEUE must be a whole number').min(0).max(1000).default(8),
  /** Heap cap of each refined-analysis worker, MB. */
  REFINED_WORKER_MEMORY_MB: z.coerce.number().int('REFINED_WORKER_MEMORY_MB must be a whole number').min(64).max(65536).default(1024),
  /** Distinct refined runs one user may have queued or running at once (beyond that 429). */
  REFINED_JOBS_PER_USER: z.coerce.number().int('REFINED_JOBS_PER_USER must be a whole number').min(1).max(1000).default(4),
  /** The same for all the users of one firm together. */
  REFINED_JOBS_PER_FIRM: z.coerce.number().int('REFINED_JOBS_PER_FIRM must be a whole number').min(1).max(1000).default(8),
  /** Worker threads that lay out calculation packages (server/compute/packagePool.ts). */
  PACKAGE_THREADS: z.coerce.number().int('PACKAGE_THREADS must be a whole number').min(1).max(16).default(1),
  /** Calculation packages that may wait for a thread beyond those being laid out. */
  PACKAGE_QUEUE: z.coerce.number().int('PACKAGE_QUEUE must be a whole number').min(0).max(1000).default(8),
  /** Largest refined model accepted: mesh nodes × girder lines (server/compute/modelSize.ts). */
  REFINED_MAX_NODE_GIRDERS: z.coerce.number().int('REFINED_MAX_NODE_GIRDERS must be a whole number').min(1000).default(100000),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  port: number;
  host: string;
  databaseUrl: string;
  jwtSecret: string;
  sessionMinutes: number;
  loginAttemptsPer15Min: number;
  loginAttemptsPerAddressPer15Min: number;
  /** Express's `trust proxy`; false: X-Forwarded-For is ignored, the socket's address counts. */
  trustProxy: TrustProxy;
  passwordHashThreads: number;
  passwordHashQueue: number;
  jsonLimit: string;
  seedDemo: boolean;
  /** Password of the demo users when seeding; undefined: a random one. */
  demoPassword?: string;
  /** The first administrator created on an empty database, when configured. */
  firstAdmin?: { email: string; password: string; name: string; firmName: string };
  logRequests: boolean;
  clientDist: string;
  publicUrl: string;
  /** Served over HTTPS (production): cookies marked Secure, HSTS and upgrade-insecure-requests sent. */
  secureCookies: boolean;
  /** Periodic backups (server/backup/periodic.ts); null when BACKUP_DIR is unset. */
  backup: { dir: string; everyMinutes: number; keep: number } | null;
  /** Stored deck data allowed per firm, bytes (FIRM_STORAGE_QUOTA_MB). */
  firmStorageQuotaBytes: number;
  /** The refined-analysis pool (server/compute/refinedPool.ts). */
  refinedThreads: number;
  refinedJobMs: number;
  refinedQueue: number;
  refinedWorkerMemoryMb: number;
  refinedMaxNodeGirders: number;
  refinedJobsPerUser: number;
  refinedJobsPerFirm: number;
  /** The calculation-package pool (server/compute/packagePool.ts); its time and memory limits are the refined pool's. */
  packageThreads: number;
  packageQueue: number;
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
    loginAttemptsPerAddressPer15Min: e.LOGIN_ATTEMPTS_PER_ADDRESS_PER_15_MIN,
    trustProxy: e.TRUST_PROXY,
    passwordHashThreads: e.PASSWORD_HASH_THREADS,
    passwordHashQueue: e.PASSWORD_HASH_QUEUE,
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
    refinedThreads: e.REFINED_THREADS ?? Math.max(1, availableParallelism() - 1),
    refinedJobMs: e.REFINED_JOB_SECONDS * 1000,
    refinedQueue: e.REFINED_QUEUE,
    refinedWorkerMemoryMb: e.REFINED_WORKER_MEMORY_MB,
    refinedMaxNodeGirders: e.REFINED_MAX_NODE_GIRDERS,
    refinedJobsPerUser: e.REFINED_JOBS_PER_USER,
    refinedJobsPerFirm: e.REFINED_JOBS_PER_FIRM,
    packageThreads: e.PACKAGE_THREADS,
    packageQueue: e.PACKAGE_QUEUE,
    ...overrides,
  };
}
