/**
 * `npm run bench`: runs every tests/bench/*.bench.ts file in turn; each prints its own
 * figures. Timings are printed, never asserted (the machine may be busy).
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();

console.log(`Deckshare benchmarks — Node ${process.version}, ${new Date().toISOString()}`);
for (const f of files) {
  console.log(`\n=== ${f}`);
  await import(pathToFileURL(join(here, f)).href);
}
