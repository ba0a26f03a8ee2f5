/**
 * Starts the real Deckshare server as a child process (tsx server/index.ts) on loopback, a free
 * port and a given SQLite file, waits until /api/health answers, and stops it by its PID.
 * The child gets its own process group: tsx runs the server in a grandchild node process, so
 * SIGKILL goes to the whole group we started (tsx and its node), never to anything else.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { resolve } from 'node:path';
import { DEMO_PASSWORD } from './client.js';

export const REPO_ROOT = resolve(import.meta.dirname, '../../..');
const TSX = resolve(REPO_ROOT, 'node_modules/.bin/tsx');
const START_TIMEOUT_MS = 60_000;
/** Fixed for the run so sessions survive a restart of the server on the same database. */
const JWT_SECRET = 'soak-and-crash-checks-local-secret-0123456789';

export interface RunningServer {
  url: string;
  pid: number;
  /** Everything the server printed so far. */
  output(): string;
  /** SIGTERM (clean shutdown) and wait for exit. */
  stop(): Promise<void>;
  /** SIGKILL the process group and wait for exit. */
  kill(): Promise<void>;
}

export function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const s = createServer();
    s.once('error', fail);
    s.listen(0, '127.0.0.1', () => {
      const addr = s.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      s.close(() => done(port));
    });
  });
}

function serverEnv(databaseUrl: string, port: number, extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  return {
    ...process.env,
    NODE_ENV: 'development',
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    HOST: '127.0.0.1',
    JWT_SECRET,
    // The demo firm is seeded only when asked for, with this password (harness/client.ts).
    SEED_DEMO: 'true',
    DEMO_PASSWORD,
    LOG_REQUESTS: 'false',
    LOCAL_SMTP_PORT: '0',
    CLIENT_DIST: resolve(databaseUrl, '..', 'no-client'),
    ...extra,
  };
}

function exited(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((done) => child.once('exit', () => done()));
}

async function waitForHealth(url: string, child: ChildProcess, output: () => string): Promise<void> {
  const deadline = Date.now() + START_TIMEOUT_MS;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`server exited with code ${child.exitCode}:\n${output()}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`server did not answer /api/health within ${START_TIMEOUT_MS / 1000} s:\n${output()}`);
}

/** Starts the real server on `databaseUrl`; `env` adds or overrides its settings (e.g. the pool's limits). */
export async function startServer(databaseUrl: string, env: Record<string, string> = {}): Promise<RunningServer> {
  const port = await freePort();
  const child = spawn(TSX, ['server/index.ts'], { cwd: REPO_ROOT, env: serverEnv(databaseUrl, port, env), stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  let text = '';
  child.stdout!.on('data', (b: Buffer) => (text += b.toString()));
  child.stderr!.on('data', (b: Buffer) => (text += b.toString()));
  const url = `http://127.0.0.1:${port}`;
  const pid = child.pid!;
  const signalGroup = (signal: NodeJS.Signals) => {
    try {
      process.kill(-pid, signal);
    } catch {
      // already gone
    }
  };
  const server: RunningServer = {
    url,
    pid,
    output: () => text,
    async stop() {
      signalGroup('SIGTERM');
      const timer = setTimeout(() => signalGroup('SIGKILL'), 10_000);
      await exited(child);
      clearTimeout(timer);
    },
    async kill() {
      signalGroup('SIGKILL');
      await exited(child);
    },
  };
  try {
    await waitForHealth(url, child, server.output);
  } catch (e) {
    await server.kill();
    throw e;
  }
  return server;
}
