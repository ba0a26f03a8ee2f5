/**
 * The words the screens and reports use for a factor's effect, method, lane case and place,
 * and the one way a factor is written as a number (4 decimals, as the review summary and the
 * calculation package print it), a ratio of factors (3 decimals) and a stated bound. One
 * source, so a label or a rounding never differs between the workspace, the review, the
 * training screens, the version comparison and the package.
 * Units: factors are dimensionless (lanes per girder).
 */
import type { FactorEffect, FactorMethod } from './factors.js';
import type { Lanes } from './formula.js';

/** Indexed by any effect id a stored result or a form holds; every effect of the engine has its words. */
export const EFFECT_LABELS: Readonly<Record<string, string>> = {
  moment: 'moment',
  'negative-moment': 'negative moment',
  shear: 'shear',
  reaction: 'reaction',
  'fatigue-moment': 'fatigue moment',
  'fatigue-shear': 'fatigue shear',
  deflection: 'deflection',
} satisfies Record<FactorEffect, string>;

export const METHOD_LABELS: Readonly<Record<string, string>> = {
  formula: 'empirical formula',
  'lever-rule': 'lever rule',
  'rigid-section': 'rigid section',
  'equal-share': 'equal share',
  'interior-minimum': 'not less than interior',
  grillage: 'grillage',
  governing: 'governing value',
} satisfies Record<FactorMethod | 'governing', string>;

export const LANE_LABELS: Readonly<Record<string, string>> = {
  one: 'one lane',
  multiple: 'two or more lanes',
} satisfies Record<Lanes, string>;

/** A factor as a number: 4 decimals; '—' only for a value that is not a number. */
export function factorText(v: number): string {
  return Number.isFinite(v) ? v.toFixed(4) : '—';
}

/** A ratio of two factors (grillage ÷ code): 3 decimals; '—' for a value that is not a number. */
export function ratioText(v: number | undefined): string {
  return v !== undefined && Number.isFinite(v) ? v.toFixed(3) : '—';
}

/**
 * A stated bound in words, "0.0020 lanes, 0.3 %", marked "± above target" when it misses the
 * target (such a factor never backs a claim): the review's ratio table and the package.
 */
export function boundText(b: { lanes: number; percent: number; meetsTarget?: boolean } | undefined): string {
  if (!b) return '—';
  return `${b.lanes.toFixed(4)} lanes, ${b.percent.toFixed(1)} %${b.meetsTarget === false ? ' ± above target' : ''}`;
}

/**
 * The place of a factor in words without the solver's note in parentheses: "support 1 (end
 * support)" → "support 1", "span 1 (support 2, left side)" → "span 1" (the comparison of
 * methods writes places so).
 */
export function placeWords(description: string): string {
  return description.replace(/ \(.*\)$/, '');
}
