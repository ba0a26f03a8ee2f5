/**
 * The conditions a reviewer's refined-analysis decision was recorded under: what the refined
 * (grillage) rows of the version could back at that moment — how many design rows could claim
 * a reduction, why the others could not, the largest claimable reduction — so the decision is
 * kept with the evidence it was made on, even if the product's rules or the stored result
 * change later. Built from the same reduction table as the review summary (reductions.ts).
 * Units: percentages of the code moment; factors dimensionless.
 * Pure: used by the server when the decision is recorded and by the client and the package to
 * print it.
 */
import { BOUND_TARGET_LANES, BOUND_TARGET_PERCENT } from '../placement/search.js';
import { largestClaimableReduction, withheldWords, type MomentReduction, type PanelAspectFact, type WithheldReason } from './reductions.js';

export interface RefinedClaimConditions {
  /** When the conditions were taken (ISO time). */
  at: string;
  /** Whether refined rows were there to judge (stored with the version). */
  refinedAvailable: boolean;
  /** Why none were, when none were. */
  note: string;
  /** The solver version of the refined result, when there was one. */
  solverVersion: string | null;
  boundTarget: { lanes: number; percent: number };
  /** Design rows of the reduction table (one per girder kind and span) and how many of them were claimable. */
  designRows: number;
  claimableRows: number;
  /** Each reason design rows were withheld for, with how many and the words of the first. */
  withheld: { reason: WithheldReason; rows: number; words: string }[];
  /** The largest claimable reduction, or null. */
  largestReduction: { girder: number; location: string; percent: number } | null;
  /** The mesh's over-elongated panel, when there was one. */
  panelAspect: PanelAspectFact | null;
}

/** The conditions of a decision taken now over `reductions` (empty when no refined rows were available). */
export function claimConditions(
  reductions: readonly MomentReduction[],
  refined: { available: boolean; note: string; solverVersion: string | null; panelAspect: PanelAspectFact | null },
  at: string = new Date().toISOString(),
): RefinedClaimConditions {
  const design = reductions.filter((r) => r.designGirder === r.girder);
  const withheld = new Map<WithheldReason, { rows: number; words: string }>();
  for (const r of design) {
    for (const w of r.withheld) {
      const seen = withheld.get(w);
      if (seen) seen.rows++;
      else withheld.set(w, { rows: 1, words: withheldWords(w, r) });
    }
  }
  const largest = largestClaimableReduction(reductions);
  return {
    at,
    refinedAvailable: refined.available,
    note: refined.note,
    solverVersion: refined.solverVersion,
    boundTarget: { lanes: BOUND_TARGET_LANES, percent: BOUND_TARGET_PERCENT },
    designRows: design.length,
    claimableRows: design.filter((r) => r.claimable).length,
    withheld: [...withheld].map(([reason, v]) => ({ reason, ...v })),
    largestReduction: largest ? { girder: largest.girder, location: largest.location, percent: largest.reductionPercent } : null,
    panelAspect: refined.panelAspect,
  };
}

/** The conditions in one sentence, as the review page, the audit trail and the package print them. */
export function conditionsWords(c: RefinedClaimConditions): string {
  if (!c.refinedAvailable) return `Recorded without refined results: ${c.note || 'none were computed for this version yet'}.`;
  const rows = `${c.claimableRows} of ${c.designRows} design moment row${c.designRows === 1 ? '' : 's'} could back a reduction`;
  const largest = c.largestReduction
    ? `; the largest claimable reduction was ${c.largestReduction.percent.toFixed(1)} % (girder ${c.largestReduction.girder}, ${c.largestReduction.location})`
    : '; no reduction could be claimed';
  const why = c.withheld.length ? `; withheld: ${c.withheld.map((w) => `${w.rows} row${w.rows === 1 ? '' : 's'} because ${w.words}`).join('; ')}` : '';
  return `Recorded with the refined results of solver ${c.solverVersion ?? 'unknown'}: ${rows}${largest}${why}.`;
}

/** Reads conditions stored as JSON (null for decisions recorded before conditions were kept, or unreadable text). */
export function parseConditions(text: string | null | undefined): RefinedClaimConditions | null {
  if (!text) return null;
  try {
    const c = JSON.parse(text) as RefinedClaimConditions;
    return typeof c === 'object' && c !== null && typeof c.refinedAvailable === 'boolean' && Array.isArray(c.withheld) ? c : null;
  } catch {
    return null;
  }
}
