/**
 * Encoding of a stored analysis result (server/storage/storedResults.ts writes and reads the
 * rows): the result's JSON compressed with brotli ('brotli-json'), or plain JSON text in older
 * rows ('json'). Pure: no database, so a worker thread can encode a result it computed
 * (server/compute/refinedWorker.ts) and the request thread only inserts the row.
 */
import { brotliCompressSync, brotliDecompressSync, constants } from 'node:zlib';
import type { AnalysisResultRow, ResultEncoding } from '../db/schema.js';

export type EncodedColumns = Pick<AnalysisResultRow, 'encoding' | 'dataJson' | 'dataBlob'>;

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

export function encodeResultRow(r: { method: string; solverVersion: string; data: unknown }): EncodedResult {
  return { method: r.method, solverVersion: r.solverVersion, ...encodeResult(r.data) };
}
