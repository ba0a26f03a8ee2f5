/**
 * The results of one saved deck version, for reviews, reports and training: the results
 * stored with the version (analysis_results rows, newest of each method) where present, and
 * otherwise computed here with the shared solver from the version's deck (not stored: saving
 * results is the deck service's job). Versions and results are immutable, so both paths give
 * the same numbers for a given solver version.
 */
import type { Db } from '../../db/client.js';
import type { DeckVersionRow } from '../../db/schema.js';
import { newestResult } from '../../storage/storedResults.js';
import { assertDeck, type Deck } from '../../../shared/deck/schema.js';
import { girderOffsets } from '../../../shared/deck/geometry.js';
import { computeCodeFactors, type CodeFactorResult, type FactorRow } from '../../../shared/lrfd/index.js';
import { SOLVER_VERSION } from '../../../shared/version.js';

export function deckOf(v: Pick<DeckVersionRow, 'deckJson'>): Deck {
  return assertDeck(JSON.parse(v.deckJson));
}

export function girderCountOf(v: Pick<DeckVersionRow, 'deckJson'>): number {
  return girderOffsets(deckOf(v)).length;
}

/** The newest stored result of a method for a version, with its solver version, or null. */
export function storedResult(db: Db, versionId: number, method: string): { data: unknown; solverVersion: string } | null {
  return newestResult(db, versionId, method);
}

function looksLikeCodeResult(d: unknown): d is CodeFactorResult {
  if (typeof d !== 'object' || d === null) return false;
  const o = d as Record<string, unknown>;
  return Array.isArray(o.factors) && Array.isArray(o.governing) && typeof o.derived === 'object' && o.derived !== null;
}

export interface CodeResults {
  result: CodeFactorResult;
  solverVersion: string;
  /** 'stored': read from analysis_results; 'computed': computed now from the version's deck. */
  source: 'stored' | 'computed';
}

/** The code-method factors of a version. */
export function codeResultsOf(db: Db, v: DeckVersionRow): CodeResults {
  const stored = storedResult(db, v.id, 'code');
  if (stored && looksLikeCodeResult(stored.data)) return { result: stored.data, solverVersion: stored.solverVersion, source: 'stored' };
  return { result: computeCodeFactors(deckOf(v)), solverVersion: SOLVER_VERSION, source: 'computed' };
}

/**
 * The article a factor row rests on: that of the first trace step whose value is the row's
 * value before the skew correction (the method's own step; the skew steps come after it),
 * else the last step's.
 */
export function factorArticle(row: Pick<FactorRow, 'trace' | 'baseValue'>): string {
  const own = row.trace.find((s) => s.kind === 'none' && Math.abs(s.value - row.baseValue) <= 1e-12 * Math.max(1, Math.abs(row.baseValue)));
  return (own ?? row.trace[row.trace.length - 1])?.article ?? '';
}
