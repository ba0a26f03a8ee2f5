/**
 * Pages of long lists (versions of a deck, a project's audit, the outbox, review rounds):
 * `?limit=N&cursor=C`. Lists are newest first and keyed by a unique, ordered key (a version
 * number, a row id, or an update time with the id), so a page never repeats or skips a row when
 * rows are added meanwhile. Every answer carries `page: { limit, total, nextCursor }`;
 * `nextCursor` is null on the last page. A cursor is opaque to the client (base64url JSON).
 */
import { z } from 'zod';
import { ApiError } from '../middleware/errors.js';

export const DEFAULT_PAGE = 50;
export const MAX_PAGE = 200;

/** The query fields of a paged list (merge into a route's query schema). */
export const pageFields = {
  limit: z.coerce
    .number({ error: 'limit must be a number' })
    .int('limit must be a whole number')
    .min(1, 'limit must be at least 1')
    .max(MAX_PAGE, `limit must be at most ${MAX_PAGE}`)
    .default(DEFAULT_PAGE),
  cursor: z
    .string()
    .max(200, 'cursor is malformed: use the nextCursor of the previous page')
    .regex(/^[A-Za-z0-9_-]+$/, 'cursor is malformed: use the nextCursor of the previous page')
    .optional(),
};

export const pageQuery = z.strictObject(pageFields);
export type PageRequest = { limit: number; cursor?: string };

export interface Page {
  limit: number;
  total: number;
  nextCursor: string | null;
}

export function encodeCursor(key: unknown): string {
  return Buffer.from(JSON.stringify(key), 'utf8').toString('base64url');
}

/** The key inside a cursor, checked against `schema`; a bad cursor is a 400 naming `query.cursor`. */
export function decodeCursor<T>(cursor: string | undefined, schema: z.ZodType<T>): T | undefined {
  if (cursor === undefined) return undefined;
  let raw: unknown;
  try {
    raw = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8'));
  } catch {
    raw = undefined;
  }
  const r = schema.safeParse(raw);
  if (!r.success) {
    throw ApiError.badRequest('query.cursor: the cursor is malformed: use the nextCursor of the previous page', [
      { path: 'query.cursor', message: 'the cursor is malformed: use the nextCursor of the previous page' },
    ]);
  }
  return r.data;
}

/**
 * Cuts a page from rows fetched with `limit + 1` (the extra row says whether another page
 * follows). `keyOf` gives the cursor key of the page's last row.
 */
export function cutPage<R>(rows: R[], limit: number, total: number, keyOf: (row: R) => unknown): { rows: R[]; page: Page } {
  const more = rows.length > limit;
  const kept = more ? rows.slice(0, limit) : rows;
  return { rows: kept, page: { limit, total, nextCursor: more ? encodeCursor(keyOf(kept[kept.length - 1])) : null } };
}

/** Cursor key schemas. */
export const idCursor = z.strictObject({ id: z.number().int().positive() });
export const numberCursor = z.strictObject({ number: z.number().int().positive() });
export const updatedCursor = z.strictObject({ updatedAt: z.string().max(40), id: z.number().int().positive() });
