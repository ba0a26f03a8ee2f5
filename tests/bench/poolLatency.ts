/**
 * How long a signed-in user waits while other users' first refined (grillage) analyses run:
 * starts the real server (tsx server/index.ts on 127.0.0.1, a fresh database in a temporary
 * folder), saves several 12-girder, 30° skew deck versions, asks for their factor tables at
 * once (each a first refined run) and meanwhile sends GET /api/auth/me one after another,
 * printing its latency (p50, p99, max) and each refined request's duration.
 *
 *   npx tsx tests/bench/poolLatency.ts [--root DIR] [--versions N] [--wide]
 *
 * --root DIR   run the server of another checkout (e.g. the code before the pool, extracted
 *              with `git archive <commit> | tar -x -C DIR` and a node_modules link) to compare
 * --versions N first-time refined runs to trigger (default 4, at most 12)
 * --wide       also time one 40-girder, 30° skew deck on one span (the largest width the
 *              schema allows; about 1,700 nodes) and show that two spans are refused
 *              before queueing (the answer's summary says why)
 * Loopback only; bounded: at most 12 versions, 400 probes per phase, 240 s per phase.
 * Prints figures and asserts nothing; a shared or busy machine inflates every number.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { quarryCreekUs } from '../fixtures/decks.js';

const MAX_VERSIONS = 12;
const MAX_PROBES = 400;
const PHASE_MS = 240_000;

function option(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const root = resolve(option('--root') ?? '.');
const versions = Math.min(MAX_VERSIONS, Math.max(1, Number(option('--versions') ?? 4)));
const wide = process.argv.includes('--wide');

function freePort(): Promise<number> {
  return new Promise((ok, fail) => {
    const s = createServer();
    s.once('error', fail);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => ok(port));
    });
  });
}

/** Quarry Creek with `girders` girders (at 8 ft, or 6 ft above 30 girders to stay within the 80 m deck width) and 110 ft spans, 30° skew. */
function deck(name: string, girders: number, spans: number): unknown {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.name = name;
  us.girders = { kind: 'uniform', count: girders, spacing: girders > 30 ? 6 : 8 };
  us.spans = Array.from({ length: spans }, () => ({ length: 110 }));
  us.supports = Array.from({ length: spans + 1 }, () => ({ skew: 30 }));
  us.continuous = spans > 1;
  return deckFromDisplay(us as never, 'US');
}

class Client {
  private cookie = '';
  private csrf = '';
  constructor(readonly base: string) {}
  async request(method: string, path: string, body?: unknown): Promise<{ status: number; json: unknown; ms: number }> {
    const t0 = performance.now();
    const res = await fetch(`${this.base}${path}`, {
      method,
      headers: { cookie: this.cookie, 'x-csrf-token': this.csrf, ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    });
    const text = await res.text();
    const ms = performance.now() - t0;
    const set = res.headers.getSetCookie();
    if (set.length) {
      this.cookie = set.map((c) => c.split(';')[0]).join('; ');
      this.csrf = /ds_csrf=([^;]+)/.exec(this.cookie)?.[1] ?? this.csrf;
    }
    let json: unknown = null;
    try {
      json = JSON.parse(text);
    } catch {
      json = text;
    }
    return { status: res.status, json, ms };
  }
}

async function startServer(dir: string, port: number): Promise<ChildProcess> {
  const child = spawn(join(root, 'node_modules/.bin/tsx'), ['server/index.ts'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'development', HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: join(dir, 'bench.db'), LOG_REQUESTS: 'false', CLIENT_DIST: join(dir, 'none'), LOCAL_SMTP_PORT: '0', SEED_DEMO: 'true', REFINED_JOBS_PER_USER: '100', REFINED_JOBS_PER_FIRM: '100', DEMO_PASSWORD: 'deckshare-demo-1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout?.on('data', (d: Buffer) => (log += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (log += d.toString()));
  const end = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited:\n${log}`);
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > end) throw new Error(`the server did not start in 60 s:\n${log}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  const pool = /Refined analyses: .*/.exec(log)?.[0];
  console.log(`server: ${root} on 127.0.0.1:${port}${pool ? ` — ${pool}` : ' — no refined-analysis pool (analyses on the request thread)'}`);
  return child;
}

function stopServer(child: ChildProcess): Promise<void> {
  return new Promise((ok) => {
    if (child.exitCode !== null) return ok();
    const kill = setTimeout(() => child.kill('SIGKILL'), 10_000);
    child.once('exit', () => {
      clearTimeout(kill);
      ok();
    });
    child.kill('SIGTERM');
  });
}

function pct(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** GET /api/auth/me one after another until `done` settles; latencies in ms. */
async function probeWhile(client: Client, done: Promise<unknown>): Promise<number[]> {
  let finished = false;
  void done.finally(() => (finished = true));
  const times: number[] = [];
  const end = Date.now() + PHASE_MS;
  while (!finished && times.length < MAX_PROBES && Date.now() < end) {
    const r = await client.request('GET', '/api/auth/me');
    if (r.status !== 200) throw new Error(`GET /api/auth/me answered ${r.status}`);
    times.push(r.ms);
    await new Promise((r2) => setTimeout(r2, 10));
  }
  return times;
}

function report(label: string, times: number[]): void {
  const s = [...times].sort((a, b) => a - b);
  if (!s.length) return console.log(`${label}: no probe completed`);
  console.log(`${label}: GET /api/auth/me × ${s.length}: p50 ${pct(s, 50).toFixed(1)} ms, p99 ${pct(s, 99).toFixed(1)} ms, max ${s[s.length - 1].toFixed(1)} ms`);
}

async function saveDeck(client: Client, projectId: number, d: unknown): Promise<number> {
  const r = await client.request('POST', `/api/projects/${projectId}/decks`, { deck: d, message: 'latency bench' });
  if (r.status !== 201) throw new Error(`saving a deck answered ${r.status}: ${JSON.stringify(r.json)}`);
  return (r.json as { deck: { id: number } }).deck.id;
}

async function refinedPhase(client: Client, label: string, deckIds: number[]): Promise<void> {
  const started = performance.now();
  const runs = Promise.all(
    deckIds.map(async (id) => {
      const r = await client.request('GET', `/api/reports/decks/${id}/versions/1/factors.csv`);
      return { id, status: r.status, ms: r.ms, note: r.status === 200 ? '' : JSON.stringify((r.json as { error?: { code?: string } }).error?.code ?? r.json).slice(0, 80) };
    }),
  );
  const times = await probeWhile(client, runs);
  const results = await runs;
  console.log(`${label}: ${deckIds.length} first-time refined run(s) asked at once, all answered in ${((performance.now() - started) / 1000).toFixed(1)} s`);
  for (const r of results) console.log(`  factors.csv of deck ${r.id}: ${r.status} in ${(r.ms / 1000).toFixed(2)} s ${r.note}`);
  report(`  meanwhile`, times);
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-pool-bench-'));
  const port = await freePort();
  console.log(`machine: ${availableParallelism()} cores, load average ${loadavg().map((l) => l.toFixed(2)).join(' ')} (shared machines inflate every figure)`);
  const server = await startServer(dir, port);
  try {
    const client = new Client(`http://127.0.0.1:${port}`);
    const login = await client.request('POST', '/api/auth/login', { email: 'designer@larchmont-ridge.example', password: 'deckshare-demo-1' });
    if (login.status !== 200) throw new Error(`sign-in answered ${login.status}`);
    const projectId = ((await client.request('GET', '/api/projects')).json as { projects: { id: number }[] }).projects[0].id;

    report('idle', await probeWhile(client, new Promise((r) => setTimeout(r, 2000))));
    const ids: number[] = [];
    for (let k = 0; k < versions; k++) ids.push(await saveDeck(client, projectId, deck(`Bench deck ${k + 1}`, 12, 1)));
    await refinedPhase(client, '12 girders, 30° skew', ids);
    if (wide) {
      await refinedPhase(client, '40 girders, 30° skew, one span', [await saveDeck(client, projectId, deck('Forty girders, one span', 40, 1))]);
      await refinedPhase(client, '40 girders, 30° skew, two spans', [await saveDeck(client, projectId, deck('Forty girders, two spans', 40, 2))]);
    }
  } finally {
    await stopServer(server);
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
