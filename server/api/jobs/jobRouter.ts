/**
 * /api/decks/:deckId/versions/:number/jobs — the computations the server's worker pools ran
 * (or are running) for one version: the refined (grillage) analysis and the calculation
 * packages, each with its state, who asked, when it was queued, started and ended, its worker
 * time and, for a failed one, the reason its requester was given (server/compute/jobRecords.ts).
 * Readable by everyone who may read the project.
 */
import { Router } from 'express';
import { and, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { deckVersions, users } from '../../db/schema.js';
import { versionParams } from '../decks/deckModel.js';
import { findDeck } from '../decks/deckService.js';
import { jobsOfVersion } from '../../compute/jobRecords.js';

export function jobRouter(db: Db): Router {
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
    const jobs = jobsOfVersion(db, v.id);
    const ids = [...new Set(jobs.map((j) => j.requestedBy).filter((id): id is number => id !== null))];
    const names = new Map(ids.length ? db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)).all().map((u) => [u.id, u.name]) : []);
    res.json({
      jobs: jobs.map((j) => ({
        id: j.id,
        kind: j.kind,
        state: j.state,
        solverVersion: j.solverVersion,
        requestedBy: j.requestedBy === null ? null : { id: j.requestedBy, name: names.get(j.requestedBy) ?? '' },
        createdAt: j.createdAt,
        startedAt: j.startedAt,
        finishedAt: j.finishedAt,
        runMs: j.runMs,
        error: j.error,
      })),
    });
  });
  return r;
}
