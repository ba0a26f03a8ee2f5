/**
 * The possible reduction in girder live-load moment if the refined (grillage) factors were
 * used instead of the code's, and which of those reductions can be claimed: one table and one
 * answer, read by the review summary, its panel and the calculation package alike.
 *
 * For one span the girder LL+IM moment is g × the per-lane LL+IM moment (AASHTO LRFD
 * Art. 4.6.2.2), so the reduction is (g_code − g_refined) / g_code of it, g_code the code's
 * governing factor of the girder's kind (interior or exterior) at the place.
 *
 * Claimable. The girders of one kind are designed alike for a span (common practice, no
 * source), so the reduction that can be claimed for a kind and a span is that of its design
 * girder: the girder of the kind with the largest refined moment there. Every other row says
 * which girder governs its kind instead. A design girder's reduction is claimable only when the
 * model earns it: its refined factor's stated bound meets the target (BOUND_TARGET_LANES lanes
 * and BOUND_TARGET_PERCENT % of the value; a factor that could be exceeded by more cannot
 * lower a design value), the factor changes by at most 1 % at twice the mesh density, and
 * the grillage includes the deck's diaphragms or cross-frames (a
 * model that leaves out members the bridge has is not the bridge), and no grid panel of the
 * mesh is more elongated than PANEL_ASPECT_LIMIT (shared/grillage/quality.ts; AASHTO LRFD
 * Art. 4.6.3.3.1: grid panel aspect ratios should not exceed 5.0, quoted from memory). Each row that is not
 * claimable says why. The largest claimable reduction is the largest reduction among the
 * claimable rows, and nothing else. The mesh must pass its convergence check too: the factor
 * changes by at most 1 % when the density is doubled (refinedFactors.ts `checkConvergence`;
 * common practice, no source).
 *
 * Units: factors dimensionless; moments N·m (internal SI); percentages of the code moment.
 * Pure: used by the server's review summary and report and by the client's tests.
 */
import type { CodeFactorResult, FactorRow, GirderKind } from '../lrfd/index.js';
import { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT } from '../placement/search.js';

/** The governing refined factor of one girder, effect and place (the largest over its lane cases). */
export interface RefinedFactor {
  /** Girder number, 1 = left exterior. */
  girder: number;
  effect: FactorRow['effect'];
  /** The code result's location key ("span1", "support2"). */
  locationKey: string;
  location: string;
  span?: number;
  lanes: FactorRow['lanes'];
  /** Loaded lanes of the row's governing placement (absent on results stored before rows named it). */
  loadedLanes?: number;
  value: number;
  /** The row's stated bound (absent on results stored before bounds were kept with rows). */
  bound?: FactorRow['bound'];
  /** The row's change at twice the mesh density (absent when not checked). */
  convergence?: FactorRow['convergence'];
  /** The load that governs it (absent on results stored before rows named it). */
  vehicle?: string;
}

/** Why a row's reduction is not claimed. */
export type WithheldReason = 'not-design-girder' | 'bound-unknown' | 'bound-misses-target' | 'convergence-unknown' | 'mesh-unconverged' | 'diaphragms-left-out' | 'mesh-aspect-ratio';

/** The most elongated grid panel of a mesh whose aspect ratio is above the limit (quality.ts). */
export interface PanelAspectFact {
  ratio: number;
  limit: number;
}

/** What the model behind the refined rows includes, for the claim. */
export interface RefinedModelFacts {
  /** The deck has diaphragms or cross-frames and the grillage leaves them out (the user's switch). */
  diaphragmsLeftOut: boolean;
  /** The mesh's worst panel when its aspect ratio exceeds the limit (absent or null: every panel is within it). */
  panelAspect?: PanelAspectFact | null;
}

/** The governing refined factor per girder, effect and place from rows of method 'grillage', sorted by girder and effect. */
export function governingPerGirder(rows: readonly FactorRow[]): RefinedFactor[] {
  const best = new Map<string, RefinedFactor>();
  for (const r of rows) {
    const girder = typeof r.girder === 'number' ? r.girder : r.girderNumber;
    if (girder === undefined) continue;
    const key = `${girder}|${r.effect}|${r.location.key}`;
    const prev = best.get(key);
    if (!prev || r.value > prev.value) {
      best.set(key, {
        girder,
        effect: r.effect,
        locationKey: r.location.key,
        location: r.location.description,
        ...(r.location.span !== undefined ? { span: r.location.span } : {}),
        lanes: r.lanes,
        ...(r.loadedLanes !== undefined ? { loadedLanes: r.loadedLanes } : {}),
        value: r.value,
        ...(r.bound ? { bound: r.bound } : {}),
        ...(r.convergence ? { convergence: r.convergence } : {}),
        ...(r.vehicle ? { vehicle: r.vehicle } : {}),
      });
    }
  }
  return [...best.values()].sort((a, b) => a.girder - b.girder || a.effect.localeCompare(b.effect));
}

export interface MomentReduction {
  girder: number;
  girderKind: GirderKind;
  /** The code result's location key ("span1") and its words. */
  locationKey: string;
  location: string;
  code: number;
  refined: number;
  /** Per-lane HL-93 LL+IM maximum positive moment of the span, N·m. */
  perLaneMoment: number;
  /** Girder LL+IM moment with the code factor and with the refined one, N·m. */
  codeMoment: number;
  refinedMoment: number;
  /** codeMoment − refinedMoment, N·m (negative: the refined factor is larger). */
  reduction: number;
  reductionPercent: number;
  /** Whether this row's reduction may be claimed (its kind's design girder for the span, bound within target, diaphragms in the model). */
  claimable: boolean;
  /** The refined factor's stated bound, when known. */
  bound?: FactorRow['bound'];
  /** The refined factor's change at twice the mesh density, when checked. */
  convergence?: FactorRow['convergence'];
  /** Why the row is not claimable (empty when it is). */
  withheld: WithheldReason[];
  /** The mesh's over-elongated panel, when that withholds the row. */
  panelAspect?: PanelAspectFact;
  /** Why the row may or may not be claimed, in words. */
  claim: string;
  /** The design girder of this row's kind and place (this row's girder when claimable). */
  designGirder: number;
}

/** The effects a refined factor is set beside the code's governing value for. */
export const RATIO_EFFECTS = ['moment', 'shear', 'negative-moment', 'reaction'] as const;
export type RatioEffect = (typeof RATIO_EFFECTS)[number];
export const isRatioEffect = (e: string): e is RatioEffect => (RATIO_EFFECTS as readonly string[]).includes(e);

/** The code's governing factor for a girder number (1-based) of `count`. */
export function codeFactorForGirder(code: CodeFactorResult, girder: number, count: number, effect: RatioEffect, locationKey: string): { value: number; kind: GirderKind } | undefined {
  const kind: GirderKind = girder === 1 || girder === count ? 'exterior' : 'interior';
  const g = code.governing.find((x) => x.girder === kind && x.effect === effect && x.location.key === locationKey);
  return g ? { value: g.value, kind } : undefined;
}

/**
 * The reduction table of the refined moment factors (one row per girder and span, in the order
 * given) with each row's claim; `perLaneMoment(span)` is the span's per-lane LL+IM maximum
 * positive moment, N·m.
 */
export function momentReductionTable(
  code: CodeFactorResult,
  refined: readonly RefinedFactor[],
  perLaneMoment: (span: number) => number,
  model: RefinedModelFacts = { diaphragmsLeftOut: false },
): MomentReduction[] {
  const count = code.derived.girderCount;
  const rows: MomentReduction[] = [];
  for (const f of refined) {
    if (f.effect !== 'moment') continue;
    const c = codeFactorForGirder(code, f.girder, count, 'moment', f.locationKey);
    if (!c || !(c.value > 0)) continue;
    const perLane = perLaneMoment(f.span ?? 0);
    const codeMoment = c.value * perLane;
    const refinedMoment = f.value * perLane;
    rows.push({
      girder: f.girder,
      girderKind: c.kind,
      locationKey: f.locationKey,
      location: f.location,
      code: c.value,
      refined: f.value,
      perLaneMoment: perLane,
      codeMoment,
      refinedMoment,
      reduction: codeMoment - refinedMoment,
      reductionPercent: ((c.value - f.value) / c.value) * 100,
      claimable: false,
      claim: '',
      designGirder: f.girder,
      withheld: [],
      ...(f.bound ? { bound: f.bound } : {}),
      ...(f.convergence ? { convergence: f.convergence } : {}),
    });
  }
  // The design girder of each kind and place: the largest refined moment (ties: the lower number).
  const design = new Map<string, MomentReduction>();
  for (const r of rows) {
    const key = `${r.girderKind}|${r.locationKey}`;
    const d = design.get(key);
    if (!d || r.refinedMoment > d.refinedMoment || (r.refinedMoment === d.refinedMoment && r.girder < d.girder)) design.set(key, r);
  }
  for (const r of rows) {
    const d = design.get(`${r.girderKind}|${r.locationKey}`) as MomentReduction;
    r.designGirder = d.girder;
    r.withheld = d === r ? withheldReasons(r, model) : ['not-design-girder'];
    r.claimable = r.withheld.length === 0;
    r.claim =
      d !== r
        ? `girder ${d.girder} carries the largest ${r.girderKind} moment in ${r.location}; its reduction applies to the ${r.girderKind} girders there`
        : r.claimable
          ? `design ${r.girderKind} girder for ${r.location}`
          : `design ${r.girderKind} girder for ${r.location}, not claimable: ${r.withheld.map((w) => withheldWords(w, r)).join('; ')}`;
  }
  return rows;
}

/** Why a design girder's reduction cannot be claimed (empty when it can). */
function withheldReasons(r: MomentReduction, model: RefinedModelFacts): WithheldReason[] {
  const why: WithheldReason[] = [];
  if (!r.bound) why.push('bound-unknown');
  else if (!r.bound.meetsTarget) why.push('bound-misses-target');
  if (!r.convergence) why.push('convergence-unknown');
  else if (!r.convergence.within) why.push('mesh-unconverged');
  if (model.diaphragmsLeftOut) why.push('diaphragms-left-out');
  if (model.panelAspect) {
    why.push('mesh-aspect-ratio');
    r.panelAspect = model.panelAspect;
  }
  return why;
}

/** A reason in words, with the row's figures. */
export function withheldWords(w: WithheldReason, r: Pick<MomentReduction, 'bound' | 'convergence' | 'designGirder' | 'panelAspect'>): string {
  switch (w) {
    case 'not-design-girder':
      return `girder ${r.designGirder} governs`;
    case 'bound-unknown':
      return 'its bound was not stored with this result (run the refined analysis again)';
    case 'bound-misses-target':
      return `its bound (${r.bound?.lanes.toFixed(4)} lanes, ${r.bound?.percent.toFixed(2)} % of the factor) misses the target of ${BOUND_TARGET_LANES} lanes and ${BOUND_TARGET_PERCENT} %`;
    case 'convergence-unknown':
      return 'the mesh was not checked at twice its density (a result stored before the check, or a model too large to run twice as fine on this server)';
    case 'mesh-unconverged':
      return `at twice the mesh density (${r.convergence?.segmentsPerSpan} segments per span) the factor changes by ${((r.convergence?.change ?? 0) * 100).toFixed(2)} %, more than 1 %`;
    case 'diaphragms-left-out':
      return 'the grillage leaves out the deck’s diaphragms or cross-frames';
    case 'mesh-aspect-ratio':
      return `a grid panel of the mesh has an aspect ratio of ${r.panelAspect?.ratio.toFixed(2)}, above ${r.panelAspect?.limit} (AASHTO LRFD Art. 4.6.3.3.1)`;
  }
}

/** The largest reduction among the claimable rows of `table`, or null when none is claimable. */
export function largestClaimableReduction(table: readonly MomentReduction[]): MomentReduction | null {
  let best: MomentReduction | null = null;
  for (const r of table) if (r.claimable && (!best || r.reductionPercent > best.reductionPercent)) best = r;
  return best;
}
