/** Hostile input on every API route, listed from the app's router stack: bad path parameters,
 *  bad queries, malformed and hostile JSON bodies (wrong types, huge and non-finite numbers,
 *  numbers as strings, 10,000-deep nesting, long arrays, long and unicode strings,
 *  `__proto__`/`constructor`/`prototype` keys) and, by fast-check, one hostile value put in
 *  place of any field of a well-formed body. Each answer must be below 500, every refusal the
 *  one error envelope (naming the field when the request was at fault), and a refused request
 *  must leave every table as it was. The server must still answer /api/health afterwards. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import request from 'supertest';
import { makeWorkflowApp, addUser, type WorkflowContext } from './workflowHelpers.js';
import { listRoutes, type RouteInfo } from './routeTable.js';
import { buildWorld, fillPath, sampleRequests, sendRequest, databaseState, tableCounts, type SampleRequest } from './routeWorld.js';
import type { Agent } from './helpers.js';

let ctx: WorkflowContext;
let fuzzer: Agent;
let routes: RouteInfo[];
let samples: Record<string, SampleRequest>;

beforeAll(async () => {
  // Sign-in attempts are rate-limited; raise the limit so the hostile sign-in bodies reach validation.
  ctx = await makeWorkflowApp({ loginAttemptsPer15Min: 100_000, loginAttemptsPerAddressPer15Min: 100_000 });
  const ids = await buildWorld(ctx);
  // One user holding every role, so each route's own validation is reached.
  fuzzer = (await addUser(ctx, 'fuzz@larchmont-ridge.example', ['admin', 'designer', 'reviewer', 'instructor', 'trainee'])).agent;
  routes = listRoutes(ctx.app);
  samples = sampleRequests(ids);
}, 60_000);
afterAll(() => ctx.close());

// ---- what a proper answer looks like -------------------------------------------------------

interface Answer {
  status: number;
  body: unknown;
  headers: Record<string, string>;
}

/** The problem with an answer, or null: below 500, and a refusal is the one envelope. */
function envelopeProblem(res: Answer, blame: 'params' | 'query' | 'body' | null): string | null {
  if (res.status >= 500) return `status ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`;
  if (res.status < 400) return null;
  const e = (res.body as { error?: { code?: unknown; message?: unknown; details?: unknown } } | undefined)?.error;
  if (!e || typeof e.code !== 'string' || typeof e.message !== 'string' || !Array.isArray(e.details)) return `status ${res.status} without the error envelope: ${JSON.stringify(res.body).slice(0, 200)}`;
  for (const d of e.details as { path?: unknown; message?: unknown }[]) {
    if (typeof d.path !== 'string' || typeof d.message !== 'string') return `a detail without path and message: ${JSON.stringify(d)}`;
  }
  if (blame && res.status === 400 && e.code === 'validation_failed') {
    const paths = (e.details as { path: string }[]).map((d) => d.path);
    const prefixes = blame === 'body' ? ['body', 'file'] : [blame];
    if (paths.length === 0 || !paths.some((p) => prefixes.some((x) => p === x || p.startsWith(`${x}.`)))) return `400 whose details name no ${blame} field: ${JSON.stringify(e.details)}`;
  }
  return null;
}

const problems: string[] = [];

/** Waits until no study computes in the background (an accepted sample request may start one, whose points are written later). */
async function studiesIdle(): Promise<void> {
  for (let i = 0; i < 400; i++) {
    const running = ctx.db.$client.prepare("SELECT count(*) AS n FROM studies WHERE state = 'running'").get() as { n: number };
    if (running.n === 0) return;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error('a study still computes after 10 s');
}

/** Sends one request and records what is wrong with its answer and with the database after it. */
async function probe(route: RouteInfo, label: string, blame: 'params' | 'query' | 'body' | null, go: (agent: Agent) => PromiseLike<Answer>) {
  const sample = samples[route.key];
  const agent = sample.anonymous ? (Object.assign(request.agent(ctx.app), { csrf: 'none' }) as Agent) : fuzzer;
  await ctx.mailer.idle();
  await studiesIdle();
  const before = { counts: tableCounts(ctx.db), state: databaseState(ctx.db) };
  const res = await go(agent);
  await ctx.mailer.idle();
  const problem = envelopeProblem(res, blame);
  if (problem) problems.push(`${route.key} [${label}]: ${problem}`);
  if (res.status >= 400) {
    const counts = tableCounts(ctx.db);
    const changed = Object.keys(counts).filter((t) => counts[t] !== before.counts[t]);
    if (changed.length) problems.push(`${route.key} [${label}]: refused with ${res.status} but rows were added or removed in ${changed.join(', ')}`);
    else if (databaseState(ctx.db) !== before.state) problems.push(`${route.key} [${label}]: refused with ${res.status} but stored rows changed`);
  }
  return res;
}

function report() {
  const list = problems.splice(0);
  expect(list, list.join('\n')).toEqual([]);
}

// ---- hostile values -----------------------------------------------------------------------

/** JSON texts that JSON.stringify cannot produce (non-finite numbers, very deep nesting). */
const RAW: Record<string, string> = {
  infinity: '1e999',
  negativeInfinity: '-1e999',
  deepArray: '['.repeat(10_000) + ']'.repeat(10_000),
  deepObject: '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000),
};
const raw = (name: keyof typeof RAW) => `@@RAW:${name}@@`;

/** The JSON text of a value holding `raw(…)` markers and own `__proto__` keys. */
function toJson(value: unknown): string {
  return JSON.stringify(value).replace(/"@@RAW:(\w+)@@"/g, (_m, n: string) => RAW[n]);
}

const UNICODE = ['\u202Eevil\u202C', 'e\u0301\u0302\u0303\u0304\u0305', '🌉🚚👷🏽‍♀️', 'a\u0000b', '\u0000', '\uFEFFbom', '\uD800', 'ﷺ 𒐫 ⸻', '=HYPERLINK("http://x")', '<script>alert(1)</script>', "'; drop table users; --"];
const NUMBERISH = [1e308, -1e308, 1e-320, -0, 0, -1, 1.5, 2 ** 53 + 2, 'NaN', 'Infinity', '-Infinity', '1e308', '12', '-1.25', '0x10'];

const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(...NUMBERISH, '', '   ', null, true, false, [], {}),
  fc.constantFrom(raw('infinity'), raw('negativeInfinity'), raw('deepArray'), raw('deepObject')),
  fc.constantFrom(...UNICODE),
  fc.string({ unit: 'grapheme', maxLength: 30 }),
  fc.constantFrom('x'.repeat(100_000), 'é'.repeat(5_000)),
  fc.constant(new Array(50_000).fill(1)),
  fc.array(fc.oneof(fc.integer(), fc.string({ maxLength: 5 })), { maxLength: 4 }),
);
const hostileKey = fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'zz_unknown');

type Path = (string | number)[];

/** Every path into a JSON value (the root, every member and element). */
function pathsOf(value: unknown, at: Path = []): Path[] {
  const out: Path[] = [at];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...pathsOf(v, [...at, i])));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) out.push(...pathsOf(v, [...at, k]));
  return out;
}

function setAt(root: unknown, path: Path, value: unknown): unknown {
  if (path.length === 0) return value;
  const copy = structuredClone(root) as Record<string | number, unknown>;
  let node = copy;
  for (const k of path.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
  node[path[path.length - 1]] = value;
  return copy;
}

/** Adds an own key (also `__proto__`, which a plain assignment would not create). */
function addKey(root: unknown, path: Path, key: string, value: unknown): unknown {
  const copy = structuredClone(root);
  let node = copy as Record<string | number, unknown>;
  for (const k of path) node = node[k] as Record<string | number, unknown>;
  if (!node || typeof node !== 'object' || Array.isArray(node)) return copy;
  Object.defineProperty(node, key, { value, enumerable: true, configurable: true, writable: true });
  return copy;
}

const BAD_IDS = ['0', '-1', '1.5', '1.0', '1e0', '+1', 'abc', '99999999999999999999999', '1e308', '-1e308', '1e-320', 'NaN', 'Infinity', '0x10', ' 1', '1;drop', '%00', '🌉', '__proto__', 'constructor'];

const WHOLE_BODIES: [string, string][] = [
  ['truncated JSON', '{"a":'],
  ['array', '[]'],
  ['string', '"text"'],
  ['number', '12'],
  ['null', 'null'],
  ['non-finite number', '1e999'],
  ['__proto__ key', '{"__proto__":{"admin":true},"constructor":{"prototype":{"x":1}}}'],
  ['10,000-deep array', RAW.deepArray],
  ['10,000-deep object', RAW.deepObject],
  ['600 kB string', JSON.stringify({ name: 'x'.repeat(600_000) })],
  ['100,000-element array', JSON.stringify({ items: new Array(100_000).fill(0) })],
];

// ---- the tests ----------------------------------------------------------------------------

describe('hostile input on every route', () => {
  it('every route of the router stack has a well-formed sample to mutate', () => {
    const missing = routes.filter((r) => !samples[r.key]).map((r) => r.key);
    expect(missing, `routes without a hostile case (add them to tests/server/routeWorld.ts): ${missing.join(', ')}`).toEqual([]);
    const stale = Object.keys(samples).filter((k) => !routes.some((r) => r.key === k));
    expect(stale, 'samples for routes that no longer exist').toEqual([]);
    expect(routes.length).toBeGreaterThanOrEqual(52);
  });

  it('bad path parameters: 0, -1, 1.5, text, huge, non-finite, ../ — refused with the envelope', async () => {
    for (const route of routes) {
      const sample = samples[route.key];
      for (const name of Object.keys(sample.params ?? {})) {
        for (const bad of BAD_IDS) {
          const url = fillPath(route, { ...sample.params, [name]: bad });
          const res = await probe(route, `:${name}=${bad}`, 'params', (a) => sendRequest(a, route.method, url, { query: sample.query, rawBody: sample.body ? toJson(sample.body) : undefined, file: sample.file }));
          if (res.status < 400) problems.push(`${route.key} [:${name}=${bad}]: accepted with ${res.status}`);
        }
        // A relative segment in place of the id must not reach another route's data.
        const dotted = fillPath(route, sample.params).replace(encodeURIComponent(String(sample.params![name])), '..');
        const res = await probe(route, `:${name}=..`, null, (a) => sendRequest(a, route.method, dotted, {}));
        if (res.status < 400 && route.method !== 'GET') problems.push(`${route.key} [:${name}=..]: accepted with ${res.status}`);
      }
    }
    report();
  }, 180_000);

  it('bad queries: unknown keys, repeated keys, long and non-finite values', async () => {
    for (const route of routes) {
      const sample = samples[route.key];
      const base = fillPath(route, sample.params);
      const queries: [string, string][] = [['unknown key', 'zz_unknown=1'], ['__proto__ key', '__proto__=1&constructor=x'], ['prototype pollution', '__proto__[admin]=1']];
      for (const key of Object.keys(sample.query ?? {})) {
        for (const v of ['', 'x'.repeat(10_000), '1e308', 'NaN', '-1', '1.5', '__proto__', '%00', encodeURIComponent('🌉\u202E')]) queries.push([`${key}=${v.slice(0, 12)}`, `${key}=${v}`]);
        queries.push([`${key} repeated`, `${key}=1&${key}=2`]);
      }
      for (const [label, qs] of queries) {
        // Routes that read a query get their well-formed body too; the others need none to show that the query is ignored.
        const parts = sample.query ? { rawBody: sample.body ? toJson(sample.body) : undefined, file: sample.file } : {};
        await probe(route, `?${label}`, sample.query ? 'query' : null, (a) => sendRequest(a, route.method, `${base}?${qs}`, parts));
      }
    }
    report();
  }, 180_000);

  it('malformed and hostile whole bodies on every route that takes one', async () => {
    for (const route of routes.filter((r) => r.method !== 'GET')) {
      const sample = samples[route.key];
      const url = fillPath(route, sample.params);
      for (const [label, text] of WHOLE_BODIES) {
        const res = await probe(route, label, 'body', (a) => sendRequest(a, route.method, url, { query: sample.query, rawBody: text }));
        if ((sample.body || sample.file) && res.status < 400 && label !== 'null') problems.push(`${route.key} [${label}]: accepted with ${res.status}`);
      }
    }
    report();
  }, 180_000);

  it('every field of every well-formed body set to huge, tiny, non-finite and text numbers and 10,000-deep nesting', async () => {
    const extremes: unknown[] = [1e308, -1e308, 1e-320, raw('infinity'), 'NaN', '12', -1.25, raw('deepArray'), raw('deepObject')];
    for (const route of routes.filter((r) => samples[r.key].body && Object.keys(samples[r.key].body!).length > 0)) {
      const sample = samples[route.key];
      const url = fillPath(route, sample.params);
      for (const path of pathsOf(sample.body).filter((p) => p.length > 0)) {
        for (const value of extremes) {
          await probe(route, `${path.join('.')}=${String(value)}`, 'body', (a) => sendRequest(a, route.method, url, { query: sample.query, rawBody: toJson(setAt(sample.body, path, value)) }));
        }
      }
    }
    report();
  }, 180_000);

  it('one hostile value in place of any field of a well-formed body (fast-check)', async () => {
    for (const route of routes.filter((r) => samples[r.key].body && Object.keys(samples[r.key].body!).length > 0)) {
      const sample = samples[route.key];
      const url = fillPath(route, sample.params);
      const paths = pathsOf(sample.body);
      const mutation = fc.oneof(
        fc.record({ kind: fc.constant('replace' as const), path: fc.constantFrom(...paths), value: hostileValue }),
        fc.record({ kind: fc.constant('add key' as const), path: fc.constantFrom(...paths), key: hostileKey, value: hostileValue }),
      );
      await fc.assert(
        fc.asyncProperty(mutation, async (m) => {
          const body = m.kind === 'replace' ? setAt(sample.body, m.path, m.value) : addKey(sample.body, m.path, m.key, m.value);
          const label = `${m.kind} ${m.path.join('.') || '(root)'}${m.kind === 'add key' ? `.${m.key}` : ''}`;
          await probe(route, label, 'body', (a) => sendRequest(a, route.method, url, { query: sample.query, rawBody: toJson(body) }));
          return true;
        }),
        { numRuns: 12 },
      );
    }
    report();
  }, 180_000);

  it('hostile multipart fields and files on the upload routes', async () => {
    for (const route of routes.filter((r) => samples[r.key].file)) {
      const sample = samples[route.key];
      const file = sample.file!;
      const url = fillPath(route, sample.params);
      const variants: [string, SampleRequest['file']][] = [
        ['empty file', { ...file, content: Buffer.alloc(0) }],
        ['NUL bytes', { ...file, content: Buffer.alloc(64) }],
        ['unicode file name', { ...file, filename: '\u202Egnp.exe🌉\u0301' }],
        ['dotted file name', { ...file, filename: '../../etc/passwd' }],
        ['unknown field', { ...file, fields: { ...file.fields, zz_unknown: '1' } }],
        ['__proto__ field', { ...file, fields: { ...file.fields, __proto__: 'x' } as Record<string, string> }],
      ];
      for (const k of Object.keys(file.fields ?? {})) {
        for (const v of ['', 'x'.repeat(9_000), '1e308', 'NaN', '-1', '\u0000', '🌉\u202E', '1.5']) variants.push([`${k}=${v.slice(0, 10)}`, { ...file, fields: { ...file.fields, [k]: v } }]);
      }
      for (const [label, f] of variants) await probe(route, label, 'body', (a) => sendRequest(a, route.method, url, { file: f }));
    }
    report();
  }, 180_000);

  it('cases that once answered 500: a 10,000-deep e-mail at sign-in, 10,000-deep saved placements', async () => {
    const login = await request(ctx.app).post('/api/auth/login').set('Content-Type', 'application/json').send(`{"email":${RAW.deepArray},"password":"x"}`);
    expect(login.status).toBe(400);
    expect(login.body.error.details[0].path).toBe('body.email');
    const save = samples['POST /api/projects/:projectId/decks'];
    const url = fillPath(routes.find((r) => r.key === 'POST /api/projects/:projectId/decks')!, save.params);
    const deep = await sendRequest(fuzzer, 'POST', url, { rawBody: toJson({ ...save.body, placements: raw('deepObject') }) });
    expect(deep.status).toBe(400);
    expect(deep.body.error.details.length).toBeGreaterThan(0);
    for (const d of deep.body.error.details) expect(d.path).toMatch(/^body\.placements/);
  });

  it("a trainee's answer of 1e308 is refused, so no grade holds a difference that is not finite", async () => {
    const ids = (await fuzzer.get('/api/auth/me')).body.user.id as number;
    const versionId = (await fuzzer.get(`/api/decks/${samples['GET /api/decks/:deckId'].params!.deckId}/versions/1`)).body.version.id as number;
    const made = await sendRequest(fuzzer, 'POST', '/api/training/assignments', {
      rawBody: JSON.stringify({ kind: 'factor', versionId, params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' }, tolerancePercent: 1, dueAt: new Date(Date.now() + 86400_000).toISOString(), traineeIds: [ids] }),
    });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    for (const value of [1e308, -1e308]) {
      const res = await sendRequest(fuzzer, 'POST', `/api/training/mine/${made.body.assignment.id}/submissions`, { rawBody: JSON.stringify({ value }) });
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].path).toBe('body.value');
    }
    const ok = await sendRequest(fuzzer, 'POST', `/api/training/mine/${made.body.assignment.id}/submissions`, { rawBody: JSON.stringify({ value: 1e-320 }) });
    expect(ok.status).toBe(201);
    for (const c of ok.body.submission.grading.checks) expect(Number.isFinite(c.differencePercent)).toBe(true);
  });

  it('the process is still alive and answers /api/health', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('ok');
  });
});
