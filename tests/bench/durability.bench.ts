/**
 * The cost of durable saves: the same deck-version saves through the service on a database
 * opened as the product opens it (WAL, synchronous = FULL: the log is synced at every commit)
 * and on one switched to synchronous = NORMAL (synced at checkpoints only; a power loss may take
 * the last acknowledged saves). Prints saves per second and the time per save for each, and
 * the raw commit cost (an empty transaction's insert) without the solver. Figures are printed,
 * never asserted. `npm run bench -- durability`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openDatabase } from '../../server/db/client.js';
import { seedDemo, DEMO_USERS } from '../../server/db/seed.js';
import { saveVersion } from '../../server/api/decks/deckService.js';
import { decks, users } from '../../server/db/schema.js';
import { demoDecks } from '../../server/db/demoDecks.js';

const SAVES = 60;
const COMMITS = 400;

async function run(mode: 'FULL' | 'NORMAL') {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-durability-'));
  const db = openDatabase(join(dir, 'bench.db'));
  db.$client.pragma(`synchronous = ${mode}`);
  await seedDemo(db, 'bench-password-1');
  const designer = db.select().from(users).all().find((u) => u.email === DEMO_USERS[1].email)!;
  const deck = db.select().from(decks).all()[0];
  const input = demoDecks()[0].deck;
  const t0 = performance.now();
  for (let i = 0; i < SAVES; i++) saveVersion(db, { id: designer.id, firmId: designer.firmId }, deck.id, { deck: input as never, message: `save ${i}` });
  const saveMs = (performance.now() - t0) / SAVES;
  db.$client.exec('CREATE TABLE bench_commits (id INTEGER PRIMARY KEY, v TEXT)');
  const insert = db.$client.prepare('INSERT INTO bench_commits (v) VALUES (?)');
  const t1 = performance.now();
  for (let i = 0; i < COMMITS; i++) insert.run(`row ${i}`); // each statement is its own transaction
  const commitMs = (performance.now() - t1) / COMMITS;
  db.$client.close();
  rmSync(dir, { recursive: true, force: true });
  return { saveMs, commitMs };
}

await run('NORMAL'); // warm-up: the solver's first runs are slower (JIT), whichever mode goes first
const full = await run('FULL');
const normal = await run('NORMAL');
const line = (label: string, r: { saveMs: number; commitMs: number }) =>
  `${label.padEnd(26)} save ${r.saveMs.toFixed(2)} ms (${(1000 / r.saveMs).toFixed(0)}/s), bare commit ${r.commitMs.toFixed(3)} ms`;
console.log(`${SAVES} deck-version saves (code factors computed, results compressed), ${COMMITS} bare commits, one connection:`);
console.log(line('synchronous = FULL (product)', full));
console.log(line('synchronous = NORMAL', normal));
console.log(`cost of durability: ${(full.saveMs - normal.saveMs).toFixed(2)} ms per save (${(((full.saveMs - normal.saveMs) / normal.saveMs) * 100).toFixed(0)} %), ${(full.commitMs - normal.commitMs).toFixed(3)} ms per bare commit`);
