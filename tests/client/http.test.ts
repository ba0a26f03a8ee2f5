// @vitest-environment happy-dom
/**
 * The client's fetch wrapper: the error envelope `{ error: { code, message, details } }`
 * documented for the Deckshare API becomes a typed ApiError; the double-submit CSRF token is
 * copied from the `ds_csrf` cookie into `X-CSRF-Token` on every non-GET request (OWASP CSRF
 * Prevention Cheat Sheet, "Double Submit Cookie"); a failed connection gives a readable message.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, describeError, errorFromResponse, fieldOf, http, onSessionProblem, readCookie, request } from '@/api/http';

type FetchArgs = [input: string, init: RequestInit];

function jsonResponse(status: number, body: unknown): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });
}

let fetchMock: ReturnType<typeof vi.fn<(...args: FetchArgs) => Promise<Response>>>;

beforeEach(() => {
  fetchMock = vi.fn<(...args: FetchArgs) => Promise<Response>>();
  vi.stubGlobal('fetch', fetchMock);
  document.cookie = 'ds_csrf=; expires=Thu, 01 Jan 1970 00:00:00 GMT; path=/';
  document.cookie = 'other=1; expires=Thu, 01 Jan 1970 00:00:00 GMT; path=/';
});

afterEach(() => {
  vi.unstubAllGlobals();
});

function headersOf(call: FetchArgs): Record<string, string> {
  return call[1].headers as Record<string, string>;
}

describe('CSRF header and request shape', () => {
  it('sends the ds_csrf cookie as X-CSRF-Token on POST and PATCH, with same-origin credentials', async () => {
    document.cookie = 'other=1; path=/';
    document.cookie = 'ds_csrf=tok%2Ben-42; path=/';
    fetchMock.mockResolvedValue(jsonResponse(200, { ok: true }));

    await http.post('/api/projects', { name: 'Culvert 7' });
    await http.patch('/api/projects/3', { name: 'Culvert 8' });

    expect(fetchMock).toHaveBeenCalledTimes(2);
    for (const call of fetchMock.mock.calls) {
      expect(headersOf(call)['X-CSRF-Token']).toBe('tok+en-42');
      expect(headersOf(call)['Content-Type']).toBe('application/json');
      expect(call[1].credentials).toBe('same-origin');
    }
    expect(fetchMock.mock.calls[0]![1].method).toBe('POST');
    expect(fetchMock.mock.calls[0]![1].body).toBe(JSON.stringify({ name: 'Culvert 7' }));
    expect(fetchMock.mock.calls[1]![1].method).toBe('PATCH');
  });

  it('does not send the token on GET, and builds the query string', async () => {
    document.cookie = 'ds_csrf=abc; path=/';
    fetchMock.mockResolvedValue(jsonResponse(200, { projects: [] }));

    await http.get('/api/projects', { archived: 'only', skip: undefined });

    const call = fetchMock.mock.calls[0]!;
    expect(call[0]).toBe('/api/projects?archived=only');
    expect(call[1].method).toBe('GET');
    expect(headersOf(call)['X-CSRF-Token']).toBeUndefined();
    expect(call[1].credentials).toBe('same-origin');
  });

  it('sends no token header when the cookie is absent (the server then answers csrf_failed)', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(403, { error: { code: 'csrf_failed', message: 'The request is missing its CSRF token.' } }),
    );
    const error = await http.post('/api/auth/logout').catch((e: unknown) => e);
    expect(headersOf(fetchMock.mock.calls[0]!)['X-CSRF-Token']).toBeUndefined();
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('csrf_failed');
    expect((error as ApiError).status).toBe(403);
  });

  it('names the form field of a detail path, without the request-part prefix', () => {
    expect(fieldOf('body.name')).toBe('name');
    expect(fieldOf('query.archived')).toBe('archived');
    expect(fieldOf('roles.0')).toBe('roles');
    expect(fieldOf('body')).toBe('');
  });

  it('reads one cookie among several, trimming spaces', () => {
    expect(readCookie('ds_csrf', 'a=1; ds_csrf=xyz ; b=2')).toBe('xyz');
    expect(readCookie('ds_csrf', 'a=1; not_ds_csrf=zzz')).toBeUndefined();
  });
});

describe('error mapping', () => {
  it('turns a validation envelope into an ApiError with field details', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Some fields are not valid.',
          details: [
            { path: 'body.name', message: 'Too long: at most 200 characters' },
            { path: 'body.units', message: "Expected 'US' or 'SI'" },
            { path: 'body', message: 'unknown field(s): colour' },
          ],
        },
      }),
    );
    const error = (await http.post('/api/projects', { name: 'x'.repeat(300) }).catch((e: unknown) => e)) as ApiError;

    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation_failed');
    expect(error.message).toBe('Some fields are not valid.');
    expect(error.details).toEqual([
      { path: 'body.name', message: 'Too long: at most 200 characters' },
      { path: 'body.units', message: "Expected 'US' or 'SI'" },
      { path: 'body', message: 'unknown field(s): colour' },
    ]);
    expect(error.fieldMessage('name')).toBe('Too long: at most 200 characters');
    expect(error.fieldMessage('units')).toBe("Expected 'US' or 'SI'");
    expect(error.fieldMessage('notes')).toBeUndefined();
    expect(describeError(error)).toBe(
      "name: Too long: at most 200 characters; units: Expected 'US' or 'SI'; unknown field(s): colour",
    );
  });

  it('keeps the server message for 401 and 409 and the code for each', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(401, { error: { code: 'unauthenticated', message: 'E-mail or password is not right.' } }),
    );
    fetchMock.mockResolvedValueOnce(
      jsonResponse(409, { error: { code: 'conflict', message: 'You cannot remove your own admin role.' } }),
    );
    const first = (await http.post('/api/auth/login', {}).catch((e: unknown) => e)) as ApiError;
    const second = (await http.patch('/api/admin/users/1', {}).catch((e: unknown) => e)) as ApiError;
    expect([first.status, first.code, first.message]).toEqual([401, 'unauthenticated', 'E-mail or password is not right.']);
    expect([second.status, second.code, second.message]).toEqual([409, 'conflict', 'You cannot remove your own admin role.']);
  });

  it('shows an API message written in lower case as a sentence (the sign-in failure)', () => {
    // The server's messages read as clauses ("e-mail or password is wrong"); a screen shows sentences.
    const error = errorFromResponse(401, { error: { code: 'unauthenticated', message: 'e-mail or password is wrong, or the account is disabled' } });
    expect(describeError(error)).toBe('E-mail or password is wrong, or the account is disabled.');
    expect(describeError(errorFromResponse(409, { error: { code: 'conflict', message: 'Already sent.' } }))).toBe('Already sent.');
  });

  it('gives a readable message when a 500 or 502 carries no envelope (empty or HTML body)', async () => {
    fetchMock.mockResolvedValueOnce(new Response('', { status: 500 }));
    fetchMock.mockResolvedValueOnce(new Response('<html><body>Bad Gateway</body></html>', { status: 502 }));
    const e500 = (await http.get('/api/projects').catch((e: unknown) => e)) as ApiError;
    const e502 = (await http.get('/api/projects').catch((e: unknown) => e)) as ApiError;
    expect(e500.code).toBe('internal');
    expect(e500.message).toMatch(/unexpected problem/);
    expect(e502.status).toBe(502);
    expect(e502.message).toMatch(/not answering/);
    expect(e502.message).not.toContain('<html>');
  });

  it('explains 429 even without a server message', () => {
    const error = errorFromResponse(429, {});
    expect(error.code).toBe('too_many_requests');
    expect(error.message).toMatch(/Too many attempts/);
  });

  it('ignores malformed details instead of failing', () => {
    const error = errorFromResponse(400, {
      error: { code: 'bad_request', message: 'Bad JSON', details: [null, 7, { path: 3, message: 'kept' }, { path: 'x' }] },
    });
    expect(error.details).toEqual([{ path: '', message: 'kept' }]);
  });

  it('turns a failed connection into a network_error with a sentence to act on', async () => {
    fetchMock.mockRejectedValue(new TypeError('Failed to fetch'));
    const error = (await http.get('/api/auth/me').catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(0);
    expect(error.code).toBe('network_error');
    expect(error.message).toMatch(/Could not reach the Deckshare server/);
  });

  it('refuses a 200 answer that is not JSON', async () => {
    fetchMock.mockResolvedValue(new Response('<!doctype html><p>index</p>', { status: 200 }));
    const error = (await http.get('/api/projects').catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('bad_response');
  });

  it('returns undefined for 204 No Content', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    await expect(request('/api/auth/logout', { method: 'POST' })).resolves.toBeUndefined();
  });

  it('tells session listeners about 401 and password_change_required, not about other errors', async () => {
    const seen: string[] = [];
    const stop = onSessionProblem((e) => seen.push(e.code));
    fetchMock.mockResolvedValueOnce(jsonResponse(401, { error: { code: 'unauthenticated', message: 'Signed out' } }));
    fetchMock.mockResolvedValueOnce(
      jsonResponse(403, { error: { code: 'password_change_required', message: 'Change your password first' } }),
    );
    fetchMock.mockResolvedValueOnce(jsonResponse(403, { error: { code: 'forbidden', message: 'Not for your role' } }));
    for (let i = 0; i < 3; i += 1) await http.get('/api/projects').catch(() => undefined);
    stop();
    expect(seen).toEqual(['unauthenticated', 'password_change_required']);
  });
});
