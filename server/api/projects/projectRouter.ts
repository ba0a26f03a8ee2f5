/** /api/projects — the firm's bridges. Who may call each route is declared with `allow`. */
import { Router } from 'express';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import { projectAudit } from '../audit/auditService.js';
import { pageQuery } from '../pagination.js';
import { projectCreateBody, projectListQuery, projectUpdateBody } from './projectModel.js';
import { createProject, findProject, getProject, listProjects, updateProject } from './projectService.js';

export function projectRouter(db: Db): Router {
  const r = Router();
  const projectId = validate({ params: idParams('projectId') });

  r.get('/', allow('project:read'), validate({ query: projectListQuery }), (req, res) => {
    res.json({ projects: listProjects(db, req.user!.firmId, res.locals.query.archived) });
  });

  r.post('/', allow('project:create'), validate({ body: projectCreateBody }), (req, res) => {
    res.status(201).json({ project: createProject(db, req.user!, res.locals.body) });
  });

  r.get('/:projectId', allow('project:read'), projectId, (req, res) => {
    res.json({ project: getProject(db, req.user!.firmId, res.locals.params.projectId) });
  });

  r.patch('/:projectId', allow('project:update'), validate({ params: idParams('projectId'), body: projectUpdateBody }), (req, res) => {
    res.json({ project: updateProject(db, req.user!, res.locals.params.projectId, res.locals.body) });
  });

  r.get('/:projectId/audit', allow('audit:read'), validate({ params: idParams('projectId'), query: pageQuery }), (req, res) => {
    findProject(db, req.user!.firmId, res.locals.params.projectId);
    res.json(projectAudit(db, req.user!.firmId, res.locals.params.projectId, res.locals.query));
  });

  return r;
}
