/**
 * Benchmark of whole refined runs with every effect (positive and negative moment, shear at
 * each support side, reactions, fatigue), as a designer starts them:
 *   1. the FHWA prestressed example deck (public/examples/fhwa-psc-step-5-1.deck.json; two
 *      continuous 110 ft spans, 20° skew, six girders), default mesh;
 *   2. the same deck under the HL-93 loading (refinedLoading 'hl93': truck or tandem with IM
 *      and the lane load; no target of its own, printed for comparison);
 *   3. 8 girders × 40 segments per span, one 100 ft span, 45° skew.
 * Target for 1 and 3: under 200 ms in Node on this machine. Prints the wall and CPU medians, the
 * largest stated bound in lanes and in % of its factor, and how many factors meet the bound
 * target. Figures only; nothing is asserted (the machine may be busy).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { assertDeck, type Deck } from '../../shared/deck/schema.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { computeRefinedFactors } from '../../shared/grillage/refinedFactors.js';
import { steelGirderDeck } from '../shared/refined/fixtures.js';

const TARGET_MS = 200;
const BOUND_LANES = 0.005;
const BOUND_PERCENT = 0.5;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function run(label: string, deck: Deck, repeats: number, target: number | null = TARGET_MS): void {
  for (let k = 0; k < 2; k++) computeRefinedFactors(deck); // warm-up
  const wall: number[] = [];
  const cpu: number[] = [];
  let last = computeRefinedFactors(deck);
  for (let k = 0; k < repeats; k++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    last = computeRefinedFactors(deck);
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  const worstLanes = last.factors.reduce((a, b) => (b.tolerance.factor > a.tolerance.factor ? b : a));
  const worstPercent = last.factors.reduce((a, b) => (b.tolerance.percent > a.tolerance.percent ? b : a));
  const met = last.factors.filter((f) => f.tolerance.factor <= BOUND_LANES && f.tolerance.percent <= BOUND_PERCENT).length;
  const effects = [...new Set(last.factors.map((f) => f.effect))].join(', ');
  console.log(`refined  ${label.padEnd(52)} median ${median(wall).toFixed(1).padStart(7)} ms (CPU ${median(cpu).toFixed(1)} ms); ${target === null ? 'no target (for comparison)' : `target < ${target} ms`}`);
  console.log(`         ${last.factors.length} factors (${effects}); ${last.mesh.unknowns} unknowns`);
  console.log(
    `         largest bound ${worstLanes.tolerance.factor.toFixed(4)} lanes (${worstLanes.effect}, ${worstLanes.label}); largest ${worstPercent.tolerance.percent.toFixed(2)} % (${worstPercent.effect}, ${worstPercent.label}); ` +
      `${met} of ${last.factors.length} meet ≤ ${BOUND_LANES} lanes and ≤ ${BOUND_PERCENT} %`,
  );
}

const root = join(import.meta.dirname, '..', '..');
const f = JSON.parse(readFileSync(join(root, 'public/examples/fhwa-psc-step-5-1.deck.json'), 'utf8'));
console.log('Refined runs, every effect');
run('FHWA prestressed example deck, default mesh', assertDeck(deckFromDisplay(f.deck, f.units)), 9);
run('FHWA example deck, HL-93 loading (truck or tandem + lane)', assertDeck({ ...deckFromDisplay(f.deck, f.units), refinedLoading: 'hl93' } as never), 3, null);
run('8 girders × 40 segments, 100 ft, 45° skew', steelGirderDeck({ girders: 8, spacingFt: 8, spansFt: [100], skew: 45 }), 9);
