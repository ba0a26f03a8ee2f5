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
import { brotliCompressSync, brotliDecompressSync, constants } from 'node:zlib';
import { analysisResults, type AnalysisResultRow, type ResultEncoding } from '../db/schema.js';
import type { DbOrTx } from '../api/audit/auditService.js';

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

type EncodedColumns = Pick<AnalysisResultRow, 'encoding' | 'dataJson' | 'dataBlob'>;

/**
 * Largest JSON of one stored result, bytes: 32 MiB. Within the deck bounds (80 m wide, 12
 * spans) the largest code result measured is about 16 MB of JSON (12 girders at 7.1 m, 12
 * continuous spans: tests/bench/storage.ts), which stores in about 17 KB.
 */
export const MAX_RESULT_JSON_BYTES = 32 * 1024 * 1024;

export class ResultTooLargeError extends Error {
  constructor(readonly bytes: number | null) {
    super(`the result's JSON is ${bytes === null ? 'too long to build' : `${bytes} bytes`}, more than the ${MAX_RESULT_JSON_BYTES} bytes one stored result may hold`);
    this.name = 'ResultTooLargeError';
  }
}

function resultJson(data: unknown): Buffer {
  let text: string;
  try {
    text = JSON.stringify(data);
  } catch (e) {
    if (e instanceof RangeError) throw new ResultTooLargeError(null); // longer than a string can be
    throw e;
  }
  // A string's UTF-16 length bounds its UTF-8 size from below: refuse before encoding a huge one.
  if (text.length > MAX_RESULT_JSON_BYTES) throw new ResultTooLargeError(text.length);
  const json = Buffer.from(text, 'utf8');
  if (json.length > MAX_RESULT_JSON_BYTES) throw new ResultTooLargeError(json.length);
  return json;
}

/** Brotli quality 5: within a few per cent of the best size at a small fraction of its time. */
const BROTLI_QUALITY = 5;

export function encodeResult(data: unknown): EncodedColumns & { encoding: ResultEncoding } {
  const json = resultJson(data);
  const blob = brotliCompressSync(json, { params: { [constants.BROTLI_PARAM_QUALITY]: BROTLI_QUALITY, [constants.BROTLI_PARAM_SIZE_HINT]: json.length } });
  return { encoding: 'brotli-json', dataJson: '', dataBlob: blob };
}

export function decodeResult(row: EncodedColumns): unknown {
  if (row.encoding === 'brotli-json') {
    if (!row.dataBlob) throw new Error('a brotli-json result row has no data');
    return JSON.parse(brotliDecompressSync(row.dataBlob).toString('utf8')) as unknown;
  }
  return JSON.parse(row.dataJson) as unknown;
}

/** Bytes a result row holds (what the firm's storage count adds for it). */
export function encodedBytes(row: EncodedColumns): number {
  return Buffer.byteLength(row.dataJson, 'utf8') + (row.dataBlob?.length ?? 0);
}

/** A result encoded for storage, not yet tied to a version (a save encodes before it writes). */
export type EncodedResult = EncodedColumns & { method: string; solverVersion: string };

export function encodeResultRow(r: Omit<ResultToStore, 'versionId'>): EncodedResult {
  return { method: r.method, solverVersion: r.solverVersion, ...encodeResult(r.data) };
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
