/**
 * Receiving one uploaded file (multer, in memory, then handed to the route): every upload
 * route uses `receiveOneFile`, so every malformed multipart body gets the same answer — 400 in
 * the API's envelope naming what is wrong (path "body" for the body's framing, "file" or the
 * field's name for a part), 413 when a part is larger than allowed, 400 when the file is
 * missing. File names are read as UTF-8, as browsers send them.
 */
import type { RequestHandler } from 'express';
import multer from 'multer';
import { ApiError } from '../middleware/errors.js';

export interface ReceiveLimits {
  /** Largest file, bytes. */
  maxBytes: number;
  /** What the file is, for messages ("a drawing", "the CSV file"). */
  what: string;
}

const MAX_FIELD_BYTES = 10_000;

/** The parser's own framing errors (busboy's messages), in our words. */
const FRAMING: { match: RegExp; message: string }[] = [
  { match: /boundary not found/i, message: 'the multipart/form-data Content-Type names no boundary (Content-Type: multipart/form-data; boundary=…)' },
  { match: /malformed content type|unsupported content type|missing content-type/i, message: 'the Content-Type is not a readable multipart/form-data type' },
  { match: /unexpected end of form/i, message: 'the multipart body ends before its closing boundary (truncated or not multipart)' },
  { match: /unexpected end of file/i, message: 'the file part ends before its closing boundary (truncated upload)' },
  { match: /malformed part header/i, message: 'a part of the multipart body has a malformed or too long header' },
  { match: /malformed urlencoded form/i, message: 'the form body is malformed' },
  { match: /request (aborted|closed)/i, message: 'the upload was interrupted before the body was complete' },
];

function bodyError(message: string, path = 'body'): ApiError {
  return ApiError.badRequest(`${path}: ${message}`, [{ path, message }]);
}

/** multer's limit errors, in our words; the size limits answer 413. */
function multerProblem(err: multer.MulterError, limits: ReceiveLimits): ApiError {
  const field = err.field ?? 'file';
  switch (err.code) {
    case 'LIMIT_FILE_SIZE': {
      const mb = (limits.maxBytes / 1024 / 1024).toFixed(limits.maxBytes < 1024 * 1024 ? 2 : 0);
      const message = `${limits.what} may be at most ${mb} MB`;
      return new ApiError(413, 'payload_too_large', `file: ${message}`, [{ path: 'file', message }]);
    }
    case 'LIMIT_FIELD_VALUE':
      return new ApiError(413, 'payload_too_large', `${field}: the field may be at most ${MAX_FIELD_BYTES} bytes`, [{ path: field, message: `the field may be at most ${MAX_FIELD_BYTES} bytes` }]);
    case 'LIMIT_FILE_COUNT':
      return bodyError(`send one file only (${limits.what})`, 'file');
    case 'LIMIT_UNEXPECTED_FILE':
      return bodyError(`unexpected file in the field "${field}": send ${limits.what} in the field "file"`, field);
    default:
      return bodyError(`${err.message.toLowerCase()}`, err.field ?? 'body');
  }
}

/** Any error the multipart parser raised, as the API's typed error. */
export function uploadProblem(err: unknown, limits: ReceiveLimits): ApiError | null {
  if (err instanceof multer.MulterError) return multerProblem(err, limits);
  const message = err instanceof Error ? err.message : String(err);
  const known = FRAMING.find((f) => f.match.test(message));
  return known ? bodyError(known.message) : null;
}

/** multer for one file in the field "file"; its errors become the API's typed errors. */
export function receiveOneFile(limits: ReceiveLimits): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: { fileSize: limits.maxBytes, files: 1, fields: 10, fieldSize: MAX_FIELD_BYTES, parts: 20, headerPairs: 100 },
  }).single('file');
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      const got = req.headers['content-type'] ?? 'none';
      return next(bodyError(`send ${limits.what} as multipart/form-data in the field "file" (the Content-Type was ${got.slice(0, 80)})`));
    }
    upload(req, res, (err: unknown) => {
      if (err) return next(uploadProblem(err, limits) ?? err);
      if (!req.file) return next(bodyError(`send ${limits.what} in the field "file"`, 'file'));
      next();
    });
  };
}
