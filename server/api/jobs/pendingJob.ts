/**
 * A client that would rather poll than wait (RFC 7240 `Prefer: respond-async`) is answered at
 * once with 202, the refined job its answer waits for and that job's address (`Location`,
 * GET /api/jobs/:jobId), while the job runs in the pool. The routes that wait for a version's
 * refined results use these: the review round, the calculation package and the CSV tables.
 */
import type { Request, Response } from 'express';
import type { Db } from '../../db/client.js';
import type { RefinedResults } from '../reviews/refinedResults.js';
import { findJob, jobViews, type JobView, type LiveJobs } from './jobRouter.js';

/** Whether the request asks to be answered without waiting. */
export function prefersAsync(req: Request): boolean {
  return /\brespond-async\b/i.test(req.get('Prefer') ?? '');
}

/**
 * The job refined results just started (startRefinedResults) still wait for, as the API shows
 * it, or null when they are stored or were refused. Nobody awaits the results of a pending
 * job here: the job records its own outcome and stores the result.
 */
export function pendingJobView(db: Db, live: Pick<LiveJobs, 'progressOf'>, firmId: number, started: { jobId: number | null; results: Promise<RefinedResults> }): JobView | null {
  if (started.jobId === null) return null;
  started.results.catch(() => undefined);
  return jobViews(db, [findJob(db, firmId, started.jobId)], live)[0];
}

/** Answers 202 with the job to follow, and `body`'s other fields. */
export function answerWithJob(res: Response, job: JobView, body: Record<string, unknown> = {}): void {
  res.status(202).location(job.url).json({ ...body, job });
}
