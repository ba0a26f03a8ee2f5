/**
 * Storage per save: saves N versions of each demo deck through the deck service on a fresh
 * SQLite file (seeded demo firm), opens the grillage result of every version (stored at first
 * use), and prints the bytes each save adds — from the file's page count × page size after a
 * WAL checkpoint, and from the stored payload columns. Figures are printed, never asserted.
 *
 * Then the code result of the largest decks the bounds allow (12 continuous spans, 80 m wide:
 * 40 girders at 1.95 m down to 10 at 8 m): its JSON and what is stored for it.
 *
 *   npx tsx tests/bench/storage.ts [N=20]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { openDatabase, type Db } from '../../server/db/client.js';
import { seedDemo } from '../../server/db/seed.js';
import { demoDecks } from '../../server/db/demoDecks.js';
import { decks, deckVersions, projects, users } from '../../server/db/schema.js';
import { saveVersion } from '../../server/api/decks/deckService.js';
import { refinedResultsOf } from '../../server/api/reviews/refinedResults.js';
import { loadConfig } from '../../server/config/env.js';
import { refinedPoolFor } from '../../server/compute/refinedPool.js';
import { encodeResult, ResultTooLargeError } from '../../server/storage/storedResults.js';
import { assertDeck } from '../../shared/deck/schema.js';
import { computeCodeFactors } from '../../shared/lrfd/factors.js';

const N = Number(process.argv[2] ?? 20);

function fileBytes(db: Db): number {
  db.$client.pragma('wal_checkpoint(TRUNCATE)');
  const pages = Number(db.$client.pragma('page_count', { simple: true }));
  const size = Number(db.$client.pragma('page_size', { simple: true }));
  return pages * size;
}

/** Bytes of the stored payload columns (text as UTF-8, blobs as stored), summed over a table. */
function payloadBytes(db: Db, table: 'deck_versions' | 'analysis_results'): number {
  const cols = db.$client.prepare(`SELECT name FROM pragma_table_info('${table}')`).all() as { name: string }[];
  const payload = cols.map((c) => c.name).filter((n) => /json|blob/.test(n));
  const expr = payload.map((n) => `COALESCE(length(CAST(${n} AS BLOB)), 0)`).join(' + ');
  return Number((db.$client.prepare(`SELECT SUM(${expr}) AS n FROM ${table}`).get() as { n: number | null }).n ?? 0);
}

/** What the storage triggers counted for the firms (0 when the table does not exist yet). */
function countedBytes(db: Db): number {
  const has = db.$client.prepare(`SELECT 1 FROM sqlite_master WHERE name = 'firm_storage'`).get();
  return has ? Number((db.$client.prepare('SELECT SUM(bytes) AS n FROM firm_storage').get() as { n: number }).n) : 0;
}

const dir = mkdtempSync(join(tmpdir(), 'deckshare-storage-'));
try {
  const db = openDatabase(join(dir, 'bench.db'));
  await seedDemo(db, 'storage-bench-password');
  const designer = db.select().from(users).where(eq(users.email, 'designer@larchmont-ridge.example')).get()!;
  const actor = { id: designer.id, firmId: designer.firmId };
  const deckRows = db.select({ id: decks.id, name: decks.name }).from(decks).innerJoin(projects, eq(projects.id, decks.projectId)).all();
  const byName = new Map(demoDecks().map((d) => [d.deck.name, d.deck]));
  const before = fileBytes(db);
  const resultsBefore = payloadBytes(db, 'analysis_results');

  let saves = 0;
  const t0 = performance.now();
  for (let i = 0; i < N; i++) {
    for (const d of deckRows) {
      const deck = byName.get(d.name)!;
      saveVersion(db, actor, d.id, { deck, message: `storage bench save ${i + 1}` });
      saves++;
    }
  }
  const saveMs = (performance.now() - t0) / saves;
  const afterSaves = fileBytes(db);
  const versionPayload = payloadBytes(db, 'deck_versions');
  const resultPayload = payloadBytes(db, 'analysis_results');

  const t1 = performance.now();
  const versions = db.select().from(deckVersions).all();
  const refinedPool = refinedPoolFor(loadConfig({}));
  for (const v of versions) await refinedResultsOf(db, refinedPool, v);
  await refinedPool.close();
  const refinedMs = (performance.now() - t1) / versions.length;
  const afterRefined = fileBytes(db);
  const resultPayloadWithRefined = payloadBytes(db, 'analysis_results');

  const kb = (b: number) => `${(b / 1024).toFixed(1)} KB`;
  console.log(`storage: ${saves} saves of ${deckRows.length} demo decks (${N} each), then the grillage result of all ${versions.length} versions`);
  console.log(`  file bytes per save (code result only):          ${kb((afterSaves - before) / saves)}  (${saveMs.toFixed(1)} ms per save)`);
  console.log(`  file bytes per version (with grillage result):   ${kb((afterRefined - before) / saves)}  (${refinedMs.toFixed(1)} ms per first grillage read)`);
  console.log(`  payload per save: deck+placements ${kb(versionPayload / versions.length)}, code result ${kb((resultPayload - resultsBefore) / saves)}`);
  console.log(`  payload per version with grillage: ${kb((resultPayloadWithRefined + versionPayload) / versions.length)}`);
  console.log(`  file: ${kb(afterRefined)} total; firm_storage counts ${kb(countedBytes(db))}`);
  db.$client.close();

  for (const [count, spacing] of [[40, 1.95], [20, 4], [17, 4.9], [14, 5.9], [12, 7.1], [10, 8]] as const) {
    const base = byName.values().next().value!;
    const deck = assertDeck({ ...base, overhangLeft: 0.4, overhangRight: 0.4, girders: { kind: 'uniform', count, spacing }, spans: Array.from({ length: 12 }, () => base.spans[0]), supports: Array.from({ length: 13 }, () => base.supports[0]), continuous: true });
    const result = computeCodeFactors(deck);
    const json = Buffer.byteLength(JSON.stringify(result));
    let stored: string;
    try {
      stored = kb(encodeResult(result).dataBlob!.length);
    } catch (e) {
      if (!(e instanceof ResultTooLargeError)) throw e;
      stored = 'refused (over the bound)';
    }
    console.log(`  ${count} girders at ${spacing} m × 12 spans: code result JSON ${kb(json)}, stored ${stored}`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
