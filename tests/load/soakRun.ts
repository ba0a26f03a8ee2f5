/**
 * The soak run: start the real server on a temporary database, load it with signed-in reads
 * and with deck-version saves, read every acknowledged save back, stop the server, check the
 * database, and print the figures. Correctness (no errors, nothing lost, integrity ok) decides
 * `ok`; the latency target is printed, never asserted.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer } from './harness/server.js';
import { DEMO, signIn } from './harness/client.js';
import { findSaveTargets, readBack, type ReadBack } from './harness/saves.js';
import { checkDatabase, megabytes, versionsOfDeck, type DatabaseCheck } from './harness/database.js';
import { printPhaseTable, type Print } from './harness/report.js';
import { readPhase, savePhase, type PhaseFigures } from './loadPhases.js';
import { runSignInFloodPhase } from './signInFloodPhase.js';

export interface SoakOptions {
  seconds: number;
  connections: number;
  /** Also run the sign-in flood phase (tests/load/signInFlood.ts) when it exists. */
  signInFlood?: boolean;
}

export interface SoakResult {
  phases: PhaseFigures[];
  saves: ReadBack;
  /** Versions the server stored whose answer never reached the client (it gave up after
   *  autocannon's 10 s timeout, or the phase ended first): not lost, just never acknowledged. */
  unacknowledgedStored: number;
  database: DatabaseCheck;
  ok: boolean;
}

const READ_P99_TARGET_MS = 100;

export async function runSoak(options: SoakOptions, print: Print = console.log): Promise<SoakResult> {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-soak-'));
  const dbPath = join(dir, 'soak.db');
  try {
    print(`Soak: ${options.connections} connections × ${options.seconds} s per phase, database ${dbPath}`);
    const server = await startServer(dbPath);
    let phases: PhaseFigures[];
    let saves: ReadBack;
    let deckIds: number[];
    let versionsBefore: number;
    try {
      const sessions = await Promise.all([DEMO.designer, DEMO.admin, DEMO.instructor].map((e) => signIn(server.url, e)));
      const settings = { url: server.url, sessions, seconds: options.seconds, connections: options.connections };
      const reads = await readPhase(settings);
      const targets = await findSaveTargets(server.url, sessions[0]);
      deckIds = targets.map((t) => t.deckId);
      versionsBefore = targets.reduce((sum, t) => sum + t.latestNumber, 0);
      const run = `r${Date.now().toString(36)}`;
      const written = await savePhase(settings, targets, run);
      saves = await readBack(server.url, sessions[0], targets, run, written.acks);
      phases = [reads, written.figures];
    } finally {
      await server.stop();
    }
    const database = checkDatabase(dbPath);
    const unacknowledgedStored = deckIds.reduce((sum, id) => sum + versionsOfDeck(dbPath, id), 0) - versionsBefore - saves.acknowledged;
    const result = { phases, saves, unacknowledgedStored, database, ok: isCorrect(phases, saves, database) };
    printSoak(print, result);
    if (options.signInFlood) {
      const flood = await runSignInFloodPhase(options, print);
      if (flood.ran && flood.exitCode !== 0) result.ok = false;
    }
    return result;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function isCorrect(phases: PhaseFigures[], saves: ReadBack, database: DatabaseCheck): boolean {
  const clean = phases.every((p) => p.errors === 0 && p.timeouts === 0 && p.non2xx === 0 && p.requests > 0);
  return clean && saves.problems.length === 0 && saves.acknowledged > 0 && database.integrity === 'ok';
}

function printSoak(print: Print, r: SoakResult): void {
  print('');
  printPhaseTable(print, r.phases);
  print(`acknowledged saves: ${r.saves.acknowledged}, found intact on read-back: ${r.saves.found}, lost or different: ${r.saves.acknowledged - r.saves.found}`);
  for (const p of r.saves.problems.slice(0, 10)) print(`  problem: ${p}`);
  print(`saves stored but never acknowledged (client timed out at 10 s, or in flight when the phase ended): ${r.unacknowledgedStored}`);
  print(`integrity_check: ${r.database.integrity}`);
  print(`database: ${megabytes(r.database.bytes)} (${r.database.versions} deck versions)`);
  const reads = r.phases[0];
  print(`read p99 target < ${READ_P99_TARGET_MS} ms: ${reads.p99 < READ_P99_TARGET_MS ? 'met' : 'NOT met'} (${reads.p99} ms; a figure, not a pass/fail check)`);
  print(`correctness (0 errors, 0 non-2xx, 0 lost, integrity ok): ${r.ok ? 'PASS' : 'FAIL'}`);
}
