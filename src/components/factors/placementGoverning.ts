/**
 * What the placement panel (PlacementPanel.vue) states as a girder's governing value, as pure
 * data. Two values, each named for what it is:
 * - the span's governing value of the studied girder and effect: the governing refined factor
 *   of that girder, effect and span (`governingPerGirder` of the refined rows,
 *   shared/review/reductions.ts — the value the comparison, the review, the version comparison,
 *   the package and the CSV show), when the refined run searched the panel's vehicle (a span's
 *   shear is the larger of its two ends; the moment is read at the governing tenth point);
 * - the studied point's governing placement (the workspace's own search on the surfaces of the
 *   studied point: the moment at its fraction, the shear just inside the span's first support),
 *   which the lanes can be moved to.
 * Units: factors dimensionless (lanes per girder).
 */
import type { FactorEffect, FactorRow } from '@shared/lrfd/factors';
import { governingPerGirder } from '@shared/review/reductions';
import type { StudyEffect, StudySummary, VehicleKey } from '@/workers/solverCore';

export interface SpanGoverning {
  value: number;
  lanes: FactorRow['lanes'];
  loadedLanes?: number;
  /** The load that governs, in words ("design truck"). */
  vehicle: string;
  /** The place in the refined row's words ("span 1 (support 2, left side)"). */
  location: string;
}

/** The refined effect the panel's effect stands for under its vehicle (the fatigue truck: the fatigue effects). */
export function refinedEffectOf(effect: StudyEffect, vehicle: VehicleKey): FactorEffect {
  if (vehicle === 'fatigue truck') return effect === 'moment' ? 'fatigue-moment' : 'fatigue-shear';
  return effect;
}

/**
 * The governing refined factor of girder `girder` (0-based), the panel's effect and span
 * `span` (0-based), or undefined before the refined run or when its load is not the panel's
 * vehicle (an HL-93 run beside the design truck, say).
 */
export function spanGoverning(rows: readonly FactorRow[] | null | undefined, q: { girder: number; effect: StudyEffect; vehicle: VehicleKey; span: number }): SpanGoverning | undefined {
  if (!rows || !rows.length) return undefined;
  const effect = refinedEffectOf(q.effect, q.vehicle);
  const f = governingPerGirder(rows).find((x) => x.girder === q.girder + 1 && x.effect === effect && x.locationKey === `span${q.span + 1}`);
  if (!f || f.vehicle !== q.vehicle) return undefined;
  return { value: f.value, lanes: f.lanes, ...(f.loadedLanes !== undefined ? { loadedLanes: f.loadedLanes } : {}), vehicle: f.vehicle, location: f.location };
}

/** Where the studied point's surfaces are read, in words: "0.5 of span 1", "support 1, right side". */
export function studiedPointWords(study: Pick<StudySummary, 'span' | 'momentFraction' | 'shearSupport'>, effect: StudyEffect): string {
  return effect === 'moment' ? `${study.momentFraction} of span ${study.span + 1}` : `support ${study.shearSupport + 1}, right side`;
}
