/**
 * /api/reports — the calculation package and CSV tables of a deck version (report:export).
 * - GET /decks/:deckId/versions/:number/package.pdf
 * - GET /decks/:deckId/versions/:number/factors.csv
 * - GET /decks/:deckId/versions/:number/envelopes.csv
 * Each download is recorded in the project's audit trail ("export"). Each waits for the
 * version's refined results; a client that would rather poll (`Prefer: respond-async`) gets
 * 202 with the refined job while it runs (server/api/jobs/pendingJob.ts), then asks again.
 */
import { Router, type Request, type Response } from 'express';
import type { Db } from '../db/client.js';
import { allow } from '../auth/passport.js';
import { validate } from '../middleware/validate.js';
import { versionParams } from '../api/decks/deckModel.js';
import { recordAudit } from '../api/audit/auditService.js';
import { reportData, type ReportData } from './reportData.js';
import { envelopesCsv, factorsCsv } from './csvExport.js';
import { assertVersionResultsVisible } from '../api/training/withheldResults.js';
import type { RefinedPool } from '../compute/refinedPool.js';
import type { PackagePool } from '../compute/packagePool.js';
import { findVersionByNumber } from '../api/decks/deckService.js';
import { startRefinedResults } from '../api/reviews/refinedResults.js';
import { answerWithJob, pendingJobView, prefersAsync } from '../api/jobs/pendingJob.js';

function fileStem(data: ReportData): string {
  const clean = data.deck.name.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'deck';
  return `${clean}-v${data.version.number}`;
}

export function reportRouter(db: Db, pool: RefinedPool, packages: PackagePool): Router {
  const r = Router();
  const params = validate({ params: versionParams });
  /** The version's report data; refused first when its results are withheld from the reader (an open exercise). */
  const reportOf = (req: Express.Request, res: Response) => {
    const { deckId, number } = res.locals.params as { deckId: number; number: number };
    assertVersionResultsVisible(db, req.user!, deckId, number);
    return reportData(db, pool, req.user!.firmId, deckId, number, req.user!);
  };
  /** With `Prefer: respond-async`, the refined job the version's results still wait for (answered 202), or null. */
  const pendingJob = (req: Request, res: Response) => {
    if (!prefersAsync(req)) return null;
    const { deckId, number } = res.locals.params as { deckId: number; number: number };
    assertVersionResultsVisible(db, req.user!, deckId, number);
    const v = findVersionByNumber(db, req.user!.firmId, deckId, number);
    return pendingJobView(db, pool, req.user!.firmId, startRefinedResults(db, pool, v, req.user!));
  };
  const audit = (req: Express.Request, data: ReportData, what: string) =>
    recordAudit(db, { firmId: req.user!.firmId, projectId: data.project.id, actorId: req.user!.id, action: 'export', entityType: 'deck', entityId: data.deck.id, summary: `exported ${what} of version ${data.version.number} of deck “${data.deck.name}”` });

  r.get('/decks/:deckId/versions/:number/package.pdf', allow('report:export'), params, async (req, res) => {
    const pending = pendingJob(req, res);
    if (pending) return answerWithJob(res, pending);
    const data = await reportOf(req, res);
    // laid out on a worker thread (server/compute/packagePool.ts): the request thread only gathers the data
    const pdf = await packages.render(data, req.user!.id);
    audit(req, data, 'the calculation package (PDF)');
    res.attachment(`${fileStem(data)}-calculation-package.pdf`);
    res.type('application/pdf');
    res.set('Cache-Control', 'private, no-store');
    res.send(pdf);
  });

  r.get('/decks/:deckId/versions/:number/factors.csv', allow('report:export'), params, async (req, res) => {
    const pending = pendingJob(req, res);
    if (pending) return answerWithJob(res, pending);
    const data = await reportOf(req, res);
    const text = factorsCsv(data);
    audit(req, data, 'the factor table (CSV)');
    res.attachment(`${fileStem(data)}-factors.csv`);
    res.type('text/csv; charset=utf-8');
    res.set('Cache-Control', 'private, no-store');
    res.send(text);
  });

  r.get('/decks/:deckId/versions/:number/envelopes.csv', allow('report:export'), params, async (req, res) => {
    const pending = pendingJob(req, res);
    if (pending) return answerWithJob(res, pending);
    const data = await reportOf(req, res);
    const text = envelopesCsv(data);
    audit(req, data, 'the girder envelopes (CSV)');
    res.attachment(`${fileStem(data)}-envelopes.csv`);
    res.type('text/csv; charset=utf-8');
    res.set('Cache-Control', 'private, no-store');
    res.send(text);
  });
  return r;
}
