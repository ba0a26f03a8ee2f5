/**
 * What the comparison of methods shows (ComparisonTable.vue), as pure data: one line per girder
 * kind, effect, place and lane case of the studied span — each code method's rows, the code's
 * adopted value (`adoptedValue`, shared/grillage/compare.ts) and the grillage value of the kind
 * (`grillageRowOfKind`: the largest of the girders of that kind, as the package prints it) with
 * the placement, load and trace of the very row it is; and, per girder, the rows of
 * `compareFactors`. Before the refined run arrives, a grillage cell holds the best governing
 * placement found so far at the studied point, marked partial. No value is computed here.
 * Units: factors dimensionless (lanes per girder); placements in m.
 */
import type { CodeFactorResult, FactorEffect, FactorMethod, FactorRow, GirderKind } from '@shared/lrfd/factors';
import { placeWords } from '@shared/lrfd/words';
import { adoptedValue, grillageRowOfKind, type ComparisonRow } from '@shared/grillage/compare';
import { rowBoundWords, type RefinedResult } from '@shared/grillage/refinedFactors';
import type { GoverningSummary, StudyEffect, VehicleKey } from '@/workers/solverCore';

export type Column = 'formula' | 'lever-rule' | 'rigid-section' | 'other' | 'grillage';
export type GoverningRecord = Record<StudyEffect, (GoverningSummary | undefined)[]>;

export interface GrillageCell {
  value: number;
  /** 0-based girder the value belongs to. */
  girder: number;
  loadedLanes: number;
  /** The placement of the row's lanes. */
  lanes: { left: number; wheelOffset: number; frontAxleAt?: number; direction?: 1 | -1; axleSpacing?: number }[];
  vehicle: string;
  tolerance: string;
  /** From the refined run: the row's stated bound (marked when it misses the target). */
  bound?: FactorRow['bound'];
  /** From the refined run: its factor row (trace, findings). */
  row?: FactorRow;
  /** Still being searched (a value found so far at the studied point). */
  partial: boolean;
}

export interface ComparisonLine {
  key: string;
  kind: GirderKind;
  effect: FactorEffect;
  lanes: 'one' | 'multiple';
  location: string;
  locationKey: string;
  code: Partial<Record<Exclude<Column, 'grillage'>, FactorRow[]>>;
  grillage?: GrillageCell;
  /** The adopted code value of this lane case. */
  adopted?: number;
  /** This lane case holds the governing code value of its girder kind and effect. */
  governing: boolean;
  /** Grillage ÷ the adopted code value, where both exist. */
  ratio?: number;
}

export interface ComparisonInput {
  code: CodeFactorResult;
  /** The governing placements found so far at the studied point (before the refined run). */
  governing: GoverningRecord;
  fatigue: GoverningRecord;
  vehicle: VehicleKey;
  span: number;
  girderCount: number;
  /** The refined run of every girder, effect and span, once computed. */
  refined?: Pick<RefinedResult, 'rows' | 'rowSources' | 'factors'> | null;
}

const ORDER: FactorEffect[] = ['moment', 'shear', 'negative-moment', 'reaction', 'fatigue-moment', 'fatigue-shear', 'deflection'];

function column(method: FactorMethod): Exclude<Column, 'grillage'> {
  if (method === 'formula' || method === 'lever-rule' || method === 'rigid-section') return method;
  return 'other';
}

/** The refined run's cell of a girder kind, effect, lane case and place: the row of the kind, and the search behind it. */
export function refinedCell(refined: NonNullable<ComparisonInput['refined']>, kind: GirderKind, effect: FactorEffect, lanes: 'one' | 'multiple', locationKey: string): GrillageCell | undefined {
  const row = grillageRowOfKind(refined.rows, { kind, effect, lanes, locationKey });
  if (!row) return undefined;
  const source = refined.rowSources.find((s) => s.rowId === row.id);
  const factor = source ? refined.factors[source.factorIndex] : undefined;
  const laneCase = factor?.byLaneCount.find((b) => b.loadedLanes === source?.loadedLanes);
  const loadedLanes = row.loadedLanes ?? 1;
  return {
    value: row.value,
    girder: (row.girderNumber ?? 1) - 1,
    loadedLanes,
    lanes: laneCase?.placement.lanes ?? [],
    vehicle: row.vehicle ?? laneCase?.vehicle ?? '',
    tolerance: factor ? rowBoundWords(factor, loadedLanes) : '',
    ...(row.bound ? { bound: row.bound } : {}),
    row,
    partial: false,
  };
}

/** Before the refined run arrives: the best governing placement found so far at the studied point, of the girders of a kind. */
function searchedCell(input: ComparisonInput, kind: GirderKind, effect: FactorEffect, lanes: 'one' | 'multiple'): GrillageCell | undefined {
  const studyEffect: StudyEffect | null = effect === 'moment' || effect === 'fatigue-moment' ? 'moment' : effect === 'shear' || effect === 'fatigue-shear' ? 'shear' : null;
  if (!studyEffect) return undefined;
  const fatigueRow = effect.startsWith('fatigue');
  if (!fatigueRow && input.vehicle === 'fatigue truck') return undefined;
  const source = fatigueRow ? input.fatigue : input.governing;
  const n = input.girderCount;
  const girders = kind === 'exterior' ? [0, n - 1] : Array.from({ length: Math.max(0, n - 2) }, (_, i) => i + 1);
  let best: GrillageCell | undefined;
  for (const g of new Set(girders)) {
    const s = source[studyEffect][g];
    if (!s) continue;
    for (const c of s.byLaneCount.filter((b) => (lanes === 'one' ? b.loadedLanes === 1 : b.loadedLanes >= 2))) {
      if (!best || c.factor > best.value) best = { value: c.factor, girder: g, loadedLanes: c.loadedLanes, lanes: c.lanes, vehicle: s.vehicle, tolerance: s.tolerance, partial: true };
    }
  }
  return best;
}

function grillageCell(input: ComparisonInput, kind: GirderKind, effect: FactorEffect, lanes: 'one' | 'multiple', locationKey: string): GrillageCell | undefined {
  if (input.refined) return refinedCell(input.refined, kind, effect, lanes, locationKey);
  return searchedCell(input, kind, effect, lanes);
}

/** The lines of the comparison by girder kind for the studied span (and its support lines), in the table's order. */
export function comparisonLines(input: ComparisonInput): ComparisonLine[] {
  const span = input.span;
  const keys = new Set([`span${span + 1}`, 'deck', `support${span + 1}`, `support${span + 2}`]);
  const byKey = new Map<string, ComparisonLine>();
  for (const r of input.code.factors) {
    // every code row of the span and of its two support lines (negative moment, reactions and
    // the fatigue moment over an interior support of a continuous deck)
    if (!keys.has(r.location.key)) continue;
    const k = `${r.girderKind}|${r.effect}|${r.lanes}|${r.location.key}`;
    let line = byKey.get(k);
    if (!line) {
      line = { key: k, kind: r.girderKind, effect: r.effect, lanes: r.lanes, location: placeWords(r.location.description), locationKey: r.location.key, code: {}, governing: false };
      byKey.set(k, line);
    }
    (line.code[column(r.method)] ??= []).push(r);
    if (r.governing) line.governing = true;
  }
  const out = [...byKey.values()];
  for (const l of out) {
    const adopted = adoptedValue(Object.values(l.code).flat());
    if (adopted !== undefined) l.adopted = adopted;
    l.grillage = grillageCell(input, l.kind, l.effect, l.lanes, l.locationKey);
    if (l.grillage && l.adopted !== undefined && l.adopted > 0) l.ratio = l.grillage.value / l.adopted;
  }
  return out.sort((a, b) =>
    a.kind !== b.kind
      ? a.kind === 'interior' ? -1 : 1
      : ORDER.indexOf(a.effect) - ORDER.indexOf(b.effect) || (a.location < b.location ? -1 : a.location > b.location ? 1 : 0) || (a.lanes === 'one' ? -1 : 1),
  );
}

/** The rows of the comparison per girder for the studied span and its support lines (compareFactors, shared/grillage/compare.ts). */
export function perGirderRows(rows: readonly ComparisonRow[], span: number): ComparisonRow[] {
  const keys = new Set([`span${span + 1}`, `support${span + 1}`, `support${span + 2}`]);
  return rows.filter((r) => keys.has(r.locationKey));
}

/** The value a code cell shows: the largest of the method's rows in it. */
export function cellRow(rows: FactorRow[] | undefined): FactorRow | undefined {
  if (!rows || !rows.length) return undefined;
  return rows.reduce((a, b) => (b.value > a.value ? b : a));
}
