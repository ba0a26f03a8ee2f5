/** The API's typed error and the one error handler that turns every error into the envelope
 *  `{ error: { code, message, details } }` with the right status. */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';

export interface ErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: ErrorDetail[],
    /** Response headers to send with the error (e.g. Retry-After). */
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.name = 'ApiError';
  }
  static badRequest(message: string, details?: ErrorDetail[]) {
    return new ApiError(400, 'validation_failed', message, details);
  }
  static unauthenticated(message = 'sign in first') {
    return new ApiError(401, 'unauthenticated', message);
  }
  static forbidden(message = 'your roles do not allow this action', code = 'forbidden') {
    return new ApiError(403, code, message);
  }
  static notFound(what = 'resource') {
    return new ApiError(404, 'not_found', `${what} not found`);
  }
  static conflict(message: string, details?: ErrorDetail[]) {
    return new ApiError(409, 'conflict', message, details);
  }
}

export function zodDetails(err: ZodError, prefix: string): ErrorDetail[] {
  return err.issues.map((i) => {
    const path = [prefix, ...i.path.map(String)].filter(Boolean).join('.');
    let message = i.message;
    if (i.code === 'unrecognized_keys') message = `unknown field(s): ${i.keys.join(', ')}`;
    return { path, message };
  });
}

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new ApiError(404, 'not_found', `no API route ${req.method} ${req.path}`));
};

export function errorHandler(log: (msg: string) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    if (res.headersSent) return;
    if (err instanceof ApiError) {
      if (err.headers) res.set(err.headers);
      res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details ?? [] } });
      return;
    }
    if (err instanceof ZodError) {
      const details = zodDetails(err, '');
      res.status(400).json({ error: { code: 'validation_failed', message: details.map((d) => `${d.path}: ${d.message}`).join('; '), details } });
      return;
    }
    const e = err as { status?: number; statusCode?: number; type?: string; message?: string };
    const status = e.status ?? e.statusCode;
    if (e.type === 'entity.parse.failed') {
      res.status(400).json({ error: { code: 'bad_json', message: 'the request body is not valid JSON', details: [] } });
      return;
    }
    if (e.type === 'entity.too.large' || status === 413) {
      res.status(413).json({ error: { code: 'payload_too_large', message: 'the request body is too large', details: [] } });
      return;
    }
    if (typeof status === 'number' && status >= 400 && status < 500) {
      res.status(status).json({ error: { code: 'bad_request', message: e.message ?? 'bad request', details: [] } });
      return;
    }
    log(`internal error: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
    res.status(500).json({ error: { code: 'internal', message: 'something went wrong on the server; the request was not completed', details: [] } });
  };
}
