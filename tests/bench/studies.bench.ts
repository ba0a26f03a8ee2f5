/**
 * Parameter studies through the real app and its worker threads (figures printed, never
 * asserted): a 1,000-point code-only sweep (target under 2 s), a 100-point sweep with the
 * grillage at 8 girders × 40 segments per span (target under 15 s on 2 cores), the longest
 * interval between two progress updates (target ≤ 0.5 s), and the p99 of a cheap route
 * (GET /api/health) while the studies run (target < 50 ms). `npm run bench -- studies`.
 */
import type { AddressInfo } from 'node:net';
import { eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn } from '../server/helpers.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { studies } from '../../server/db/schema.js';

const ctx = await makeTestApp();
const server = ctx.app.listen(0, '127.0.0.1');
await new Promise((r) => server.once('listening', r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const designer = await signIn(ctx.app, demo.designer);
const projectId = (await designer.get('/api/projects')).body.projects[0].id;
const deck = { ...quarryCreekDeck(), girders: { kind: 'uniform' as const, count: 8, spacing: 2.5 } };
const deckId = (await designer.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', designer.csrf).send({ deck, message: 'bench' })).body.deck.id;

async function run(label: string, sweep: unknown): Promise<void> {
  const latencies: number[] = [];
  let running = true;
  const probe = (async () => {
    while (running) {
      const t = performance.now();
      await fetch(`${base}/api/health`).then((r) => r.text());
      latencies.push(performance.now() - t);
      await new Promise((r) => setTimeout(r, 10));
    }
  })();
  const t0 = performance.now();
  const res = await designer.post(`/api/projects/${projectId}/studies`).set('X-CSRF-Token', designer.csrf).send({ name: label, deckId, versionNumber: 1, sweep });
  if (res.status !== 201) throw new Error(JSON.stringify(res.body));
  const id = res.body.study.id as number;
  let last = -1;
  let lastChange = performance.now();
  let longest = 0;
  for (;;) {
    const row = ctx.db.select({ done: studies.pointsDone, state: studies.state }).from(studies).where(eq(studies.id, id)).get()!;
    const now = performance.now();
    if (row.done !== last) {
      if (last >= 0) longest = Math.max(longest, now - lastChange);
      last = row.done;
      lastChange = now;
    }
    if (row.state !== 'running') break;
    await new Promise((r) => setTimeout(r, 20));
  }
  const seconds = (performance.now() - t0) / 1000;
  running = false;
  await probe;
  latencies.sort((a, b) => a - b);
  const p99 = latencies[Math.min(latencies.length - 1, Math.floor(0.99 * latencies.length))];
  console.log(`${label}: ${res.body.study.pointsTotal} points in ${seconds.toFixed(2)} s; longest interval between progress updates ${(longest / 1000).toFixed(2)} s; GET /api/health p99 ${p99.toFixed(1)} ms over ${latencies.length} requests`);
}

await run('code only, 1,000 points', { axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 49.95, step: 0.05 } }] });
await run('grillage at every point, 8 girders × 40 segments, 100 points', { axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 49.5, step: 0.5 } }], grillage: 'all' });
server.close();
await ctx.close();
