/**
 * How much a finding matters to the engineer reading a factor, in four levels shared by the
 * workspace, the review, the calculation package and the CSV (one rule, one answer):
 * - note: information only (a correction that does not apply, a member the model includes);
 * - assumption: a choice the engine or the owner made where the code leaves one open;
 * - warning: a value to check (a cap the code applies, a girder with no share, a refined
 *   bound that misses its target, a mesh check that fails);
 * - out of range or fallback: an input outside a formula's range of applicability, whether
 *   the formula was still used or the code's fallback (usually the lever rule) replaced it.
 * Common practice, no source: the levels are the product's reading of the finding codes of
 * shared/lrfd/findings.ts and of the grillage's findings (their `severity`).
 */

export type FindingLevel = 'note' | 'assumption' | 'warning' | 'out-of-range';

/** Mildest first. */
export const FINDING_LEVELS: readonly FindingLevel[] = ['note', 'assumption', 'warning', 'out-of-range'];

export const FINDING_LEVEL_WORDS: Record<FindingLevel, string> = {
  note: 'note',
  assumption: 'assumption',
  warning: 'warning',
  'out-of-range': 'out of range or fallback',
};

/** A short mark per level (distinct in shape, not only in colour). */
export const FINDING_LEVEL_MARKS: Record<FindingLevel, string> = {
  note: 'i',
  assumption: 'a',
  warning: '!',
  'out-of-range': '×',
};

const BY_CODE: Record<string, FindingLevel> = {
  'out-of-range': 'out-of-range',
  fallback: 'out-of-range',
  capped: 'warning',
  'no-share': 'warning',
  'loose-bound': 'warning',
  assumption: 'assumption',
  policy: 'assumption',
  'not-applicable': 'note',
};

/** The level of a finding: by its code, else by its severity (grillage findings: warning or info). */
export function findingLevel(f: { code: string; severity?: string }): FindingLevel {
  const byCode = BY_CODE[f.code];
  if (byCode) return byCode;
  return f.severity === 'warning' ? 'warning' : 'note';
}

/** The highest level among some findings, or null for none. */
export function worstFindingLevel(findings: readonly { code: string; severity?: string }[]): FindingLevel | null {
  let worst = -1;
  for (const f of findings) worst = Math.max(worst, FINDING_LEVELS.indexOf(findingLevel(f)));
  return worst < 0 ? null : FINDING_LEVELS[worst];
}
