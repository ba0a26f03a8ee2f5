/**
 * GET /api/decks/:deckId/versions/:number/factors (project:read) — a version's factors for the
 * comparison of two versions (shared/versionDiff): its code rows and governing values, read
 * from the code result the review summary and the package read (stored with the version, or
 * computed from its deck), and its grillage rows and governing value per girder, read from the
 * refined result they read (stored, or run once on the refined pool and stored; see
 * server/api/reviews/refinedResults.ts). No traces: the comparison needs the numbers only.
 *
 * A client that would rather poll (`Prefer: respond-async`) is answered at once with 202, the
 * code part, the grillage part marked 'computing' and the job to follow (GET /api/jobs/:jobId);
 * a run the pool refuses now (a limit, or full) is answered with 200, the grillage part saying
 * so and the refusal. Without the header the answer waits for the grillage. A version under the
 * caller's open exercise is refused (403 results_withheld), as its other results are.
 */
import { Router } from 'express';
import type { Db } from '../../db/client.js';
import type { DeckVersionRow } from '../../db/schema.js';
import type { RefinedPool } from '../../compute/refinedPool.js';
import { allow } from '../../auth/passport.js';
import { validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { versionParams } from './deckModel.js';
import { findVersionByNumber } from './deckService.js';
import { assertResultsVisible } from '../training/withheldResults.js';
import { codeResultsOf } from '../reviews/versionResults.js';
import { startRefinedResults, type RefinedResults } from '../reviews/refinedResults.js';
import { answerWithJob, pendingJobView, prefersAsync } from '../jobs/pendingJob.js';
import { codeFactorsPart, refinedFactorsPart, type VersionFactors } from '../../../shared/versionDiff/versionFactors.js';

function codePart(db: Db, v: DeckVersionRow): VersionFactors['code'] {
  const { result, solverVersion, source } = codeResultsOf(db, v);
  return codeFactorsPart(result, solverVersion, source);
}

/** The version's factors once its refined results are here. */
function withRefined(code: VersionFactors['code'], refined: RefinedResults): VersionFactors {
  return { code, refined: refinedFactorsPart(refined) };
}

/** The pool refused the run now (a limit, or full) or it was cancelled: the answer says so where the grillage would be. */
function refusedNow(e: unknown): e is ApiError {
  return e instanceof ApiError && (e.status === 429 || e.status === 503 || e.status === 409);
}

export function versionFactorsRouter(db: Db, pool: RefinedPool): Router {
  const r = Router();
  r.get('/:deckId/versions/:number/factors', allow('project:read'), validate({ params: versionParams }), async (req, res) => {
    const { deckId, number } = res.locals.params as { deckId: number; number: number };
    const v = findVersionByNumber(db, req.user!.firmId, deckId, number);
    assertResultsVisible(db, req.user!, v.id);
    const code = codePart(db, v);
    const async = prefersAsync(req);
    const refined = startRefinedResults(db, pool, v, req.user!);
    const pending = async ? pendingJobView(db, pool, req.user!.firmId, refined) : null;
    if (pending) {
      const computing: VersionFactors = { code, refined: { available: false, missing: 'computing', note: 'The grillage of this version is being computed on the server.' } };
      answerWithJob(res, pending, { factors: computing });
      return;
    }
    try {
      res.json({ factors: withRefined(code, await refined.results), job: null, refusal: null });
    } catch (e) {
      if (!(async && refusedNow(e))) throw e;
      const retryAfter = Number(e.headers?.['Retry-After']);
      const refusal = { code: e.code, message: e.message, retryAfterSeconds: Number.isFinite(retryAfter) ? retryAfter : null };
      res.json({ factors: { code, refined: { available: false, missing: e.status === 409 ? 'cancelled' : 'refused', note: e.message } }, job: null, refusal });
    }
  });
  return r;
}
