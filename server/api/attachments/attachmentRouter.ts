/**
 * Drawings (multer, in memory up to the size limit, then written outside the web root):
 * - GET    /api/projects/:projectId/attachments       project:read
 * - POST   /api/projects/:projectId/attachments       attachment:upload (multipart: file, title?)
 * - GET    /api/attachments/:attachmentId/download    project:read (the project's firm only)
 * - DELETE /api/attachments/:attachmentId             attachment:delete
 */
import { createReadStream, existsSync } from 'node:fs';
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { personText } from '../../../shared/text.js';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { ApiError } from '../../middleware/errors.js';
import { idParams, validate } from '../../middleware/validate.js';
import { addAttachment, deleteAttachment, findAttachment, listAttachments } from './attachmentService.js';
import { MAX_ATTACHMENT_BYTES, storedPath } from './attachmentStore.js';

const uploadFields = z.strictObject({
  title: personText('title', 200).optional(),
});

/** multer for one file in the field "file"; its errors become the API's typed errors. */
export function receiveOneFile(maxBytes: number, what: string): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 10, fieldSize: 10_000 } }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) {
        if (!req.file) return next(ApiError.badRequest(`file: send ${what} as multipart/form-data in the field "file"`, [{ path: 'file', message: `send ${what} in the field "file"` }]));
        return next();
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new ApiError(413, 'payload_too_large', `file: ${what} may be at most ${(maxBytes / 1024 / 1024).toFixed(maxBytes < 1024 * 1024 ? 2 : 0)} MB`));
        const field = err.field ?? 'file';
        return next(ApiError.badRequest(`${field}: ${err.message}`, [{ path: field, message: err.message }]));
      }
      next(err);
    });
  };
}

export function projectAttachmentsRouter(db: Db, dir: string): Router {
  const r = Router({ mergeParams: true });
  r.get('/', allow('project:read'), validate({ params: idParams('projectId') }), (req, res) => {
    res.json({ attachments: listAttachments(db, req.user!.firmId, res.locals.params.projectId) });
  });
  r.post('/', allow('attachment:upload'), validate({ params: idParams('projectId') }), receiveOneFile(MAX_ATTACHMENT_BYTES, 'a drawing'), validate({ body: uploadFields }), (req, res) => {
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
    res.attachment(a.originalName);
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
