/**
 * Refined distribution factors from the grillage: for each girder and effect, the largest
 * over 1..NL loaded lanes of
 *     g = m · E_girder / E_beam,
 * E_girder the girder's effect from its influence surface under the governing placement of
 * the lanes' vehicles (shared/placement/search.ts), E_beam the largest effect of one lane of
 * the same vehicle on a beam line of the same spans, and m the multiple presence factor
 * (Table 3.6.1.1.2-1). This is how the code's factors are defined (a girder's share of one
 * lane's beam-line effect, multiple presence included), so the two compare directly
 * (AASHTO LRFD Art. 4.6.3.3, refined methods, against Art. 4.6.2.2).
 *
 * Units: internal SI in; factors in lanes (dimensionless) out; effects in N·m (moment) and
 * N (shear); positions in m (x along girder 1 from support line 0, y from girder 1,
 * positive right). Girders are 0-based in `girder`, 1-based in `girderNumber`.
 *
 * Choices, and why
 * - Vehicle: the design truck alone (8, 32, 32 kip, rear spacing searched 14–30 ft), no
 *   tandem and no lane load. The empirical factors of Art. 4.6.2.2 were calibrated as ratios
 *   of girder to beam-line effects under truck loading on refined models (the NCHRP 12-26
 *   study behind them; from memory), and the code applies one factor to the whole HL-93
 *   beam-line effect; the ratio under the truck is therefore the like-for-like number. A
 *   lane load spreads more evenly across the deck and would lower the ratio slightly; the
 *   tandem governs the beam-line moment only on short spans.
 * - Each lane's truck takes its own governing position along the span and direction
 *   (Art. 3.6.1.3.1 places each lane's vehicle for the extreme effect); axles that do not
 *   contribute are neglected (Art. 3.6.1.3.1), in the girder effect and the beam line alike.
 * - Moment: positive moment at the tenth point of each span where one lane's beam-line truck
 *   moment is largest (midspan for most simple spans; 0.4 of the end spans of a continuous
 *   deck). Shear: at each support, just inside each span it bounds; 'right' of a support is
 *   sought positive and 'left' negative (the girder's and the beam line's sign convention:
 *   upward resultant on the lower-x side). A span's shear factor is the larger of its ends.
 * - Fatigue: one fatigue truck (rear spacing 30 ft, Art. 3.6.1.4.1) anywhere, without the
 *   multiple presence factor (Art. 3.6.1.4.3b), over the fatigue truck's beam-line effect.
 * - The beam line: uniform girder on the girder's own spans (its crossings of the support
 *   lines), continuous or simple as the deck; influence lines by the stiffness method
 *   (shared/loads/influenceLine.ts).
 *
 * Sampling. Each surface is sampled on one station grid (`grillageStations`): longitudinally
 * every node of every line, the support crossings with a step of 1 µm on each side (the
 * shear's jump there), the moment points, and at least `stationsPerSegment` stations per
 * girder segment (default 1: the nodes; the surface is cubic along the girders between them); transversely every
 * longitudinal line, the deck edges, the curb faces and `rowsPerStrip` rows per strip
 * between lines. The governing placement is exact on that sample and carries its tolerance
 * against the surface (search.ts); `tolerance.factor` states it in lanes.
 */
import { assertDeck, DeckInputError, type Deck } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { buildFactorRow, RESULT_CAUTION, type FactorEffect, type FactorRow, type GirderKind } from '../lrfd/factors.js';
import { DESIGN_TRUCK, FATIGUE_TRUCK, type Vehicle } from '../loads/vehicles.js';
import { influenceLine, maxVehicleEffect, type BeamModel, type BeamResponse } from '../loads/influenceLine.js';
import { placementRulesForDeck, type Placement, type PlacementRules } from '../placement/rules.js';
import { checkPoints, sampledFromGrid } from '../placement/sampledSurface.js';
import { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT, boundInLanes, governingSurfacePlacement, type ToleranceStatement } from '../placement/search.js';
import type { Sense } from '../placement/evaluate.js';
import { influenceSurfaces, type InfluenceSurface } from './influenceSurface.js';
import { supportX } from './mesh.js';
import { buildGrillage, type GrillageModel, type GrillageOptions } from './model.js';
import type { GrillageFinding } from './quality.js';
import { responseLabel, type GrillageResponse } from './responses.js';

export type RefinedEffect = 'moment' | 'shear' | 'fatigue-moment' | 'fatigue-shear';
export const REFINED_EFFECTS: readonly RefinedEffect[] = ['moment', 'shear', 'fatigue-moment', 'fatigue-shear'];

/** Step either side of a support crossing where a shear surface jumps, m. */
export const JUMP_STEP = 1e-6;

export interface StationOptions {
  /**
   * Longitudinal stations per girder segment, at least (whole number 1–8; default 1). The
   * factors found hardly depend on it (0.004 % between 1 and 4 on the test decks); the stated
   * bound does: about 0.2–0.3 % of the factor at 1, 0.02–0.05 % at 4 on right decks.
   */
  stationsPerSegment?: number;
  /**
   * Rows per strip between adjacent longitudinal lines (whole number 1–8; default 1 on a right
   * deck, 2 on a skewed one, where a wheel load's shares follow skewed lines and the surface
   * is not linear across a strip).
   */
  rowsPerStrip?: number;
}

/**
 * Segments per span of the refined run's grillage unless the caller sets them: the shear at a
 * support converges at first order in the segment length (the transverse members of the first
 * panel share the wheel next to the bearing), and at 40 segments the factors change by less
 * than 1 % when the density is doubled (tests/shared/refined).
 */
export const REFINED_SEGMENTS_PER_SPAN = 40;

/** The bound target (search.ts): a factor whose stated bound misses it gets a finding and `tolerance.meetsTarget` false. */
export { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT };

export interface RefinedFinding {
  code: 'loose-bound';
  severity: 'info' | 'warning';
  message: string;
  /** Girder (1-based) with the loosest bound, and the effect concerned. */
  girderNumber: number;
  effect: RefinedEffect;
  values: { bound: number; factor: number };
}

export interface RefinedOptions extends StationOptions {
  /** Grillage options (mesh density etc.), used when `model` is not given (segmentsPerSpan default REFINED_SEGMENTS_PER_SPAN). */
  grillage?: GrillageOptions;
  /** A grillage already built for this deck. */
  model?: GrillageModel;
  /** Effects to compute (default all four). */
  effects?: RefinedEffect[];
}

export interface RefinedLane {
  lane: number;
  /** Lane edges, m. */
  left: number;
  right: number;
  /** Left wheel line's distance from the lane's left edge, m. */
  wheelOffset: number;
  /** y of the wheel lines, m. */
  wheelLines: [number, number];
  frontAxleAt: number;
  direction: 1 | -1;
  axleSpacing?: number;
  /** Axle x (m), weight (N), contribution before m (N·m or N), counted or neglected. */
  axles: { x: number; weight: number; contribution: number; counted: boolean }[];
  /** The lane's contribution before m. */
  effect: number;
}

export interface RefinedFactor {
  girder: number;
  girderNumber: number;
  girderKind: GirderKind;
  effect: RefinedEffect;
  /** 0-based span the factor belongs to. */
  span: number;
  /** Where on the girder: a moment point (fraction of the span) or a shear at a support side. */
  point: { kind: 'moment'; fraction: number; x: number } | { kind: 'shear'; support: number; side: 'left' | 'right'; x: number };
  response: GrillageResponse;
  label: string;
  sense: Sense;
  vehicle: string;
  /** The refined factor, lanes. */
  value: number;
  loadedLanes: number;
  multiplePresence: number;
  /** Girder effect of the governing placement, m included (N·m or N, signed). */
  girderEffect: number;
  /** One lane's beam-line effect of the same vehicle (signed as girderEffect). */
  beamLineEffect: number;
  placement: Placement;
  lanes: RefinedLane[];
  byLaneCount: { loadedLanes: number; multiplePresence: number; factor: number; girderEffect: number; placement: Placement }[];
  /**
   * The search's bound restated for the factor: `factor` in lanes, `percent` of the value,
   * `text` in those words; `meetsTarget` whether it is within BOUND_TARGET_LANES lanes and
   * BOUND_TARGET_PERCENT % of the value (a factor that misses it must not back a reduction claim).
   */
  tolerance: ToleranceStatement & { factor: number; percent: number; meetsTarget: boolean };
  trace: TraceStep[];
}

export interface RefinedResult {
  deckName: string;
  girderCount: number;
  designLanes: number;
  designLaneWidth: number;
  layout: GrillageModel['layout'];
  segmentsPerSpan: number;
  mesh: GrillageModel['stats'];
  stations: { longitudinal: number; transverse: number };
  factors: RefinedFactor[];
  /** Rows of method "grillage", one per girder number, effect, span and lane case. */
  rows: FactorRow[];
  /** For each row (same order): the factor (index into `factors`) and lane count whose placement gave it. */
  rowSources: { rowId: string; factorIndex: number; loadedLanes: number }[];
  /** The grillage's findings (mesh quality, estimates) and the refined run's own. */
  findings: (GrillageFinding | RefinedFinding)[];
  trace: TraceStep[];
  caution: string;
}

function wholeOption(value: number | undefined, name: string, fallback: number, max: number): number {
  if (value === undefined) return fallback;
  if (!Number.isInteger(value) || value < 1 || value > max) {
    throw new DeckInputError(['refined', name], `${name} must be a whole number from 1 to ${max}, not ${String(value)}`);
  }
  return value;
}

/**
 * The station grid used to sample a model's influence surfaces (see the header), m.
 * `extraX`: further longitudinal stations (e.g. moment points).
 */
export function grillageStations(
  model: GrillageModel,
  rules: Pick<PlacementRules, 'curbLeft' | 'curbRight'>,
  options: StationOptions = {},
  extraX: number[] = [],
): { xs: Float64Array; ys: Float64Array } {
  const perSegment = wholeOption(options.stationsPerSegment, 'stationsPerSegment', 1, 8);
  const skewed = model.deck.supports.some((x) => x.skew !== 0);
  const perStrip = wholeOption(options.rowsPerStrip, 'rowsPerStrip', skewed ? 2 : 1, 8);
  const mesh = model.mesh;
  const e = model.extent;
  const xsList: number[] = [e.xMin, e.xMax, ...extraX];
  for (const line of mesh.lines) {
    for (const x of line.xs) xsList.push(x);
    for (let j = 0; j <= mesh.spanCount; j++) {
      const xs = supportX(mesh, j, line.y);
      xsList.push(xs - JUMP_STEP, xs, xs + JUMP_STEP);
    }
  }
  const h = Math.min(...mesh.spanLengths) / mesh.segmentsPerSpan / perSegment;
  const sorted = xsList.filter((x) => x >= e.xMin && x <= e.xMax).sort((a, b) => a - b);
  const xs: number[] = [];
  for (const x of sorted) {
    if (xs.length && x - xs[xs.length - 1] <= 1e-9) continue;
    if (xs.length) {
      const prev = xs[xs.length - 1];
      const gap = x - prev;
      if (gap > h * (1 + 1e-9)) {
        const n = Math.ceil(gap / h - 1e-9);
        for (let k = 1; k < n; k++) xs.push(prev + (gap * k) / n);
      }
    }
    xs.push(x);
  }
  const lineYs = mesh.lines.map((l) => l.y).sort((a, b) => a - b);
  const bounds = [e.yMin, ...lineYs.filter((y) => y > e.yMin && y < e.yMax), e.yMax];
  const ysList: number[] = [rules.curbLeft, rules.curbRight];
  for (let i = 0; i + 1 < bounds.length; i++) {
    for (let k = 0; k < perStrip; k++) ysList.push(bounds[i] + ((bounds[i + 1] - bounds[i]) * k) / perStrip);
  }
  ysList.push(e.yMax);
  const ys: number[] = [];
  for (const y of ysList.filter((v) => v >= e.yMin && v <= e.yMax).sort((a, b) => a - b)) if (!ys.length || y - ys[ys.length - 1] > 1e-9) ys.push(y);
  return { xs: Float64Array.from(xs), ys: Float64Array.from(ys) };
}

interface Target {
  girder: number;
  effect: RefinedEffect;
  span: number;
  point: RefinedFactor['point'];
  response: GrillageResponse;
  sense: Sense;
  vehicle: Vehicle;
  /** Index of the surface. */
  surface: number;
  beam: BeamModel;
  beamResponse: BeamResponse;
}

const FATIGUE_ARTICLE = 'AASHTO LRFD Art. 3.6.1.4.1 (fatigue truck) and 3.6.1.4.3b (no multiple presence)';
const REFINED_ARTICLE = 'AASHTO LRFD Art. 4.6.3.3 (refined methods); Art. 3.6.1.3.1 (placement); Table 3.6.1.1.2-1 (m)';

/**
 * Refined (grillage) distribution factors of a deck. Throws DeckInputError for an invalid
 * deck or option, GrillageInputError / GrillageMechanismError from the grillage.
 */
export function computeRefinedFactors(deckInput: Deck, options: RefinedOptions = {}): RefinedResult {
  const deck = assertDeck(deckInput);
  const effects = options.effects ?? [...REFINED_EFFECTS];
  effects.forEach((e, i) => {
    if (!REFINED_EFFECTS.includes(e)) throw new DeckInputError(['refined', 'effects', i], `effect must be one of ${REFINED_EFFECTS.join(', ')}, not ${String(e)}`);
  });
  const model = options.model ?? buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN, ...options.grillage });
  const rules = placementRulesForDeck(deck);
  const mesh = model.mesh;
  const Nb = model.girderCount;
  const N = model.spanCount;
  const wantMoment = effects.includes('moment') || effects.includes('fatigue-moment');
  const wantShear = effects.includes('shear') || effects.includes('fatigue-shear');

  // Each girder's spans, beam model and governing tenth points.
  const beamCache = new Map<string, { beam: BeamModel; starts: number[]; fractions: number[] }>();
  const girderBeam = (g: number) => {
    const y = mesh.lines[mesh.girderLine[g]].y;
    const xsup = Array.from({ length: N + 1 }, (_, j) => supportX(mesh, j, y));
    const spans = xsup.slice(1).map((x, j) => x - xsup[j]);
    const key = spans.map((s) => s.toFixed(9)).join(',');
    let entry = beamCache.get(key);
    if (!entry) {
      const beam: BeamModel = { spans, continuous: deck.continuous };
      const starts = spans.map((_, j) => spans.slice(0, j).reduce((a, b) => a + b, 0));
      const fractions = spans.map((L, s) => {
        const tenth = Array.from({ length: 9 }, (_, k) => (k + 1) / 10);
        const v = tenth.map((f) => maxVehicleEffect(influenceLine(beam, { kind: 'moment', x: starts[s] + f * L }), DESIGN_TRUCK, 'positive').value);
        const top = Math.max(...v);
        // the largest; ties (within 1e-9) go to the point nearest midspan, then the first
        let bestF = 0.5;
        let bestD = Infinity;
        tenth.forEach((f, k) => {
          if (v[k] >= top * (1 - 1e-9) && Math.abs(f - 0.5) < bestD - 1e-12) {
            bestD = Math.abs(f - 0.5);
            bestF = f;
          }
        });
        return bestF;
      });
      entry = { beam, starts, fractions };
      beamCache.set(key, entry);
    }
    return { ...entry, y, xsup };
  };

  const responses: GrillageResponse[] = [];
  const targets: Target[] = [];
  const momentPoints: number[] = [];
  for (let g = 0; g < Nb; g++) {
    const gb = girderBeam(g);
    if (wantMoment) {
      for (let s = 0; s < N; s++) {
        const f = gb.fractions[s];
        const r: GrillageResponse = { kind: 'girder-moment', girder: g, span: s, fraction: f };
        const k = responses.push(r) - 1;
        const x = gb.xsup[s] + f * (gb.xsup[s + 1] - gb.xsup[s]);
        momentPoints.push(x);
        const beamResponse: BeamResponse = { kind: 'moment', x: gb.starts[s] + f * gb.beam.spans[s] };
        for (const effect of ['moment', 'fatigue-moment'] as const) {
          if (!effects.includes(effect)) continue;
          targets.push({
            girder: g,
            effect,
            span: s,
            point: { kind: 'moment', fraction: f, x },
            response: r,
            sense: 'positive',
            vehicle: effect === 'moment' ? DESIGN_TRUCK : FATIGUE_TRUCK,
            surface: k,
            beam: gb.beam,
            beamResponse,
          });
        }
      }
    }
    if (wantShear) {
      for (let j = 0; j <= N; j++) {
        const sides: ('left' | 'right')[] = j === 0 ? ['right'] : j === N ? ['left'] : ['left', 'right'];
        for (const side of sides) {
          const r: GrillageResponse = { kind: 'girder-shear', girder: g, support: j, side };
          const k = responses.push(r) - 1;
          const span = side === 'right' ? j : j - 1;
          const xBeam = j === 0 ? 0 : gb.starts[j - 1] + gb.beam.spans[j - 1];
          for (const effect of ['shear', 'fatigue-shear'] as const) {
            if (!effects.includes(effect)) continue;
            targets.push({
              girder: g,
              effect,
              span,
              point: { kind: 'shear', support: j, side, x: gb.xsup[j] },
              response: r,
              sense: side === 'right' ? 'positive' : 'negative',
              vehicle: effect === 'shear' ? DESIGN_TRUCK : FATIGUE_TRUCK,
              surface: k,
              beam: gb.beam,
              beamResponse: { kind: 'shear', x: xBeam, side },
            });
          }
        }
      }
    }
  }

  const surfaces: InfluenceSurface[] = influenceSurfaces(model, responses);
  const st = grillageStations(model, rules, options, momentPoints);
  const table = model.transfer.tabulateGrid(st.xs, st.ys);
  const points = checkPoints(st.xs, st.ys);
  const checkTable = model.transfer.tabulate(points.x, points.y);
  const sampled = surfaces.map((s) => sampledFromGrid(s, st.xs, st.ys, s.evaluate(table), { points, values: s.evaluate(checkTable) }));

  const beamCacheEffect = new Map<string, number>();
  const factors: RefinedFactor[] = targets.map((t) => {
    const fatigue = t.effect.startsWith('fatigue');
    const search = governingSurfacePlacement(sampled[t.surface], rules, t.vehicle, {
      sense: t.sense,
      laneCounts: fatigue ? [1] : undefined,
      multiplePresence: !fatigue,
      source: surfaces[t.surface],
    });
    const bKey = `${JSON.stringify(t.beam.spans)}|${JSON.stringify(t.beamResponse)}|${t.vehicle.name}|${t.sense}`;
    let B = beamCacheEffect.get(bKey);
    if (B === undefined) {
      B = maxVehicleEffect(influenceLine(t.beam, t.beamResponse), t.vehicle, t.sense).value;
      beamCacheEffect.set(bKey, B);
    }
    const sgn = t.sense === 'positive' ? 1 : -1;
    if (!(sgn * B > 0)) {
      throw new DeckInputError(['spans'], `the beam-line ${t.effect} of one lane at ${responseLabel(t.response)} is zero; a refined factor cannot be formed`);
    }
    const byLaneCount = search.byLaneCount.map((r) => ({
      loadedLanes: r.loadedLanes,
      multiplePresence: r.multiplePresence,
      factor: r.value / B,
      girderEffect: r.value,
      placement: r.placement,
    }));
    const kind = t.point.kind === 'moment' ? ('moment' as const) : ('force' as const);
    const label = responseLabel(t.response);
    const lanes: RefinedLane[] = search.effect.lanes.map((l, i) => {
      const p = search.placement.lanes[i];
      const out: RefinedLane = {
        lane: i,
        left: l.left,
        right: l.right,
        wheelOffset: p.wheelOffset,
        wheelLines: l.wheelLines,
        frontAxleAt: p.frontAxleAt as number,
        direction: p.direction as 1 | -1,
        axles: l.axles ?? [],
        effect: l.vehicleValue,
      };
      if (p.axleSpacing !== undefined) out.axleSpacing = p.axleSpacing;
      return out;
    });
    const value = search.value / B;
    const bound = boundInLanes(search.tolerance, B, value);
    const article = fatigue ? FATIGUE_ARTICLE : REFINED_ARTICLE;
    const trace: TraceStep[] = [
      {
        label: `Grillage: ${label}, governing placement of ${search.loadedLanes} ${t.vehicle.name}${search.loadedLanes > 1 ? 's' : ''}`,
        formula: fatigue
          ? 'E_g = max over legal placements of Σ_axles ½·W·(η(x, y_L) + η(x, y_R)), one lane, no m'
          : 'E_g = max over k and legal placements of m(k)·Σ_lanes Σ_axles ½·W·(η(x, y_L) + η(x, y_R))',
        inputs: [
          { symbol: 'k', description: 'loaded lanes', value: search.loadedLanes, kind: 'none' },
          { symbol: 'm', description: 'multiple presence factor', value: search.multiplePresence, kind: 'none' },
        ],
        value: search.value,
        kind,
        article,
        note: bound.text,
      },
      {
        label: `Beam line: one lane of the ${t.vehicle.name}, ${t.beamResponse.kind} at ${'x' in t.beamResponse ? t.beamResponse.x.toFixed(3) : ''} m along the girder`,
        formula: 'E_1 = max over positions and directions of Σ W·η_beam(x) (axles that do not contribute neglected)',
        inputs: t.beam.spans.map((L, i) => ({ symbol: `L${i + 1}`, description: 'span length along the girder', value: L, kind: 'length' as const })),
        value: B,
        kind,
        article: 'AASHTO LRFD Art. 3.6.1.2 and 3.6.1.3.1; influence line by the stiffness method',
      },
      {
        label: `Refined distribution factor, girder ${t.girder + 1}, ${t.effect}`,
        formula: 'g = E_g / E_1',
        inputs: [
          { symbol: 'E_g', description: 'girder effect, m included', value: search.value, kind },
          { symbol: 'E_1', description: 'one lane on the beam line', value: B, kind },
        ],
        value,
        kind: 'none',
        article,
        note: `governing with ${search.loadedLanes} loaded lane(s); ${bound.text}`,
      },
    ];
    return {
      girder: t.girder,
      girderNumber: t.girder + 1,
      girderKind: t.girder === 0 || t.girder === Nb - 1 ? 'exterior' : 'interior',
      effect: t.effect,
      span: t.span,
      point: t.point,
      response: t.response,
      label,
      sense: t.sense,
      vehicle: t.vehicle.name,
      value,
      loadedLanes: search.loadedLanes,
      multiplePresence: search.multiplePresence,
      girderEffect: search.value,
      beamLineEffect: B,
      placement: search.placement,
      lanes,
      byLaneCount,
      tolerance: { ...search.tolerance, text: bound.text, factor: bound.lanes, percent: bound.percent, meetsTarget: bound.meetsTarget },
      trace,
    };
  });

  const { rows, sources: rowSources } = refinedRows(deck, factors, rules.laneCount);
  const own = looseBoundFindings(deck, factors, effects);
  const trace: TraceStep[] = [
    ...model.trace,
    {
      label: 'Vehicles of the refined factors',
      formula: 'design truck alone (strength); fatigue truck, one lane, no m (fatigue)',
      inputs: [{ symbol: 'NL', description: 'design lanes', value: rules.laneCount, kind: 'none' }],
      value: rules.laneCount,
      kind: 'none',
      article: 'AASHTO LRFD Art. 3.6.1.2.2, 3.6.1.4.1; ratio as Art. 4.6.2.2 defines its factors',
      note: 'the empirical factors were calibrated as girder-to-beam ratios under truck loads, so the truck alone gives the comparable ratio',
    },
  ];
  return {
    deckName: deck.name,
    girderCount: Nb,
    designLanes: rules.laneCount,
    designLaneWidth: rules.laneWidth,
    layout: model.layout,
    segmentsPerSpan: mesh.segmentsPerSpan,
    mesh: model.stats,
    stations: { longitudinal: st.xs.length, transverse: st.ys.length },
    factors,
    rows,
    rowSources,
    findings: [...model.findings, ...own],
    trace,
    caution: RESULT_CAUTION,
  };
}

/**
 * One finding per effect whose factors miss the bound target (BOUND_TARGET_LANES lanes and
 * BOUND_TARGET_PERCENT % of the value), naming the worst by its share of the target.
 */
function looseBoundFindings(deck: Deck, factors: RefinedFactor[], effects: RefinedEffect[]): RefinedFinding[] {
  const own: RefinedFinding[] = [];
  const excess = (f: RefinedFactor) => Math.max(f.tolerance.factor / BOUND_TARGET_LANES, f.tolerance.percent / BOUND_TARGET_PERCENT);
  for (const effect of effects) {
    const loose = factors.filter((f) => f.effect === effect && !f.tolerance.meetsTarget);
    if (!loose.length) continue;
    const worst = loose.reduce((a, b) => (excess(b) > excess(a) ? b : a));
    const skewShear = worst.point.kind === 'shear' && deck.supports.some((x) => x.skew !== 0);
    own.push({
      code: 'loose-bound',
      severity: 'warning',
      message:
        `${effect}: ${loose.length} of the refined factors are bounded against the grillage's surface only to more than the target ` +
        `(${BOUND_TARGET_LANES} lanes and ${BOUND_TARGET_PERCENT} % of the value; worst ${worst.tolerance.factor.toFixed(4)} lanes, ` +
        `${worst.tolerance.percent.toFixed(2)} %, ${worst.label}); each is exact on the sampled surface and is the true value of a legal placement, ` +
        'but must not back a reduction claim' +
        (skewShear ? ' — the shear jumps along the skewed support line, which the sampled grid cannot follow' : ' — more stations (stationsPerSegment, rowsPerStrip) tighten the bound'),
      girderNumber: worst.girderNumber,
      effect,
      values: { bound: worst.tolerance.factor, factor: worst.value },
    });
  }
  return own;
}

/** One row of method "grillage" per girder number, effect, span and lane case, with where each came from. */
function refinedRows(deck: Deck, factors: RefinedFactor[], laneCount: number): { rows: FactorRow[]; sources: RefinedResult['rowSources'] } {
  const rows: FactorRow[] = [];
  const sources: RefinedResult['rowSources'] = [];
  const groups = new Map<string, number[]>();
  factors.forEach((f, i) => {
    const k = `${f.girder}|${f.effect}|${f.span}`;
    const g = groups.get(k);
    if (g) g.push(i);
    else groups.set(k, [i]);
  });
  for (const list of groups.values()) {
    const f0 = factors[list[0]];
    const cases: ('one' | 'multiple')[] = f0.effect.startsWith('fatigue') || laneCount < 2 ? ['one'] : ['one', 'multiple'];
    for (const lanes of cases) {
      let best: { i: number; c: RefinedFactor['byLaneCount'][number] } | undefined;
      for (const i of list) {
        for (const c of factors[i].byLaneCount) {
          if ((lanes === 'one') !== (c.loadedLanes === 1)) continue;
          if (!best || c.factor > best.c.factor) best = { i, c };
        }
      }
      if (!best) continue;
      const bf = factors[best.i];
      const where = bf.point.kind === 'moment' ? `${bf.point.fraction.toFixed(1)} of the span` : `support ${bf.point.support + 1}, ${bf.point.side} side`;
      const row = buildFactorRow({
        girderKind: f0.girderKind,
        girderNumber: f0.girderNumber,
        numbered: true,
        effect: f0.effect as FactorEffect,
        lanes,
        loadedLanes: best.c.loadedLanes,
        method: 'grillage',
        baseValue: best.c.factor,
        location: { span: f0.span, spanLength: deck.spans[f0.span].length, description: `span ${f0.span + 1} (${where})`, key: `span${f0.span + 1}` },
        trace: bf.trace,
      });
      if (!row.id.endsWith(`/g${f0.girderNumber}`)) row.id = `${row.id}/g${f0.girderNumber}`;
      rows.push(row);
      sources.push({ rowId: row.id, factorIndex: best.i, loadedLanes: best.c.loadedLanes });
    }
  }
  return { rows, sources };
}
