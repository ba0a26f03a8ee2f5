/**
 * Benchmark of the grillage: mesh + banded factorisation + influence surfaces of every
 * girder's midspan moment (each span) and end shears (just inside both end supports), for
 *   1. 8 girders × 40 segments per span (one span), and the same through the dense
 *      ml-matrix path (dense assembly, Cholesky, the same right-hand sides) with the ratio;
 *   2. 12 girders × 100 segments per span (one span);
 *   3. a three-span continuous skewed deck (perpendicular members), default density and 40;
 * each with its memory (JS heap + typed-array buffers): the peak above a collected baseline while one model and its
 * surfaces are built (garbage included) and what they keep after a collection. Also the
 * cost of ordinates (at, a table of points evaluated for every surface).
 * Prints figures when imported; asserts nothing about time (the machine may be busy: times
 * are medians of repeated runs, with the best run beside them).
 */
import v8 from 'node:v8';
import { runInNewContext } from 'node:vm';
import {
  DenseCholesky,
  assembleGrid,
  buildGrillage,
  denseStiffness,
  evaluateSurfaces,
  influenceSurfaces,
  type GrillageModel,
  type GrillageOptions,
  type GrillageResponse,
  type InfluenceSurface,
} from '../../shared/grillage/index.js';
import type { Deck } from '../../shared/deck/schema.js';
import { steelDeck } from '../shared/grillage/fixtures.js';

// expose the collector for the memory figures (a flag set at run time, fetched from a fresh context)
v8.setFlagsFromString('--expose-gc');
const gc = runInNewContext('gc') as () => void;
const MB = 1024 * 1024;
/** A full collection, with time for typed-array backing stores to be released. */
async function settle(): Promise<void> {
  gc();
  await new Promise((r) => setTimeout(r, 30));
  gc();
}
/** JS heap plus typed-array backing stores (held outside the JS heap), bytes. */
const used = () => {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
};

function stats(xs: number[]): { median: number; best: number } {
  const s = [...xs].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], best: s[0] };
}
const fmt = (ms: number) => `${ms.toFixed(2).padStart(8)} ms`;
const line = (text: string) => console.log(`          ${text}`);

/** Every girder's midspan moment (each span) and end shears (just inside the end supports). */
function benchResponses(model: GrillageModel): GrillageResponse[] {
  const out: GrillageResponse[] = [];
  const N = model.spanCount;
  for (let g = 0; g < model.girderCount; g++) {
    for (let j = 0; j < N; j++) out.push({ kind: 'girder-moment', girder: g, span: j, fraction: 0.5 });
    out.push({ kind: 'girder-shear', girder: g, support: 0, side: 'right' });
    out.push({ kind: 'girder-shear', girder: g, support: N, side: 'left' });
  }
  return out;
}

function run(deck: Deck, options: GrillageOptions): { model: GrillageModel; surfaces: InfluenceSurface[]; buildMs: number; surfMs: number } {
  const t0 = performance.now();
  const model = buildGrillage(deck, options);
  const t1 = performance.now();
  const surfaces = influenceSurfaces(model, benchResponses(model));
  const t2 = performance.now();
  return { model, surfaces, buildMs: t1 - t0, surfMs: t2 - t1 };
}

async function measure(label: string, deck: Deck, options: GrillageOptions, repeats: number): Promise<{ model: GrillageModel; surfaces: InfluenceSurface[]; total: number }> {
  for (let k = 0; k < 3; k++) run(deck, options); // warm-up
  const build: number[] = [];
  const surf: number[] = [];
  const total: number[] = [];
  for (let k = 0; k < repeats; k++) {
    const r = run(deck, options);
    build.push(r.buildMs);
    surf.push(r.surfMs);
    total.push(r.buildMs + r.surfMs);
  }
  await settle();
  const base = used();
  const model = buildGrillage(deck, options);
  const afterBuild = used();
  const surfaces = influenceSurfaces(model, benchResponses(model));
  const peak = Math.max(afterBuild, used()) - base;
  await settle();
  const kept = used() - base;
  const s = model.stats;
  const b = stats(build);
  const f = stats(surf);
  const t = stats(total);
  console.log(`grillage  ${label}`);
  line(`${s.nodes} nodes, ${s.members} members, ${s.unknowns} unknowns, half-bandwidth ${s.halfBandwidth}, ${surfaces.length} influence surfaces (${model.layout} members)`);
  line(`mesh + factorisation ${fmt(b.median)}  (best ${b.best.toFixed(2)})`);
  line(`influence surfaces   ${fmt(f.median)}  (best ${f.best.toFixed(2)})`);
  line(`total                ${fmt(t.median)}  (best ${t.best.toFixed(2)})`);
  line(`memory: peak ${(peak / MB).toFixed(2)} MB above the baseline while building; kept by the model and its surfaces ${(kept / MB).toFixed(2)} MB`);
  return { model, surfaces, total: t.median };
}

/** The linear algebra alone (no meshing): assembly, factorisation and the surfaces' block solve. */
function linearAlgebra(model: GrillageModel, dense: boolean): number {
  const m = benchResponses(model).length;
  const B = new Float64Array(model.grid.n * m).map((_, k) => ((k * 7919) % 101) / 101);
  const t0 = performance.now();
  if (dense) new DenseCholesky(denseStiffness(model.grid)).solveManyInPlace(B, m);
  else assembleGrid(model.grid.definition).factor.solveManyInPlace(B, m);
  return performance.now() - t0;
}

// 1. 8 girders × 40 segments, and the dense path
const deck8 = steelDeck({ girders: 8, spacingFt: 8, spansFt: [100] });
const r8 = await measure('8 girders × 40 segments, one 100 ft span', deck8, { segmentsPerSpan: 40 }, 15);
{
  for (let k = 0; k < 5; k++) linearAlgebra(r8.model, false);
  linearAlgebra(r8.model, true); // warm-up
  const banded: number[] = [];
  const dense: number[] = [];
  for (let k = 0; k < 15; k++) banded.push(linearAlgebra(r8.model, false));
  for (let k = 0; k < 3; k++) dense.push(linearAlgebra(r8.model, true));
  const whole: number[] = [];
  for (let k = 0; k < 3; k++) {
    const t0 = performance.now();
    const model = buildGrillage(deck8, { segmentsPerSpan: 40 });
    influenceSurfaces(model, benchResponses(model), { solver: new DenseCholesky(denseStiffness(model.grid)) });
    whole.push(performance.now() - t0);
  }
  await settle();
  const before = used();
  const chol = new DenseCholesky(denseStiffness(r8.model.grid));
  const after = used();
  const b = stats(banded);
  const d = stats(dense);
  const w = stats(whole);
  line(`dense ml-matrix path, whole run (mesh, dense assembly, Cholesky, the same solves) ${fmt(w.median)}: ${(w.median / r8.total).toFixed(0)}× the banded run`);
  line(`linear algebra alone (assembly + factorisation + ${benchResponses(r8.model).length} solves): banded ${fmt(b.median)}, dense ${fmt(d.median)}: ${(d.median / b.median).toFixed(0)}×`);
  line(`dense factors kept ≈ ${((after - before) / MB).toFixed(1)} MB${chol.n > 0 ? '' : ''}`);
}
{
  // cost of ordinates
  const s = r8.surfaces;
  const e = r8.model.extent;
  const L = e.xMax - e.xMin;
  const W = e.yMax - e.yMin;
  const n = 1_000_000;
  let acc = 0;
  for (let k = 0; k < 200_000; k++) acc += s[k & 7].at(e.xMin + (k % 997) * (L / 997), e.yMin + (k % 101) * (W / 101));
  const t0 = performance.now();
  for (let k = 0; k < n; k++) acc += s[k & 7].at(e.xMin + (k % 997) * (L / 997), e.yMin + (k % 101) * (W / 101));
  const atNs = ((performance.now() - t0) * 1e6) / n;
  const xs = Float64Array.from({ length: 120 }, (_, k) => e.xMin + ((k + 0.5) * L) / 120);
  const ys = Float64Array.from({ length: 400 }, (_, k) => e.yMin + ((k + 0.5) * W) / 400);
  const t1 = performance.now();
  const table = r8.model.transfer.tabulateGrid(xs, ys);
  const t2 = performance.now();
  const outs = evaluateSurfaces(s, table);
  const t3 = performance.now();
  line(`ordinates: at(x, y) ${atNs.toFixed(0)} ns per call (1e6 calls over 8 surfaces)${Number.isFinite(acc + outs[0][0]) ? '' : ' (non-finite!)'}`);
  line(`table of ${table.count} points ${fmt(t2 - t1)}; all ${s.length} surfaces on it ${fmt(t3 - t2)} (${(((t3 - t2) * 1e6) / (table.count * s.length)).toFixed(0)} ns per ordinate)`);
}

// 2. 12 girders × 100 segments
await measure('12 girders × 100 segments, one 150 ft span', steelDeck({ girders: 12, spacingFt: 8, spansFt: [150] }), { segmentsPerSpan: 100 }, 7);

// 3. three-span continuous, skewed 35° (perpendicular members), default and 40 segments
const deck3 = steelDeck({ girders: 7, spacingFt: 9.5, spansFt: [120, 150, 120], continuous: true, skew: 35 });
await measure('three-span continuous 120-150-120 ft, 7 girders, skew 35°, default 20 segments', deck3, {}, 9);
await measure('three-span continuous 120-150-120 ft, 7 girders, skew 35°, 40 segments', deck3, { segmentsPerSpan: 40 }, 7);
