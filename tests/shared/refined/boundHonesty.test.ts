/**
 * Bound honesty of the refined factors (common practice, no source: a closed-form identity of
 * the search, not a published value). Each refined factor g states a bound b: no legal
 * placement on the grillage's own influence surface exceeds g by more than b lanes. A
 * brute-force search over a grid of legal placements (lane edges, wheel offsets, front-axle
 * positions including every axle just either side of each support line under each wheel line,
 * both directions, several rear spacings), evaluated on the surface itself with the product's
 * evaluation (shared/placement/evaluate.ts), must never beat g + b. Multiple presence factors:
 * AASHTO LRFD Table 3.6.1.1.2-1 (1.20, 1.00, 0.85, 0.65). The row's `meetsTarget` must say
 * whether b is within the target (BOUND_TARGET_LANES lanes and BOUND_TARGET_PERCENT % of g).
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { assertDeck } from '../../../shared/deck/schema.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { buildGrillage } from '../../../shared/grillage/model.js';
import { REFINED_SEGMENTS_PER_SPAN } from '../../../shared/grillage/refinedFactors.js';
import { influenceSurfaces } from '../../../shared/grillage/influenceSurface.js';
import { supportX } from '../../../shared/grillage/mesh.js';
import { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT, computeRefinedFactors, type RefinedFactor } from '../../../shared/grillage/refinedFactors.js';
import { DESIGN_TRUCK, FATIGUE_TRUCK, type Vehicle } from '../../../shared/loads/vehicles.js';
import { evaluateSurface } from '../../../shared/placement/evaluate.js';
import { axleStations, frontAxleRange, laneLeftMax, laneLeftMin, placementRulesForDeck, wheelOffsetRange, type PlacementRules } from '../../../shared/placement/rules.js';
import type { SurfaceLike } from '../../../shared/placement/sampledSurface.js';
import { steelGirderDeck } from './fixtures.js';

const PRESENCE = [1.2, 1.0, 0.85, 0.65];

/** Best one-lane effect (maximised sense, no m) for a lane whose left edge is at `left`, over the grid. */
function bestLane(surface: SurfaceLike, rules: PlacementRules, vehicle: Vehicle, sgn: 1 | -1, left: number, jumpXs: (y: number) => number[]): number {
  const r = wheelOffsetRange(rules, left);
  const spacings = vehicle.variableSpacing ? [vehicle.variableSpacing.min, (vehicle.variableSpacing.min + vehicle.variableSpacing.max) / 2, vehicle.variableSpacing.max] : [undefined];
  const sense = sgn > 0 ? 'positive' : 'negative';
  let best = 0;
  for (const wheelOffset of [r.min, (r.min + r.max) / 2, r.max]) {
    const yL = left + wheelOffset;
    const targets = [...jumpXs(yL), ...jumpXs(yL + vehicle.gauge)];
    for (const direction of [1, -1] as const) {
      for (const axleSpacing of spacings) {
        const range = frontAxleRange(vehicle, direction, axleSpacing, surface.extent);
        const fronts: number[] = [];
        const n = 120;
        for (let k = 0; k <= n; k++) fronts.push(range.min + ((range.max - range.min) * k) / n);
        // Every axle just either side of each jump.
        const pos = axleStations(vehicle, { left, wheelOffset, frontAxleAt: 0, direction: 1, ...(axleSpacing !== undefined ? { axleSpacing } : {}) }).map((x) => -x);
        for (const x of targets) for (const p of pos) for (const d of [-1e-5, 1e-5]) fronts.push(x + direction * p + d);
        for (const frontAxleAt of fronts) {
          if (frontAxleAt < range.min || frontAxleAt > range.max) continue;
          const lane = { left, wheelOffset, frontAxleAt, direction, ...(axleSpacing !== undefined ? { axleSpacing } : {}) };
          const v = sgn * evaluateSurface(surface, { lanes: [lane] }, rules, vehicle, { check: false, multiplePresence: false, sense }).value;
          if (v > best) best = v;
        }
      }
    }
  }
  return best;
}

/** Brute-force governing effect (maximised sense, m included) over lane sets on the grid of lane edges. */
function bruteForce(surface: SurfaceLike, rules: PlacementRules, vehicle: Vehicle, sgn: 1 | -1, fatigue: boolean, jumpXs: (y: number) => number[]): number {
  const L0 = laneLeftMin(rules);
  const R0 = laneLeftMax(rules);
  const n = Math.max(1, Math.ceil((R0 - L0) / 0.3));
  const lefts = Array.from({ length: n + 1 }, (_, i) => L0 + ((R0 - L0) * i) / n);
  const G = lefts.map((p) => bestLane(surface, rules, vehicle, sgn, p, jumpXs));
  const K = fatigue ? 1 : rules.laneCount;
  let best = 0;
  // best[k][i]: best total of k lanes, the last at lefts[i].
  let prev = G.slice();
  for (let k = 1; k <= K; k++) {
    const m = fatigue ? 1 : PRESENCE[Math.min(k, 4) - 1];
    best = Math.max(best, m * Math.max(...prev));
    if (k === K) break;
    const next = lefts.map((p, i) => {
      let b = -Infinity;
      for (let j = 0; j < i; j++) if (lefts[j] <= p - rules.laneWidth + 1e-9) b = Math.max(b, prev[j]);
      return b + G[i];
    });
    prev = next;
  }
  return best;
}

function checkFactor(f: RefinedFactor, surface: SurfaceLike, rules: PlacementRules, jumpXs: (y: number) => number[]) {
  const sgn = f.sense === 'positive' ? 1 : -1;
  const fatigue = f.effect.startsWith('fatigue');
  const vehicle = fatigue ? FATIGUE_TRUCK : DESIGN_TRUCK;
  const brute = bruteForce(surface, rules, vehicle, sgn, fatigue, jumpXs) / Math.abs(f.beamLineEffect);
  expect(brute).toBeLessThanOrEqual(f.value + f.tolerance.factor + 1e-9 * Math.abs(f.value));
  expect(f.tolerance.meetsTarget).toBe(f.tolerance.factor <= BOUND_TARGET_LANES && f.tolerance.percent <= BOUND_TARGET_PERCENT);
}

describe('refined factors: no legal placement beats a factor by more than its stated bound', () => {
  it('holds on random decks (skew 0–60°, 3–12 girders at 6–10 ft, 1–3 spans), and every bound meets the target', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 60 }),
        fc.integer({ min: 3, max: 12 }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 60, max: 120 }),
        fc.integer({ min: 6, max: 10 }),
        (skew, girders, spanCount, spanFt, spacingFt) => {
          const deck = steelGirderDeck({ girders, spacingFt, skew, spansFt: new Array(spanCount).fill(spanFt), continuous: spanCount > 1 });
          const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN }); // the mesh of a product run
          const rules = placementRulesForDeck(deck);
          const r = computeRefinedFactors(deck, { model });
          const jumpXs = (y: number) => Array.from({ length: spanCount + 1 }, (_, j) => supportX(model.mesh, j, y));
          // The loosest-bound and the largest factor of each effect.
          const picks = new Set<RefinedFactor>();
          for (const effect of ['moment', 'shear', 'fatigue-shear'] as const) {
            const list = r.factors.filter((f) => f.effect === effect);
            picks.add(list.reduce((a, b) => (b.tolerance.factor > a.tolerance.factor ? b : a)));
            picks.add(list.reduce((a, b) => (b.value > a.value ? b : a)));
          }
          const responses = [...picks].map((f) => f.response);
          const surfaces = influenceSurfaces(model, responses);
          [...picks].forEach((f, i) => checkFactor(f, surfaces[i], rules, jumpXs));
          // and every stated bound meets the target (issue target; measured on 42 further
          // random decks of this family: 4,928 of 4,928 factors, the largest 0.0042 lanes, 0.50 %)
          expect(r.factors.filter((f) => !f.tolerance.meetsTarget).map((f) => `${f.label} ${f.effect}: ${f.tolerance.factor.toFixed(4)} lanes, ${f.tolerance.percent.toFixed(2)} %`)).toEqual([]);
        },
      ),
      { numRuns: 6, seed: 20261203 },
    );
  }, 240_000);

  it('on the FHWA example deck (20° skew): the loosest shear and moment factors are honest, and every factor meets the target', () => {
    const f = JSON.parse(readFileSync('public/examples/fhwa-psc-step-5-1.deck.json', 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
    const deck = assertDeck(deckFromDisplay(f.deck as never, f.units));
    const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
    const rules = placementRulesForDeck(deck);
    const r = computeRefinedFactors(deck, { model });
    const jumpXs = (y: number) => Array.from({ length: model.spanCount + 1 }, (_, j) => supportX(model.mesh, j, y));
    const picks = (['moment', 'shear'] as const).map((effect) => r.factors.filter((x) => x.effect === effect).reduce((a, b) => (b.tolerance.factor > a.tolerance.factor ? b : a)));
    const surfaces = influenceSurfaces(model, picks.map((p) => p.response));
    picks.forEach((p, i) => checkFactor(p, surfaces[i], rules, jumpXs));
    for (const x of r.factors) {
      const meets = x.tolerance.factor <= BOUND_TARGET_LANES && x.tolerance.percent <= BOUND_TARGET_PERCENT;
      expect(x.tolerance.meetsTarget).toBe(meets);
      if (!meets) expect(x.tolerance.text).toContain('misses the target');
    }
    // every factor of this deck, shear at its skewed supports included, within the target
    // (each surface sampled in the frame of its skew, loose ones sampled denser: refinedFactors.ts)
    expect(r.factors.filter((x) => !x.tolerance.meetsTarget).map((x) => `${x.label}: ${x.tolerance.factor} lanes`)).toEqual([]);
    for (const effect of ['moment', 'shear', 'fatigue-moment', 'fatigue-shear'] as const) {
      const missing = r.factors.filter((x) => x.effect === effect && !x.tolerance.meetsTarget).length;
      const finding = r.findings.find((x) => x.code === 'loose-bound' && 'effect' in x && x.effect === effect);
      expect(!!finding).toBe(missing > 0);
    }
  }, 120_000);
});
