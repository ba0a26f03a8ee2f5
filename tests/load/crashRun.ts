/**
 * The crash run: on one temporary database, three rounds (by default) of deck saves from a few
 * concurrent writers, the server SIGKILLed mid-stream, the file checked with integrity_check,
 * the server restarted and every save acknowledged before the kill read back whole. Then a
 * SIGKILL in the middle of a calculation-package (PDF) export: afterwards nothing new is left
 * in the data folder, the database is intact and the export yields a complete PDF.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServer, type RunningServer } from './harness/server.js';
import { DEMO, getJson, signIn, type Session } from './harness/client.js';
import { ackFrom, findSaveTarget, readBack, saveBody, type Ack, type ReadBack, type SaveTarget } from './harness/saves.js';
import { checkDatabase, megabytes, type DatabaseCheck } from './harness/database.js';
import { checkPdf, type PdfCheck } from './harness/pdf.js';
import type { Print } from './harness/report.js';

export interface CrashOptions {
  rounds: number;
  /** Longest time saves run before the kill (the kill comes at a random 40–100 % of it). */
  seconds: number;
  /** Concurrent writers. */
  connections: number;
}

export interface RoundFigures {
  round: number;
  killAfterMs: number;
  acknowledged: number;
  unanswered: number;
  integrityAfterKill: string;
  /** From the restart command to /api/health answering (migrations and WAL recovery included). */
  restartMs: number;
  /** Highest version number acknowledged in the round. */
  lastNumber: number;
  readBack: ReadBack;
}

export interface ExportCrashFigures {
  /** The version whose export was killed. */
  version: number;
  killAfterMs: number;
  /** The interrupted request: whether anything arrived, and whether that was a whole PDF. */
  interrupted: { answered: boolean; complete: boolean; text: string };
  newFiles: string[];
  integrityAfterKill: string;
  /** GET of the killed version after the restart: status and the methods of its stored results. */
  versionAfterRestart: { status: number; methods: string[] };
  afterRestart: PdfCheck & { status: number; bytes: number };
}

export interface CrashResult {
  rounds: RoundFigures[];
  exportCrash: ExportCrashFigures;
  database: DatabaseCheck;
  ok: boolean;
}

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

interface Writers {
  acks: Ack[];
  unanswered: number;
  done: Promise<void>;
}

/** Writers that save until the server stops answering; `next` numbers every save sent. */
function startWriters(server: RunningServer, session: Session, target: SaveTarget, run: string, count: number, next: { n: number }): Writers {
  const w: Writers = { acks: [], unanswered: 0, done: Promise.resolve() };
  const writer = async () => {
    for (;;) {
      const n = next.n++;
      try {
        const res = await fetch(`${server.url}/api/decks/${target.deckId}/versions`, { method: 'POST', headers: session.headers, body: JSON.stringify(saveBody(target, n, run)) });
        const ack = ackFrom(n, target.deckId, res.status, await res.text());
        if (!ack) throw new Error(`save ${n} answered ${res.status}`);
        w.acks.push(ack);
      } catch {
        w.unanswered++;
        return;
      }
    }
  };
  w.done = Promise.all(Array.from({ length: count }, writer)).then(() => {});
  return w;
}

/** On a slow machine the first save may outlast the chosen delay: a round kills only after one
 *  acknowledged save (bounded), so every round has something to lose. */
async function untilFirstAck(w: Writers, boundMs = 30_000): Promise<void> {
  const deadline = Date.now() + boundMs;
  while (w.acks.length === 0 && w.unanswered === 0 && Date.now() < deadline) await pause(20);
}

async function crashRound(round: number, server: RunningServer, dbPath: string, options: CrashOptions, target: SaveTarget, run: string, next: { n: number }): Promise<{ figures: RoundFigures; server: RunningServer }> {
  const session = await signIn(server.url, DEMO.designer);
  const started = Date.now();
  const writers = startWriters(server, session, target, run, options.connections, next);
  await pause(Math.round(options.seconds * 1000 * (0.4 + 0.6 * Math.random())));
  await untilFirstAck(writers);
  const killAfterMs = Date.now() - started;
  await server.kill();
  await writers.done;
  const integrityAfterKill = checkDatabase(dbPath).integrity;
  const t0 = Date.now();
  const restarted = await startServer(dbPath);
  const restartMs = Date.now() - t0;
  const back = await readBack(restarted.url, await signIn(restarted.url, DEMO.designer), [target], run, writers.acks);
  return { figures: { round, killAfterMs, acknowledged: writers.acks.length, unanswered: writers.unanswered, integrityAfterKill, restartMs, lastNumber: Math.max(1, ...writers.acks.map((a) => a.number)), readBack: back }, server: restarted };
}

function dataFiles(dir: string): string[] {
  return readdirSync(dir).filter((f) => !/-(wal|shm)$/.test(f)).sort();
}

async function fetchPdf(url: string, session: Session): Promise<{ status: number; pdf: Buffer }> {
  const res = await fetch(url, { headers: session.headers });
  return { status: res.status, pdf: Buffer.from(await res.arrayBuffer()) };
}

/** Milliseconds of the first export of a version: its refined analysis runs (on the pool's
 *  worker threads) and is stored, then the PDF is drawn. */
async function timeColdExport(url: string, session: Session): Promise<number> {
  const t0 = Date.now();
  const r = await fetchPdf(url, session);
  if (r.status !== 200 || !checkPdf(r.pdf).complete) throw new Error(`the export failed before any kill: ${r.status}`);
  return Date.now() - t0;
}

const packagePath = (deckId: number, n: number) => `/api/reports/decks/${deckId}/versions/${n}/package.pdf`;

/** After the restart: the killed version reads back (its stored results decode) and exports whole. */
async function afterExportRestart(server: RunningServer, deckId: number, n: number) {
  const session = await signIn(server.url, DEMO.designer);
  const v = await getJson<{ version?: { results?: { method: string }[] } }>(server.url, session, `/api/decks/${deckId}/versions/${n}?include=results`);
  const again = await fetchPdf(`${server.url}${packagePath(deckId, n)}`, session);
  return {
    version: { status: v.status, methods: (v.body.version?.results ?? []).map((r) => r.method) },
    pdf: { ...checkPdf(again.pdf), status: again.status, bytes: again.pdf.length },
  };
}

type Interrupted = ExportCrashFigures['interrupted'];

/** Starts an export of version n and returns what the client got once the server is gone. */
function exportInFlight(server: RunningServer, session: Session, deckId: number, n: number): Promise<Interrupted> {
  return fetchPdf(`${server.url}${packagePath(deckId, n)}`, session).then(
    (r) => ({ answered: true, complete: r.status === 200 && checkPdf(r.pdf).complete, text: `answered ${r.status} before the kill: ${checkPdf(r.pdf).reason}` }),
    () => ({ answered: false, complete: false, text: 'got no response (connection dropped)' }),
  );
}

/** Kills the server while it exports a version never exported before (so its refined analysis
 *  is running or being stored), at 40 % of a first export of version 1. When the export beat the
 *  kill, the server is restarted and a newer unexported version tried with half the delay (up
 *  to three times). */
async function exportCrash(server: RunningServer, dbPath: string, dir: string, deckId: number, freshNumber: number): Promise<{ figures: ExportCrashFigures; server: RunningServer }> {
  let session = await signIn(server.url, DEMO.designer);
  let killAfterMs = Math.max(5, Math.round((await timeColdExport(`${server.url}${packagePath(deckId, 1)}`, session)) * 0.4));
  let attempt = 0;
  for (;;) {
    const version = freshNumber - attempt;
    const before = dataFiles(dir);
    const interruptedRequest = exportInFlight(server, session, deckId, version);
    await pause(killAfterMs);
    await server.kill();
    const interrupted = await interruptedRequest;
    const newFiles = dataFiles(dir).filter((f) => !before.includes(f));
    const integrityAfterKill = checkDatabase(dbPath).integrity;
    server = await startServer(dbPath);
    if (interrupted.answered && interrupted.complete && ++attempt < 3 && integrityAfterKill === 'ok' && newFiles.length === 0) {
      killAfterMs = Math.max(5, Math.round(killAfterMs / 2));
      session = await signIn(server.url, DEMO.designer);
      continue;
    }
    const after = await afterExportRestart(server, deckId, version);
    return { figures: { version, killAfterMs, interrupted, newFiles, integrityAfterKill, versionAfterRestart: after.version, afterRestart: after.pdf }, server };
  }
}

export async function runCrash(options: CrashOptions, print: Print = console.log): Promise<CrashResult> {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-crash-'));
  const dbPath = join(dir, 'crash.db');
  print(`Crash: ${options.rounds} rounds of ${options.connections} writers, SIGKILL within ${options.seconds} s, database ${dbPath}`);
  let server = await startServer(dbPath);
  try {
    const target = await findSaveTarget(server.url, await signIn(server.url, DEMO.designer));
    const run = `c${Date.now().toString(36)}`;
    const next = { n: 0 };
    const rounds: RoundFigures[] = [];
    for (let round = 1; round <= options.rounds; round++) {
      const r = await crashRound(round, server, dbPath, options, target, run, next);
      server = r.server;
      rounds.push(r.figures);
    }
    const fresh = Math.max(...rounds.map((r) => r.lastNumber));
    const e = await exportCrash(server, dbPath, dir, target.deckId, fresh);
    server = e.server;
    await server.stop();
    const database = checkDatabase(dbPath);
    const result = { rounds, exportCrash: e.figures, database, ok: isCorrect(rounds, e.figures, database) };
    printCrash(print, result);
    return result;
  } finally {
    await server.kill();
    rmSync(dir, { recursive: true, force: true });
  }
}

function isCorrect(rounds: RoundFigures[], e: ExportCrashFigures, database: DatabaseCheck): boolean {
  const roundsOk = rounds.every((r) => r.acknowledged > 0 && r.readBack.problems.length === 0 && r.integrityAfterKill === 'ok');
  // A response that did arrive must be a whole PDF (never half a file served as done).
  const exportOk = (!e.interrupted.answered || e.interrupted.complete) && e.newFiles.length === 0 && e.versionAfterRestart.status === 200 && e.integrityAfterKill === 'ok' && e.afterRestart.status === 200 && e.afterRestart.complete;
  return roundsOk && exportOk && database.integrity === 'ok';
}

function printCrash(print: Print, r: CrashResult): void {
  print('');
  print('round  kill after ms  acknowledged  unanswered at kill  found intact after restart  lost  integrity after kill  restart ms');
  for (const x of r.rounds) {
    const lost = x.readBack.acknowledged - x.readBack.found;
    print(`${String(x.round).padStart(5)}  ${String(x.killAfterMs).padStart(13)}  ${String(x.acknowledged).padStart(12)}  ${String(x.unanswered).padStart(18)}  ${String(x.readBack.found).padStart(26)}  ${String(lost).padStart(4)}  ${x.integrityAfterKill.padEnd(20)}  ${String(x.restartMs).padStart(10)}`);
    for (const p of x.readBack.problems.slice(0, 10)) print(`       problem: ${p}`);
  }
  const e = r.exportCrash;
  print(`PDF export of version ${e.version} (never exported before) killed after ${e.killAfterMs} ms: interrupted request ${e.interrupted.text}; new files left in the data folder: ${e.newFiles.length ? e.newFiles.join(', ') : 'none'}; integrity after kill: ${e.integrityAfterKill}`);
  const caution = e.afterRestart.cautionReadBack === null ? 'pdftotext not installed' : e.afterRestart.cautionReadBack ? 'caution line read back by pdftotext' : 'caution line NOT read back';
  print(`PDF export after restart: ${e.afterRestart.status}, ${e.afterRestart.bytes} bytes, ${e.afterRestart.complete ? 'complete' : 'INCOMPLETE'} (${e.afterRestart.reason}; ${caution})`);
  print(`version ${e.version} read back after restart (before exporting it again): ${e.versionAfterRestart.status}, stored results: ${e.versionAfterRestart.methods.join(', ') || 'none'}${e.versionAfterRestart.methods.includes('grillage') ? '' : ' (the killed refined run stored nothing)'}`);
  print('background jobs: refined analyses run on an in-memory worker pool; there is no job table, so a run cut off by the kill leaves nothing behind and runs again when next asked for');
  print(`final integrity_check: ${r.database.integrity}; database ${megabytes(r.database.bytes)} (${r.database.versions} deck versions)`);
  print(`correctness (every acknowledged save intact after each kill, integrity ok, export complete after restart): ${r.ok ? 'PASS' : 'FAIL'}`);
}
