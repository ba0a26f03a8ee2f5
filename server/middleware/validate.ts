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

/**
 * A positive whole-number id sent as text (path parameter, query or form field): digits only,
 * so " 1", "0x10", "1e3" or "1.0" are refused rather than read as some other id.
 */
export function idText(name: string) {
  return z
    .string({ error: `${name} must be a number` })
    .superRefine((s, ctx) => {
      if (/^\d{1,16}$/.test(s)) return;
      const numeric = /^\s*[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?\s*$/i.test(s);
      ctx.addIssue({ code: 'custom', message: numeric ? `${name} must be a positive whole number written in digits` : `${name} must be a number` });
    })
    .transform(Number)
    .pipe(z.number().int(`${name} must be a whole number`).positive(`${name} must be a positive id`).max(Number.MAX_SAFE_INTEGER, `${name} is too large`));
}

/** Path parameters that are positive integer ids, e.g. `idParams('projectId')`. */
export function idParams<K extends string>(...names: K[]) {
  const shape = {} as Record<K, ReturnType<typeof idText>>;
  for (const n of names) shape[n] = idText(n);
  return z.object(shape);
}
