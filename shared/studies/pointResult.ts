/**
 * One study point's result in short: for the interior and the exterior girder, for moment
 * and shear, the governing factor and the largest value of each method (empirical formula,
 * lever rule, rigid section, grillage), read from the rows of `computeCodeFactors` (and of
 * the refined run when the point had one), with whether the point's rows carry an
 * out-of-range or fallback finding (shared/findings/levels.ts).
 *
 * Units: factors are lane fractions (dimensionless); the point's parameter values are
 * internal SI (see sweep.ts).
 */
import { computeCodeFactors, type FactorEffect, type FactorMethod, type FactorRow, type GirderKind } from '../lrfd/factors.js';
import { assertDeck, DeckInputError, type DeckInput } from '../deck/schema.js';
import { findingLevel } from '../findings/levels.js';

export const STUDY_EFFECTS = ['moment', 'shear'] as const satisfies readonly FactorEffect[];
export type StudyEffect = (typeof STUDY_EFFECTS)[number];
export const STUDY_GIRDERS = ['interior', 'exterior'] as const satisfies readonly GirderKind[];
export const STUDY_METHODS = ['formula', 'lever-rule', 'rigid-section', 'grillage'] as const satisfies readonly FactorMethod[];
export type StudyMethod = (typeof STUDY_METHODS)[number];

/** One girder kind and effect at one point. */
export interface StudyValue {
  /** The governing factor over every location and lane case (code methods). */
  governing: number;
  /** Method of the governing factor. */
  governingMethod: FactorMethod;
  /** Largest value of each method over the locations and lane cases (absent where the method gives none). */
  byMethod: Partial<Record<StudyMethod, number>>;
  /** Some row of this girder kind and effect carries an out-of-range finding (formula used outside its range). */
  outOfRange: boolean;
  /** Some row carries a fallback finding (the code's other method replaced the formula). */
  fallback: boolean;
  /** The messages of those findings, each once. */
  rangeMessages: string[];
}

export type StudyKey = `${GirderKind}/${StudyEffect}`;

export interface PointSummary {
  values: Partial<Record<StudyKey, StudyValue>>;
  /** Whether the grillage ran at this point. */
  refined: boolean;
  /** Why the grillage could not run here (the deck's own message), if it was asked for and failed. */
  refinedError?: string;
}

export const studyKey = (girder: GirderKind, effect: StudyEffect): StudyKey => `${girder}/${effect}`;

function valueOf(code: FactorRow[], refined: FactorRow[] | null, girder: GirderKind, effect: StudyEffect): StudyValue | undefined {
  const mine = (rows: FactorRow[]) => rows.filter((r) => r.girderKind === girder && r.effect === effect);
  const rows = mine(code);
  const governingRows = rows.filter((r) => r.governing);
  if (governingRows.length === 0) return undefined;
  const gov = governingRows.reduce((a, b) => (b.value > a.value ? b : a));
  const byMethod: Partial<Record<StudyMethod, number>> = {};
  for (const r of rows.concat(refined ? mine(refined) : [])) {
    const m = r.method as StudyMethod;
    if (!STUDY_METHODS.includes(m)) continue;
    byMethod[m] = Math.max(byMethod[m] ?? -Infinity, r.value);
  }
  const ranged = rows.flatMap((r) => r.findings).filter((f) => findingLevel(f) === 'out-of-range');
  return {
    governing: gov.value,
    governingMethod: gov.method,
    byMethod,
    outOfRange: ranged.some((f) => f.code === 'out-of-range'),
    fallback: ranged.some((f) => f.code === 'fallback'),
    rangeMessages: [...new Set(ranged.map((f) => f.message))],
  };
}

/** The summary of code rows (and refined rows, or null). */
export function summarizeRows(code: FactorRow[], refined: FactorRow[] | null, refinedError?: string): PointSummary {
  const values: PointSummary['values'] = {};
  for (const g of STUDY_GIRDERS) {
    for (const e of STUDY_EFFECTS) {
      const v = valueOf(code, refined, g, e);
      if (v) values[studyKey(g, e)] = v;
    }
  }
  return { values, refined: refined !== null, ...(refinedError !== undefined ? { refinedError } : {}) };
}

/** Whether a point's formulas left their range (for the grillage choice 'outside-range'). */
export function leavesRange(summary: PointSummary): boolean {
  return Object.values(summary.values).some((v) => v !== undefined && (v.outOfRange || v.fallback));
}

/** A point's code result: its summary, or the deck's own error messages when the deck is invalid there. */
export type CodePointOutcome = { ok: true; summary: PointSummary; code: FactorRow[] } | { ok: false; error: string };

export function computeCodePoint(deck: DeckInput): CodePointOutcome {
  try {
    const result = computeCodeFactors(assertDeck(deck));
    return { ok: true, summary: summarizeRows(result.factors, null), code: result.factors };
  } catch (e) {
    if (e instanceof DeckInputError) return { ok: false, error: e.message };
    throw e;
  }
}
