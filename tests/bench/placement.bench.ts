/**
 * Benchmark of the refined run and the placement fast path:
 *   1. the whole refined run for 8 girders × 40 segments per span, one 100 ft span: mesh,
 *      banded factorisation, influence surfaces of every girder's midspan moment and both end
 *      shears, sampling, governing search for 1..NL lanes, beam-line normalisation
 *      (computeRefinedFactors, effects moment and shear; target under 50 ms), and the same
 *      with the fatigue factors as well;
 *   2. one placement evaluation (the drag path): three loaded lanes of the design truck on a
 *      grillage influence surface and on its sample, with and without the lane load, and on
 *      a transverse line (target well under 2 ms);
 *   3. 12 girders × 100 segments per span;
 *   4. a three-span continuous deck (80-100-80 ft, 6 girders, default density);
 * each with its memory: the JS heap plus typed-array buffers above a collected baseline at the
 * end of one run (garbage included, so close to the run's peak), and the process's peak RSS.
 * Prints figures when imported; asserts nothing about time (times are medians of repeated
 * runs, with the best beside them, and the process's CPU time per run, which a busy machine
 * inflates less than the wall time).
 */
import v8 from 'node:v8';
import { runInNewContext } from 'node:vm';
import { computeRefinedFactors, type RefinedOptions } from '../../shared/grillage/refinedFactors.js';
import { buildGrillage, influenceSurfaces } from '../../shared/grillage/index.js';
import { deckGeometry } from '../../shared/deck/geometry.js';
import type { Deck } from '../../shared/deck/schema.js';
import { DESIGN_TRUCK } from '../../shared/loads/vehicles.js';
import { evaluateSurface, evaluateTransverse } from '../../shared/placement/evaluate.js';
import { placementRulesForDeck, type Placement } from '../../shared/placement/rules.js';
import { sampleSurface } from '../../shared/placement/sampledSurface.js';
import { grillageStations } from '../../shared/grillage/refinedFactors.js';
import { rigidSectionLine } from '../../shared/placement/transverseLines.js';
import { fromUs } from '../../shared/units.js';
import { steelGirderDeck } from '../shared/refined/fixtures.js';

v8.setFlagsFromString('--expose-gc');
const gc = runInNewContext('gc') as () => void;
const MB = 1024 * 1024;
async function settle(): Promise<void> {
  gc();
  await new Promise((r) => setTimeout(r, 30));
  gc();
}
const used = () => {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
};
function stats(xs: number[]): { median: number; best: number } {
  const s = [...xs].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], best: s[0] };
}

async function refinedRun(label: string, deck: Deck, options: RefinedOptions, repeats: number, target?: number): Promise<void> {
  for (let k = 0; k < 3; k++) computeRefinedFactors(deck, options); // warm-up
  const times: number[] = [];
  const cpu: number[] = [];
  let factors = 0;
  let worstBound = 0;
  let stations = '';
  let mesh = '';
  for (let k = 0; k < repeats; k++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const r = computeRefinedFactors(deck, options);
    times.push(performance.now() - t0);
    const c1 = process.cpuUsage(c0);
    cpu.push((c1.user + c1.system) / 1000);
    factors = r.factors.length;
    worstBound = Math.max(...r.factors.map((f) => f.tolerance.factor));
    stations = `${r.stations.longitudinal}×${r.stations.transverse} stations`;
    mesh = `${r.mesh.nodes} nodes, ${r.mesh.unknowns} unknowns, half-band ${r.mesh.halfBandwidth}`;
  }
  await settle();
  const base = used();
  computeRefinedFactors(deck, options);
  const peak = used() - base;
  const s = stats(times);
  const c = stats(cpu);
  console.log(
    `refined  ${label.padEnd(58)} median ${s.median.toFixed(1).padStart(7)} ms (best ${s.best.toFixed(1)} ms; CPU median ${c.median.toFixed(1)} ms)${target ? `; target < ${target} ms` : ''}`,
  );
  console.log(`         ${mesh}; ${stations}; ${factors} factors; largest stated bound ${worstBound.toExponential(2)} lanes; memory +${(peak / MB).toFixed(1)} MB`);
}

function perCall(fn: () => void, n: number): { median: number; best: number } {
  for (let i = 0; i < Math.min(200, n); i++) fn();
  const runs: number[] = [];
  for (let k = 0; k < 7; k++) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++) fn();
    runs.push(((performance.now() - t0) / n) * 1000);
  }
  return stats(runs);
}

console.log('Refined distribution factors (grillage) and governing placements');
const eight = steelGirderDeck({ girders: 8, spacingFt: 8, spansFt: [100] });
await refinedRun('8 girders × 40 segments, moment + end shears', eight, { grillage: { segmentsPerSpan: 40 }, effects: ['moment', 'shear'] }, 9, 50);
await refinedRun('8 girders × 40 segments, moment, shear and both fatigue effects', eight, { grillage: { segmentsPerSpan: 40 } }, 7);

// 2. one placement evaluation
{
  const model = buildGrillage(eight, { segmentsPerSpan: 40 });
  const rules = placementRulesForDeck(eight);
  const [surface] = influenceSurfaces(model, [{ kind: 'girder-moment', girder: 3, span: 0, fraction: 0.5 }]);
  const sampled = sampleSurface(surface, grillageStations(model, rules));
  const L = eight.spans[0].length;
  const ft = fromUs.ft;
  const placement: Placement = {
    lanes: [0, 1, 2].map((i) => ({
      left: rules.curbLeft + i * rules.laneWidth,
      wheelOffset: ft(3),
      frontAxleAt: L / 2 + ft(14) + i * ft(3),
      direction: 1 as const,
      axleSpacing: ft(14),
    })),
  };
  const geo = deckGeometry(eight);
  const line = rigidSectionLine(geo.offsets, 0, geo.curbLeft, geo.curbRight);
  const rows: [string, () => void][] = [
    ['3 lanes on the grillage surface', () => evaluateSurface(surface, placement, rules, DESIGN_TRUCK)],
    ['3 lanes on the sampled surface', () => evaluateSurface(sampled, placement, rules, DESIGN_TRUCK)],
    ['3 lanes + lane load on the grillage surface', () => evaluateSurface(surface, placement, rules, DESIGN_TRUCK, { laneLoad: {} })],
    ['3 lanes + lane load on the sampled surface', () => evaluateSurface(sampled, placement, rules, DESIGN_TRUCK, { laneLoad: {} })],
    ['3 lanes on a transverse line (rigid section)', () => evaluateTransverse(line, placement, rules)],
  ];
  for (const [label, fn] of rows) {
    const s = perCall(fn, label.includes('lane load') ? 200 : 5000);
    console.log(`evaluate ${label.padEnd(58)} median ${s.median.toFixed(2).padStart(8)} µs (best ${s.best.toFixed(2)} µs); target well under 2000 µs`);
  }
}

await refinedRun('12 girders × 100 segments, moment + end shears', steelGirderDeck({ girders: 12, spacingFt: 8, spansFt: [100] }), { grillage: { segmentsPerSpan: 100 }, effects: ['moment', 'shear'] }, 3);
await refinedRun('3 continuous spans 80-100-80 ft, 6 girders, default density, all effects', steelGirderDeck({ spansFt: [80, 100, 80], continuous: true }), {}, 5);
console.log(`         process peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
