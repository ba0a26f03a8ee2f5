/**
 * The workspace's solver session: everything the deck workspace computes, run inside the
 * solver Web Worker (solver.worker.ts is only its message layer; the benchmark imports this
 * file directly). Pure computation on the shared solver, no DOM.
 *
 * - `analyse`: the code-method factors, the grillage model (mesh + banded factorisation),
 *   the placement rules and the beam-line (one design lane) HL-93 envelopes.
 * - `study`: influence surfaces of every girder's moment (at the studied point of the studied
 *   span) and shear (just inside the span's first support), sampled for the search as the
 *   refined run samples them (each in the frame of its skew).
 * - `evaluate`: the drag path — every girder's share of the current placement, in lanes:
 *     share_g = m(k) · Σ_lanes Σ_axles ½·W·(η_g(x, y_left) + η_g(x, y_right)) / E₁
 *   with E₁ the largest beam-line effect of one lane of the same vehicle at the same point
 *   (the denominator of the refined factor), so that at the governing placement the share
 *   equals the refined (grillage) distribution factor. Fatigue: one lane, no m. The shares
 *   are evaluated on the influence surfaces themselves.
 * - `governing`: the governing placement of 1..NL lanes for a girder and effect, searched on
 *   the sampled surface (shared/placement/search.ts; exact on the sample, with its stated
 *   tolerance against the surface).
 *
 * Units: internal SI throughout (m, N, N·m); factors in lanes per girder. Plan coordinates
 * as shared/grillage: x along girder 1 from support line 0, y from girder 1, positive right.
 */
import { assertDeck, DeckInputError, type Deck } from '../../shared/deck/schema';
import { computeCodeFactors, governingFactor, type CodeFactorResult, type FactorEffect, type FactorRow, type GirderKind } from '../../shared/lrfd/factors';
import { buildGrillage, influenceSurfaces, type GrillageModel, type GrillageResponse, type InfluenceSurface } from '../../shared/grillage/index';
import {
  boundInLanes,
  clampPlacement,
  evaluateSurface,
  governingSurfacePlacement,
  placementRulesForDeck,
  type LanePlacement,
  type Placement,
  type PlacementRules,
  type SampledSurface,
} from '../../shared/placement/index';
import type { Vehicle } from '../../shared/loads/vehicles';
import { designValuesOf, vehicleOf } from '../../shared/loads/designValues';
import { influenceLine, maxVehicleEffect, type BeamModel } from '../../shared/loads/influenceLine';
import { hl93BeamLineEffects, type BeamLineEffects } from '../../shared/loads/beamLine';
import { girderLiveLoadEffects } from '../../shared/loads/girderEffects';
import { deckGirderEffects } from '../../shared/loads/deckEffects';
import { REFINED_SEGMENTS_PER_SPAN, computeRefinedFactors, girderMomentPoint, sampleSurfaces, type RefinedResult } from '../../shared/grillage/refinedFactors';
import { compareFactors, type FactorComparison } from '../../shared/grillage/compare';
import { governingPerGirder } from '../../shared/review/reductions';

export type VehicleKey = 'design truck' | 'design tandem' | 'fatigue truck';
export type StudyEffect = 'moment' | 'shear';

/** A vehicle of the deck's design values (shared/loads/designValues.ts) by its key; undefined for an unknown key. */
export function vehicleForDeck(deck: Deck, key: VehicleKey): Vehicle | undefined {
  return vehicleOf(designValuesOf(deck), key);
}

/** Thrown between steps of long work when the user cancels it. */
export class CancelledError extends Error {
  constructor() {
    super('the computation was cancelled');
    this.name = 'CancelledError';
  }
}

/** Progress reporting and cooperative cancellation between the steps of long work. */
export interface WorkContext {
  progress(phase: string, fraction: number): void;
  /** Yields to pending messages; throws CancelledError when cancelled. */
  checkpoint(): Promise<void>;
}

export const QUIET_CONTEXT: WorkContext = { progress: () => undefined, checkpoint: async () => undefined };

export interface AnalyseOptions {
  /** Grillage segments per span (default the refined run's 40; a finer mesh is slower). */
  segmentsPerSpan?: number;
}

/** The refined factors of every girder, effect and span, and their comparison with the code's. */
export interface RefinedSummary {
  refined: RefinedResult;
  comparison: FactorComparison;
  elapsedMs: number;
}

export interface GrillageSummary {
  layout: string;
  segmentsPerSpan: number;
  stats: GrillageModel['stats'];
  findings: GrillageModel['findings'];
  /** How the members were built: girder, slab-strip and diaphragm stiffness (trace in the deck's units). */
  trace: GrillageModel['trace'];
  extent: GrillageModel['extent'];
  elapsedMs: number;
}

/** Per-lane beam-line envelope at the tenth points, for the charts (N·m and N). */
export interface BeamLineSummary {
  x: number[];
  span: number[];
  fraction: number[];
  momentMax: number[];
  momentMin: number[];
  shearMax: number[];
  shearMin: number[];
}

export interface AnalysisSummary {
  code: CodeFactorResult;
  rules: PlacementRules;
  /** null when the grillage could not be built (the code factors stand on their own). */
  grillage: GrillageSummary | null;
  /** Why the grillage could not be built, in plain words. */
  grillageError?: string;
  beamLine: BeamLineSummary;
  girderCount: number;
  spanCount: number;
  timings: { codeMs: number; grillageMs: number; beamLineMs: number };
}

export interface LongitudinalPosition {
  frontAxleAt: number;
  direction: 1 | -1;
  axleSpacing?: number;
}

export interface StudySummary {
  span: number;
  vehicle: VehicleKey;
  /** The studied moment point: fraction of the span and x on the centreline, m. */
  momentFraction: number;
  momentX: number;
  /** The studied shear: just right of the span's first support. */
  shearSupport: number;
  /** E₁ per effect: the largest beam-line effect of one lane of the vehicle (N·m, N). */
  beamLineMax: Record<StudyEffect, number>;
  /** The vehicle position giving E₁ on the beam line, per effect (the default for new lanes). */
  beamLinePosition: Record<StudyEffect, LongitudinalPosition>;
  /**
   * Largest representation error of the sampled surfaces used by the governing search
   * (measured at cell and edge midpoints), relative to the surface's largest ordinate, per effect.
   */
  sampleRelativeError: Record<StudyEffect, number>;
  elapsedMs: number;
}

export interface LiveShares {
  effect: StudyEffect;
  /** share per girder, lanes. */
  shares: number[];
  loadedLanes: number;
  multiplePresence: number;
  /** The placement as evaluated (after the rules were applied). */
  lanes: LanePlacement[];
  elapsedMs: number;
}

export interface GoverningSummary {
  girder: number;
  effect: StudyEffect;
  vehicle: VehicleKey;
  /** Refined factor, lanes: m × effect / E₁. */
  factor: number;
  loadedLanes: number;
  lanes: LanePlacement[];
  byLaneCount: { loadedLanes: number; factor: number; lanes: LanePlacement[] }[];
  tolerance: string;
  /** Tolerance as a factor (lanes). */
  toleranceFactor: number;
  elapsedMs: number;
}

export interface SurfaceGrid {
  girder: number;
  effect: StudyEffect;
  xs: Float64Array;
  ys: Float64Array;
  /** values[ix * ys.length + iy], response per unit force (m for moment, 1 for shear). */
  values: Float64Array;
  min: number;
  max: number;
  unit: 'm' | '1';
  label: string;
}

export interface GirderEnvelopeSeries {
  girder: number;
  label: string;
  factors: { moment: number; shear: number; source: string };
  x: number[];
  momentMax: number[];
  momentMin: number[];
  shearMax: number[];
  shearMin: number[];
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** A girder's governing refined moment and shear factors in a span (governingPerGirder of the rows: one source with every table), or undefined without both. */
function refinedFactorsOfSpan(rows: readonly FactorRow[], girder: number, span: number): { moment: number; shear: number } | undefined {
  const own = governingPerGirder(rows).filter((f) => f.girder === girder + 1 && f.locationKey === `span${span + 1}`);
  const moment = own.find((f) => f.effect === 'moment')?.value;
  const shear = own.find((f) => f.effect === 'shear')?.value;
  return moment !== undefined && shear !== undefined && moment >= 0 && shear >= 0 ? { moment, shear } : undefined;
}

function girderKindOf(girder: number, count: number): GirderKind {
  return girder === 0 || girder === count - 1 ? 'exterior' : 'interior';
}

/** Studied moment point: 0.4 of an end span of a continuous deck, else midspan (common practice, no source). */
function momentFractionFor(deck: Deck, span: number): number {
  const n = deck.spans.length;
  if (!deck.continuous || n === 1) return 0.5;
  if (span === 0) return 0.4;
  if (span === n - 1) return 0.6;
  return 0.5;
}

export class SolverSession {
  private deck: Deck | null = null;
  private code: CodeFactorResult | null = null;
  private model: GrillageModel | null = null;
  private rules: PlacementRules | null = null;
  private beamLine: BeamLineEffects | null = null;
  private studyState: {
    summary: StudySummary;
    raw: Record<StudyEffect, InfluenceSurface[]>;
    sampled: Record<StudyEffect, SampledSurface[]>;
  } | null = null;
  private governingCache = new Map<string, GoverningSummary>();
  private refinedCache: RefinedSummary | null = null;
  /** E₁ of the fatigue truck at the studied points (the fatigue rows of the comparison). */
  private fatigueBeamLineMax: Record<StudyEffect, number> = { moment: 0, shear: 0 };

  /** Code factors of any deck input (for version diffs), without touching the session. */
  static codeFactorRows(input: unknown): FactorRow[] {
    return computeCodeFactors(assertDeck(input)).factors;
  }

  async analyse(input: unknown, options: AnalyseOptions, ctx: WorkContext = QUIET_CONTEXT): Promise<AnalysisSummary> {
    this.deck = null;
    this.model = null;
    this.studyState = null;
    this.refinedCache = null;
    this.governingCache.clear();
    const deck = assertDeck(input);
    ctx.progress('code factors', 0.02);
    const t0 = now();
    const code = computeCodeFactors(deck);
    const t1 = now();
    const rules = placementRulesForDeck(deck);
    await ctx.checkpoint();
    ctx.progress('grillage mesh and factorisation', 0.1);
    const segmentsPerSpan = options.segmentsPerSpan ?? REFINED_SEGMENTS_PER_SPAN;
    let model: GrillageModel | null = null;
    let grillageError: string | undefined;
    try {
      model = buildGrillage(deck, { segmentsPerSpan });
    } catch (error) {
      // A deck the mesher cannot build or a grillage that is a mechanism: the code factors
      // still stand; the error names the cause (shared/grillage/errors.ts).
      if (!(error instanceof Error)) throw error;
      grillageError = error.message;
    }
    const t2 = now();
    await ctx.checkpoint();
    ctx.progress('beam-line envelopes', 0.6);
    const beam: BeamModel = { spans: deck.spans.map((s) => s.length), continuous: deck.continuous };
    const beamLine = hl93BeamLineEffects(beam, { fatigue: true, values: designValuesOf(deck) });
    const t3 = now();
    this.deck = deck;
    this.code = code;
    this.model = model;
    this.rules = rules;
    this.beamLine = beamLine;
    ctx.progress('ready', 1);
    const summary: AnalysisSummary = {
      code,
      rules,
      grillage: model
        ? { layout: model.layout, segmentsPerSpan, stats: model.stats, findings: model.findings, trace: model.trace, extent: model.extent, elapsedMs: t2 - t1 }
        : null,
      beamLine: {
        x: beamLine.points.map((p) => p.x),
        span: beamLine.points.map((p) => p.span),
        fraction: beamLine.points.map((p) => p.fraction),
        momentMax: beamLine.points.map((p) => p.moment.max.value),
        momentMin: beamLine.points.map((p) => p.moment.min.value),
        shearMax: beamLine.points.map((p) => p.shear.max.value),
        shearMin: beamLine.points.map((p) => p.shear.min.value),
      },
      girderCount: code.derived.girderCount,
      spanCount: deck.spans.length,
      timings: { codeMs: t1 - t0, grillageMs: t2 - t1, beamLineMs: t3 - t2 },
    };
    if (grillageError !== undefined) summary.grillageError = grillageError;
    return summary;
  }

  private need(): { deck: Deck; model: GrillageModel; rules: PlacementRules; code: CodeFactorResult } {
    if (!this.deck || !this.rules || !this.code) {
      throw new DeckInputError(['deck'], 'no deck has been analysed yet');
    }
    if (!this.model) throw new DeckInputError(['grillage'], 'the grillage of this deck could not be built');
    return { deck: this.deck, model: this.model, rules: this.rules, code: this.code };
  }

  private needStudy() {
    if (!this.studyState) throw new DeckInputError(['study'], 'the influence surfaces have not been computed yet');
    return this.studyState;
  }

  /** Influence surfaces of every girder's moment and shear for one span and vehicle. */
  async study(span: number, vehicleKey: VehicleKey, ctx: WorkContext = QUIET_CONTEXT): Promise<StudySummary> {
    const { deck, model, rules } = this.need();
    if (!Number.isInteger(span) || span < 0 || span >= deck.spans.length) {
      throw new DeckInputError(['study', 'span'], `the studied span must be a whole number from 1 to ${deck.spans.length}`);
    }
    const vehicle = vehicleForDeck(deck, vehicleKey);
    if (!vehicle) throw new DeckInputError(['study', 'vehicle'], `unknown vehicle ${String(vehicleKey)}`);
    const t0 = now();
    this.governingCache.clear();
    const Nb = model.girderCount;
    const fraction = momentFractionFor(deck, span);
    const responses: GrillageResponse[] = [];
    for (let g = 0; g < Nb; g++) responses.push({ kind: 'girder-moment', girder: g, span, fraction });
    for (let g = 0; g < Nb; g++) responses.push({ kind: 'girder-shear', girder: g, support: span, side: 'right' });
    ctx.progress('influence surfaces (one adjoint solve each)', 0.05);
    const surfaces = influenceSurfaces(model, responses);
    await ctx.checkpoint();
    const raw = { moment: surfaces.slice(0, Nb), shear: surfaces.slice(Nb) };
    // Sampled as the refined run samples them (refinedFactors.ts, step 3): each surface in the
    // frame of the skew it is read at (the shear along its support line, the moment along the
    // load transfer at its moment point), with the moment points stepped either side, so the
    // governing values and their stated bounds agree with the refined factors. Every sample's
    // representation error is measured, so each governing placement's tolerance statement is a
    // true bound (shared/placement/search.ts).
    const momentPoints = Array.from({ length: Nb }, (_, g) => girderMomentPoint(model, g, span, fraction));
    const sampled: Record<StudyEffect, SampledSurface[]> = { moment: [], shear: [] };
    const sampleRelativeError: Record<StudyEffect, number> = { moment: 0, shear: 0 };
    for (const [effect, from] of [['moment', 0], ['shear', Nb]] as const) {
      ctx.progress(`sampling the ${effect} surfaces`, effect === 'moment' ? 0.1 : 0.5);
      await ctx.checkpoint();
      sampled[effect] = sampleSurfaces(model, responses.slice(from, from + Nb), surfaces.slice(from, from + Nb), rules, {}, momentPoints).sampled;
      for (const s of sampled[effect]) if (s.maxOrdinate > 0) sampleRelativeError[effect] = Math.max(sampleRelativeError[effect], s.representationError / s.maxOrdinate);
    }
    const spans = deck.spans.map((s) => s.length);
    const beam: BeamModel = { spans, continuous: deck.continuous };
    const spanStart = spans.slice(0, span).reduce((a, b) => a + b, 0);
    const momentX = spanStart + fraction * spans[span];
    const ml = influenceLine(beam, { kind: 'moment', x: momentX });
    const sl = influenceLine(beam, { kind: 'shear', x: spanStart, side: 'right' });
    const beamLineOf = (key: VehicleKey) => {
      const v = vehicleForDeck(deck, key)!;
      const me = maxVehicleEffect(ml, v, 'positive');
      const se = maxVehicleEffect(sl, v, 'positive');
      if (!(me.value > 0) || !(se.value > 0)) {
        throw new DeckInputError(['spans', span], `the beam-line effect of one lane of the ${key} is not positive at the studied point`);
      }
      return { me, se };
    };
    const studied = beamLineOf(vehicleKey);
    const fatigue = beamLineOf('fatigue truck');
    this.fatigueBeamLineMax = { moment: fatigue.me.value, shear: fatigue.se.value };
    const pos = (v: { frontAxleAt: number; direction: 1 | -1; axleSpacing?: number }): LongitudinalPosition =>
      v.axleSpacing === undefined ? { frontAxleAt: v.frontAxleAt, direction: v.direction } : { frontAxleAt: v.frontAxleAt, direction: v.direction, axleSpacing: v.axleSpacing };
    const summary: StudySummary = {
      span,
      vehicle: vehicleKey,
      momentFraction: fraction,
      momentX,
      shearSupport: span,
      beamLineMax: { moment: studied.me.value, shear: studied.se.value },
      beamLinePosition: { moment: pos(studied.me), shear: pos(studied.se) },
      sampleRelativeError,
      elapsedMs: now() - t0,
    };
    this.studyState = { summary, raw, sampled };
    ctx.progress('ready', 1);
    return summary;
  }

  private multiplePresenceOn(): boolean {
    return this.needStudy().summary.vehicle !== 'fatigue truck';
  }

  /** Applies the placement rules (what a drag may reach), with the vehicle's longitudinal limits. */
  clamp(lanes: LanePlacement[], dragged?: number): LanePlacement[] {
    const { deck, model, rules } = this.need();
    const { summary } = this.needStudy();
    const placement = clampPlacement({ lanes }, rules, {
      dragged,
      vehicle: vehicleForDeck(deck, summary.vehicle)!,
      extent: { xMin: model.extent.xMin, xMax: model.extent.xMax },
    });
    return placement.lanes;
  }

  /**
   * The drag path: every girder's share of the placement, in lanes. Each girder's effect
   * neglects the axles that do not add to it (Art. 3.6.1.3.1), as the governing search does;
   * `countAdverseAxles` counts every axle instead (the plain statics of the placement).
   */
  evaluate(lanes: LanePlacement[], effect: StudyEffect, options: { countAdverseAxles?: boolean } = {}): LiveShares {
    const t0 = now();
    const { deck, rules } = this.need();
    const state = this.needStudy();
    const vehicle = vehicleForDeck(deck, state.summary.vehicle)!;
    const placement: Placement = { lanes: this.clamp(lanes) };
    const E1 = state.summary.beamLineMax[effect];
    // The surfaces themselves (not their samples): the share at a governing placement is then
    // exactly the governing value, which the search also evaluates on the surface.
    const surfaces = state.raw[effect];
    const mp = this.multiplePresenceOn();
    const shares = new Array<number>(surfaces.length);
    let m = 1;
    for (let g = 0; g < surfaces.length; g++) {
      const r = evaluateSurface(surfaces[g], placement, rules, vehicle, { check: false, multiplePresence: mp, countAdverseAxles: options.countAdverseAxles });
      shares[g] = r.value / E1;
      m = r.multiplePresence;
    }
    return { effect, shares, loadedLanes: placement.lanes.length, multiplePresence: m, lanes: placement.lanes, elapsedMs: now() - t0 };
  }

  /**
   * Governing placement for a girder and effect: of 1..NL lanes with multiple presence for the
   * design truck and tandem, of one lane without it for the fatigue truck. `vehicleKey`
   * defaults to the studied vehicle; the surfaces serve every vehicle.
   */
  governing(girder: number, effect: StudyEffect, vehicleKey?: VehicleKey): GoverningSummary {
    const { deck, rules } = this.need();
    const state = this.needStudy();
    const key = vehicleKey ?? state.summary.vehicle;
    const cacheKey = `${key}|${girder}|${effect}`;
    const cached = this.governingCache.get(cacheKey);
    if (cached) return cached;
    const surfaces = state.sampled[effect];
    if (!Number.isInteger(girder) || girder < 0 || girder >= surfaces.length) {
      throw new DeckInputError(['girder'], `the girder must be a whole number from 1 to ${surfaces.length}`);
    }
    const vehicle = vehicleForDeck(deck, key);
    if (!vehicle) throw new DeckInputError(['vehicle'], `unknown vehicle ${String(key)}`);
    const t0 = now();
    const fatigue = key === 'fatigue truck';
    const result = governingSurfacePlacement(surfaces[girder], rules, vehicle, {
      sense: 'positive',
      multiplePresence: !fatigue,
      laneCounts: fatigue ? [1] : undefined,
      source: state.raw[effect][girder],
    });
    const E1 = key === state.summary.vehicle ? state.summary.beamLineMax[effect] : fatigue ? this.fatigueBeamLineMax[effect] : this.beamLineMaxOf(key, effect);
    const summary: GoverningSummary = {
      girder,
      effect,
      vehicle: key,
      factor: result.value / E1,
      loadedLanes: result.loadedLanes,
      lanes: result.placement.lanes,
      byLaneCount: result.byLaneCount.map((b) => ({ loadedLanes: b.loadedLanes, factor: b.value / E1, lanes: b.placement.lanes })),
      tolerance: boundInLanes(result.tolerance, E1, result.value / E1).text,
      toleranceFactor: result.tolerance.absolute / E1,
      elapsedMs: now() - t0,
    };
    this.governingCache.set(cacheKey, summary);
    return summary;
  }

  private beamLineMaxOf(key: VehicleKey, effect: StudyEffect): number {
    const { deck } = this.need();
    const { summary } = this.needStudy();
    const spans = deck.spans.map((s) => s.length);
    const beam: BeamModel = { spans, continuous: deck.continuous };
    const start = spans.slice(0, summary.span).reduce((a, b) => a + b, 0);
    const line = effect === 'moment' ? influenceLine(beam, { kind: 'moment', x: summary.momentX }) : influenceLine(beam, { kind: 'shear', x: start, side: 'right' });
    return maxVehicleEffect(line, vehicleForDeck(deck, key)!, 'positive').value;
  }

  /**
   * Governing values for every girder and both effects for the studied vehicle (the fatigue
   * rows of the comparison come from the refined run); yields between searches.
   */
  async governingAll(ctx: WorkContext = QUIET_CONTEXT, onEach?: (g: GoverningSummary) => void): Promise<GoverningSummary[]> {
    const state = this.needStudy();
    const Nb = state.sampled.moment.length;
    const out: GoverningSummary[] = [];
    const total = 2 * Nb;
    let done = 0;
    for (const effect of ['moment', 'shear'] as const) {
      for (let g = 0; g < Nb; g++) {
        const r = this.governing(g, effect);
        out.push(r);
        onEach?.(r);
        done++;
        ctx.progress(`governing placements (${done} of ${total})`, done / total);
        await ctx.checkpoint();
      }
    }
    return out;
  }

  /**
   * The refined (grillage) factors of every girder, effect and span — design truck, and the
   * fatigue truck for fatigue (shared/grillage/refinedFactors.ts, on the session's model) —
   * and their comparison with the code's factors (shared/grillage/compare.ts). Computed once
   * per analysed deck.
   */
  refinedComparison(): RefinedSummary {
    if (this.refinedCache) return this.refinedCache;
    const { deck, model, code } = this.need();
    const t0 = now();
    const refined = computeRefinedFactors(deck, { model });
    const comparison = compareFactors(code, refined);
    this.refinedCache = { refined, comparison, elapsedMs: now() - t0 };
    return this.refinedCache;
  }

  /** An influence surface on a regular grid, for the heat map. */
  surfaceGrid(girder: number, effect: StudyEffect, nx: number, ny: number): SurfaceGrid {
    const state = this.needStudy();
    const s = state.raw[effect][girder];
    if (!s) throw new DeckInputError(['girder'], `no surface for girder ${girder + 1}`);
    if (!(Number.isInteger(nx) && nx >= 2 && nx <= 1000 && Number.isInteger(ny) && ny >= 2 && ny <= 1000)) {
      throw new DeckInputError(['grid'], 'the heat map grid must have 2 to 1000 points each way');
    }
    const e = s.extent;
    const xs = Float64Array.from({ length: nx }, (_, i) => e.xMin + ((e.xMax - e.xMin) * i) / (nx - 1));
    const ys = Float64Array.from({ length: ny }, (_, j) => e.yMin + ((e.yMax - e.yMin) * j) / (ny - 1));
    const values = s.sampleGrid(xs, ys);
    let min = Infinity;
    let max = -Infinity;
    for (const v of values) {
      if (v < min) min = v;
      if (v > max) max = v;
    }
    return { girder, effect, xs, ys, values, min, max, unit: s.unit, label: s.label };
  }

  /**
   * Girder LL+IM envelopes of one girder (the beam-line envelopes × its factors): the code
   * factors of its kind (interior or exterior) as shared/loads/deckEffects.ts applies them,
   * and, once the refined run is computed, its refined (grillage) factors — the governing
   * values of the girder in span 1 (governingPerGirder of the refined rows, the value every
   * table shows), like the code series.
   */
  envelopes(girder: number): GirderEnvelopeSeries[] {
    const { code, model, deck } = this.need();
    if (!this.beamLine) throw new DeckInputError(['deck'], 'no beam-line envelopes yet');
    const kind = girderKindOf(girder, model.girderCount);
    const codeEffects = deckGirderEffects(deck, code, this.beamLine).girders[kind];
    if (!codeEffects) throw new DeckInputError(['factors'], `no ${kind} girder effects for this deck`);
    const first = (effect: FactorEffect) => governingFactor(code, kind, effect, 'span1')?.value ?? Number.NaN;
    const series: GirderEnvelopeSeries[] = [];
    series.push({
      girder,
      label: `code factors (${kind} girders, span 1, the governing lane case)`,
      factors: { moment: first('moment'), shear: first('shear'), source: 'code' },
      x: codeEffects.points.map((p) => p.x),
      momentMax: codeEffects.points.map((p) => p.moment.max.value),
      momentMin: codeEffects.points.map((p) => p.moment.min.value),
      shearMax: codeEffects.points.map((p) => p.shear.max.value),
      shearMin: codeEffects.points.map((p) => p.shear.min.value),
    });
    const refined = this.refinedCache ? refinedFactorsOfSpan(this.refinedCache.refined.rows, girder, 0) : undefined;
    if (refined) {
      const refinedEffects = girderLiveLoadEffects(this.beamLine, { moment: refined.moment, shear: refined.shear });
      series.push({
        girder,
        label: `grillage factors of girder ${girder + 1} (span 1, the governing values of the refined run: the moment at its governing tenth point, the shear at the larger of the span's ends)`,
        factors: { ...refined, source: 'grillage' },
        x: refinedEffects.points.map((p) => p.x),
        momentMax: refinedEffects.points.map((p) => p.moment.max.value),
        momentMin: refinedEffects.points.map((p) => p.moment.min.value),
        shearMax: refinedEffects.points.map((p) => p.shear.max.value),
        shearMin: refinedEffects.points.map((p) => p.shear.min.value),
      });
    }
    return series;
  }
}
