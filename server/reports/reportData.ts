/**
 * Everything the calculation package and the CSV exports print for one deck version: the
 * project, deck and version, who saved it and who reviews it, its review state, the deck
 * inputs, the code-method result (stored or computed), the refined-analysis summary, the
 * girder envelopes and the review record. Firm-scoped: another firm's ids answer 404.
 */
import { and, asc, eq } from 'drizzle-orm';
import type { Db } from '../db/client.js';
import { decks, deckVersions, projects, reviewRounds, users } from '../db/schema.js';
import { ApiError } from '../middleware/errors.js';
import type { Deck } from '../../shared/deck/schema.js';
import type { CodeFactorResult, FactorRow } from '../../shared/lrfd/index.js';
import { refinedResultsOf, type Requester } from '../api/reviews/refinedResults.js';
import type { UnitSystem } from '../../shared/units.js';
import { codeResultsOf, deckOf } from '../api/reviews/versionResults.js';
import { refinedSummaryOf, type RefinedSummary } from '../api/reviews/refinedSummary.js';
import { STATE_WORDS, type VersionReviewState } from '../api/reviews/reviewService.js';
import { girderEnvelopes, type GirderEnvelopes } from './envelopes.js';
import { conditionsWords, parseConditions } from '../../shared/review/claimConditions.js';
import type { RefinedPool } from '../compute/refinedPool.js';

export interface ReportData {
  generatedAt: string;
  units: UnitSystem;
  project: { id: number; name: string; ownerAgency: string; location: string };
  deck: { id: number; name: string };
  version: { id: number; number: number; message: string; createdAt: string; latestNumber: number };
  author: { name: string; email: string };
  reviewer: { name: string; email: string } | null;
  status: { state: VersionReviewState; label: string; decidedAt: string | null; decisionNote: string | null };
  /** The reviewer's refined-analysis decision, with the sentence of the conditions it was recorded under (null when recorded before they were kept). */
  refinedDecision: { justified: boolean; reason: string; at: string | null; conditions: string | null } | null;
  rounds: { id: number; state: string; label: string; submittedBy: string; reviewer: string; submittedAt: string; decidedAt: string | null; note: string | null }[];
  input: Deck;
  code: CodeFactorResult;
  solverVersion: string;
  resultSource: 'stored' | 'computed';
  summary: RefinedSummary;
  /** Every refined (grillage) row, each lane case, or null when there is none. */
  refinedRows: FactorRow[] | null;
  envelopes: GirderEnvelopes[];
}

/** The sentence of a decision's stored conditions (shared/review/claimConditions.ts), or null. */
function conditionsSentence(text: string | null): string | null {
  const c = parseConditions(text);
  return c ? conditionsWords(c) : null;
}

function name(db: Db, id: number | null) {
  if (id === null) return null;
  return db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, id)).get() ?? { name: '', email: '' };
}

/** `requester`: the user asking (recorded with a refined job the call starts). */
export async function reportData(db: Db, pool: RefinedPool, firmId: number, deckId: number, versionNumber: number, requester: Requester | null = null): Promise<ReportData> {
  const row = db
    .select({ v: deckVersions, d: decks, p: projects })
    .from(deckVersions)
    .innerJoin(decks, eq(decks.id, deckVersions.deckId))
    .innerJoin(projects, eq(projects.id, decks.projectId))
    .where(and(eq(decks.id, deckId), eq(deckVersions.number, versionNumber), eq(projects.firmId, firmId)))
    .get();
  if (!row) throw ApiError.notFound(`version ${versionNumber} of deck ${deckId}`);
  const latestNumber = db.select({ n: deckVersions.number }).from(deckVersions).where(eq(deckVersions.deckId, deckId)).all().reduce((m, r) => Math.max(m, r.n), 0);
  const rounds = db.select().from(reviewRounds).where(eq(reviewRounds.versionId, row.v.id)).orderBy(asc(reviewRounds.id)).all();
  const current = [...rounds].reverse().find((r) => r.state !== 'withdrawn');
  const state: VersionReviewState = current ? current.state : 'in-progress';
  const code = codeResultsOf(db, row.v);
  const input = deckOf(row.v);
  const refined = await refinedResultsOf(db, pool, row.v, requester);
  return {
    generatedAt: new Date().toISOString(),
    units: row.p.units,
    project: { id: row.p.id, name: row.p.name, ownerAgency: row.p.ownerAgency, location: row.p.location },
    deck: { id: row.d.id, name: row.d.name },
    version: { id: row.v.id, number: row.v.number, message: row.v.message, createdAt: row.v.createdAt, latestNumber },
    author: name(db, row.v.createdBy)!,
    reviewer: current ? name(db, current.reviewerId) : null,
    status: { state, label: STATE_WORDS[state], decidedAt: current?.decidedAt ?? null, decisionNote: current?.decisionNote ?? null },
    refinedDecision: current && current.refinedJustified !== null ? { justified: current.refinedJustified, reason: current.refinedReason ?? '', at: current.refinedDecidedAt, conditions: conditionsSentence(current.refinedConditions) } : null,
    rounds: rounds.map((r) => ({
      id: r.id,
      state: r.state,
      label: STATE_WORDS[r.state],
      submittedBy: name(db, r.submittedBy)!.name,
      reviewer: name(db, r.reviewerId)!.name,
      submittedAt: r.createdAt,
      decidedAt: r.decidedAt,
      note: r.decisionNote,
    })),
    input,
    code: code.result,
    solverVersion: code.solverVersion,
    resultSource: code.source,
    summary: await refinedSummaryOf(db, pool, row.v, refined),
    refinedRows: refined.rows,
    envelopes: girderEnvelopes(input, code.result),
  };
}
