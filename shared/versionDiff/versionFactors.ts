/**
 * A saved version's factors as two versions are compared: the code-method rows and governing
 * values of the version's code result, and the grillage rows and governing value per girder
 * of its refined result — each passed through as the review summary and the calculation
 * package read them (the code result's `governing`; the refined result's `factors`, which are
 * `governingPerGirder` of its rows, shared/review/reductions.ts), only without the traces.
 * Without a refined result the part says why (`missing`), in words a row can show.
 * Units: factors dimensionless (lanes per girder).
 */
import type { CodeFactorResult, FactorEffect, FactorMethod, FactorRow, GirderKind, GoverningFactor } from '../lrfd/factors.js';
import type { Lanes } from '../lrfd/formula.js';
import type { RefinedFactor } from '../review/reductions.js';

/** Where a factor applies: the result's key ("span1", "support2", "deck") and its words. */
export interface ComparedPlace {
  key: string;
  description: string;
}

/** A code-method row: one girder (kind, and number where the method names one), effect, place, lane case and method. */
export interface ComparedCodeRow {
  girderKind: GirderKind;
  girderNumber?: number;
  effect: FactorEffect;
  location: ComparedPlace;
  lanes: Lanes;
  method: FactorMethod;
  value: number;
}

/** The code's governing value of a girder kind, effect and place (the largest adopted lane case). */
export interface ComparedCodeGoverning extends ComparedCodeRow {
  loadedLanes?: number;
}

/** A grillage row: one girder, effect, place (a span's shear: the larger of its two ends) and lane case. */
export interface ComparedRefinedRow {
  girderNumber: number;
  girderKind: GirderKind;
  effect: FactorEffect;
  location: ComparedPlace;
  lanes: Lanes;
  loadedLanes?: number;
  value: number;
  vehicle?: string;
}

/** Why a version has no grillage values to compare. */
export type GrillageMissing = 'computing' | 'not-built' | 'no-rows' | 'too-large' | 'refused' | 'failed' | 'cancelled' | 'not-followed';

/** What a row shows for a side without grillage values. */
export const GRILLAGE_MISSING_WORDS: Record<GrillageMissing, string> = {
  computing: 'grillage still being computed',
  'not-built': 'the grillage could not be built',
  'no-rows': 'no grillage rows stored',
  'too-large': 'grillage not run: the model is above this server’s size limit',
  refused: 'grillage not started: the server is busy',
  failed: 'the grillage run did not finish',
  cancelled: 'the grillage run was cancelled',
  'not-followed': 'the grillage run could not be followed',
};

export type RefinedFactorsPart =
  | {
      available: true;
      source: string;
      solverVersion: string | null;
      rows: ComparedRefinedRow[];
      /** The governing grillage factor per girder, effect and place (the refined result's `factors`). */
      governing: RefinedFactor[];
    }
  | { available: false; missing: GrillageMissing; note: string };

export interface VersionFactors {
  code: {
    solverVersion: string;
    /** 'stored': the result saved with the version; 'computed': computed now from its deck. */
    source: 'stored' | 'computed';
    rows: ComparedCodeRow[];
    governing: ComparedCodeGoverning[];
  };
  refined: RefinedFactorsPart;
}

function place(l: FactorRow['location']): ComparedPlace {
  return { key: l.key, description: l.description };
}

function codeRow(r: Pick<FactorRow, 'girderKind' | 'girderNumber' | 'effect' | 'location' | 'lanes' | 'method' | 'value'>): ComparedCodeRow {
  return {
    girderKind: r.girderKind,
    ...(r.girderNumber !== undefined ? { girderNumber: r.girderNumber } : {}),
    effect: r.effect,
    location: place(r.location),
    lanes: r.lanes,
    method: r.method,
    value: r.value,
  };
}

function codeGoverning(g: GoverningFactor): ComparedCodeGoverning {
  return { ...codeRow({ ...g, girderKind: g.girder }), ...(g.loadedLanes !== undefined ? { loadedLanes: g.loadedLanes } : {}) };
}

/** The code part of a version's factors, from its code result (stored or computed). */
export function codeFactorsPart(code: CodeFactorResult, solverVersion: string, source: 'stored' | 'computed'): VersionFactors['code'] {
  return { solverVersion, source, rows: code.factors.map(codeRow), governing: code.governing.map(codeGoverning) };
}

function refinedRow(r: FactorRow): ComparedRefinedRow | null {
  const girderNumber = typeof r.girder === 'number' ? r.girder : r.girderNumber;
  if (girderNumber === undefined) return null;
  return {
    girderNumber,
    girderKind: r.girderKind,
    effect: r.effect,
    location: place(r.location),
    lanes: r.lanes,
    ...(r.loadedLanes !== undefined ? { loadedLanes: r.loadedLanes } : {}),
    value: r.value,
    ...(r.vehicle ? { vehicle: r.vehicle } : {}),
  };
}

/** The refined results of a version as its review summary reads them (server/api/reviews/refinedResults.ts). */
export interface RefinedResultsLike {
  factors: RefinedFactor[] | null;
  rows: FactorRow[] | null;
  source: string;
  note: string;
  solverVersion?: string;
  missing?: GrillageMissing;
}

/** The grillage part of a version's factors, or why there is none. */
export function refinedFactorsPart(refined: RefinedResultsLike): RefinedFactorsPart {
  if (!refined.factors || !refined.rows) return { available: false, missing: refined.missing ?? 'no-rows', note: refined.note };
  return {
    available: true,
    source: refined.source,
    solverVersion: refined.solverVersion ?? null,
    rows: refined.rows.map(refinedRow).filter((r): r is ComparedRefinedRow => r !== null),
    governing: refined.factors,
  };
}
