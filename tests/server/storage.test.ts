/**
 * Stored data stays readable and bounded (API, in-process): saved placements follow one
 * bounded format (the largest accepted value reads back unchanged; anything else is a 400
 * naming the field); results are stored compressed and read back equal to the solver's; rows
 * saved before either change stay readable; and a firm past its storage quota cannot save.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { analysisResults, auditLog, deckVersions, firms, firmStorage } from '../../server/db/schema.js';
import { MAX_GIRDERS, MAX_LANES, PLACEMENTS_MAX_BYTES } from '../../server/api/decks/placementsModel.js';
import { encodeResult, MAX_RESULT_JSON_BYTES, ResultTooLargeError } from '../../server/storage/storedResults.js';
import { computeCodeFactors } from '../../shared/lrfd/factors.js';
import { assertDeck } from '../../shared/deck/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

const post = (a: Agent, url: string, body: unknown) => a.post(url).set('X-CSRF-Token', a.csrf).send(body as object);
/** Sends JSON text as written (the test client's own serializer cannot write very deep values). */
const postRaw = (a: Agent, url: string, json: string) => a.post(url).set('X-CSRF-Token', a.csrf).set('Content-Type', 'application/json').send(json);

/** Every list full, every optional field present, every number at full double precision. */
function largestPlacements() {
  const n = (i: number) => -1234.5678901234567 + i * 0.1111111111111111;
  const perGirder = (k: number) => Array.from({ length: MAX_GIRDERS }, (_, g) => (g % 7 === 3 ? null : -123.45678901234567 + g * 1.0000000000000002 + k));
  return {
    format: 'deckshare-placements-1',
    vehicle: 'design tandem',
    lanes: Array.from({ length: MAX_LANES }, (_, i) => ({ left: n(i), wheelOffset: n(i + 1), frontAxleAt: n(i + 2), direction: -1, axleSpacing: 9.143999999999998 })),
    studied: { girder: MAX_GIRDERS - 1, effect: 'shear' },
    shares: { moment: perGirder(0), shear: perGirder(1) },
    governing: { moment: perGirder(2), shear: perGirder(3) },
  };
}

/** `{"a":{"a":…1…}}` nested `depth` levels, as JSON text. */
function nestedJson(depth: number): string {
  return '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
}
const nested = (depth: number): unknown => JSON.parse(nestedJson(depth));

let ctx: TestContext;
let designer: Agent;
let projectId: number;
beforeAll(async () => {
  ctx = await makeTestApp();
  designer = await signIn(ctx.app, demo.designer);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
});
afterAll(() => ctx.close());

describe('saved placements', () => {
  it('stores the largest accepted value and reads it back unchanged', async () => {
    const placements = largestPlacements();
    const bytes = Buffer.byteLength(JSON.stringify(placements));
    expect(bytes).toBeGreaterThan(8 * 1024);
    expect(bytes).toBeLessThanOrEqual(PLACEMENTS_MAX_BYTES);
    const created = await post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'fullest placements', placements });
    expect(created.status).toBe(201);
    expect(created.body.version.placements).toEqual(placements);
    const deckId = created.body.deck.id;
    const saved = await post(designer, `/api/decks/${deckId}/versions`, { deck: quarryCreekDeck(), message: 'again', placements, basedOnVersionId: created.body.version.id });
    expect(saved.status).toBe(201);
    expect(saved.body.version.placements).toEqual(placements);
    for (const number of [1, 2]) {
      const got = await designer.get(`/api/decks/${deckId}/versions/${number}`);
      expect(got.status).toBe(200);
      expect(got.body.version.placements).toEqual(placements);
    }
    const history = await designer.get(`/api/decks/${deckId}`);
    expect(history.status).toBe(200);
    expect(history.body.versions.map((v: { number: number }) => v.number)).toEqual([2, 1]);
  });

  it('refuses anything else with 400 naming the field, and writes nothing', async () => {
    const before = ctx.db.select().from(deckVersions).all().length;
    const full = largestPlacements();
    const raw = (v: unknown) => JSON.stringify(v);
    const cases: [string, string][] = [
      [nestedJson(10_000), 'body.placements'],
      [nestedJson(4_083), 'body.placements'],
      [`[${'['.repeat(5000)}${']'.repeat(5000)}]`, 'body.placements'],
      [raw({ ...full, format: undefined }).replace(/}$/, `,"extra":${nestedJson(5000)}}`), 'body.placements'],
      [raw({ ...full, format: 'something-else' }), 'body.placements.format'],
      [raw({ ...full, lanes: Array.from({ length: MAX_LANES + 1 }, () => full.lanes[0]) }), 'body.placements.lanes'],
      [raw({ ...full, lanes: [{ left: 1, wheelOffset: 'x'.repeat(100_000) }] }), 'body.placements.lanes.0.wheelOffset'],
      [raw({ ...full, lanes: [{ left: 1, wheelOffset: 0.6, note: 'hi' }] }), 'body.placements.lanes.0'],
      [raw({ ...full, studied: { girder: MAX_GIRDERS, effect: 'moment' } }), 'body.placements.studied.girder'],
      [raw({ ...full, shares: { moment: Array.from({ length: MAX_GIRDERS + 1 }, () => 0.5) } }), 'body.placements.shares.moment'],
      [raw({ ...full, governing: { moment: [nested(20)] } }), 'body.placements.governing.moment.0'],
      [raw('a string'), 'body.placements'],
    ];
    const deckJson = JSON.stringify(quarryCreekDeck());
    for (const [placements, path] of cases) {
      const res = await postRaw(designer, `/api/projects/${projectId}/decks`, `{"deck":${deckJson},"message":"bad placements","placements":${placements}}`);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path), path).toContain(path);
    }
    expect(ctx.db.select().from(deckVersions).all().length).toBe(before);
  });

  it('still answers a version saved with free-form placements before the format was enforced', async () => {
    const created = await post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'for old rows' });
    const deckId = created.body.deck.id;
    const v1 = ctx.db.select().from(deckVersions).where(eq(deckVersions.id, created.body.version.id)).get()!;
    const insertOld = (number: number, placementsJson: string) =>
      ctx.db.insert(deckVersions).values({ deckId, number, deckJson: v1.deckJson, placementsJson, message: 'saved by an older release', createdBy: v1.createdBy }).run();
    insertOld(2, JSON.stringify(nested(4_083)));
    insertOld(3, JSON.stringify({ lanes: [{ left: 1, wheelOffset: 0.6 }], note: 'older shape' }));
    const deep = await designer.get(`/api/decks/${deckId}/versions/2`);
    expect(deep.status).toBe(200);
    expect(deep.body.version.placements).toBeNull();
    const shallow = await designer.get(`/api/decks/${deckId}/versions/3`);
    expect(shallow.status).toBe(200);
    expect(shallow.body.version.placements).toEqual({ lanes: [{ left: 1, wheelOffset: 0.6 }], note: 'older shape' });
  });
});

describe('stored results', () => {
  it('are stored compressed and read back equal to the solver result', async () => {
    const deck = quarryCreekDeck();
    const created = await post(designer, `/api/projects/${projectId}/decks`, { deck, message: 'compressed' });
    expect(created.status).toBe(201);
    const row = ctx.db.select().from(analysisResults).where(eq(analysisResults.versionId, created.body.version.id)).get()!;
    const json = JSON.stringify(computeCodeFactors(assertDeck(deck)));
    expect(row.encoding).toBe('brotli-json');
    expect(row.dataJson).toBe('');
    // brotli stores this code result in about 1/30 of its JSON (tests/bench/storage.ts: 206.3 KB → 6.1 KB);
    // 1/5 leaves a wide margin for other solver output
    expect(row.dataBlob!.length).toBeLessThan(json.length / 5);
    const got = await designer.get(`/api/decks/${created.body.deck.id}/versions/1?include=results`);
    expect(got.body.version.results.find((r: { method: string }) => r.method === 'code').data).toEqual(JSON.parse(json));
  });

  it('reads a result stored as plain JSON by an older release', async () => {
    const created = await post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'older result' });
    const deckId = created.body.deck.id;
    const v1 = ctx.db.select().from(deckVersions).where(eq(deckVersions.id, created.body.version.id)).get()!;
    const v2 = ctx.db.insert(deckVersions).values({ deckId, number: 2, deckJson: v1.deckJson, message: 'older release', createdBy: v1.createdBy }).returning().get();
    ctx.db.insert(analysisResults).values({ versionId: v2.id, method: 'code', solverVersion: 'older', dataJson: JSON.stringify({ marker: 'plain json' }) }).run();
    const got = await designer.get(`/api/decks/${deckId}/versions/2?include=results`);
    expect(got.status).toBe(200);
    expect(got.body.version.results).toEqual([expect.objectContaining({ method: 'code', solverVersion: 'older', data: { marker: 'plain json' } })]);
  });

  it('refuses to store a result larger than the bound', () => {
    expect(() => encodeResult({ text: 'x'.repeat(MAX_RESULT_JSON_BYTES) })).toThrow(ResultTooLargeError);
    expect(encodeResult({ text: 'x'.repeat(MAX_RESULT_JSON_BYTES - 20) }).encoding).toBe('brotli-json');
  });
});

describe('firm storage quota', () => {
  /** What the firm's rows hold, summed in SQL from the stored columns. */
  function storedInRows(c: TestContext, firmId: number): number {
    const one = (sql: string) => Number((c.db.$client.prepare(sql).get(firmId) as { n: number | null }).n ?? 0);
    const scope = 'JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id WHERE p.firm_id = ?';
    return (
      one(`SELECT SUM(length(CAST(v.deck_json AS BLOB)) + COALESCE(length(CAST(v.placements_json AS BLOB)), 0)) AS n FROM deck_versions v ${scope}`) +
      one(`SELECT SUM(length(CAST(r.data_json AS BLOB)) + COALESCE(length(r.data_blob), 0)) AS n FROM analysis_results r JOIN deck_versions v ON v.id = r.version_id ${scope}`)
    );
  }

  it('counts exactly what the firm stores', async () => {
    const firmId = ctx.db.select().from(firms).get()!.id;
    const counted = ctx.db.select().from(firmStorage).where(eq(firmStorage.firmId, firmId)).get()!.bytes;
    expect(counted).toBeGreaterThan(0);
    expect(counted).toBe(storedInRows(ctx, firmId));
  });

  it('refuses a save past the quota with a clear 403, and writes nothing', async () => {
    const small = await makeTestApp({ firmStorageQuotaBytes: 1 });
    try {
      const a = await signIn(small.app, demo.designer);
      const pid = (await a.get('/api/projects')).body.projects[0].id;
      const versions = small.db.select().from(deckVersions).all().length;
      const audit = small.db.select().from(auditLog).all().length;
      const used = small.db.select().from(firmStorage).all()[0].bytes;
      const res = await post(a, `/api/projects/${pid}/decks`, { deck: quarryCreekDeck(), message: 'over quota' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('storage_quota_reached');
      expect(res.body.error.message).toMatch(/^the firm's stored data has reached its quota of 1 bytes \(.* stored, this save needs .* more\); nothing was saved/);
      const deckId = (await a.get(`/api/projects/${pid}/decks`)).body.decks[0].id;
      const again = await post(a, `/api/decks/${deckId}/versions`, { deck: quarryCreekDeck(), message: 'over quota' });
      expect(again.status).toBe(403);
      expect(small.db.select().from(deckVersions).all().length).toBe(versions);
      expect(small.db.select().from(auditLog).all().length).toBe(audit);
      expect(small.db.select().from(firmStorage).all()[0].bytes).toBe(used);
    } finally {
      await small.close();
    }
  });

  it('lets a save through when it fits exactly', async () => {
    const probe = await makeTestApp();
    let need: number;
    let used: number;
    try {
      const a = await signIn(probe.app, demo.designer);
      const pid = (await a.get('/api/projects')).body.projects[0].id;
      used = probe.db.select().from(firmStorage).all()[0].bytes;
      expect((await post(a, `/api/projects/${pid}/decks`, { deck: quarryCreekDeck(), message: 'sized' })).status).toBe(201);
      need = probe.db.select().from(firmStorage).all()[0].bytes - used;
    } finally {
      await probe.close();
    }
    for (const [quota, status] of [
      [used + need, 201],
      [used + need - 1, 403],
    ] as const) {
      const c = await makeTestApp({ firmStorageQuotaBytes: quota });
      try {
        const a = await signIn(c.app, demo.designer);
        const pid = (await a.get('/api/projects')).body.projects[0].id;
        expect((await post(a, `/api/projects/${pid}/decks`, { deck: quarryCreekDeck(), message: 'sized' })).status).toBe(status);
      } finally {
        await c.close();
      }
    }
  });
});
