/**
 * The computations the server's worker pools ran (or are running): the refined (grillage)
 * analysis and the calculation packages, each with its state, who asked, when it was queued,
 * started and ended, its worker time and, for a failed one, the reason its requester was given
 * (server/compute/jobRecords.ts). Readable by everyone who may read the project.
 * - GET /api/decks/:deckId/versions/:number/jobs — one version's jobs, newest first;
 * - GET /api/jobs/:jobId — one job: what a client polls after a 202 (its `Location`).
 */
import { Router } from 'express';
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { computeJobs, deckVersions, decks, projects, users } from '../../db/schema.js';
import { versionParams } from '../decks/deckModel.js';
import { findDeck } from '../decks/deckService.js';
import { jobsOfVersion } from '../../compute/jobRecords.js';
import type { RefinedProgress } from '../../../shared/grillage/refinedFactors.js';

type JobRow = typeof computeJobs.$inferSelect;

/** Where a live refined job is, as its pool knows it (server/compute/refinedPool.ts). */
export interface ProgressSource {
  progressOf(recordId: number): RefinedProgress | null;
}

/** A job as the API shows it (requester by name, the address to poll, where a live refined run is). */
export function jobViews(db: Db, jobs: JobRow[], live?: ProgressSource) {
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

export function jobRouter(db: Db, live: ProgressSource): Router {
  const r = Router();
  r.get('/:jobId', allow('project:read'), validate({ params: idParams('jobId') }), (req, res) => {
    res.json({ job: jobViews(db, [findJob(db, req.user!.firmId, res.locals.params.jobId)], live)[0] });
  });
  return r;
}

export function versionJobsRouter(db: Db, live: ProgressSource): Router {
  const r = Router();
  r.get('/:deckId/versions/:number/jobs', allow('project:read'), validate({ params: versionParams }), (req, res) => {
    const { deckId, number } = res.locals.params as { deckId: number; number: number };
    findDeck(db, req.user!.firmId, deckId);
    const v = db
      .select({ id: deckVersions.id })
      .from(deckVersions)
      .where(and(eq(deckVersions.deckId, deckId), eq(deckVersions.number, number)))
      .get();
    if (!v) throw ApiError.notFound(`version ${number} of deck ${deckId}`);
    res.json({ jobs: jobViews(db, jobsOfVersion(db, v.id), live) });
  });
  return r;
}
