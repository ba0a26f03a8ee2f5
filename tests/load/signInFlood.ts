/**
 * Sign-in flood, measured: starts the real server on a free loopback port with a temporary
 * database (demo firm seeded, asked for with SEED_DEMO=true and a known DEMO_PASSWORD), signs one demo user in, then for the duration floods
 * POST /api/auth/login from 50 connections (a new e-mail each request, wrong password) while a
 * few connections make that user's cheap requests (GET /api/auth/me). Prints p50/p99/max of
 * the cheap requests — alone first, then under the flood — and the flood's answers by status.
 * Target: cheap p99 < 100 ms under the flood.
 *
 *   node_modules/.bin/tsx tests/load/signInFlood.ts [--seconds N] [--many-addresses]
 *
 * --many-addresses starts the server with TRUST_PROXY=loopback and sends a new
 * X-Forwarded-For per request, as if the flood came from many clients: the address limit no
 * longer stops it, so every attempt reaches the password pool (401, or 503 when it is full).
 * The flood runs in a child process of its own (this file with `--flood-at URL`), so its
 * client work does not delay the measuring client's event loop and inflate its figures.
 * Traffic goes only to 127.0.0.1; the run is bounded in time and the server is killed by PID.
 */
import autocannon from 'autocannon';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_USERS } from '../../server/db/seed.js';

const HOST = '127.0.0.1';
const FLOOD_CONNECTIONS = 50;
const CHEAP_CONNECTIONS = 4;
const BASELINE_SECONDS = 3;
/** Given to the server for its demo users (it would pick a random one otherwise). */
const DEMO_PASSWORD = 'flood-demo-password-1';
const FLOOD_STARTED = 'flood started';

interface Options {
  seconds: number;
  manyAddresses: boolean;
  /** Set in the flood's own child process: the server to flood. */
  floodAt?: string;
}

function parseArgs(argv: string[]): Options {
  const opts: Options = { seconds: 30, manyAddresses: false };
  for (let i = 0; i < argv.length; i++) {
    if (argv[i] === '--seconds') {
      const n = Number(argv[++i]);
      if (!Number.isInteger(n) || n < 1 || n > 300) throw new Error('--seconds must be a whole number from 1 to 300');
      opts.seconds = n;
    } else if (argv[i] === '--many-addresses') {
      opts.manyAddresses = true;
    } else if (argv[i] === '--flood-at') {
      const url = new URL(argv[++i] ?? '');
      if (url.hostname !== HOST) throw new Error(`--flood-at must be on ${HOST}`);
      opts.floodAt = url.origin;
    } else {
      throw new Error(`unknown argument ${argv[i]} (use --seconds N, --many-addresses)`);
    }
  }
  return opts;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, HOST, () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

/** Starts `tsx server/index.ts` directly (not through npx), so its PID is the server's. */
function startServer(port: number, dir: string, manyAddresses: boolean): ChildProcess {
  const env = {
    ...process.env,
    NODE_ENV: 'development',
    HOST,
    PORT: String(port),
    DATABASE_URL: join(dir, 'flood.db'),
    CLIENT_DIST: join(dir, 'no-client'),
    SEED_DEMO: 'true',
    DEMO_PASSWORD,
    LOG_REQUESTS: 'false',
    LOCAL_SMTP_PORT: '0',
    TRUST_PROXY: manyAddresses ? 'loopback' : '',
  };
  const child = spawn('node_modules/.bin/tsx', ['server/index.ts'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stderr!.on('data', (d: Buffer) => process.stderr.write(`[server] ${d}`));
  child.stdout!.resume();
  return child;
}

async function waitForHealth(base: string, child: ChildProcess, timeoutMs = 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the server did not answer /api/health in time');
}

/** Starts the server on a free port, trying another when that port is taken meanwhile. */
async function startOnFreePort(dir: string, manyAddresses: boolean): Promise<{ child: ChildProcess; base: string }> {
  for (let attempt = 1; ; attempt++) {
    const port = await freePort();
    const base = `http://${HOST}:${port}`;
    const child = startServer(port, dir, manyAddresses);
    try {
      await waitForHealth(base, child);
      return { child, base };
    } catch (err) {
      await stopServer(child);
      if (attempt === 3) throw err;
    }
  }
}

/** Signs the demo designer in and returns the Cookie header for later requests. */
async function signIn(base: string): Promise<string> {
  const email = DEMO_USERS.find((u) => u.roles.includes('designer'))!.email;
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
}

function cheapRequests(base: string, cookie: string, seconds: number): Promise<autocannon.Result> {
  return autocannon({ url: `${base}/api/auth/me`, connections: CHEAP_CONNECTIONS, duration: seconds, headers: { cookie } });
}

function flood(base: string, seconds: number, manyAddresses: boolean): Promise<autocannon.Result> {
  let n = 0;
  return autocannon({
    url: `${base}/api/auth/login`,
    connections: FLOOD_CONNECTIONS,
    duration: seconds,
    requests: [
      {
        method: 'POST',
        setupRequest: (req) => {
          n += 1;
          const headers: Record<string, string> = { 'content-type': 'application/json' };
          if (manyAddresses) headers['x-forwarded-for'] = `10.${(n >> 16) & 255}.${(n >> 8) & 255}.${n & 255}`;
          return { ...req, headers, body: JSON.stringify({ email: `flood-${n}@example.com`, password: 'wrong-password' }) };
        },
      },
    ],
  });
}

/**
 * Starts the flood in a child process; resolves `started` once its first request is about to
 * go out, and `result` with its autocannon result (the last line it prints, JSON).
 */
function floodInChild(base: string, seconds: number, manyAddresses: boolean) {
  const args = ['tests/load/signInFlood.ts', '--flood-at', base, '--seconds', String(seconds), ...(manyAddresses ? ['--many-addresses'] : [])];
  const child = spawn('node_modules/.bin/tsx', args, { stdio: ['ignore', 'pipe', 'inherit'] });
  let out = '';
  let markStarted: () => void = () => {};
  const started = new Promise<void>((resolve) => (markStarted = resolve));
  child.stdout!.on('data', (d: Buffer) => {
    out += d.toString();
    if (out.startsWith(`${FLOOD_STARTED}\n`)) markStarted();
  });
  const result = new Promise<autocannon.Result>((resolve, reject) => {
    child.once('error', reject);
    child.once('exit', (code) => {
      markStarted();
      if (code !== 0) return reject(new Error(`the flood process exited with code ${code}`));
      try {
        resolve(JSON.parse(out.trim().split('\n').at(-1) ?? '') as autocannon.Result);
      } catch {
        reject(new Error('the flood process printed no result'));
      }
    });
  });
  return { started, result };
}

function latencyLine(label: string, r: autocannon.Result): string {
  const l = r.latency;
  return `${label}: ${r.requests.total} requests (${r.non2xx} not 2xx, ${r.errors} errors) p50 ${l.p50} ms, p99 ${l.p99} ms, max ${l.max} ms`;
}

function statusLine(r: autocannon.Result): string {
  const stats = Object.entries(r.statusCodeStats ?? {}).map(([code, s]) => [Number(code), s.count ?? 0] as const);
  const count = (pred: (code: number) => boolean) => stats.reduce((sum, [code, n]) => sum + (pred(code) ? n : 0), 0);
  const by = stats.map(([code, n]) => `${code}: ${n}`).join(', ');
  return `flood answers: 2xx ${count((c) => c >= 200 && c < 300)}, 429 ${count((c) => c === 429)}, 503 ${count((c) => c === 503)}, other ${count((c) => c < 200 || (c >= 300 && c !== 429 && c !== 503))} (${by}; ${r.errors} connection errors, ${r.timeouts} timeouts)`;
}

function stopServer(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    const force = setTimeout(() => child.kill('SIGKILL'), 8000);
    console.log(`stopping the server (pid ${child.pid})`);
    child.once('exit', () => {
      clearTimeout(force);
      resolve();
    });
    child.kill('SIGTERM');
  });
}

async function main() {
  const opts = parseArgs(process.argv.slice(2));
  if (opts.floodAt) {
    const running = flood(opts.floodAt, opts.seconds, opts.manyAddresses);
    process.stdout.write(`${FLOOD_STARTED}\n`);
    process.stdout.write(`${JSON.stringify(await running)}\n`);
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-flood-'));
  try {
    const { child, base } = await startOnFreePort(dir, opts.manyAddresses);
    // Whatever happens, the run ends: after a fixed bound the server is stopped by its PID
    // (SIGTERM, which tsx passes on; the server exits by itself within 5 s of it).
    const guard = setTimeout(() => {
      console.error('time bound reached: stopping');
      void stopServer(child).then(() => process.exit(2));
    }, (opts.seconds + BASELINE_SECONDS + 120) * 1000);
    try {
      await measure(base, opts, child.pid!);
    } finally {
      clearTimeout(guard);
      await stopServer(child);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * CPU seconds the server process has used so far (all its threads), read from Linux's /proc;
 * tsx runs the server as its child process. Undefined where /proc is not there.
 */
function serverCpuSeconds(tsxPid: number): number | undefined {
  try {
    const children = readFileSync(`/proc/${tsxPid}/task/${tsxPid}/children`, 'utf8').trim().split(/\s+/).filter(Boolean);
    const pid = children[0] ?? String(tsxPid);
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    const ticks = Number(fields[11]) + Number(fields[12]); // utime + stime
    return ticks / 100; // USER_HZ is 100 on Linux
  } catch {
    return undefined;
  }
}

/** The baseline, then the flood and the cheap requests side by side; prints the figures. */
async function measure(base: string, opts: Options, serverPid: number): Promise<void> {
  const cookie = await signIn(base);
  console.log(`server on ${base}; flood ${FLOOD_CONNECTIONS} connections for ${opts.seconds} s${opts.manyAddresses ? ' from many forwarded addresses (TRUST_PROXY=loopback)' : ' from one address'}`);
  console.log(latencyLine(`cheap GET /api/auth/me alone, ${BASELINE_SECONDS} s`, await cheapRequests(base, cookie, BASELINE_SECONDS)));
  const flooding = floodInChild(base, opts.seconds, opts.manyAddresses);
  await flooding.started;
  const cpuBefore = serverCpuSeconds(serverPid);
  const [cheap, floodResult] = await Promise.all([cheapRequests(base, cookie, opts.seconds), flooding.result]);
  const cpuAfter = serverCpuSeconds(serverPid);
  console.log(latencyLine('cheap GET /api/auth/me under the flood', cheap));
  console.log(statusLine(floodResult));
  if (cpuBefore !== undefined && cpuAfter !== undefined) {
    const used = cpuAfter - cpuBefore;
    const served = floodResult.requests.total + cheap.requests.total;
    console.log(`server CPU meanwhile: ${used.toFixed(1)} s (all threads, hashing included) for ${served} requests, ${((used / served) * 1e6).toFixed(0)} µs each`);
  }
  console.log(`target cheap p99 < 100 ms: ${cheap.latency.p99 < 100 ? 'met' : 'NOT met'} (p99 ${cheap.latency.p99} ms)`);
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
