/**
 * /api/training — exercises made from deck versions.
 * Instructors (training:manage):
 * - GET   /questions                 ready-made questions
 * - GET   /trainees                  the firm's trainees
 * - GET   /assignments               every exercise of the firm, with counts
 * - POST  /assignments               make one `{ kind, versionId, params, title?, instructions?, tolerancePercent, dueAt, traineeIds }`
 * - GET   /assignments/:assignmentId the answer, the trainees and every submission with its grade
 * - PATCH /assignments/:assignmentId `{ dueAt?, instructions?, addTraineeIds? }`
 * Trainees (training:submit), their own exercises only (others answer 404):
 * - GET   /mine
 * - GET   /mine/:assignmentId        the product's answer and trace only after submitting
 * - POST  /mine/:assignmentId/submissions `{ value, steps?, placement? }` → graded at once
 */
import { Router } from 'express';
import type { Config } from '../../config/env.js';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import type { Mailer } from '../../mail/mailer.js';
import { assignmentBody, assignmentUpdateBody, QUESTION_PRESETS, submissionBody } from './trainingModel.js';
import { createAssignment, instructorView, listAssignments, listTrainees, myAssignments, submitAnswer, traineeView, updateAssignment, type TrainingDeps } from './trainingService.js';

export function trainingRouter(db: Db, config: Config, mailer: Mailer): Router {
  const r = Router();
  const deps: TrainingDeps = { db, mailer, publicUrl: config.publicUrl };
  const assignmentId = validate({ params: idParams('assignmentId') });

  r.get('/questions', allow('training:manage'), (_req, res) => {
    res.json({ questions: QUESTION_PRESETS });
  });
  r.get('/trainees', allow('training:manage'), (req, res) => {
    res.json({ trainees: listTrainees(db, req.user!.firmId) });
  });
  r.get('/assignments', allow('training:manage'), (req, res) => {
    res.json({ assignments: listAssignments(db, req.user!.firmId) });
  });
  r.post('/assignments', allow('training:manage'), validate({ body: assignmentBody }), (req, res) => {
    res.status(201).json({ assignment: createAssignment(deps, req.user!, res.locals.body) });
  });
  r.get('/assignments/:assignmentId', allow('training:manage'), assignmentId, (req, res) => {
    res.json({ assignment: instructorView(db, req.user!.firmId, res.locals.params.assignmentId) });
  });
  r.patch('/assignments/:assignmentId', allow('training:manage'), validate({ params: idParams('assignmentId'), body: assignmentUpdateBody }), (req, res) => {
    res.json({ assignment: updateAssignment(deps, req.user!, res.locals.params.assignmentId, res.locals.body) });
  });

  r.get('/mine', allow('training:submit'), (req, res) => {
    res.json({ assignments: myAssignments(db, req.user!) });
  });
  r.get('/mine/:assignmentId', allow('training:submit'), assignmentId, (req, res) => {
    res.json({ assignment: traineeView(db, req.user!, res.locals.params.assignmentId) });
  });
  r.post('/mine/:assignmentId/submissions', allow('training:submit'), validate({ params: idParams('assignmentId'), body: submissionBody }), (req, res) => {
    const out = submitAnswer(deps, req.user!, res.locals.params.assignmentId, res.locals.body);
    res.status(201).json({ submission: out.submission, assignment: out.exercise });
  });
  return r;
}
