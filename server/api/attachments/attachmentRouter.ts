/**
 * Drawings (multer, in memory up to the size limit, then written outside the web root):
 * - GET    /api/projects/:projectId/attachments       project:read
 * - POST   /api/projects/:projectId/attachments       attachment:upload (multipart: file, title?)
 * - GET    /api/attachments/:attachmentId/download    project:read (the project's firm only)
 * - DELETE /api/attachments/:attachmentId             attachment:delete
 */
import { createReadStream, existsSync } from 'node:fs';
import { Router } from 'express';
import { z } from 'zod';
import { personText } from '../../../shared/text.js';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { ApiError } from '../../middleware/errors.js';
import { idParams, validate } from '../../middleware/validate.js';
import { addAttachment, deleteAttachment, findAttachment, listAttachments } from './attachmentService.js';
import { MAX_ATTACHMENT_BYTES, storedPath } from './attachmentStore.js';
import { receiveOneFile } from '../../uploads/receiveFile.js';
import { contentDisposition } from '../../uploads/contentDisposition.js';

const uploadFields = z.strictObject({
  title: personText('title', 200).optional(),
});

export function projectAttachmentsRouter(db: Db, dir: string): Router {
  const r = Router({ mergeParams: true });
  r.get('/', allow('project:read'), validate({ params: idParams('projectId') }), (req, res) => {
    res.json({ attachments: listAttachments(db, req.user!.firmId, res.locals.params.projectId) });
  });
  r.post('/', allow('attachment:upload'), validate({ params: idParams('projectId') }), receiveOneFile({ maxBytes: MAX_ATTACHMENT_BYTES, what: 'a drawing' }), validate({ body: uploadFields }), (req, res) => {
    res.status(201).json({ attachment: addAttachment(db, dir, req.user!, res.locals.params.projectId, req.file!, res.locals.body.title) });
  });
  return r;
}

export function attachmentRouter(db: Db, dir: string): Router {
  const r = Router();
  r.get('/:attachmentId/download', allow('project:read'), validate({ params: idParams('attachmentId') }), (req, res) => {
    const a = findAttachment(db, req.user!.firmId, res.locals.params.attachmentId);
    const path = storedPath(dir, a.storedName);
    if (!existsSync(path)) throw new ApiError(404, 'not_found', `the file of drawing “${a.title}” is missing on the server`);
    res.set('Content-Disposition', contentDisposition(a.originalName));
    res.type(a.contentType);
    res.set('Content-Length', String(a.sizeBytes));
    res.set('Cache-Control', 'private, no-store');
    createReadStream(path).pipe(res);
  });
  r.delete('/:attachmentId', allow('attachment:delete'), validate({ params: idParams('attachmentId') }), (req, res) => {
    deleteAttachment(db, dir, req.user!, res.locals.params.attachmentId);
    res.status(204).end();
  });
  return r;
}
