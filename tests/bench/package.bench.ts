/**
 * Benchmark: size and time of the calculation package (PDF) of the first demo deck, as seeded
 * (Latin text only: Open Sans alone is embedded) and with CJK and emoji in the project, deck
 * and review-note names (the Noto Sans SC and Noto Emoji subsets those characters need are
 * loaded and embedded too). Prints figures when imported (wall and CPU time: the machine may be busy); asserts nothing about time.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { asc } from 'drizzle-orm';
import { openDatabase } from '../../server/db/client.js';
import { seedDemo } from '../../server/db/seed.js';
import { decks, firms } from '../../server/db/schema.js';
import { reportData, type ReportData } from '../../server/reports/reportData.js';
import { calculationPackagePdf } from '../../server/reports/calculationPackage.js';
import { loadConfig } from '../../server/config/env.js';
import { refinedPoolFor } from '../../server/compute/refinedPool.js';

const dir = mkdtempSync(join(tmpdir(), 'deckshare-bench-'));
const db = openDatabase(join(dir, 'bench.db'));
await seedDemo(db, 'bench-demo-password-1');
const firmId = db.select().from(firms).orderBy(asc(firms.id)).get()!.id;
const deck = db.select().from(decks).orderBy(asc(decks.id)).get()!;
const refinedPool = refinedPoolFor(loadConfig({}));
const plain = await reportData(db, refinedPool, firmId, deck.id, 1);
const wide: ReportData = {
  ...plain,
  project: { ...plain.project, name: `${plain.project.name} 橋梁 🦀` },
  deck: { ...plain.deck, name: `${plain.deck.name} — über Año 桥梁 🌉` },
  version: { ...plain.version, message: 'Girder layout from the general arrangement 橋梁 (ü ñ) 🦀' },
};

async function time(label: string, data: ReportData): Promise<void> {
  // The first run loads and parses the fonts; later runs reuse them.
  const t0 = performance.now();
  const first = await calculationPackagePdf(data);
  const firstMs = performance.now() - t0;
  const runs: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < 5; i++) {
    const t = performance.now();
    const c = process.cpuUsage();
    await calculationPackagePdf(data);
    runs.push(performance.now() - t);
    const used = process.cpuUsage(c);
    cpu.push((used.user + used.system) / 1000);
  }
  runs.sort((a, b) => a - b);
  cpu.sort((a, b) => a - b);
  console.log(`calculation package  ${label.padEnd(34)} ${(first.length / 1024).toFixed(0).padStart(5)} kB  first ${firstMs.toFixed(0).padStart(5)} ms  median ${runs[2].toFixed(0).padStart(5)} ms (CPU ${cpu[2].toFixed(0)} ms)`);
}

await time('demo deck (Latin names)', plain);
await time('demo deck, CJK + emoji in names', wide);
await refinedPool.close();
db.$client.close();
rmSync(dir, { recursive: true, force: true });
