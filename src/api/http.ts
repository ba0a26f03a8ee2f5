/**
 * The one fetch wrapper of the client. Every request to the Deckshare API goes through
 * `request()` (or its `get`/`post`/`patch` shorthands):
 *  - sends and expects JSON, with the session cookie (`credentials: 'same-origin'`);
 *  - on every method other than GET/HEAD, copies the readable `ds_csrf` cookie into the
 *    `X-CSRF-Token` header (double-submit CSRF protection; the server compares the two);
 *  - turns the server's error envelope `{ error: { code, message, details? } }` into a typed
 *    `ApiError`, and a failed connection or an unreadable answer into an `ApiError` with a
 *    sentence a person can act on.
 */
import { asSentence } from '@shared/text';

/** Error codes the API documents, plus the two the client itself produces. */
export type ApiErrorCode =
  | 'bad_request'
  | 'validation_failed'
  | 'unauthenticated'
  | 'forbidden'
  | 'csrf_failed'
  | 'password_change_required'
  | 'not_found'
  | 'conflict'
  | 'payload_too_large'
  | 'too_many_requests'
  | 'internal'
  | 'network_error'
  | 'bad_response'
  | (string & {});

/** One field-level problem: `path` names the field (e.g. "name", "roles.0"). */
export interface ApiErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: ApiErrorCode;
  readonly details: ApiErrorDetail[];

  constructor(status: number, code: ApiErrorCode, message: string, details: ApiErrorDetail[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /** The messages for one field (top-level path segment), joined for display beside it. */
  fieldMessage(field: string): string | undefined {
    const hits = this.details.filter((d) => fieldOf(d.path) === field);
    return hits.length > 0 ? hits.map((d) => d.message).join('; ') : undefined;
  }
}

/**
 * The form field a detail path names: its first segment once the request part the server
 * may prefix ("body.", "query.", "params.") is removed. "body.name" → "name",
 * "roles.0" → "roles", "body" → "" (the body as a whole).
 */
export function fieldOf(path: string): string {
  const segments = path.split('.');
  if (segments[0] === 'body' || segments[0] === 'query' || segments[0] === 'params') segments.shift();
  return segments[0] ?? '';
}

/** Name of the readable cookie that carries the CSRF token. */
export const CSRF_COOKIE = 'ds_csrf';
/** Header the server checks against the cookie. */
export const CSRF_HEADER = 'X-CSRF-Token';

/** Reads one cookie's value from `document.cookie`; undefined when absent. */
export function readCookie(name: string, cookieString: string = document.cookie): string | undefined {
  for (const part of cookieString.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() === name) {
      const raw = part.slice(eq + 1).trim();
      try {
        return decodeURIComponent(raw);
      } catch {
        return raw;
      }
    }
  }
  return undefined;
}

/** A readable sentence for an HTTP status when the server sent no usable envelope. */
function fallbackMessage(status: number): string {
  switch (status) {
    case 400:
      return 'The request was not accepted (bad input).';
    case 401:
      return 'You are not signed in, or your session has ended. Please sign in again.';
    case 403:
      return 'You are not allowed to do this.';
    case 404:
      return 'Not found.';
    case 409:
      return 'This conflicts with the current state; reload and try again.';
    case 413:
      return 'The request is too large.';
    case 429:
      return 'Too many attempts. Please wait a few minutes and try again.';
    case 502:
    case 503:
    case 504:
      return 'The Deckshare server is not answering right now. Please try again shortly.';
    default:
      return status >= 500
        ? 'The server met an unexpected problem. Please try again; if it persists, tell your administrator.'
        : `The request failed (HTTP ${status}).`;
  }
}

function fallbackCode(status: number): ApiErrorCode {
  const byStatus: Record<number, ApiErrorCode> = {
    400: 'bad_request',
    401: 'unauthenticated',
    403: 'forbidden',
    404: 'not_found',
    409: 'conflict',
    413: 'payload_too_large',
    429: 'too_many_requests',
  };
  return byStatus[status] ?? (status >= 500 ? 'internal' : 'bad_response');
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Builds an ApiError from a non-2xx status and whatever body came back (maybe none). */
export function errorFromResponse(status: number, body: unknown): ApiError {
  const envelope = isRecord(body) && isRecord(body.error) ? body.error : undefined;
  const code = envelope && typeof envelope.code === 'string' && envelope.code ? envelope.code : fallbackCode(status);
  const message =
    envelope && typeof envelope.message === 'string' && envelope.message.trim()
      ? envelope.message
      : fallbackMessage(status);
  const details: ApiErrorDetail[] = [];
  if (envelope && Array.isArray(envelope.details)) {
    for (const d of envelope.details) {
      if (isRecord(d) && typeof d.message === 'string') {
        details.push({ path: typeof d.path === 'string' ? d.path : '', message: d.message });
      }
    }
  }
  return new ApiError(status, code, message, details);
}

export type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions {
  method?: HttpMethod;
  /** Serialised as JSON. */
  body?: unknown;
  /** Query parameters; undefined values are left out. */
  query?: Record<string, string | number | boolean | undefined>;
  /** Extra request headers (e.g. `Prefer: respond-async`). */
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

/** Listeners told about every 401/password-change answer (the auth store subscribes). */
type SessionListener = (error: ApiError) => void;
const sessionListeners = new Set<SessionListener>();

/** Subscribe to session problems (401 unauthenticated, 403 password_change_required). */
export function onSessionProblem(listener: SessionListener): () => void {
  sessionListeners.add(listener);
  return () => sessionListeners.delete(listener);
}

function buildUrl(path: string, query?: RequestOptions['query']): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined) params.set(key, String(value));
  }
  const qs = params.toString();
  return qs ? `${path}${path.includes('?') ? '&' : '?'}${qs}` : path;
}

/**
 * Sends one request to the API and returns the parsed JSON body (undefined for 204).
 * Throws ApiError for any failure; never resolves with an error body.
 */
export async function request<T>(path: string, options: RequestOptions = {}): Promise<T> {
  return (await requestWithStatus<T>(path, options)).body;
}

/** As `request`, with the success status (e.g. 202 Accepted beside 200). */
export async function requestWithStatus<T>(path: string, options: RequestOptions = {}): Promise<{ status: number; body: T }> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { ...options.headers, Accept: 'application/json' };
  let body: string | undefined;
  if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }
  if (method !== 'GET') {
    const token = readCookie(CSRF_COOKIE);
    if (token) headers[CSRF_HEADER] = token;
  }

  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body,
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(
      0,
      'network_error',
      'Could not reach the Deckshare server. Check your network connection and try again.',
    );
  }

  if (response.status === 204) return { status: 204, body: undefined as T };

  const text = await response.text().catch(() => '');
  let parsed: unknown = undefined;
  let parseFailed = false;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parseFailed = true;
    }
  }

  if (!response.ok) {
    const error = errorFromResponse(response.status, parsed);
    if (error.status === 401 || error.code === 'password_change_required') {
      for (const listener of sessionListeners) listener(error);
    }
    throw error;
  }
  if (parseFailed) {
    throw new ApiError(
      response.status,
      'bad_response',
      'The server sent an answer the client could not read. Please reload the page.',
    );
  }
  return { status: response.status, body: parsed as T };
}

/** A downloaded file: its bytes and the name the server gave it (Content-Disposition). */
export interface DownloadedFile {
  blob: Blob;
  fileName: string | null;
}

/**
 * Asks for a file (a PDF, a CSV). Resolves with the file, or with the JSON body of a 202 (the
 * server answered with a job to follow instead). Throws ApiError for any failure, as `request`.
 */
export async function requestFile<T>(path: string, options: Pick<RequestOptions, 'headers' | 'signal'> = {}): Promise<{ status: 200; file: DownloadedFile } | { status: 202; body: T }> {
  let response: Response;
  try {
    response = await fetch(path, { headers: { ...options.headers }, credentials: 'same-origin', signal: options.signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network_error', 'Could not reach the Deckshare server. Check your network connection and try again.');
  }
  if (!response.ok || response.status === 202) {
    const text = await response.text().catch(() => '');
    let parsed: unknown;
    try {
      parsed = text ? JSON.parse(text) : undefined;
    } catch {
      parsed = undefined;
    }
    if (response.status === 202) return { status: 202, body: parsed as T };
    const error = errorFromResponse(response.status, parsed);
    if (error.status === 401 || error.code === 'password_change_required') {
      for (const listener of sessionListeners) listener(error);
    }
    throw error;
  }
  return { status: 200, file: { blob: await response.blob(), fileName: fileNameOf(response.headers.get('Content-Disposition') ?? '') } };
}

/** The file name of a Content-Disposition header (RFC 6266): `filename*=UTF-8''…` first, then `filename="…"` or a bare token. */
export function fileNameOf(disposition: string): string | null {
  const extended = /filename\*\s*=\s*UTF-8''([^;]+)/i.exec(disposition);
  if (extended) {
    try {
      return decodeURIComponent(extended[1].trim());
    } catch {
      // a malformed escape: fall back to the plain name
    }
  }
  const plain = /filename\s*=\s*(?:"((?:[^"\\]|\\.)*)"|([^;\s]+))/i.exec(disposition);
  if (!plain) return null;
  return plain[1] !== undefined ? plain[1].replace(/\\(.)/g, '$1') : plain[2];
}

export const http = {
  get: <T>(path: string, query?: RequestOptions['query'], signal?: AbortSignal) =>
    request<T>(path, { method: 'GET', query, signal }),
  post: <T>(path: string, body?: unknown) => request<T>(path, { method: 'POST', body }),
  patch: <T>(path: string, body: unknown) => request<T>(path, { method: 'PATCH', body }),
};

/** A readable sentence for any thrown value (for message/alert display). */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.details.length > 0 && (error.code === 'validation_failed' || error.code === 'bad_request')) {
      return error.details.map((d) => (fieldOf(d.path) ? `${fieldOf(d.path)}: ${d.message}` : d.message)).join('; ');
    }
    return asSentence(error.message);
  }
  if (error instanceof Error && error.message) return asSentence(error.message);
  return 'Something went wrong. Please try again.';
}
