/**
 * Stored analysis results: the one place that writes and reads analysis_results rows.
 * New rows keep the result's JSON compressed with brotli in data_blob (encoding
 * 'brotli-json'; a code result of about 100-300 KB of JSON stores in 5-8 KB); older rows
 * (encoding 'json') keep it as text in data_json and stay readable. Rows are append-only:
 * a second result for the same version, method and solver version is refused by the
 * database, which `insertResultOnce` reports as "already stored". A result whose JSON would
 * exceed MAX_RESULT_JSON_BYTES is not stored (ResultTooLargeError): a last guard, twice the
 * largest result the deck bounds allow.
 */
import { and, asc, desc, eq } from 'drizzle-orm';
import { analysisResults } from '../db/schema.js';
import type { DbOrTx } from '../api/audit/auditService.js';
import { decodeResult, encodeResultRow, ResultTooLargeError, type EncodedResult } from './resultEncoding.js';

export { decodeResult, encodedBytes, encodeResult, encodeResultRow, MAX_RESULT_JSON_BYTES, ResultTooLargeError, type EncodedResult } from './resultEncoding.js';

export interface ResultToStore {
  versionId: number;
  method: string;
  solverVersion: string;
  data: unknown;
}

export interface StoredResultRow {
  method: string;
  solverVersion: string;
  data: unknown;
  createdAt: string;
}

export function insertEncodedResult(db: DbOrTx, versionId: number, r: EncodedResult): void {
  db.insert(analysisResults).values({ versionId, ...r }).run();
}

export function insertResult(db: DbOrTx, r: ResultToStore): void {
  insertEncodedResult(db, r.versionId, encodeResultRow(r));
}

function isAlreadyStored(e: unknown): boolean {
  const m = String((e as Error)?.message ?? '');
  return m.includes('this result is already stored') || m.includes('UNIQUE');
}

/**
 * Stores the result unless one is already stored for its version, method and solver version
 * (or it is too large to store: the caller then has it for this request only).
 */
export function insertResultOnce(db: DbOrTx, r: ResultToStore): boolean {
  try {
    insertResult(db, r);
    return true;
  } catch (e) {
    if (isAlreadyStored(e) || e instanceof ResultTooLargeError) return false;
    throw e;
  }
}

/** `insertResultOnce` for a result already encoded (e.g. on a worker thread): false when one is already stored. */
export function insertEncodedResultOnce(db: DbOrTx, versionId: number, r: EncodedResult): boolean {
  try {
    insertEncodedResult(db, versionId, r);
    return true;
  } catch (e) {
    if (isAlreadyStored(e)) return false;
    throw e;
  }
}

/** Every stored result of a version, oldest first. */
export function resultsOfVersion(db: DbOrTx, versionId: number): StoredResultRow[] {
  return db
    .select()
    .from(analysisResults)
    .where(eq(analysisResults.versionId, versionId))
    .orderBy(asc(analysisResults.id))
    .all()
    .map((r) => ({ method: r.method, solverVersion: r.solverVersion, data: decodeResult(r), createdAt: r.createdAt }));
}

/** The headings of a version's stored results (method, solver version, time): nothing decoded. */
export function resultHeadingsOfVersion(db: DbOrTx, versionId: number): Omit<StoredResultRow, 'data'>[] {
  return db
    .select({ method: analysisResults.method, solverVersion: analysisResults.solverVersion, createdAt: analysisResults.createdAt })
    .from(analysisResults)
    .where(eq(analysisResults.versionId, versionId))
    .orderBy(asc(analysisResults.id))
    .all();
}

/** The newest stored result of a method for a version, or null. */
export function newestResult(db: DbOrTx, versionId: number, method: string): StoredResultRow | null {
  const r = db
    .select()
    .from(analysisResults)
    .where(and(eq(analysisResults.versionId, versionId), eq(analysisResults.method, method)))
    .orderBy(desc(analysisResults.id))
    .get();
  return r ? { method: r.method, solverVersion: r.solverVersion, data: decodeResult(r), createdAt: r.createdAt } : null;
}
