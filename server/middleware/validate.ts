/**
 * Validates a request's params, query and body with zod schemas; the parsed values go to
 * `res.locals.params`, `res.locals.query`, `res.locals.body`. A failure is a 400 naming each
 * field and its rule. Objects should be `z.strictObject` so unknown fields are refused.
 */
import type { RequestHandler } from 'express';
import { z } from 'zod';
import { ApiError, zodDetails } from './errors.js';

interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}

export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const details = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input = part === 'body' ? (req.body ?? {}) : req[part];
      const r = schema.safeParse(input);
      if (r.success) res.locals[part] = r.data;
      else details.push(...zodDetails(r.error, part));
    }
    if (details.length) {
      next(ApiError.badRequest(details.map((d) => `${d.path}: ${d.message}`).join('; '), details));
      return;
    }
    next();
  };
}

/** Path parameters that are positive integer ids, e.g. `idParams('projectId')`. */
export function idParams<K extends string>(...names: K[]) {
  const shape = {} as Record<K, z.ZodType<number>>;
  for (const n of names) {
    shape[n] = z.coerce.number({ error: `${n} must be a number` }).int(`${n} must be a whole number`).positive(`${n} must be a positive id`);
  }
  return z.object(shape);
}
