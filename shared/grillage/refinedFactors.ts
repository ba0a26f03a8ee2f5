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
 * - Vehicle (the deck's `refinedLoading`, refinedLoads.ts): by default the design truck alone
 *   (8, 32, 32 kip, rear spacing searched 14–30 ft), no tandem and no lane load; 'hl93' searches
 *   (1 + IM)·(truck or tandem) with the lane load instead, and over interior piers 90 % of two
 *   trucks with 90 % of the lane load too. The empirical factors of Art. 4.6.2.2 were calibrated as ratios
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
 * - Negative moment: at each interior support of a continuous deck, the girder's moment at its
 *   node on the support line, sought negative (hogging), over one lane's beam-line moment
 *   there. Reactions: every bearing, upward positive (at a line between simple spans, both
 *   bearings of the girder together), over one lane's beam-line reaction. Under the default
 *   loading (the design truck alone) the 90 % two-truck load of Art. 3.6.1.3.1, which governs
 *   the beam line over interior piers of longer spans, is not placed, so the one-truck ratio
 *   stands for it and each such row's trace says so; under 'hl93' it is one of the loads
 *   searched (two trucks as two rigid axle groups, shared/placement/twoGroups.ts).
 * - A target may carry several loads; its factor is then the largest girder effect over the
 *   largest beam-line effect, so that g × the governing beam-line effect is the girder's
 *   governing effect.
 * - Convergence (`checkConvergence`): the positive-moment rows are run again at twice the mesh
 *   density and each records its change; a reduction claim needs it within 1 %.
 * - Fatigue: one fatigue truck (rear spacing 30 ft, Art. 3.6.1.4.1) anywhere, without the
 *   multiple presence factor (Art. 3.6.1.4.3b), over the fatigue truck's beam-line effect.
 * - The beam line: uniform girder on the girder's own spans (its crossings of the support
 *   lines), continuous or simple as the deck; influence lines by the stiffness method
 *   (shared/loads/influenceLine.ts).
 * - Rows and traces: one row per girder, effect, place and lane case (one lane; two or more),
 *   the largest factor of that lane case among the place's factors (a span's shear: both its
 *   ends). A row's trace is built from the very searches that gave its value, for its lane
 *   count: each load's girder effect with k lanes, its beam line, and the ratio, whose last
 *   step states k, m, the governing load and the lane case, and equals the row's value.
 *
 * Sampling. Each surface is sampled on a station grid (`grillageStations`) in its own frame
 * s = x − c·y (sampledSurface.ts), c the tan θ of the support line it is read at (shear,
 * negative moment, reaction) or the load transfer's direction at its moment point, so the
 * jump or kink along that skewed line lies on a grid line instead of crossing cells:
 * longitudinally every node of every line (where the lines' nodes share the frame's grid
 * lines), the support crossings with a step of 1 µm on each side (the shear's jump there;
 * in the frame of the line's own skew the crossing is s = A exactly), the moment points as a
 * 1 µm pair either side (a jump under the overhangs), the ends of the perpendicular layout's
 * turning zones, and at least `stationsPerSegment` stations per girder segment (default 1;
 * the surface is cubic along the girders between nodes); transversely every longitudinal
 * line, the deck edges, the curb faces and `rowsPerStrip` rows per strip between lines
 * (baseDensity). The governing placement is exact on that sample and carries its tolerance
 * against the surface (search.ts); `tolerance.factor` states it in lanes. Surfaces whose
 * factors miss the bound target are sampled again, denser where their measured error lies,
 * up to MAX_REFINEMENTS times (step 4b).
 */
import { assertDeck, DeckInputError, type Deck } from '../deck/schema.js';
import { lengthInText } from '../quantities/inText.js';
import type { TraceStep } from '../trace.js';
import { effectLocations, type EffectLocation } from '../lrfd/spanLengths.js';
import { buildFactorRow, RESULT_CAUTION, type FactorEffect, type FactorRow, type GirderKind } from '../lrfd/factors.js';
import { citeArticle, designValuesOf, designValuesStep, type DesignValues } from '../loads/designValues.js';
import type { Vehicle } from '../loads/vehicles.js';
import { assertLoadingFits, beamLineEffect, loadingWords, strengthLoads, type TargetLoad } from './refinedLoads.js';
import type { RefinedLoading } from '../deck/schema.js';
import { influenceLine, maxVehicleEffect, type BeamModel, type BeamResponse } from '../loads/influenceLine.js';
import { placementRulesForDeck, type Placement, type PlacementRules } from '../placement/rules.js';
import { checkPoints, frameRange, sampledFromGrid, type SampledSurface } from '../placement/sampledSurface.js';
import { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT, boundInLanes, governingSurfacePlacement, type GoverningPlacement, type LaneCountResult, type ToleranceStatement } from '../placement/search.js';
import { EFFECT_LABELS, LANE_LABELS } from '../lrfd/words.js';
import type { Lanes } from '../lrfd/formula.js';
import type { Sense } from '../placement/evaluate.js';
import { influenceSurfaces, type InfluenceSurface } from './influenceSurface.js';
import { supportX } from './mesh.js';
import { buildGrillage, type GrillageModel, type GrillageOptions } from './model.js';
import type { GrillageFinding } from './quality.js';
import { responseLabel, type GrillageResponse } from './responses.js';

export type RefinedEffect = 'moment' | 'shear' | 'negative-moment' | 'reaction' | 'fatigue-moment' | 'fatigue-shear';
export const REFINED_EFFECTS: readonly RefinedEffect[] = ['moment', 'shear', 'negative-moment', 'reaction', 'fatigue-moment', 'fatigue-shear'];

/**
 * Where on the girder a refined factor is read: a positive-moment point (fraction of the span),
 * a shear at a support side, the moment at an interior support line (negative moment), or the
 * bearing reaction on a support line. x is the girder line's x there, m.
 */
export type RefinedPoint =
  | { kind: 'moment'; fraction: number; x: number }
  | { kind: 'shear'; support: number; side: 'left' | 'right'; x: number }
  | { kind: 'support-moment'; support: number; x: number }
  | { kind: 'reaction'; support: number; x: number };

/** Step either side of a support crossing where a shear surface jumps, m. */
export const JUMP_STEP = 1e-6;

export interface StationOptions {
  /**
   * Longitudinal stations per girder segment, at least (whole number 1–16; default 1). The
   * factors found hardly depend on it (0.004 % between 1 and 4 on the test decks); the stated
   * bound does: about 0.2–0.3 % of the factor at 1, 0.02–0.05 % at 4 on right decks.
   */
  stationsPerSegment?: number;
  /**
   * Rows per strip between adjacent longitudinal lines (whole number 1–16; default 1 where the
   * load transfer follows the sample's frame, so the surface is linear across a strip; else 4
   * or 8 in a skewed frame, by the skew and the strip width, and 2 in the plan frame:
   * baseDensity).
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
  /** Effects to compute (default all six). */
  effects?: RefinedEffect[];
  /**
   * Also run the positive-moment factors at twice the mesh density and record each moment
   * row's change (`FactorRow.convergence`), the check a reduction claim needs (default false).
   */
  checkConvergence?: boolean;
  /** Told as the run goes: the grillage built, each factor found, the convergence run begun. */
  onProgress?: (progress: RefinedProgress) => void;
}

/** Where a refined run is: its phase, and in the search, factors found of all. */
export interface RefinedProgress {
  phase: 'model' | 'search' | 'refine' | 'convergence';
  done: number;
  total: number;
}

/** A moment row's factor may change by at most this share when the mesh density is doubled (common practice, no source). */
export const CONVERGENCE_LIMIT = 0.01;

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
  /** The lane's contribution before m (its vehicle's; the lane load's is `laneLoadEffect`). */
  effect: number;
  /** The design lane load's contribution before m (0 without the lane load). */
  laneLoadEffect: number;
}

export interface RefinedFactor {
  girder: number;
  girderNumber: number;
  girderKind: GirderKind;
  effect: RefinedEffect;
  /** 0-based span the factor belongs to (for a support row: the span ending there, or the first span). */
  span: number;
  /** Where on the girder the factor is read. */
  point: RefinedPoint;
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
  /** One lane's beam-line effect of the same vehicle (signed as girderEffect); with several loads, the largest. */
  beamLineEffect: number;
  /** Every load searched for this factor (one, or the design truck and 90 % of two trucks), with its effects. */
  loads: { vehicle: string; girderEffect: number; beamLineEffect: number; loadedLanes: number }[];
  placement: Placement;
  lanes: RefinedLane[];
  /** Per number of loaded lanes: the best over the loads, and the load (in words) that gives it. */
  byLaneCount: { loadedLanes: number; multiplePresence: number; factor: number; girderEffect: number; placement: Placement; vehicle: string }[];
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
  /** Wheel-line spacing of the vehicles, m (the design values' 6 ft or 1800 mm; absent in results stored before it). */
  wheelGauge?: number;
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
 * Largest stations per segment and rows per strip, given or reached by refinement (16: a
 * 16 ft strip at 60° needs 16 rows of 1 ft before its moment bounds meet the target).
 */
const MAX_DENSITY = 16;
/**
 * Largest sample grid a refinement makes (stations × rows). A point's load shares take 168
 * bytes (LoadShareTable: 2 slots of 12 + 8 doubles and an index), four times over with its
 * three check points, so 200,000 points hold about 135 MB of tables while they are sampled.
 */
const MAX_SAMPLE_POINTS = 200_000;
/** Rounds of refinement of the surfaces whose factors miss the bound target (refineLooseBounds). */
export const MAX_REFINEMENTS = 4;

/**
 * The station grid used to sample a model's influence surfaces (see the header), m, in the
 * frame s = x − shear·y (sampledSurface.ts; shear 0: the plan axes). `extraX`: further
 * stations of s (e.g. moment points), each as the pair 1 µm before and after it (an
 * overhang's load reaches its line with a couple, loadTransfer.ts, whose moment jumps where it
 * passes the moment point, so the exterior strips' moment surface jumps there; the pair holds
 * the two sides, whereas a station on the point itself would take, point by point, whichever
 * side x = s + c·y rounds to). Rows per strip default to 1 where the load transfer
 * runs along the frame everywhere (a right deck in the plan frame; the skew-parallel layout
 * in the frame of its parallel supports), so that ordinates are linear across a strip, to 4
 * or 8 in another skewed frame and to 2 elsewhere (baseDensity). `density`: another density
 * (a refinement's, nextDensity).
 */
export function grillageStations(
  model: GrillageModel,
  rules: Pick<PlacementRules, 'curbLeft' | 'curbRight'>,
  options: StationOptions = {},
  extraX: number[] = [],
  shear = 0,
  density: SampleDensity = baseDensity(model, options, shear),
): { xs: Float64Array; ys: Float64Array } {
  const along = transferAlongFrame(model, shear);
  const { perSegment, perStrip } = density;
  const mesh = model.mesh;
  const e = model.extent;
  const range = frameRange(e, shear);
  const xsList: number[] = [range.sMin, range.sMax, ...extraX.flatMap((x) => [x - JUMP_STEP, x + JUMP_STEP])];
  // a line's nodes are stations where the lines' nodes meet the frame's grid lines together;
  // elsewhere (the perpendicular layout in a skewed frame) uniform stations stand for them
  // (a surface is smooth across the nodes of the lines it is not read on)
  const nodesAligned = shear === 0 || along;
  // in the frame of a support line's own skew the line is s = A exactly (not A + B·y − c·y to
  // rounding), so a point on it evaluates, as x = A + c·y, bitwise where loadTransfer.ts puts
  // the support and falls on the span that starts there; line nodes on it are snapped to it
  const onSupport = (j: number, y: number) => (shear === mesh.supportB[j] ? mesh.supportA[j] : supportX(mesh, j, y) - shear * y);
  for (const line of mesh.lines) {
    const supports = Array.from({ length: mesh.spanCount + 1 }, (_, j) => onSupport(j, line.y));
    for (const xs of supports) xsList.push(xs - JUMP_STEP, xs, xs + JUMP_STEP);
    if (!nodesAligned) continue;
    for (const x of line.xs) {
      const s = x - shear * line.y;
      xsList.push(supports.find((a) => Math.abs(a - s) <= 1e-9) ?? s);
    }
  }
  xsList.push(...endZoneStations(model, shear));
  const h = Math.min(...mesh.spanLengths) / mesh.segmentsPerSpan / perSegment;
  const sorted = xsList.filter((x) => x >= range.sMin && x <= range.sMax).sort((a, b) => a - b);
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

/** Widths of the strips across the deck (m): between the deck edges and the longitudinal lines, edge to edge. */
function stripWidths(mesh: GrillageModel['mesh']): number[] {
  const ys = [mesh.deckLeft, ...mesh.lines.map((l) => l.y), mesh.deckRight].sort((a, b) => a - b);
  const out: number[] = [];
  for (let i = 0; i + 1 < ys.length; i++) if (ys[i + 1] - ys[i] > 1e-9) out.push(ys[i + 1] - ys[i]);
  return out;
}

/**
 * In the perpendicular layout, the frame coordinates (s, m) where a strip's end zone ends
 * (loadTransfer.ts rule 2: within strip width × |tan θ| of a skewed support line the split's
 * direction turns to the line's; the surface kinks where the turn starts). In the frame of
 * that support line's own skew the zone's end is the line s = A ± width·|tan θ| across the
 * strip, one station per strip width; in other frames it runs obliquely and is not listed.
 */
function endZoneStations(model: GrillageModel, shear: number): number[] {
  const mesh = model.mesh;
  if (model.layout !== 'perpendicular') return [];
  const widths: number[] = [];
  for (const w of stripWidths(mesh)) if (!widths.some((v) => Math.abs(v - w) <= 1e-9)) widths.push(w);
  const out: number[] = [];
  for (let j = 0; j <= mesh.spanCount; j++) {
    const B = mesh.supportB[j];
    if (B === 0 || shear !== B) continue;
    for (const w of widths) {
      if (j < mesh.spanCount) out.push(mesh.supportA[j] + w * Math.abs(B));
      if (j > 0) out.push(mesh.supportA[j] - w * Math.abs(B));
    }
  }
  return out;
}

/** Stations per girder segment and rows per strip of a sample grid (grillageStations). */
export interface SampleDensity {
  perSegment: number;
  perStrip: number;
}

/**
 * The first density of a frame's grid: the options' or the defaults (grillageStations): one
 * station per segment; rows per strip 1 where the transfer follows the frame, 2 in the plan
 * frame of a skewed deck, and in another skewed frame enough that the girders' node lines,
 * which cross each strip obliquely there (s = x_node − c·y), move at most half a station
 * spacing per row: 2·|c|·w / h for the widest strip w and station spacing h, taken as 4 or
 * 8 (measured on the benchmark's 45° deck: 4 rows miss the bound target on 42 of 64 factors,
 * 8 meet it on all). Powers of two: rows then often fall a gauge apart (6 ft in 1 ft or 2 ft
 * rows of an 8 ft strip), so a lane's two wheel lines share their transverse breakpoints
 * and the search has about half as many to try (7 rows took 485 ms, 8 rows 406 ms there).
 */
export function baseDensity(model: GrillageModel, options: StationOptions, shear: number): SampleDensity {
  const along = transferAlongFrame(model, shear);
  const perSegment = wholeOption(options.stationsPerSegment, 'stationsPerSegment', 1, MAX_DENSITY);
  let rows = along ? 1 : 2;
  if (!along && shear !== 0) {
    const mesh = model.mesh;
    const w = Math.max(...stripWidths(mesh));
    const h = Math.min(...mesh.spanLengths) / mesh.segmentsPerSpan / perSegment;
    rows = (2 * Math.abs(shear) * w) / h <= 4 + 1e-9 ? 4 : 8;
  }
  return { perSegment, perStrip: wholeOption(options.rowsPerStrip, 'rowsPerStrip', rows, MAX_DENSITY) };
}

/**
 * The next density of a surface whose factors miss the bound target, from where its sample's
 * measured error lies (adaptive refinement): the stations double where the error along the
 * rows is at least half the error across them, the rows where the error across is at least
 * half the error along, each up to MAX_DENSITY (the other one grows when one is at its cap),
 * and the grid up to MAX_SAMPLE_POINTS. Null when nothing may grow. Measured on the example
 * decks and random skewed decks: moment bounds need both; the shear at a skewed end of the perpendicular layout needs the
 * rows, the pier shear of a narrow-strip deck in that layout the stations (there the girders'
 * node lines cross the frame's cells).
 */
export function nextDensity(d: SampleDensity, sample: Pick<SampledSurface, 'errorAlong' | 'errorAcross' | 'xs' | 'ys'>): SampleDensity | null {
  const along = sample.errorAlong ?? 0;
  const across = sample.errorAcross ?? 0;
  const points = sample.xs.length * sample.ys.length;
  const canS = d.perSegment < MAX_DENSITY && 2 * points <= MAX_SAMPLE_POINTS;
  const canR = d.perStrip < MAX_DENSITY && 2 * points <= MAX_SAMPLE_POINTS;
  if (!canS && !canR) return null;
  let growS = canS && along >= 0.5 * across;
  let growR = canR && across >= 0.5 * along;
  if (!growS && !growR) {
    growS = canS;
    growR = !canS;
  }
  if (growS && growR && 4 * points > MAX_SAMPLE_POINTS) growR = false;
  return {
    perSegment: growS ? Math.min(MAX_DENSITY, 2 * d.perSegment) : d.perSegment,
    perStrip: growR ? Math.min(MAX_DENSITY, 2 * d.perStrip) : d.perStrip,
  };
}

/** Same shear, to rounding (support lines' tan θ from one deck). */
const sameShear = (a: number, b: number) => Math.abs(a - b) <= 1e-12 * Math.max(1, Math.abs(a), Math.abs(b));

/**
 * Whether the load transfer splits a wheel load along the frame's direction everywhere
 * (loadTransfer.ts rule 2), so a surface is linear across a strip at fixed s: the plan frame
 * of a right deck, or the frame of the supports' skew when they are parallel and the layout
 * is skew-parallel.
 */
function transferAlongFrame(model: GrillageModel, shear: number): boolean {
  const B = model.mesh.supportB;
  if (!B.every((b) => sameShear(b, B[0]))) return false;
  if (B[0] === 0) return shear === 0;
  return model.layout === 'skew-parallel' && sameShear(shear, B[0]);
}

/**
 * The frame a response's surface is sampled in (its shear, sampledSurface.ts): the skew of
 * the support line it is read at (shear, negative moment, reaction: the surface jumps or
 * kinks along that line), and for a positive moment at fraction f of a span the direction
 * the load transfer takes there (skew-parallel layout: the fan between the span's support
 * lines; perpendicular layout: at right angles to the girders), so the kink through the
 * moment point runs along a grid line.
 */
function responseShear(model: GrillageModel, r: GrillageResponse): number {
  const B = model.mesh.supportB;
  switch (r.kind) {
    case 'girder-shear':
    case 'reaction':
      return B[r.support];
    case 'girder-moment':
      if (r.fraction === 1) return B[r.span + 1];
      if (r.fraction === 0) return B[r.span];
      return model.layout === 'skew-parallel' ? (1 - r.fraction) * B[r.span] + r.fraction * B[r.span + 1] : 0;
    default:
      return 0;
  }
}

/** The quantity kind of a refined factor's effects: moment (N·m) or force (N). */
export function refinedEffectKind(f: Pick<RefinedFactor, 'point'>): 'moment' | 'force' {
  return f.point.kind === 'moment' || f.point.kind === 'support-moment' ? 'moment' : 'force';
}


interface Target {
  girder: number;
  effect: RefinedEffect;
  span: number;
  point: RefinedPoint;
  response: GrillageResponse;
  sense: Sense;
  /** The loads searched; the row takes the largest girder effect over the largest beam-line effect. */
  loads: TargetLoad[];
  /** Index of the surface. */
  surface: number;
  beam: BeamModel;
  beamResponse: BeamResponse;
}

const FATIGUE_ARTICLE = 'AASHTO LRFD Art. 3.6.1.4.1 (fatigue truck) and 3.6.1.4.3b (no multiple presence)';
const REFINED_ARTICLE = 'AASHTO LRFD Art. 4.6.3.3 (refined methods); Art. 3.6.1.3.1 (placement); Table 3.6.1.1.2-1 (m)';

interface GirderBeam {
  beam: BeamModel;
  /** Start of each span along the beam line, m. */
  starts: number[];
  /** Governing tenth point of each span for positive moment. */
  fractions: number[];
  /** The girder line's y and its crossings of the support lines, m. */
  y: number;
  xsup: number[];
}

/**
 * Girder g's moment point at `fraction` of span `span`, in plan (m): on its line, between its
 * crossings of the span's support lines, as refinedTargets places it from girderBeams (for
 * callers without those beams: the workspace study).
 */
export function girderMomentPoint(model: GrillageModel, girder: number, span: number, fraction: number): { x: number; y: number } {
  const mesh = model.mesh;
  const y = mesh.lines[mesh.girderLine[girder]].y;
  const x0 = supportX(mesh, span, y);
  const x1 = supportX(mesh, span + 1, y);
  return { x: x0 + fraction * (x1 - x0), y };
}

/** Step 1. Each girder's beam line (its own spans), with the tenth point where one lane's truck moment is largest. */
function girderBeams(model: GrillageModel, continuous: boolean, truck: Vehicle): GirderBeam[] {
  const mesh = model.mesh;
  const N = model.spanCount;
  const cache = new Map<string, Omit<GirderBeam, 'y' | 'xsup'>>();
  return Array.from({ length: model.girderCount }, (_, g) => {
    const y = mesh.lines[mesh.girderLine[g]].y;
    const xsup = Array.from({ length: N + 1 }, (_, j) => supportX(mesh, j, y));
    const spans = xsup.slice(1).map((x, j) => x - xsup[j]);
    const key = spans.map((s) => s.toFixed(9)).join(',');
    let entry = cache.get(key);
    if (!entry) {
      const beam: BeamModel = { spans, continuous };
      const starts = spans.map((_, j) => spans.slice(0, j).reduce((a, b) => a + b, 0));
      entry = { beam, starts, fractions: spans.map((L, s) => governingTenthPoint(beam, starts[s], L, truck)) };
      cache.set(key, entry);
    }
    return { ...entry, y, xsup };
  });
}

/** The tenth point of a span with the largest one-lane truck moment; ties (1e-9) go to the point nearest midspan. */
function governingTenthPoint(beam: BeamModel, start: number, L: number, truck: Vehicle): number {
  const tenth = Array.from({ length: 9 }, (_, k) => (k + 1) / 10);
  const v = tenth.map((f) => maxVehicleEffect(influenceLine(beam, { kind: 'moment', x: start + f * L }), truck, 'positive').value);
  const top = Math.max(...v);
  let bestF = 0.5;
  let bestD = Infinity;
  tenth.forEach((f, k) => {
    if (v[k] >= top * (1 - 1e-9) && Math.abs(f - 0.5) < bestD - 1e-12) {
      bestD = Math.abs(f - 0.5);
      bestF = f;
    }
  });
  return bestF;
}

/** Step 2. The responses to compute surfaces for, and the factors (targets) read from them. */
function refinedTargets(deck: Deck, beams: GirderBeam[], effects: readonly RefinedEffect[], values: DesignValues): { responses: GrillageResponse[]; targets: Target[]; momentPoints: { x: number; y: number }[] } {
  const responses: GrillageResponse[] = [];
  const targets: Target[] = [];
  const momentPoints: { x: number; y: number }[] = [];
  const N = deck.spans.length;
  const truck = strengthLoads(deck.refinedLoading, false, 0, values);
  const fatigue: TargetLoad = { vehicle: values.fatigueTruck, label: 'fatigue truck', laneLoad: false, reason: 'one fatigue truck' };
  // the two trucks' headway may reach twice the deck's length: the second truck can always leave the girder
  const overPier = strengthLoads(deck.refinedLoading, true, 2 * deck.spans.reduce((a, sp) => a + sp.length, 0), values);
  const wants = (e: RefinedEffect) => effects.includes(e);
  const add = (r: GrillageResponse, list: Omit<Target, 'response' | 'surface'>[]) => {
    const chosen = list.filter((t) => wants(t.effect));
    if (!chosen.length) return;
    const surface = responses.push(r) - 1;
    for (const t of chosen) targets.push({ ...t, response: r, surface });
  };
  beams.forEach((gb, g) => {
    for (let s = 0; s < N && (wants('moment') || wants('fatigue-moment')); s++) {
      const f = gb.fractions[s];
      const x = gb.xsup[s] + f * (gb.xsup[s + 1] - gb.xsup[s]);
      momentPoints.push({ x, y: gb.y });
      const common = { girder: g, span: s, point: { kind: 'moment' as const, fraction: f, x }, sense: 'positive' as const, beam: gb.beam, beamResponse: { kind: 'moment' as const, x: gb.starts[s] + f * gb.beam.spans[s] } };
      add({ kind: 'girder-moment', girder: g, span: s, fraction: f }, [
        { ...common, effect: 'moment', loads: truck },
        { ...common, effect: 'fatigue-moment', loads: [fatigue] },
      ]);
    }
    for (let j = 0; j <= N; j++) {
      const sides: ('left' | 'right')[] = j === 0 ? ['right'] : j === N ? ['left'] : ['left', 'right'];
      const xBeam = j === 0 ? 0 : gb.starts[j - 1] + gb.beam.spans[j - 1];
      for (const side of sides) {
        const common = { girder: g, span: side === 'right' ? j : j - 1, point: { kind: 'shear' as const, support: j, side, x: gb.xsup[j] }, sense: side === 'right' ? ('positive' as const) : ('negative' as const), beam: gb.beam, beamResponse: { kind: 'shear' as const, x: xBeam, side } };
        add({ kind: 'girder-shear', girder: g, support: j, side }, [
          { ...common, effect: 'shear', loads: truck },
          { ...common, effect: 'fatigue-shear', loads: [fatigue] },
        ]);
      }
      const interiorPier = deck.continuous && j > 0 && j < N;
      if (interiorPier) {
        // negative moment at the girder's node on the support line (the end of span j and the start of span j+1)
        add({ kind: 'girder-moment', girder: g, span: j - 1, fraction: 1 }, [
          { girder: g, span: j - 1, effect: 'negative-moment', point: { kind: 'support-moment', support: j, x: gb.xsup[j] }, sense: 'negative', loads: overPier, beam: gb.beam, beamResponse: { kind: 'moment', x: xBeam } },
        ]);
      }
      add({ kind: 'reaction', girder: g, support: j }, [
        { girder: g, span: j === N ? j - 1 : j, effect: 'reaction', point: { kind: 'reaction', support: j, x: gb.xsup[j] }, sense: 'positive', loads: interiorPier ? overPier : truck, beam: gb.beam, beamResponse: { kind: 'reaction', support: j } },
      ]);
    }
  });
  return { responses, targets, momentPoints };
}

/**
 * Step 3. Every surface sampled, with its check points: surfaces of one frame (responseShear)
 * and one density share one station grid and one table of load shares. `densities`: each
 * surface's density (default: its frame's baseDensity; a refinement's: nextDensity).
 */
export function sampleSurfaces(
  model: GrillageModel,
  responses: GrillageResponse[],
  surfaces: InfluenceSurface[],
  rules: PlacementRules,
  options: StationOptions,
  momentPoints: { x: number; y: number }[],
  densities?: SampleDensity[],
) {
  const groups: { shear: number; density: SampleDensity; members: number[] }[] = [];
  responses.forEach((r, k) => {
    const c = responseShear(model, r);
    const d = densities?.[k] ?? baseDensity(model, options, c);
    const g = groups.find((fr) => sameShear(fr.shear, c) && fr.density.perSegment === d.perSegment && fr.density.perStrip === d.perStrip);
    if (g) g.members.push(k);
    else groups.push({ shear: c, density: d, members: [k] });
  });
  const sampled: SampledSurface[] = new Array(surfaces.length);
  const used: SampleDensity[] = new Array(surfaces.length);
  let stations: { xs: Float64Array; ys: Float64Array } = { xs: new Float64Array(0), ys: new Float64Array(0) };
  for (const { shear, density, members } of groups) {
    const st = grillageStations(model, rules, options, momentPoints.map((p) => p.x - shear * p.y), shear, density);
    if (st.xs.length * st.ys.length > stations.xs.length * stations.ys.length) stations = st;
    const table = model.transfer.tabulateGrid(st.xs, st.ys, shear);
    const points = checkPoints(st.xs, st.ys);
    const plan = Float64Array.from(points.x, (s, k) => s + shear * points.y[k]);
    const checkTable = model.transfer.tabulate(plan, points.y);
    for (const k of members) {
      sampled[k] = sampledFromGrid(surfaces[k], st.xs, st.ys, surfaces[k].evaluate(table), { points, values: surfaces[k].evaluate(checkTable) }, shear);
      used[k] = density;
    }
  }
  return { stations, sampled, densities: used };
}

/** One load's search on a target's surface and its one-lane beam-line effect. */
interface LoadOutcome {
  load: TargetLoad;
  search: GoverningPlacement;
  beamLineEffect: number;
}

/** Step 4. The governing placement of each of a target's loads, and their beam-line effects (memoised). */
function searchTarget(t: Target, sampled: SampledSurface, source: InfluenceSurface, rules: PlacementRules, beamEffects: Map<string, number>): LoadOutcome[] {
  const fatigue = t.effect.startsWith('fatigue');
  return t.loads.map((load) => {
    const search = governingSurfacePlacement(sampled, rules, load.vehicle, {
      sense: t.sense,
      laneCounts: fatigue ? [1] : undefined,
      multiplePresence: !fatigue,
      source,
      ...(load.laneLoad ? { laneLoad: { ...(load.laneIntensity !== undefined ? { intensity: load.laneIntensity } : {}), ...(load.laneWidth !== undefined ? { width: load.laneWidth } : {}) } } : {}),
    });
    const key = `${JSON.stringify(t.beam.spans)}|${JSON.stringify(t.beamResponse)}|${load.vehicle.name}|${load.laneLoad}|${t.sense}`;
    let B = beamEffects.get(key);
    if (B === undefined) {
      B = beamLineEffect(t.beam, t.beamResponse, load, t.sense);
      beamEffects.set(key, B);
    }
    const sgn = t.sense === 'positive' ? 1 : -1;
    if (!(sgn * B > 0)) {
      throw new DeckInputError(['spans'], `the beam-line ${t.effect} of one lane of the ${load.vehicle.name} at ${responseLabel(t.response)} is zero; a refined factor cannot be formed`);
    }
    return { load, search, beamLineEffect: B };
  });
}

/**
 * Step 5. The factor of a target from its loads' outcomes: the largest girder effect over the
 * largest one-lane beam-line effect, so g × (the governing beam-line effect) is the girder's
 * governing effect (the code applies one factor to the governing beam-line effect). With one
 * load this is E_g / E_1 of that load. The bound: what any load's legal placement could add
 * beyond the governing girder effect, in lanes of the same denominator.
 */
function factorOfTarget(t: Target, outcomes: LoadOutcome[], girderCount: number): RefinedFactor {
  const sgn = t.sense === 'positive' ? 1 : -1;
  const gov = outcomes.reduce((a, b) => (sgn * b.search.value > sgn * a.search.value ? b : a));
  const beamGov = outcomes.reduce((a, b) => (sgn * b.beamLineEffect > sgn * a.beamLineEffect ? b : a));
  const B = beamGov.beamLineEffect;
  const search = gov.search;
  const value = search.value / B;
  const excess = Math.max(...outcomes.map((o) => sgn * o.search.value + o.search.tolerance.absolute)) - sgn * search.value;
  const tolerance: ToleranceStatement = { ...search.tolerance, absolute: Math.max(0, excess) };
  const bound = boundInLanes(tolerance, B, value);
  const byLaneCount = search.byLaneCount.map((_, i) => {
    const best = outcomes.reduce((a, b) => (sgn * b.search.byLaneCount[i].value > sgn * a.search.byLaneCount[i].value ? b : a));
    const c = best.search.byLaneCount[i];
    return { loadedLanes: c.loadedLanes, multiplePresence: c.multiplePresence, factor: c.value / B, girderEffect: c.value, placement: c.placement, vehicle: best.load.label };
  });
  const lanes = refinedLanes(search);
  return {
    girder: t.girder,
    girderNumber: t.girder + 1,
    girderKind: t.girder === 0 || t.girder === girderCount - 1 ? 'exterior' : 'interior',
    effect: t.effect,
    span: t.span,
    point: t.point,
    response: t.response,
    label: responseLabel(t.response),
    sense: t.sense,
    vehicle: gov.load.vehicle.name,
    value,
    loadedLanes: search.loadedLanes,
    multiplePresence: search.multiplePresence,
    girderEffect: search.value,
    beamLineEffect: B,
    loads: outcomes.map((o) => ({ vehicle: o.load.vehicle.name, girderEffect: o.search.value, beamLineEffect: o.beamLineEffect, loadedLanes: o.search.loadedLanes })),
    placement: search.placement,
    lanes,
    byLaneCount,
    tolerance: { ...tolerance, text: bound.text, factor: bound.lanes, percent: bound.percent, meetsTarget: bound.meetsTarget },
    trace: factorTrace(t, outcomes, { boundNote: bound.text }),
  };
}

/** The governing placement's lanes as the factor reports them: edges, wheels, vehicle position and each axle's contribution. */
function refinedLanes(search: GoverningPlacement): RefinedLane[] {
  return search.effect.lanes.map((l, i) => {
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
      laneLoadEffect: l.laneLoadValue,
    };
    if (p.axleSpacing !== undefined) out.axleSpacing = p.axleSpacing;
    return out;
  });
}

/**
 * One load's placement a trace shows: its best of `loadedLanes` loaded lanes, or (undefined)
 * its governing placement over every lane count.
 */
function placementOfLoad(o: LoadOutcome, loadedLanes?: number): LaneCountResult {
  if (loadedLanes === undefined) return o.search;
  const c = o.search.byLaneCount.find((b) => b.loadedLanes === loadedLanes);
  if (!c) throw new Error(`the search holds no placement of ${loadedLanes} loaded lanes`);
  return c;
}

/** What a trace closes with: the row's lane case (absent: the factor over every lane count) and the words on its bound. */
interface TraceCase {
  lanes?: Lanes;
  loadedLanes?: number;
  boundNote: string;
}

/**
 * The trace of a refined factor, from the searches that gave it: each load's girder effect
 * (for the case's lane count, or its governing one), the beam line, and the ratio, whose last
 * step states the lane count (k), the multiple presence factor, the governing load and the
 * row's lane case. Its value is the row's (or the factor's) value by the same arithmetic:
 * the largest girder effect over the largest one-lane beam-line effect.
 */
function factorTrace(t: Target, outcomes: LoadOutcome[], c: TraceCase): TraceStep[] {
  const sgn = t.sense === 'positive' ? 1 : -1;
  const picks = outcomes.map((o) => placementOfLoad(o, c.loadedLanes));
  const govIndex = picks.reduce((a, p, i) => (sgn * p.value > sgn * picks[a].value ? i : a), 0);
  const beamGov = outcomes.reduce((a, b) => (sgn * b.beamLineEffect > sgn * a.beamLineEffect ? b : a));
  const gov = picks[govIndex];
  const steps: TraceStep[] = outcomes.flatMap((o, i) => loadSteps(t, o, picks[i], outcomes.length > 1 && i === govIndex, outcomes.length > 1 && o === beamGov));
  steps.push(ratioStep(t, outcomes.length, gov, outcomes[govIndex].load, beamGov.beamLineEffect, c));
  for (const s of steps) if (s.note === undefined) delete s.note;
  return steps;
}

/** One load's two steps: the girder effect of its placement on the grillage, and its one-lane beam-line effect. */
function loadSteps(t: Target, o: LoadOutcome, p: LaneCountResult, governsGirder: boolean, governsBeam: boolean): TraceStep[] {
  const fatigue = t.effect.startsWith('fatigue');
  const kind = refinedEffectKind(t);
  const where = 'x' in t.beamResponse ? `at ${lengthInText(t.beamResponse.x)} along the girder` : `at support ${t.beamResponse.support + 1}`;
  return [
    {
      label: `Grillage: ${responseLabel(t.response)}, governing placement of ${lanesWords(p.loadedLanes)} (${o.load.reason})`,
      formula: fatigue
        ? 'E_g = max over legal placements of Σ_axles ½·W·(η(x, y_L) + η(x, y_R)), one lane, no m'
        : o.load.laneLoad
          ? 'E_g = max over legal placements of k lanes of m(k)·Σ_lanes [Σ_axles ½·W·(η(x, y_L) + η(x, y_R)) + (q/w)·∫ max(0, ∫_strip η dy) dx]'
          : 'E_g = max over legal placements of k lanes of m(k)·Σ_lanes Σ_axles ½·W·(η(x, y_L) + η(x, y_R))',
      inputs: [
        { symbol: 'k', description: 'loaded lanes', value: p.loadedLanes, kind: 'none' },
        { symbol: 'm', description: 'multiple presence factor', value: p.multiplePresence, kind: 'none' },
      ],
      value: p.value,
      kind,
      article: fatigue ? FATIGUE_ARTICLE : REFINED_ARTICLE,
      note: governsGirder ? 'governs the girder effect' : undefined,
    },
    {
      label: `Beam line: one lane (${o.load.reason}), ${t.beamResponse.kind} ${where}`,
      formula: o.load.laneLoad
        ? 'E_1 = max over positions and directions of Σ W·η_beam(x) (axles that do not contribute neglected) + q·∫ max(0, η_beam) dx'
        : 'E_1 = max over positions and directions of Σ W·η_beam(x) (axles that do not contribute neglected)',
      inputs: t.beam.spans.map((L, i) => ({ symbol: `L${i + 1}`, description: 'span length along the girder', value: L, kind: 'length' as const })),
      value: o.beamLineEffect,
      kind,
      article: 'AASHTO LRFD Art. 3.6.1.2 and 3.6.1.3.1; influence line by the stiffness method',
      note: governsBeam ? 'governs the beam-line effect' : undefined,
    },
  ];
}

/** The closing step: g = E_g / E_1, stating the lane count, m, the governing load and the lane case. */
function ratioStep(t: Target, loadCount: number, gov: LaneCountResult, load: TargetLoad, beamLine: number, c: TraceCase): TraceStep {
  const kind = refinedEffectKind(t);
  const caseWords = c.lanes ? `, ${LANE_LABELS[c.lanes]}` : '';
  return {
    label: `Refined distribution factor, girder ${t.girder + 1}, ${EFFECT_LABELS[t.effect]}${caseWords}`,
    formula: loadCount > 1 ? 'g = max over the loads of E_g ÷ max over the loads of E_1' : 'g = E_g / E_1',
    inputs: [
      { symbol: 'k', description: 'loaded lanes', value: gov.loadedLanes, kind: 'none' },
      { symbol: 'm', description: 'multiple presence factor', value: gov.multiplePresence, kind: 'none' },
      { symbol: 'E_g', description: 'girder effect, m included', value: gov.value, kind },
      { symbol: 'E_1', description: 'one lane on the beam line', value: beamLine, kind },
    ],
    value: gov.value / beamLine,
    kind: 'none',
    article: t.effect.startsWith('fatigue') ? FATIGUE_ARTICLE : REFINED_ARTICLE,
    note: `${lanesWords(gov.loadedLanes)}, ${load.label}; ${c.boundNote}`,
  };
}

/** "1 loaded lane", "2 loaded lanes". */
function lanesWords(k: number): string {
  return `${k} loaded lane${k === 1 ? '' : 's'}`;
}

/**
 * Step 6. One finding per effect whose factors miss the bound target (BOUND_TARGET_LANES lanes
 * and BOUND_TARGET_PERCENT % of the value), naming the worst by its share of the target.
 */
function boundFindings(deck: Deck, factors: RefinedFactor[], effects: readonly RefinedEffect[]): RefinedFinding[] {
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

/**
 * Step 7. Each positive-moment row's change when the mesh density is doubled: the same run
 * (moment only) at 2× the segments per span, matched row by row (the same id). A model that
 * cannot be built at twice the density leaves the rows unchecked (no `convergence`).
 */
function recordConvergence(deck: Deck, options: RefinedOptions, segmentsPerSpan: number, rows: FactorRow[]): void {
  const doubled = 2 * segmentsPerSpan;
  let fine: RefinedResult;
  try {
    fine = computeRefinedFactors(deck, {
      ...(options.stationsPerSegment !== undefined ? { stationsPerSegment: options.stationsPerSegment } : {}),
      ...(options.rowsPerStrip !== undefined ? { rowsPerStrip: options.rowsPerStrip } : {}),
      grillage: { ...options.grillage, segmentsPerSpan: doubled },
      effects: ['moment'],
    });
  } catch (e) {
    if (e instanceof DeckInputError) return;
    throw e;
  }
  const byId = new Map(fine.rows.map((r) => [r.id, r]));
  for (const r of rows) {
    if (r.effect !== 'moment') continue;
    const f = byId.get(r.id);
    if (!f) continue;
    const change = Math.abs(f.value - r.value) / Math.abs(r.value);
    r.convergence = { segmentsPerSpan: doubled, value: f.value, change, within: change <= CONVERGENCE_LIMIT };
  }
}

/** The run's own trace step: which loads the refined factors use, and why. */
function loadsTrace(laneCount: number, continuous: boolean, loading: RefinedLoading, values: DesignValues): TraceStep {
  const words = loadingWords(loading);
  return {
    label: 'Vehicles of the refined factors',
    formula: words.formula,
    inputs: [{ symbol: 'NL', description: 'design lanes', value: laneCount, kind: 'none' }],
    value: laneCount,
    kind: 'none',
    article: citeArticle(values, 'AASHTO LRFD Art. 3.6.1.2, 3.6.1.3.1, 3.6.1.4.1, Table 3.6.2.1-1; ratio as Art. 4.6.2.2 defines its factors'),
    note:
      words.note +
      (continuous && loading !== 'hl93'
        ? '; over interior supports (negative moment, reactions) the factor is the one-truck ratio: the 90 % two-truck load of Art. 3.6.1.3.1 governs the beam line there but is not placed on the grillage, so the factor applied to it assumes the two trucks share out as one does'
        : ''),
  };
}

/**
 * Refined (grillage) distribution factors of a deck. Throws DeckInputError for an invalid
 * deck or option, GrillageInputError / GrillageMechanismError from the grillage. The steps:
 * the model and its rules (1), the targets and their surfaces, sampled (2, 3), each target
 * searched (4) and its factor formed (5), the loose bounds refined (4b), the rows per lane
 * case with their traces from the same searches, the bound findings (6) and the convergence
 * check (7).
 */
export function computeRefinedFactors(deckInput: Deck, options: RefinedOptions = {}): RefinedResult {
  const deck = assertDeck(deckInput);
  const effects = effectsOption(options);
  const progress = options.onProgress ?? (() => undefined);
  progress({ phase: 'model', done: 0, total: 1 });
  const model = options.model ?? buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN, ...options.grillage });
  const rules = placementRulesForDeck(deck);
  const values = designValuesOf(deck);
  assertLoadingFits(deck.refinedLoading, rules, values);
  const run = sampledRun(deck, model, rules, options, effects, progress, values);
  const searched = searchTargets(run);
  refineLooseBounds(run, searched);
  const factors = searched.map((s) => s.factor);
  const { rows, sources: rowSources } = refinedRows(deck, searched, rules.laneCount);
  if (options.checkConvergence && effects.includes('moment')) {
    progress({ phase: 'convergence', done: 0, total: 1 });
    recordConvergence(deck, options, model.mesh.segmentsPerSpan, rows);
  }
  return {
    deckName: deck.name,
    girderCount: model.girderCount,
    designLanes: rules.laneCount,
    designLaneWidth: rules.laneWidth,
    wheelGauge: rules.gauge,
    layout: model.layout,
    segmentsPerSpan: model.mesh.segmentsPerSpan,
    mesh: model.stats,
    stations: { longitudinal: run.stations.xs.length, transverse: run.stations.ys.length },
    factors,
    rows,
    rowSources,
    findings: [...model.findings, ...boundFindings(deck, factors, effects)],
    trace: [...model.trace, ...(values.name === 'us-customary' ? [] : [designValuesStep(values)]), loadsTrace(rules.laneCount, deck.continuous, deck.refinedLoading, values)],
    caution: RESULT_CAUTION,
  };
}

/** The effects asked for (default all six), each one the run knows. */
function effectsOption(options: RefinedOptions): RefinedEffect[] {
  const effects = options.effects ?? [...REFINED_EFFECTS];
  effects.forEach((e, i) => {
    if (!REFINED_EFFECTS.includes(e)) throw new DeckInputError(['refined', 'effects', i], `effect must be one of ${REFINED_EFFECTS.join(', ')}, not ${String(e)}`);
  });
  return effects;
}

/** What the searches of a run share: the model, its rules, the targets and their sampled surfaces. */
interface SampledRun {
  model: GrillageModel;
  rules: PlacementRules;
  options: RefinedOptions;
  responses: GrillageResponse[];
  surfaces: InfluenceSurface[];
  sampled: SampledSurface[];
  densities: SampleDensity[];
  stations: { xs: Float64Array; ys: Float64Array };
  targets: Target[];
  momentPoints: { x: number; y: number }[];
  beamEffects: Map<string, number>;
  progress: (p: RefinedProgress) => void;
}

/** Steps 1–3: each girder's beam line, the targets and their responses, the surfaces and their samples. */
function sampledRun(deck: Deck, model: GrillageModel, rules: PlacementRules, options: RefinedOptions, effects: readonly RefinedEffect[], progress: SampledRun['progress'], values: DesignValues): SampledRun {
  const beams = girderBeams(model, deck.continuous, values.truck);
  const { responses, targets, momentPoints } = refinedTargets(deck, beams, effects, values);
  const surfaces = influenceSurfaces(model, responses);
  const { stations, sampled, densities } = sampleSurfaces(model, responses, surfaces, rules, options, momentPoints);
  return { model, rules, options, responses, surfaces, sampled, densities, stations, targets, momentPoints, beamEffects: new Map(), progress };
}

/** A target with the searches of its loads and the factor formed from them: a row's value and its trace come from the same searches. */
interface Searched {
  target: Target;
  outcomes: LoadOutcome[];
  factor: RefinedFactor;
}

/** Steps 4 and 5 for one target on the run's current sample of its surface. */
function searchOne(run: SampledRun, t: Target): Searched {
  const outcomes = searchTarget(t, run.sampled[t.surface], run.surfaces[t.surface], run.rules, run.beamEffects);
  return { target: t, outcomes, factor: factorOfTarget(t, outcomes, run.model.girderCount) };
}

/** Steps 4 and 5 for every target, telling the progress. */
function searchTargets(run: SampledRun): Searched[] {
  return run.targets.map((t, k) => {
    run.progress({ phase: 'search', done: k, total: run.targets.length });
    return searchOne(run, t);
  });
}

/**
 * Step 4b. Adaptive refinement: the surfaces of factors whose stated bound misses the target
 * are sampled again denser (nextDensity: the stations, the rows or both, by where the sample's
 * measured error lies; up to MAX_REFINEMENTS rounds, at most 16 stations a segment or 16 rows a
 * strip) and their targets searched again; a factor takes the
 * new search when its bound is smaller (each search is exact on its own sample and its bound
 * honest for its own value, so either may stand). Surfaces whose factors all meet the target,
 * and surfaces whose grid is already at the caps, are not sampled again, so the run's time
 * grows only where a denser surface can help.
 */
function refineLooseBounds(run: SampledRun, searched: Searched[]): void {
  const { targets } = run;
  const loose = (k: number) => !searched[k].factor.tolerance.meetsTarget;
  for (let round = 1; round <= MAX_REFINEMENTS; round++) {
    const next = new Map<number, SampleDensity>();
    targets.forEach((t, k) => {
      if (!loose(k) || next.has(t.surface)) return;
      const d = nextDensity(run.densities[t.surface], run.sampled[t.surface]);
      if (d) next.set(t.surface, d);
    });
    if (!next.size) return;
    const list = [...next.keys()];
    const again = sampleSurfaces(run.model, list.map((i) => run.responses[i]), list.map((i) => run.surfaces[i]), run.rules, run.options, run.momentPoints, list.map((i) => next.get(i)!));
    list.forEach((i, k) => {
      run.sampled[i] = again.sampled[k];
      run.densities[i] = again.densities[k];
    });
    const redo = targets.map((_, k) => k).filter((k) => next.has(targets[k].surface) && loose(k));
    redo.forEach((k, n) => {
      run.progress({ phase: 'refine', done: n, total: redo.length });
      const s = searchOne(run, targets[k]);
      if (s.factor.tolerance.factor < searched[k].factor.tolerance.factor) searched[k] = s;
    });
  }
}

/** The row location of a factor: its span for moment and shear, its support line (with the code's L) for negative moment and reactions. */
function rowLocation(deck: Deck, locations: EffectLocation[], f: RefinedFactor, best: RefinedFactor): FactorRow['location'] {
  if (f.point.kind === 'support-moment' || f.point.kind === 'reaction') {
    const effect = f.point.kind === 'reaction' ? 'reaction' : 'negative-moment';
    const support = f.point.support;
    const code = locations.find((l) => l.effect === effect && l.support === support);
    const description = code?.description ?? `support ${support + 1}`;
    return { support, spanLength: code?.length ?? deck.spans[f.span].length, description, key: `support${support + 1}` };
  }
  const where = best.point.kind === 'moment' ? `${best.point.fraction.toFixed(1)} of the span` : best.point.kind === 'shear' ? `support ${best.point.support + 1}, ${best.point.side} side` : '';
  return { span: f.span, spanLength: deck.spans[f.span].length, description: `span ${f.span + 1} (${where})`, key: `span${f.span + 1}` };
}

/** The factors one row is chosen from (indices): one girder, effect and place (a span's shear: both its ends). */
function rowGroups(factors: RefinedFactor[]): number[][] {
  const groups = new Map<string, number[]>();
  factors.forEach((f, i) => {
    const place = f.point.kind === 'support-moment' || f.point.kind === 'reaction' ? `support${f.point.support}` : `span${f.span}`;
    const k = `${f.girder}|${f.effect}|${place}`;
    const g = groups.get(k);
    if (g) g.push(i);
    else groups.set(k, [i]);
  });
  return [...groups.values()];
}

/** The largest factor of a lane case among a group's factors and their lane counts, and where it came from. */
function bestOfCase(factors: RefinedFactor[], list: number[], lanes: Lanes): { i: number; c: RefinedFactor['byLaneCount'][number] } | undefined {
  let best: { i: number; c: RefinedFactor['byLaneCount'][number] } | undefined;
  for (const i of list) {
    for (const c of factors[i].byLaneCount) {
      if ((lanes === 'one') !== (c.loadedLanes === 1)) continue;
      if (!best || c.factor > best.c.factor) best = { i, c };
    }
  }
  return best;
}

/**
 * The words on a row's bound (its trace's note, the workspace's detail): the search states its
 * bound for the factor's governing placement over every lane count; a row of another lane
 * count says whose bound it is.
 */
export function rowBoundWords(f: Pick<RefinedFactor, 'loadedLanes' | 'tolerance'>, loadedLanes: number): string {
  return loadedLanes === f.loadedLanes ? f.tolerance.text : `the search's stated bound is that of its governing placement (${lanesWords(f.loadedLanes)}): ${f.tolerance.text}`;
}

/** One row of method "grillage" per girder number, effect, location (span or support line) and lane case, with where each came from. */
function refinedRows(deck: Deck, searched: Searched[], laneCount: number): { rows: FactorRow[]; sources: RefinedResult['rowSources'] } {
  const factors = searched.map((s) => s.factor);
  const rows: FactorRow[] = [];
  const sources: RefinedResult['rowSources'] = [];
  const locations = effectLocations(deck);
  for (const list of rowGroups(factors)) {
    const f0 = factors[list[0]];
    const cases: Lanes[] = f0.effect.startsWith('fatigue') || laneCount < 2 ? ['one'] : ['one', 'multiple'];
    for (const lanes of cases) {
      const best = bestOfCase(factors, list, lanes);
      if (!best) continue;
      const { target, outcomes, factor: bf } = searched[best.i];
      const row = buildFactorRow({
        girderKind: f0.girderKind,
        girderNumber: f0.girderNumber,
        numbered: true,
        effect: f0.effect as FactorEffect,
        lanes,
        loadedLanes: best.c.loadedLanes,
        method: 'grillage',
        baseValue: best.c.factor,
        location: rowLocation(deck, locations, f0, bf),
        trace: factorTrace(target, outcomes, { lanes, loadedLanes: best.c.loadedLanes, boundNote: rowBoundWords(bf, best.c.loadedLanes) }),
      });
      if (!row.id.endsWith(`/g${f0.girderNumber}`)) row.id = `${row.id}/g${f0.girderNumber}`;
      row.bound = { lanes: bf.tolerance.factor, percent: bf.tolerance.percent, meetsTarget: bf.tolerance.meetsTarget };
      row.vehicle = best.c.vehicle;
      rows.push(row);
      sources.push({ rowId: row.id, factorIndex: best.i, loadedLanes: best.c.loadedLanes });
    }
  }
  return { rows, sources };
}
