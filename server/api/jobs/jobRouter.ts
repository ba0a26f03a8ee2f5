/**
 * The computations the server's worker pools ran (or are running): the refined (grillage)
 * analysis and the calculation packages, each with its state, who asked, when it was queued,
 * started and ended, its worker time and, for a failed one, the reason its requester was given
 * (server/compute/jobRecords.ts). Readable by everyone who may read the project.
 * - GET /api/decks/:deckId/versions/:number/jobs — one version's jobs, newest first;
 * - GET /api/jobs/:jobId — one job: what a client polls after a 202 (its `Location`);
 * - POST /api/jobs/:jobId/cancel — stops a queued or running refined job (the user who asked
 *   for it, or an administrator); every request waiting for it is told who cancelled it.
 */
import { Router } from 'express';
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { computeJobs, deckVersions, decks, projects, users } from '../../db/schema.js';
import { versionParams } from '../decks/deckModel.js';
import { findVersionByNumber } from '../decks/deckService.js';
import { jobsOfVersion } from '../../compute/jobRecords.js';
import type { RefinedProgress } from '../../../shared/grillage/refinedFactors.js';

type JobRow = typeof computeJobs.$inferSelect;

/** The live refined jobs, as their pool knows them (server/compute/refinedPool.ts). */
export interface LiveJobs {
  progressOf(recordId: number): RefinedProgress | null;
  cancel(recordId: number, byName: string): boolean;
}

/** A job as the API shows it (requester by name, the address to poll, where a live refined run is). */
export function jobViews(db: Db, jobs: JobRow[], live?: Pick<LiveJobs, 'progressOf'>) {
  const ids = [...new Set(jobs.map((j) => j.requestedBy).filter((id): id is number => id !== null))];
  const names = new Map(ids.length ? db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)).all().map((u) => [u.id, u.name]) : []);
  return jobs.map((j) => ({
    id: j.id,
    url: `/api/jobs/${j.id}`,
    kind: j.kind,
    state: j.state,
    solverVersion: j.solverVersion,
    requestedBy: j.requestedBy === null ? null : { id: j.requestedBy, name: names.get(j.requestedBy) ?? '' },
    createdAt: j.createdAt,
    startedAt: j.startedAt,
    finishedAt: j.finishedAt,
    runMs: j.runMs,
    error: j.error,
    progress: j.state === 'running' && j.kind === 'refined' ? (live?.progressOf(j.id) ?? null) : null,
  }));
}
export type JobView = ReturnType<typeof jobViews>[number];

/** One job of the firm's, or 404. */
export function findJob(db: Db, firmId: number, jobId: number): JobRow {
  const row = db
    .select({ j: computeJobs })
    .from(computeJobs)
    .innerJoin(deckVersions, eq(deckVersions.id, computeJobs.versionId))
    .innerJoin(decks, eq(decks.id, deckVersions.deckId))
    .innerJoin(projects, eq(projects.id, decks.projectId))
    .where(and(eq(computeJobs.id, jobId), eq(projects.firmId, firmId)))
    .get();
  if (!row) throw ApiError.notFound('job');
  return row.j;
}

/** Cancels a queued or running refined job for `user`, or says why it cannot (403, 409). */
function cancelJob(db: Db, live: LiveJobs, user: Express.User, jobId: number): JobRow {
  const job = findJob(db, user.firmId, jobId);
  const who = `job ${job.id}`;
  if (job.state !== 'queued' && job.state !== 'running') {
    throw new ApiError(409, 'job_finished', `${who} is already ${job.state}; there is nothing to cancel.`, [{ path: 'jobId', message: `the job is ${job.state}` }]);
  }
  if (job.kind !== 'refined') {
    throw new ApiError(409, 'job_not_cancellable', `${who} lays out a calculation package, which takes a few seconds and cannot be cancelled; it ends by itself.`, [{ path: 'jobId', message: 'a package job cannot be cancelled' }]);
  }
  if (job.requestedBy !== user.id && !user.roles.includes('admin')) {
    throw ApiError.forbidden(`only the user who asked for ${who}, or an administrator, may cancel it`);
  }
  if (!live.cancel(job.id, user.name)) {
    throw new ApiError(409, 'job_finished', `${who} ended before it could be cancelled.`, [{ path: 'jobId', message: 'the job has ended' }]);
  }
  return findJob(db, user.firmId, jobId);
}

export function jobRouter(db: Db, live: LiveJobs): Router {
  const r = Router();
  const params = validate({ params: idParams('jobId') });
  r.get('/:jobId', allow('project:read'), params, (req, res) => {
    res.json({ job: jobViews(db, [findJob(db, req.user!.firmId, res.locals.params.jobId)], live)[0] });
  });
  r.post('/:jobId/cancel', allow('project:read'), params, (req, res) => {
    res.json({ job: jobViews(db, [cancelJob(db, live, req.user!, res.locals.params.jobId)], live)[0] });
  });
  return r;
}

export function versionJobsRouter(db: Db, live: Pick<LiveJobs, 'progressOf'>): Router {
  const r = Router();
  r.get('/:deckId/versions/:number/jobs', allow('project:read'), validate({ params: versionParams }), (req, res) => {
    const { deckId, number } = res.locals.params as { deckId: number; number: number };
    const v = findVersionByNumber(db, req.user!.firmId, deckId, number);
    res.json({ jobs: jobViews(db, jobsOfVersion(db, v.id), live) });
  });
  return r;
}
