/**
 * Bench of the refined run's stated bounds (prints figures; not a test): for the three
 * grillage-capable example decks and an 8-girder, 45° skew deck at 40 segments a span, the
 * run's CPU time (median of 3 after one warm-up, ms; CPU time, not wall time, as the machine is shared) and each effect's largest bound in lanes and
 * in percent of its factor, with how many factors miss the target.
 * Run: npx tsx scripts/benchBound.ts
 */
import { readFileSync } from 'node:fs';
import { assertDeck, type Deck } from '../shared/deck/schema.js';
import { deckFromDisplay } from '../shared/deck/units.js';
import { computeRefinedFactors } from '../shared/grillage/refinedFactors.js';
import { steelGirderDeck } from '../tests/shared/refined/fixtures.js';

const decks: [string, Deck][] = ['fhwa-psc-step-5-1', 'larchmont-mill-creek', 'larchmont-quarry-lane'].map((n) => {
  const f = JSON.parse(readFileSync(`public/examples/${n}.deck.json`, 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
  return [n, assertDeck(deckFromDisplay(f.deck as never, f.units))];
});
decks.push(['8 girders, 45° skew, 40 segments', steelGirderDeck({ girders: 8, skew: 45, spansFt: [100] })]);

for (const [name, deck] of decks) {
  computeRefinedFactors(deck);
  const times: number[] = [];
  let r = computeRefinedFactors(deck);
  for (let k = 0; k < 3; k++) {
    const t0 = process.cpuUsage();
    r = computeRefinedFactors(deck);
    const t = process.cpuUsage(t0);
    times.push((t.user + t.system) / 1000);
  }
  times.sort((a, b) => a - b);
  const by: Record<string, { lanes: number; percent: number; missing: number; of: number }> = {};
  for (const f of r.factors) {
    const b = (by[f.effect] ??= { lanes: 0, percent: 0, missing: 0, of: 0 });
    b.lanes = Math.max(b.lanes, f.tolerance.factor);
    b.percent = Math.max(b.percent, f.tolerance.percent);
    b.of++;
    if (!f.tolerance.meetsTarget) b.missing++;
  }
  console.log(`${name}: ${times[1].toFixed(0)} ms`);
  for (const [e, b] of Object.entries(by)) console.log(`  ${e}: largest bound ${b.lanes.toFixed(4)} lanes, ${b.percent.toFixed(2)} %; ${b.missing} of ${b.of} miss the target`);
}
