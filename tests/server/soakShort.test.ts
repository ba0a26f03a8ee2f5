/**
 * The short form of `npm run soak` and `npm run crash` for CI: the real server on loopback
 * under a few seconds of signed-in reads and saves, then killed three times during saves and
 * once during a PDF export. Only correctness is asserted — no failed request, no acknowledged
 * save lost or changed, integrity_check ok, a complete PDF after restart. Latencies are
 * printed by the full scripts and never asserted here.
 */
import { describe, expect, it } from 'vitest';
import { runSoak } from '../load/soakRun.js';
import { runCrash } from '../load/crashRun.js';

function collector() {
  const lines: string[] = [];
  return { lines, print: (l: string) => lines.push(l) };
}

describe('soak and crash checks, short form', () => {
  it('loses no acknowledged save under concurrent reads and saves, and the database stays intact', async () => {
    const out = collector();
    const r = await runSoak({ seconds: 2, connections: 10 }, out.print);
    const report = out.lines.join('\n');
    for (const p of r.phases) {
      expect(p.requests, report).toBeGreaterThan(0);
      expect({ phase: p.phase, errors: p.errors, timeouts: p.timeouts, non2xx: p.non2xx }, report).toEqual({ phase: p.phase, errors: 0, timeouts: 0, non2xx: 0 });
    }
    expect(r.saves.acknowledged, report).toBeGreaterThan(0);
    expect(r.saves.problems, report).toEqual([]);
    expect(r.saves.found, report).toBe(r.saves.acknowledged);
    expect(r.database.integrity, report).toBe('ok');
    expect(r.ok, report).toBe(true);
  }, 120_000);

  it('keeps every save acknowledged before a SIGKILL, and serves a whole PDF after a kill mid-export', async () => {
    const out = collector();
    const r = await runCrash({ rounds: 3, seconds: 1, connections: 4 }, out.print);
    const report = out.lines.join('\n');
    expect(r.rounds, report).toHaveLength(3);
    for (const round of r.rounds) {
      expect(round.acknowledged, report).toBeGreaterThan(0);
      expect(round.readBack.problems, report).toEqual([]);
      expect(round.integrityAfterKill, report).toBe('ok');
    }
    const e = r.exportCrash;
    expect(e.newFiles, report).toEqual([]);
    expect(e.integrityAfterKill, report).toBe('ok');
    if (e.interrupted.answered) expect(e.interrupted.complete, report).toBe(true);
    expect(e.afterRestart.status, report).toBe(200);
    expect(e.afterRestart.complete, report).toBe(true);
    expect(r.database.integrity, report).toBe('ok');
    expect(r.ok, report).toBe(true);
  }, 120_000);
});
