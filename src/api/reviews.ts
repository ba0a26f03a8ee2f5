/** Review rounds of deck versions (see server/api/reviews): submit, comment, decide, withdraw. */
import { http, request, requestFile, requestWithStatus, type DownloadedFile } from './http';
import type { Page, PersonRef, UnitSystem } from './types';
import type { RefinedClaimConditions } from '@shared/review/claimConditions';

export type ReviewState = 'awaiting-review' | 'approved' | 'sent-back' | 'withdrawn';
export type VersionReviewState = ReviewState | 'in-progress';

export const REVIEW_STATE_LABELS: Record<VersionReviewState, string> = {
  'in-progress': 'in progress',
  'awaiting-review': 'awaiting review',
  approved: 'approved',
  'sent-back': 'sent back',
  withdrawn: 'withdrawn',
};

export const ANCHOR_EFFECTS = ['moment', 'negative-moment', 'shear', 'reaction', 'fatigue-moment', 'fatigue-shear', 'deflection'] as const;
export const ANCHOR_METHODS = ['formula', 'lever-rule', 'rigid-section', 'equal-share', 'interior-minimum', 'grillage', 'governing'] as const;
export type AnchorEffect = (typeof ANCHOR_EFFECTS)[number];
export type AnchorMethod = (typeof ANCHOR_METHODS)[number];

export interface CommentAnchor {
  girder?: number;
  effect?: AnchorEffect;
  method?: AnchorMethod;
  lanes?: 'one' | 'multiple';
}

export interface ReviewComment {
  id: number;
  roundId: number;
  parentId: number | null;
  author: PersonRef;
  body: string;
  anchor: CommentAnchor | null;
  anchorText: string;
  createdAt: string;
}

export interface ReviewSummary {
  id: number;
  state: ReviewState;
  stateLabel: string;
  project: { id: number; name: string; units: UnitSystem };
  deck: { id: number; name: string };
  version: { id: number; number: number; girderCount: number; message: string; createdAt: string; createdBy: PersonRef; isLatest: boolean; latestNumber: number };
  submittedBy: PersonRef;
  reviewer: PersonRef;
  previousRoundId: number | null;
  nextRoundId: number | null;
  submissionNote: string;
  decision: { outcome: 'approve' | 'send-back'; note: string; by: PersonRef; at: string | null } | null;
  /** The reviewer's refined-analysis decision, with what the refined rows could back when it was recorded (null for decisions recorded before that was kept). */
  refinedAnalysis: { justified: boolean; reason: string; at: string | null; label: string; conditions: RefinedClaimConditions | null; conditionsWords: string | null } | null;
  commentCount: number;
  createdAt: string;
  updatedAt: string;
  allowed: { comment: boolean; decide: boolean; withdraw: boolean; resubmit: boolean };
}

export interface EarlierRound {
  id: number;
  versionNumber: number;
  state: ReviewState;
  stateLabel: string;
  decisionNote: string | null;
  decidedAt: string | null;
  comments: ReviewComment[];
}

export interface ReviewDetail extends ReviewSummary {
  comments: ReviewComment[];
  earlierRounds: EarlierRound[];
}

export interface Finding {
  code: string;
  message: string;
  article: string;
  parameter?: string;
  value?: number;
  limit?: number;
  unit?: string;
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
    effects: { girder: string; effect: string; location: string; method: string; lanes: string; baseValue: number; skewFactor: number; value: number; changePercent: number }[];
  };
  governing: { girder: string; effect: string; location: string; value: number; reason: string }[];
  refined: {
    available: boolean;
    note: string;
    source: string;
    /** The loads the refined factors were searched under, in words. */
    loads: string;
    ratios: { girder: number; girderKind: string; effect: string; locationKey: string; location: string; refined: number; code: number; ratio: number; vehicle?: string; bound?: { lanes: number; percent: number; meetsTarget: boolean } }[];
    momentReductions: { girder: number; girderKind: string; locationKey: string; location: string; code: number; refined: number; perLaneMoment: number; codeMoment: number; refinedMoment: number; reduction: number; reductionPercent: number; claimable: boolean; claim: string; designGirder: number; withheld: string[]; bound?: { lanes: number; percent: number; meetsTarget: boolean }; convergence?: { segmentsPerSpan: number; value: number; change: number; within: boolean } }[];
    largestReduction: { girder: number; girderKind: string; location: string; reductionPercent: number; reduction: number } | null;
  };
  indicators: string[];
}

export interface Reviewer {
  id: number;
  name: string;
  email: string;
}

export interface DeckReviewStatus {
  deckId: number;
  versions: { versionId: number; number: number; state: VersionReviewState; stateLabel: string; roundId: number | null }[];
  page: Page;
  latestApprovedNumber: number | null;
}

export type ReviewView = 'assigned' | 'submitted' | 'all';

/** A page of review rounds, most recently changed first. */
export async function listReviews(query: { view?: ReviewView; state?: ReviewState; deckId?: number; cursor?: string } = {}): Promise<{ reviews: ReviewSummary[]; page: Page }> {
  return http.get<{ reviews: ReviewSummary[]; page: Page }>('/api/reviews', query);
}

export async function getReview(reviewId: number): Promise<{ review: ReviewDetail; summary: RefinedSummary }> {
  return http.get<{ review: ReviewDetail; summary: RefinedSummary }>(`/api/reviews/${reviewId}`);
}

/** A computation of the server's worker pools (server/compute/jobRecords.ts). */
export interface ComputeJob {
  id: number;
  /** Where to poll it. */
  url: string;
  kind: 'refined' | 'package';
  state: 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
  solverVersion: string;
  requestedBy: PersonRef | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  runMs: number | null;
  error: string | null;
  /** Where a running refined job is (null when not running, or not said yet). */
  progress: { phase: 'model' | 'search' | 'refine' | 'convergence'; done: number; total: number } | null;
}

/**
 * The round at once: with its summary when the version's refined result is stored, or (202)
 * with the refined job the summary waits for, to poll with `getJob`.
 */
/** Why the server could not start the refined run now (a limit, or a full pool). */
export interface RefinedRefusal {
  code: string;
  message: string;
  retryAfterSeconds: number | null;
}

export async function getReviewWithoutWaiting(
  reviewId: number,
): Promise<{ review: ReviewDetail; summary: RefinedSummary | null; job: ComputeJob | null; refusal: RefinedRefusal | null }> {
  const { status, body } = await requestWithStatus<{ review: ReviewDetail; summary: RefinedSummary | null; job?: ComputeJob | null; refusal?: RefinedRefusal }>(`/api/reviews/${reviewId}`, {
    headers: { Prefer: 'respond-async' },
  });
  return { review: body.review, summary: status === 202 ? null : body.summary, job: status === 202 ? (body.job ?? null) : null, refusal: body.refusal ?? null };
}

export async function getJob(url: string): Promise<ComputeJob> {
  return (await http.get<{ job: ComputeJob }>(url)).job;
}

/** Stops a queued or running refined job (its requester, or an administrator); answers the cancelled job. */
export async function cancelJob(job: Pick<ComputeJob, 'url'>): Promise<ComputeJob> {
  return (await http.post<{ job: ComputeJob }>(`${job.url}/cancel`, {})).job;
}

/** A job that is still queued or running. */
export const jobIsLive = (job: Pick<ComputeJob, 'state'>) => job.state === 'queued' || job.state === 'running';

/** A report file of a version, or the refined job it waits for (the server answers 202 while that runs). */
export async function requestReportFile(url: string): Promise<{ file: DownloadedFile; job: null } | { file: null; job: ComputeJob }> {
  const answer = await requestFile<{ job: ComputeJob }>(url, { headers: { Prefer: 'respond-async' } });
  return answer.status === 202 ? { file: null, job: answer.body.job } : { file: answer.file, job: null };
}

export async function listReviewers(): Promise<Reviewer[]> {
  const { reviewers } = await http.get<{ reviewers: Reviewer[] }>('/api/reviews/reviewers');
  return reviewers;
}

/** The review state of a page of the deck's versions (newest first). */
export async function deckReviewStatus(deckId: number, cursor?: string): Promise<DeckReviewStatus> {
  return http.get<DeckReviewStatus>('/api/reviews/status', cursor ? { deckId, cursor } : { deckId });
}

export async function submitForReview(input: { versionId: number; reviewerId: number; note?: string }): Promise<ReviewSummary> {
  const { review } = await http.post<{ review: ReviewSummary }>('/api/reviews', input);
  return review;
}

export async function addComment(reviewId: number, input: { body: string; anchor?: CommentAnchor; parentId?: number }): Promise<ReviewComment> {
  const { comment } = await http.post<{ comment: ReviewComment }>(`/api/reviews/${reviewId}/comments`, input);
  return comment;
}

export async function recordRefinedDecision(reviewId: number, input: { justified: boolean; reason: string }): Promise<ReviewSummary> {
  const { review } = await request<{ review: ReviewSummary }>(`/api/reviews/${reviewId}/refined-analysis`, { method: 'PUT', body: input });
  return review;
}

export async function decide(reviewId: number, input: { outcome: 'approve' | 'send-back'; note: string }): Promise<ReviewSummary> {
  const { review } = await http.post<{ review: ReviewSummary }>(`/api/reviews/${reviewId}/decision`, input);
  return review;
}

export async function withdraw(reviewId: number): Promise<ReviewSummary> {
  const { review } = await http.post<{ review: ReviewSummary }>(`/api/reviews/${reviewId}/withdraw`);
  return review;
}

/** Download links of a version's calculation package and CSV tables (same-origin GET with the session cookie). */
export function reportLinks(deckId: number, versionNumber: number) {
  const base = `/api/reports/decks/${deckId}/versions/${versionNumber}`;
  return { pdf: `${base}/package.pdf`, factors: `${base}/factors.csv`, envelopes: `${base}/envelopes.csv` };
}
