/**
 * Refined (grillage) distribution factors of a version, per girder, for comparison with the
 * code's factors. They come from the result stored with the version under method 'grillage':
 * factor rows in the code engine's row shape (`FactorRow`, method 'grillage', with the girder
 * number), either as `{ factors: FactorRow[] }` or as a bare list.
 * Units: dimensionless factors (lanes per girder).
 */
import type { Db } from '../../db/client.js';
import type { DeckVersionRow } from '../../db/schema.js';
import type { FactorRow } from '../../../shared/lrfd/index.js';
import { storedResult } from './versionResults.js';

export interface RefinedFactor {
  /** Girder number, 1 = left exterior. */
  girder: number;
  effect: FactorRow['effect'];
  /** The code result's location key ("span1", "support2"). */
  locationKey: string;
  location: string;
  span?: number;
  lanes: FactorRow['lanes'];
  value: number;
}

export interface RefinedResults {
  factors: RefinedFactor[] | null;
  source: string;
  note: string;
}

function rowsOf(data: unknown): FactorRow[] | null {
  const list = Array.isArray(data) ? data : typeof data === 'object' && data !== null && Array.isArray((data as { factors?: unknown }).factors) ? (data as { factors: unknown[] }).factors : null;
  if (!list) return null;
  const rows = list.filter(
    (r): r is FactorRow =>
      typeof r === 'object' && r !== null && typeof (r as FactorRow).value === 'number' && Number.isFinite((r as FactorRow).value) && typeof (r as FactorRow).effect === 'string' && typeof (r as FactorRow).location?.key === 'string',
  );
  return rows;
}

/**
 * The governing refined factor of each girder, effect and location (the largest over the
 * lane cases), or null with the reason when the version has none.
 */
export function refinedResultsOf(db: Db, v: DeckVersionRow): RefinedResults {
  const stored = storedResult(db, v.id, 'grillage');
  if (!stored) {
    return { factors: null, source: '', note: 'No grillage (refined) analysis is stored with this version: the refined/code ratios and the possible moment reduction appear once the designer saves the version with a grillage result.' };
  }
  const rows = rowsOf(stored.data);
  if (!rows || rows.length === 0) {
    return { factors: null, source: `grillage, solver ${stored.solverVersion}`, note: 'The stored grillage result holds no factor rows that can be compared.' };
  }
  const best = new Map<string, RefinedFactor>();
  for (const r of rows) {
    const girder = typeof r.girder === 'number' ? r.girder : r.girderNumber;
    if (girder === undefined) continue;
    const key = `${girder}|${r.effect}|${r.location.key}`;
    const prev = best.get(key);
    if (!prev || r.value > prev.value) {
      best.set(key, { girder, effect: r.effect, locationKey: r.location.key, location: r.location.description, ...(r.location.span !== undefined ? { span: r.location.span } : {}), lanes: r.lanes, value: r.value });
    }
  }
  return { factors: [...best.values()].sort((a, b) => a.girder - b.girder || a.effect.localeCompare(b.effect)), source: `grillage, solver ${stored.solverVersion}`, note: '' };
}
