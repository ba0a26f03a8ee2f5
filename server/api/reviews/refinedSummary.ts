/**
 * The refined-analysis summary a reviewer reads before deciding whether a refined analysis
 * is justified for a deck version:
 * - every range-of-applicability violation, fallback and cap of the code's approximate
 *   methods (findings of the code-method result, AASHTO LRFD Art. 4.6.2.2);
 * - the skew at each support and what its corrections did to the governing factors (moment
 *   reduction, Art. 4.6.2.2.2e; shear correction, Art. 4.6.2.2.3c);
 * - refined / code ratios per girder and effect, where a refined (grillage) result exists;
 * - the possible reduction in the girder live-load moment if the refined factors were used:
 *   the girder LL+IM moment is g × the per-lane LL+IM moment (Art. 4.6.2.2), so for the same
 *   beam line the reduction is (g_code − g_refined) / g_code of it; the per-lane maximum
 *   positive moment of the span comes from the HL-93 beam-line envelope (Art. 3.6.1.3.1).
 *
 * Factors are dimensionless (lanes per girder); moments N·m (internal SI).
 */
import type { Db } from '../../db/client.js';
import type { DeckVersionRow } from '../../db/schema.js';
import type { Finding } from '../../../shared/lrfd/findings.js';
import type { CodeFactorResult, FactorEffect, FactorRow, GirderKind } from '../../../shared/lrfd/index.js';
import { codeResultsOf, deckOf } from './versionResults.js';
import { refinedResultsOf, storedRefinedResults, type RefinedResults, type Requester } from './refinedResults.js';
import { claimConditions, type RefinedClaimConditions } from '../../../shared/review/claimConditions.js';
import type { Deck } from '../../../shared/deck/schema.js';
import { loadingWords } from '../../../shared/grillage/refinedLoads.js';
import type { RefinedPool } from '../../compute/refinedPool.js';
import { perLaneMaxMoment } from '../../reports/envelopes.js';
import { codeFactorForGirder, isRatioEffect, largestClaimableReduction, momentReductionTable, type MomentReduction, type RatioEffect } from '../../../shared/review/reductions.js';

export { codeFactorForGirder, type MomentReduction };

export const CAUTION = 'Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';

const RANGE_CODES = new Set(['out-of-range', 'fallback', 'capped']);

export interface SkewEffect {
  girder: GirderKind;
  effect: FactorEffect;
  location: string;
  method: string;
  lanes: string;
  /** Factor before the skew correction. */
  baseValue: number;
  /** Multiplier (< 1 a moment reduction, > 1 a shear increase). */
  skewFactor: number;
  value: number;
  /** (value − base) / base, percent. */
  changePercent: number;
}

export interface RatioRow {
  /** Girder number, 1 = left exterior. */
  girder: number;
  girderKind: GirderKind;
  effect: RatioEffect;
  /** Location key of the code result ("span1", "support2"). */
  locationKey: string;
  location: string;
  refined: number;
  code: number;
  /** refined / code. */
  ratio: number;
  /** The load that governs the refined factor (absent on results stored before rows named it). */
  vehicle?: string;
  /** The refined factor's stated bound (absent on results stored before bounds were kept). */
  bound?: FactorRow['bound'];
}

export interface RefinedSummary {
  caution: string;
  solverVersion: string;
  source: 'stored' | 'computed';
  deckName: string;
  girderCount: number;
  rangeFindings: Finding[];
  otherFindings: Finding[];
  skew: {
    supports: number[];
    largest: number;
    words: string;
    effects: SkewEffect[];
  };
  governing: { girder: GirderKind; effect: FactorEffect; location: string; value: number; reason: string }[];
  refined: {
    available: boolean;
    /** Why no refined result is shown, when none is. */
    note: string;
    source: string;
    /** The loads the refined factors were searched under (the deck's refinedLoading), in words. */
    loads: string;
    ratios: RatioRow[];
    momentReductions: MomentReduction[];
    /** The largest reduction among the claimable rows of momentReductions (reductions.ts), or null. */
    largestReduction: MomentReduction | null;
  };
  /** A short reading of the figures for the reviewer (not a decision). */
  indicators: string[];
}

function governingRow(code: CodeFactorResult, girder: GirderKind, effect: FactorEffect, locationKey: string): FactorRow | undefined {
  const g = code.governing.find((x) => x.girder === girder && x.effect === effect && x.location.key === locationKey);
  return g ? code.factors.find((r) => r.id === g.rowId) : undefined;
}

function skewWords(skews: number[]): string {
  const largest = Math.max(...skews.map(Math.abs));
  if (largest === 0) return 'The supports are square (no skew): no skew corrections apply.';
  const list = skews.map((s, i) => `support ${i + 1}: ${Math.abs(s).toFixed(1)}°`).join(', ');
  if (largest < 30) return `Skew ${list}. Below 30° the moment reduction is nil (c1 = 0, Table 4.6.2.2.2e-1); the shear correction of Table 4.6.2.2.3c-1 still applies at the obtuse corners.`;
  return `Skew ${list}. The moment reduction of Table 4.6.2.2.2e-1 and the shear correction of Table 4.6.2.2.3c-1 both apply${largest > 60 ? '; θ above 60° is taken as 60° for the moment reduction' : ''}.`;
}

/** The moment-reduction table of a version's refined results (empty when there are none): one table for the summary and for a decision's conditions. */
function reductionsOf(code: CodeFactorResult, deck: Deck, refined: RefinedResults): MomentReduction[] {
  if (!refined.factors) return [];
  return momentReductionTable(code, refined.factors, (span) => perLaneMaxMoment(deck, span), {
    diaphragmsLeftOut: deck.diaphragms.type !== 'none' && deck.diaphragms.includeInGrillage === false,
    panelAspect: refined.panelAspect ?? null,
  });
}

/**
 * What the version's stored refined results could back now, for a refined-analysis decision
 * recorded now (never starts a run: a reviewer decides on what was shown).
 */
export function decisionConditions(db: Db, v: DeckVersionRow): RefinedClaimConditions {
  const refined = storedRefinedResults(db, v);
  if (!refined || !refined.factors) {
    return claimConditions([], { available: false, note: refined?.note || 'no refined (grillage) result was stored for this version when the decision was recorded', solverVersion: refined?.solverVersion ?? null, panelAspect: null });
  }
  const { result: code } = codeResultsOf(db, v);
  return claimConditions(reductionsOf(code, deckOf(v), refined), { available: true, note: '', solverVersion: refined.solverVersion ?? null, panelAspect: refined.panelAspect ?? null });
}

/** The summary of version `v`; `refined` when the caller already has the version's refined results. */
export async function refinedSummaryOf(db: Db, pool: RefinedPool, v: DeckVersionRow, refinedKnown?: RefinedResults, requester: Requester | null = null): Promise<RefinedSummary> {
  const { result: code, solverVersion, source } = codeResultsOf(db, v);
  const refined = refinedKnown ?? (await refinedResultsOf(db, pool, v, requester));
  return summaryOf(code, deckOf(v), refined, { solverVersion, source });
}

/**
 * The summary from a version's code result, deck and refined results (pure: the review, the
 * package and the tests read it so). Every factor in it is passed through from those results:
 * the code's governing values, and the refined results' governing factor per girder (their
 * `factors`, governingPerGirder of the rows) beside the code's governing value of its kind.
 */
export function summaryOf(code: CodeFactorResult, deck: Deck, refined: RefinedResults, meta: { solverVersion: string; source: 'stored' | 'computed' }): RefinedSummary {
  const skews = code.derived.skews;
  const reductions = reductionsOf(code, deck, refined);
  const largest = largestClaimableReduction(reductions);
  const rangeFindings = code.findings.filter((f) => RANGE_CODES.has(f.code));
  return {
    caution: CAUTION,
    solverVersion: meta.solverVersion,
    source: meta.source,
    deckName: code.deckName,
    girderCount: code.derived.girderCount,
    rangeFindings,
    otherFindings: code.findings.filter((f) => !RANGE_CODES.has(f.code)),
    skew: { supports: skews, largest: Math.max(...skews.map(Math.abs)), words: skewWords(skews), effects: skewEffects(code) },
    governing: code.governing.map((g) => ({ girder: g.girder, effect: g.effect, location: g.location.description, value: g.value, reason: g.reason })),
    refined: {
      available: refined.factors !== null,
      note: refined.note,
      source: refined.source,
      loads: loadingWords(deck.refinedLoading).formula,
      ratios: ratioRows(code, refined),
      momentReductions: reductions,
      largestReduction: largest,
    },
    indicators: indicatorsOf(rangeFindings, skews, reductions, largest),
  };
}

/** What the skew corrections did to each governing factor they changed. */
function skewEffects(code: CodeFactorResult): SkewEffect[] {
  const effects: SkewEffect[] = [];
  for (const g of code.governing) {
    const row = code.factors.find((r) => r.id === g.rowId);
    if (!row || Math.abs(row.skewFactor - 1) < 1e-12) continue;
    effects.push({
      girder: g.girder,
      effect: g.effect,
      location: g.location.description,
      method: row.method,
      lanes: row.lanes,
      baseValue: row.baseValue,
      skewFactor: row.skewFactor,
      value: row.value,
      changePercent: ((row.value - row.baseValue) / row.baseValue) * 100,
    });
  }
  return effects;
}

/** Each girder's governing refined factor beside the code's governing value of its kind and place. */
function ratioRows(code: CodeFactorResult, refined: RefinedResults): RatioRow[] {
  const ratios: RatioRow[] = [];
  for (const f of refined.factors ?? []) {
    if (!isRatioEffect(f.effect)) continue;
    const c = codeFactorForGirder(code, f.girder, code.derived.girderCount, f.effect, f.locationKey);
    if (!c || c.value <= 0) continue;
    ratios.push({ girder: f.girder, girderKind: c.kind, effect: f.effect, locationKey: f.locationKey, location: f.location, refined: f.value, code: c.value, ratio: f.value / c.value, ...(f.vehicle ? { vehicle: f.vehicle } : {}), ...(f.bound ? { bound: f.bound } : {}) });
  }
  return ratios;
}

const WITHHELD_INDICATOR_WORDS: Record<string, string> = {
  'bound-misses-target': 'their stated bounds miss the target of 0.005 lanes and 0.5 %',
  'bound-unknown': 'the stored result predates bound statements',
  'convergence-unknown': 'the mesh was not checked at twice its density',
  'mesh-unconverged': 'the factors change by more than 1 % at twice the mesh density',
  'diaphragms-left-out': 'the grillage leaves out the deck’s diaphragms or cross-frames',
  'mesh-aspect-ratio': 'a grid panel of the mesh is more elongated than Art. 4.6.3.3.1 allows (aspect ratio above 5.0)',
};

/** A short reading of the figures for the reviewer (not a decision). */
function indicatorsOf(rangeFindings: Finding[], skews: number[], reductions: MomentReduction[], largest: MomentReduction | null): string[] {
  const indicators: string[] = [];
  const fallbacks = rangeFindings.filter((f) => f.code === 'fallback').length;
  const outside = rangeFindings.filter((f) => f.code === 'out-of-range').length;
  if (outside > 0) indicators.push(`${outside} range-of-applicability violation${outside === 1 ? '' : 's'}: the empirical formulas were used outside their ranges (Art. 4.6.2.2.1 calls for a refined analysis or engineering judgement there).`);
  if (fallbacks > 0) indicators.push(`${fallbacks} fallback${fallbacks === 1 ? '' : 's'} to the lever rule or another method.`);
  if (outside === 0 && fallbacks === 0) indicators.push('Every formula was used within its range of applicability.');
  const maxSkew = Math.max(...skews.map(Math.abs));
  if (maxSkew >= 30) indicators.push(`Skew up to ${maxSkew.toFixed(1)}°: the approximate skew corrections are significant here.`);
  if (largest) {
    indicators.push(
      largest.reductionPercent > 0
        ? `The refined factors would lower the governing ${largest.girderKind} girder's LL+IM moment by ${largest.reductionPercent.toFixed(1)} % (girder ${largest.girder}, ${largest.location}).`
        : `The refined factors do not lower the governing girder moments (the code's factors are not conservative here by ${(-largest.reductionPercent).toFixed(1)} %).`,
    );
  }
  const withheld = reductions.filter((r) => r.designGirder === r.girder && !r.claimable);
  if (!largest && withheld.length) {
    const why = [...new Set(withheld.flatMap((r) => r.withheld))];
    indicators.push(`The refined moment factors cannot back a reduction: ${why.map((w) => WITHHELD_INDICATOR_WORDS[w] ?? w).join('; ')} (see the reduction table).`);
  }
  return indicators;
}

export { governingRow };
