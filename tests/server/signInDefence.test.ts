/**
 * Sign-in under attack (API, in-process): failed sign-ins limited per client address across
 * e-mails and per account and address, slowed (never refused) per account across addresses,
 * first refusals recorded; X-Forwarded-For believed only with TRUST_PROXY;
 * bcrypt on a bounded worker pool that answers 503 when full instead of queueing without end;
 * unknown e-mails compared against a dummy hash; HTTPS-only headers only over HTTPS.
 * Common practice, no source (OWASP-style sign-in hardening).
 */
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import request from 'supertest';
import bcrypt from 'bcryptjs';
import { demo, DEMO_PASSWORD, makeTestApp, type TestContext } from './helpers.js';
import { loadConfig, defaultPasswordHashThreads, DEFAULT_PASSWORD_HASH_QUEUE } from '../../server/config/env.js';
import { closePasswordHashing, configurePasswordHashing, DUMMY_HASH, hashPassword, verifyPassword } from '../../server/auth/password.js';
import { PasswordPool } from '../../server/auth/passwordPool.js';
import { signInRefusals } from '../../server/db/schema.js';
import { SOLVER_VERSION } from '../../shared/version.js';

const open: TestContext[] = [];
async function app(overrides: Parameters<typeof makeTestApp>[0] = {}) {
  const ctx = await makeTestApp(overrides);
  open.push(ctx);
  return ctx;
}
afterEach(async () => {
  vi.restoreAllMocks();
  for (const ctx of open.splice(0)) await ctx.close();
});
afterAll(() => closePasswordHashing());

function login(ctx: TestContext, email: string, password = 'wrong-password', forwardedFor?: string) {
  const req = request(ctx.app).post('/api/auth/login');
  if (forwardedFor) req.set('X-Forwarded-For', forwardedFor);
  return req.send({ email, password });
}

function expectLimited(res: request.Response) {
  expect(res.status).toBe(429);
  expect(res.body).toEqual({ error: { code: 'too_many_requests', message: expect.stringMatching(/too many failed sign-ins/), details: [] } });
  expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
}

describe('limit per client address, whatever the e-mail', () => {
  it('refuses a new e-mail each time once the address has used its attempts, and then the right password too', async () => {
    const ctx = await app({ loginAttemptsPerAddressPer15Min: 3, loginAttemptsPer15Min: 100 });
    for (let i = 0; i < 3; i++) expect((await login(ctx, `nobody-${i}@example.com`)).status).toBe(401);
    const limited = await login(ctx, 'nobody-new@example.com');
    expectLimited(limited);
    expect(limited.body.error.message).toMatch(/from this address/);
    expectLimited(await login(ctx, demo.designer, DEMO_PASSWORD));
  });

  it('does not count successful sign-ins', async () => {
    const ctx = await app({ loginAttemptsPerAddressPer15Min: 2, loginAttemptsPer15Min: 2 });
    for (let i = 0; i < 4; i++) expect((await login(ctx, demo.designer, DEMO_PASSWORD)).status).toBe(200);
    expect((await login(ctx, demo.designer)).status).toBe(401);
  });
});

describe('per account: one client is refused, many clients are slowed, the owner still signs in', () => {
  it('refuses one client guessing one account after the limit, and leaves the account to its owner elsewhere', async () => {
    const ctx = await app({ trustProxy: ['loopback'], loginAttemptsPer15Min: 3, loginAttemptsPerAddressPer15Min: 100 });
    for (let i = 0; i < 3; i++) expect((await login(ctx, demo.trainee, 'wrong-password', '10.0.0.1')).status).toBe(401);
    const limited = await login(ctx, demo.trainee, DEMO_PASSWORD, '10.0.0.1');
    expectLimited(limited);
    expect(limited.body.error.message).toMatch(/for this account from this address/);
    expect((await login(ctx, demo.trainee, DEMO_PASSWORD, '10.0.0.2')).status).toBe(200);
  });

  it('slows guessing of one account from many addresses with growing waits, never a refusal', async () => {
    const ctx = await app({ trustProxy: ['loopback'], loginAttemptsPer15Min: 2, loginAttemptsPerAddressPer15Min: 100 });
    const timed = async (password: string, address: string) => {
      const t0 = performance.now();
      const res = await login(ctx, demo.trainee, password, address);
      return { status: res.status, ms: performance.now() - t0 };
    };
    for (let i = 1; i <= 2; i++) expect((await timed('wrong-password', `10.0.1.${i}`)).status).toBe(401);
    // past the limit: each further attempt waits at least 0.5 s, then 1 s (accountSlowdown in
    // server/auth/authRouter.ts: 500 ms, doubling; 10 ms less for timer rounding; lower bounds of a timer: cannot flake)
    const third = await timed('wrong-password', '10.0.1.3');
    expect(third.status).toBe(401);
    expect(third.ms).toBeGreaterThanOrEqual(490);
    // the owner, from a clean address, with the right password: slowed, and signed in
    const owner = await timed(DEMO_PASSWORD, '10.0.1.99');
    expect(owner.status).toBe(200);
    expect(owner.ms).toBeGreaterThanOrEqual(990);
    // another account still signs in (its own count is 0: it is not slowed)
    expect((await login(ctx, demo.designer, DEMO_PASSWORD, '10.0.1.3')).status).toBe(200);
  });

  it('records the first refusal of each key in its window, with the account’s firm, and no more', async () => {
    // 5 attempts from 10.0.2.1 stay under its address limit of 6; 6 e-mails sprayed from 10.0.2.7 reach it
    const ctx = await app({ trustProxy: ['loopback'], loginAttemptsPer15Min: 2, loginAttemptsPerAddressPer15Min: 6 });
    for (let i = 0; i < 2; i++) await login(ctx, demo.reviewer, 'wrong-password', '10.0.2.1');
    for (let i = 0; i < 3; i++) expectLimited(await login(ctx, demo.reviewer, 'wrong-password', '10.0.2.1'));
    for (let i = 0; i < 6; i++) await login(ctx, `sprayed-${i}@example.com`, 'x', '10.0.2.7');
    for (let i = 0; i < 3; i++) expectLimited(await login(ctx, `sprayed-more-${i}@example.com`, 'x', '10.0.2.7'));
    const rows = ctx.db.select().from(signInRefusals).all();
    expect(rows.map((r) => [r.limit, r.email, r.address, r.firmId !== null])).toEqual([
      ['account-address', demo.reviewer, '10.0.2.1', true],
      ['address', null, '10.0.2.7', false],
    ]);
  });
});

describe('X-Forwarded-For and TRUST_PROXY', () => {
  it('is off by default: a forged X-Forwarded-For does not reset the address limit', async () => {
    const ctx = await app({ loginAttemptsPerAddressPer15Min: 2, loginAttemptsPer15Min: 100 });
    expect(ctx.config.trustProxy).toBe(false);
    expect((await login(ctx, 'a@example.com')).status).toBe(401);
    expect((await login(ctx, 'b@example.com')).status).toBe(401);
    expectLimited(await login(ctx, 'c@example.com', 'wrong-password', '10.9.9.1'));
    expectLimited(await login(ctx, demo.designer, DEMO_PASSWORD, '10.9.9.2'));
  });

  it('with TRUST_PROXY=loopback the header names the client, so each forwarded address has its own limit', async () => {
    const config = loadConfig({ NODE_ENV: 'test', TRUST_PROXY: 'loopback' });
    expect(config.trustProxy).toEqual(['loopback']);
    const ctx = await app({ trustProxy: config.trustProxy, loginAttemptsPerAddressPer15Min: 2, loginAttemptsPer15Min: 100 });
    expect((await login(ctx, 'a@example.com', 'wrong-password', '10.9.9.1')).status).toBe(401);
    expect((await login(ctx, 'b@example.com', 'wrong-password', '10.9.9.1')).status).toBe(401);
    expectLimited(await login(ctx, 'c@example.com', 'wrong-password', '10.9.9.1'));
    expect((await login(ctx, 'c@example.com', 'wrong-password', '10.9.9.2')).status).toBe(401);
  });

  it('accepts a hop count or a list of addresses / CIDR ranges and refuses anything else by name', () => {
    const parse = (TRUST_PROXY?: string) => loadConfig({ NODE_ENV: 'test', TRUST_PROXY }).trustProxy;
    expect(parse(undefined)).toBe(false);
    expect(parse('')).toBe(false);
    expect(parse('false')).toBe(false);
    expect(parse('0')).toBe(false);
    expect(parse('2')).toBe(2);
    expect(parse('10.0.0.5, 192.168.0.0/16,fd00::/8, uniquelocal')).toEqual(['10.0.0.5', '192.168.0.0/16', 'fd00::/8', 'uniquelocal']);
    expect(() => parse('true')).toThrow(/TRUST_PROXY: .*"true", which would trust every client/);
    expect(() => parse('10.0.0.0/33')).toThrow(/TRUST_PROXY: .*"10\.0\.0\.0\/33"/);
    expect(() => parse('loopback,proxy.example')).toThrow(/TRUST_PROXY: .*"proxy\.example"/);
    expect(() => parse('-1')).toThrow(/TRUST_PROXY/);
  });
});

describe('password hashing off the request thread, bounded', () => {
  it('hashes and compares on the worker pool, never with bcryptjs on the request thread', async () => {
    const ctx = await app();
    const onThread = [vi.spyOn(bcrypt, 'compare'), vi.spyOn(bcrypt, 'compareSync'), vi.spyOn(bcrypt, 'hash'), vi.spyOn(bcrypt, 'hashSync')];
    const poolCompare = vi.spyOn(PasswordPool.prototype, 'compare');
    expect((await login(ctx, demo.designer, DEMO_PASSWORD)).status).toBe(200);
    const hash = await hashPassword('a-new-password-1');
    expect(await verifyPassword('a-new-password-1', hash)).toBe(true);
    expect(await verifyPassword('another-password', hash)).toBe(false);
    expect(poolCompare).toHaveBeenCalledTimes(3);
    for (const spy of onThread) expect(spy).not.toHaveBeenCalled();
  });

  it('compares an unknown e-mail against a dummy hash of the same cost as real ones', async () => {
    const ctx = await app();
    const poolCompare = vi.spyOn(PasswordPool.prototype, 'compare');
    expect((await login(ctx, 'no-such-user@example.com', 'some-password')).status).toBe(401);
    expect(poolCompare).toHaveBeenCalledExactlyOnceWith('some-password', DUMMY_HASH);
    expect((await login(ctx, demo.designer, 'some-password')).status).toBe(401);
    expect(poolCompare).toHaveBeenCalledTimes(2);
    expect(bcrypt.getRounds(DUMMY_HASH)).toBe(bcrypt.getRounds(await hashPassword('x-password-1')));
  });

  it('answers 503 with Retry-After when the threads are busy and the queue is full, then recovers', async () => {
    const ctx = await app();
    await configurePasswordHashing({ threads: 1, queue: 1 });
    try {
      // A slow hash (cost 13) holds the one thread and a second fills the one queue place.
      const slow = '$2b$13$3EBcQp5dIZ10RoirjZCMPOYzpYzZ5jNCO6LdqQxU81o3QjYves..e';
      const busy = [verifyPassword('blocker', slow), verifyPassword('blocker', slow)];
      const refused = await login(ctx, demo.designer, DEMO_PASSWORD);
      expect(refused.status).toBe(503);
      expect(refused.body).toEqual({ error: { code: 'busy', message: expect.stringMatching(/busy checking other passwords/), details: [] } });
      expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
      expect(await Promise.all(busy)).toEqual([true, true]);
      expect((await login(ctx, demo.designer, DEMO_PASSWORD)).status).toBe(200);
    } finally {
      await configurePasswordHashing({ threads: defaultPasswordHashThreads(), queue: DEFAULT_PASSWORD_HASH_QUEUE });
    }
  });

  it('reads the pool size and the limits from the environment, with bounded defaults', () => {
    const defaults = loadConfig({ NODE_ENV: 'test' });
    expect(defaults).toMatchObject({ passwordHashThreads: defaultPasswordHashThreads(), passwordHashQueue: 16, loginAttemptsPer15Min: 10, loginAttemptsPerAddressPer15Min: 50 });
    expect(defaults.passwordHashThreads).toBeGreaterThanOrEqual(1);
    const set = loadConfig({ NODE_ENV: 'test', PASSWORD_HASH_THREADS: '2', PASSWORD_HASH_QUEUE: '0', LOGIN_ATTEMPTS_PER_ADDRESS_PER_15_MIN: '200' });
    expect(set).toMatchObject({ passwordHashThreads: 2, passwordHashQueue: 0, loginAttemptsPerAddressPer15Min: 200 });
    expect(() => loadConfig({ NODE_ENV: 'test', PASSWORD_HASH_THREADS: '0' })).toThrow(/PASSWORD_HASH_THREADS/);
    expect(() => loadConfig({ NODE_ENV: 'test', PASSWORD_HASH_QUEUE: 'lots' })).toThrow(/PASSWORD_HASH_QUEUE/);
  });

  it('refuses at once, without queueing, the task beyond threads + queue', async () => {
    const pool = new PasswordPool({ threads: 1, queue: 2 });
    try {
      const hash = bcrypt.hashSync('x', 4);
      const results = await Promise.allSettled([0, 1, 2, 3, 4].map(() => pool.compare('x', hash)));
      expect(results.map((r) => r.status)).toEqual(['fulfilled', 'fulfilled', 'fulfilled', 'rejected', 'rejected']);
      expect((results[3] as PromiseRejectedResult).reason).toMatchObject({ status: 503, code: 'busy', headers: { 'Retry-After': '3' } });
    } finally {
      await pool.close();
    }
  });

  it('works under tsx from the command line, and the idle pool lets the process exit', () => {
    const script = "import { hashPassword, verifyPassword } from './server/auth/password.ts'; const h = await hashPassword('cli-password-1'); console.log(await verifyPassword('cli-password-1', h), await verifyPassword('other', h));";
    const out = execFileSync('node_modules/.bin/tsx', ['--input-type=module', '-e', script], { encoding: 'utf8', timeout: 20000 });
    expect(out.trim()).toBe('true false');
  });
});

describe('health', () => {
  it('names the product version from package.json, its one source, and the solver version apart', async () => {
    const ctx = await app();
    const res = await request(ctx.app).get('/api/health');
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    expect(res.body).toEqual({ status: 'ok', version: pkg.version, solverVersion: SOLVER_VERSION, database: 'ok' });
  });
});

describe('HTTPS-only headers', () => {
  it('sends neither HSTS nor upgrade-insecure-requests on a plain HTTP start', async () => {
    const ctx = await app();
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['content-security-policy']).toMatch(/script-src 'self'/);
    expect(res.headers['content-security-policy']).not.toMatch(/upgrade-insecure-requests/);
  });

  it('sends both when served over HTTPS (secure cookies, as in production)', async () => {
    const ctx = await app({ secureCookies: true });
    const res = await request(ctx.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['content-security-policy']).toMatch(/upgrade-insecure-requests/);
  });

  it('treats production as served over HTTPS', () => {
    expect(loadConfig({ NODE_ENV: 'production', JWT_SECRET: 'x'.repeat(32) }).secureCookies).toBe(true);
    expect(loadConfig({ NODE_ENV: 'development' }).secureCookies).toBe(false);
  });
});
