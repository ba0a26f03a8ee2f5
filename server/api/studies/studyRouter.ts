/**
 * Parameter studies (shared/studies/):
 * - GET  /api/projects/:projectId/studies — the project's studies, newest first;
 * - POST /api/projects/:projectId/studies — a new study from a saved version
 *   `{ name, deckId, versionNumber, sweep }`; it starts computing at once (201);
 * - GET  /api/studies/:studyId — the study, its progress and its stored points;
 * - POST /api/studies/:studyId/cancel — stops it; finished points stay;
 * - POST /api/studies/:studyId/resume — computes the points an interrupted or cancelled study lacks;
 * - GET  /api/studies/:studyId/points/:number/deck — one point's deck (internal units), points numbered from 1;
 * - GET  /api/studies/:studyId/study.csv — every stored point, in the project's units.
 * Designers and instructors create, cancel and resume studies; reviewers and admins read them;
 * trainees do not see them (server/auth/permissions.ts).
 */
import { Router } from 'express';
import { z } from 'zod';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, idText, validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { createStudy, findStudy, listStudies, pointDeck, pointsOf, studyCsv, studyView } from './studyService.js';
import { findProject } from '../projects/projectService.js';
import type { StudyRunner } from '../../compute/studyRunner.js';
import { eq } from 'drizzle-orm';
import { studies } from '../../db/schema.js';
import { personText } from '../../../shared/text.js';
import { sweepSchema } from '../../../shared/studies/sweep.js';

const createBody = z.strictObject({
  name: personText('study name', 200, { min: 1, minMessage: 'study name is required' }),
  deckId: z.number({ error: 'deckId must be a number' }).int('deckId must be a whole number').positive('deckId must be a positive id'),
  versionNumber: z.number({ error: 'versionNumber must be a number' }).int('versionNumber must be a whole number').positive('versionNumber must be 1 or more'),
  sweep: sweepSchema,
});

export function projectStudiesRouter(db: Db, runner: StudyRunner): Router {
  const r = Router({ mergeParams: true });
  const params = validate({ params: idParams('projectId') });
  r.get('/', allow('study:read'), params, (req, res) => {
    const list = listStudies(db, req.user!.firmId, res.locals.params.projectId);
    res.json({ studies: list.map((s) => studyView(db, s, runner.progress(s.id))) });
  });
  r.post('/', allow('study:create'), validate({ params: idParams('projectId'), body: createBody }), (req, res) => {
    const study = createStudy(db, req.user!, res.locals.params.projectId, res.locals.body);
    runner.start(study.id);
    res.status(201).json({ study: studyView(db, study, runner.progress(study.id)) });
  });
  return r;
}

export function studyRouter(db: Db, runner: StudyRunner): Router {
  const r = Router();
  const params = validate({ params: idParams('studyId') });
  r.get('/:studyId', allow('study:read'), params, (req, res) => {
    const s = findStudy(db, req.user!.firmId, res.locals.params.studyId);
    res.json({ study: studyView(db, s, runner.progress(s.id)), points: pointsOf(db, s.id) });
  });
  r.post('/:studyId/cancel', allow('study:create'), params, (req, res) => {
    const s = findStudy(db, req.user!.firmId, res.locals.params.studyId);
    if (s.state !== 'running' || !runner.cancel(s.id, req.user!.name)) {
      throw new ApiError(409, 'study_not_running', `study ${s.id} is ${s.state === 'running' ? 'ending' : s.state}; there is nothing to cancel.`, [{ path: 'studyId', message: `the study is ${s.state}` }]);
    }
    const after = findStudy(db, req.user!.firmId, s.id);
    res.json({ study: studyView(db, after, null) });
  });
  r.post('/:studyId/resume', allow('study:create'), params, (req, res) => {
    const s = findStudy(db, req.user!.firmId, res.locals.params.studyId);
    if (s.state === 'done' || s.state === 'running') {
      throw new ApiError(409, 'study_not_resumable', `study ${s.id} is ${s.state}; only a cancelled or interrupted study can be resumed.`, [{ path: 'studyId', message: `the study is ${s.state}` }]);
    }
    db.update(studies).set({ state: 'running', cancelledBy: null, finishedAt: null }).where(eq(studies.id, s.id)).run();
    runner.start(s.id);
    res.json({ study: studyView(db, findStudy(db, req.user!.firmId, s.id), runner.progress(s.id)) });
  });
  r.get('/:studyId/points/:number/deck', allow('study:read'), validate({ params: z.object({ studyId: idText('studyId'), number: idText('number') }) }), (req, res) => {
    const s = findStudy(db, req.user!.firmId, res.locals.params.studyId);
    res.json({ deck: pointDeck(db, s, res.locals.params.number - 1) });
  });
  r.get('/:studyId/study.csv', allow('study:read'), params, (req, res) => {
    const s = findStudy(db, req.user!.firmId, res.locals.params.studyId);
    const project = findProject(db, req.user!.firmId, s.projectId);
    res.attachment(`study-${s.id}.csv`);
    res.type('text/csv; charset=utf-8');
    res.send(studyCsv(s, pointsOf(db, s.id), project.units));
  });
  return r;
}
