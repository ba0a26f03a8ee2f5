/**
 * The real server (tsx server/index.ts on loopback, a fresh database) with ten first-time
 * refined (grillage) runs queued on ten different versions and one analysis thread: a cheap
 * request sent meanwhile is answered while refined runs are still pending — asserted by order,
 * not by a timing threshold — and every run ends with its table (200).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer, type RunningServer } from '../load/harness/server.js';
import { getJson, postJson, signIn, type Session } from '../load/harness/client.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

const RUNS = 10;

describe('ten first-time refined runs on the real server', () => {
  let dir: string;
  let server: RunningServer;
  let designer: Session;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'deckshare-queue-'));
    // one thread, so the runs queue; limits raised so all ten are accepted
    server = await startServer(join(dir, 'deckshare.db'), { REFINED_THREADS: '1', REFINED_QUEUE: '20', REFINED_JOBS_PER_USER: '20', REFINED_JOBS_PER_FIRM: '20' });
    designer = await signIn(server.url, 'designer@larchmont-ridge.example');
  }, 90_000);

  afterAll(async () => {
    await server?.stop();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('answers a cheap request while the runs are queued, and every run finishes', async () => {
    const projects = await getJson<{ projects: { id: number }[] }>(server.url, designer, '/api/projects');
    const project = projects.body.projects[0].id;
    const decks: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const made = await postJson<{ deck: { id: number } }>(server.url, designer, `/api/projects/${project}/decks`, { deck: { ...quarryCreekDeck(), name: `Queue deck ${i + 1}` }, message: 'queued' });
      expect(made.status).toBe(201);
      decks.push(made.body.deck.id);
    }
    const finished: string[] = [];
    const runs = decks.map((id) =>
      fetch(`${server.url}/api/reports/decks/${id}/versions/1/factors.csv`, { headers: designer.headers }).then(async (r) => {
        await r.text();
        finished.push(`refined ${id}`);
        return r.status;
      }),
    );
    // wait until the first run is on the worker (its job record says running)
    const end = Date.now() + 60_000;
    for (;;) {
      const jobs = await getJson<{ jobs: { state: string }[] }>(server.url, designer, `/api/decks/${decks[0]}/versions/1/jobs`);
      if (jobs.body.jobs.some((j) => j.state === 'running' || j.state === 'done')) break;
      if (Date.now() > end) throw new Error('no refined job started');
      await new Promise((r) => setTimeout(r, 20));
    }
    const me = await getJson<{ user: { email: string } }>(server.url, designer, '/api/auth/me');
    finished.push('me');
    expect(me.status).toBe(200);
    const statuses = await Promise.all(runs);
    expect(statuses).toEqual(Array(RUNS).fill(200));
    // the cheap request was answered before the queued runs were done
    const refinedBeforeMe = finished.indexOf('me');
    expect(refinedBeforeMe).toBeLessThan(RUNS);
    expect(finished.length).toBe(RUNS + 1);
  }, 180_000);
});
