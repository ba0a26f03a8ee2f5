/** Projects, decks and versions: firm scoping, bad input, immutability (API, in-process). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { deckVersions, firms, userRoles, users } from '../../server/db/schema.js';
import { hashPassword } from '../../server/auth/password.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { assertDeck } from '../../shared/deck/schema.js';
import { computeCodeFactors } from '../../shared/lrfd/factors.js';
import { SOLVER_VERSION } from '../../shared/version.js';

let ctx: TestContext;
let designer: Agent;
let outsider: Agent;

beforeAll(async () => {
  ctx = await makeTestApp();
  designer = await signIn(ctx.app, demo.designer);
  // A second firm with one designer, to prove firm isolation.
  const firm = ctx.db.insert(firms).values({ name: 'Other Firm' }).returning().get();
  const u = ctx.db
    .insert(users)
    .values({ firmId: firm.id, email: 'designer@other-firm.example', name: 'Other Designer', passwordHash: await hashPassword('other-firm-pass'), mustChangePassword: false })
    .returning()
    .get();
  ctx.db.insert(userRoles).values({ userId: u.id, role: 'designer' }).run();
  outsider = await signIn(ctx.app, 'designer@other-firm.example', 'other-firm-pass');
});
afterAll(() => ctx.close());

const post = (a: Agent, url: string, body: unknown) => a.post(url).set('X-CSRF-Token', a.csrf).send(body as object);
const patch = (a: Agent, url: string, body: unknown) => a.patch(url).set('X-CSRF-Token', a.csrf).send(body as object);

describe('projects', () => {
  it('lists the two demo projects of the firm', async () => {
    const res = await designer.get('/api/projects');
    expect(res.status).toBe(200);
    expect(res.body.projects.map((p: { name: string }) => p.name)).toEqual(expect.arrayContaining(['Quarry Creek Overpass', 'Ashgrove Street Viaduct']));
  });

  it('creates, renames, archives and restores a project, each step audited', async () => {
    const created = await post(designer, '/api/projects', { name: 'Millrace Lane Bridge', ownerAgency: 'Town of Eastbury', location: 'Millrace Lane', units: 'SI', notes: '' });
    expect(created.status).toBe(201);
    const id = created.body.project.id;
    expect((await patch(designer, `/api/projects/${id}`, { name: 'Millrace Lane Bridge No. 2' })).body.project.name).toBe('Millrace Lane Bridge No. 2');
    expect((await patch(designer, `/api/projects/${id}`, { archived: true })).body.project.archived).toBe(true);
    expect((await designer.get('/api/projects')).body.projects.some((p: { id: number }) => p.id === id)).toBe(false);
    expect((await designer.get('/api/projects?archived=only')).body.projects.some((p: { id: number }) => p.id === id)).toBe(true);
    expect((await patch(designer, `/api/projects/${id}`, { archived: false })).body.project.archived).toBe(false);
    const audit = await designer.get(`/api/projects/${id}/audit`);
    expect(audit.body.entries.map((e: { action: string }) => e.action)).toEqual(['restore', 'archive', 'change', 'create']);
  });

  it('stores a hostile name verbatim (quotes, SQL, HTML) and refuses an over-long one', async () => {
    const hostile = `Robert'); DROP TABLE projects;-- <script>alert("x")</script>`;
    const res = await post(designer, '/api/projects', { name: hostile, units: 'US' });
    expect(res.status).toBe(201);
    expect((await designer.get(`/api/projects/${res.body.project.id}`)).body.project.name).toBe(hostile);
    const long = await post(designer, '/api/projects', { name: 'x'.repeat(10000), units: 'US' });
    expect(long.status).toBe(400);
    expect(long.body.error.details[0]).toEqual({ path: 'body.name', message: 'name must be at most 200 characters' });
  });

  it('names each bad field and refuses unknown fields', async () => {
    const res = await post(designer, '/api/projects', { name: '', units: 'metric', colour: 'red' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['body.name', 'body.units', 'body']));
    expect(res.body.error.message).toContain('colour');
    const badId = await designer.get('/api/projects/abc');
    expect(badId.status).toBe(400);
    expect(badId.body.error.details[0].path).toBe('params.projectId');
  });

  it('answers 404 for a project of another firm, and for a missing one', async () => {
    const mine = (await designer.get('/api/projects')).body.projects[0].id;
    expect((await outsider.get(`/api/projects/${mine}`)).status).toBe(404);
    expect((await patch(outsider, `/api/projects/${mine}`, { name: 'taken over' })).status).toBe(404);
    expect((await outsider.get(`/api/projects/${mine}/decks`)).status).toBe(404);
    expect((await outsider.get('/api/projects')).body.projects).toEqual([]);
    expect((await designer.get('/api/projects/99999')).status).toBe(404);
  });

  it('answers 413 for a body over the limit and 400 for broken JSON', async () => {
    const big = await designer.post('/api/projects').set('X-CSRF-Token', designer.csrf).set('Content-Type', 'application/json').send(JSON.stringify({ name: 'x', notes: 'y'.repeat(600_000), units: 'US' }));
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const broken = await designer.post('/api/projects').set('X-CSRF-Token', designer.csrf).set('Content-Type', 'application/json').send('{"name": ');
    expect(broken.status).toBe(400);
    expect(broken.body.error.code).toBe('bad_json');
  });
});

describe('decks and versions', () => {
  let projectId: number;
  beforeAll(async () => {
    projectId = (await post(designer, '/api/projects', { name: 'Deck versions', units: 'US' })).body.project.id;
  });

  it('saves a deck as version 1 with computed results, then version 2, leaving version 1 unchanged', async () => {
    const deck = quarryCreekDeck();
    const first = await post(designer, `/api/projects/${projectId}/decks`, { deck, message: 'first layout' });
    expect(first.status).toBe(201);
    const deckId = first.body.deck.id;
    expect(first.body.version.number).toBe(1);
    // The save answers with the headings of its stored results; their data is fetched with
    // ?include=results. The stored code-method result is the solver's own answer for the saved deck.
    expect(first.body.version.results).toEqual([{ method: 'code', solverVersion: SOLVER_VERSION, createdAt: expect.any(String) }]);
    const light = await designer.get(`/api/decks/${deckId}/versions/1`);
    const full = await designer.get(`/api/decks/${deckId}/versions/1?include=results`);
    // the version's page stays small; the big part (every factor row and its trace) comes on request
    expect(light.text.length).toBeLessThan(10_000);
    expect(full.text.length).toBeGreaterThan(5 * light.text.length);
    expect((await designer.get(`/api/decks/${deckId}/versions/1?include=everything`)).body.error.details).toEqual([{ path: 'query.include', message: 'include must be "results"' }]);
    const stored = full.body.version.results.find((r: { method: string }) => r.method === 'code');
    expect(stored.solverVersion).toBe(SOLVER_VERSION);
    const expected = computeCodeFactors(assertDeck(deck));
    expect(stored.data.governing).toEqual(JSON.parse(JSON.stringify(expected.governing)));
    const v1 = (await designer.get(`/api/decks/${deckId}/versions/1`)).body.version;

    const wider = { ...deck, girders: { kind: 'uniform', count: 7, spacing: 2.5 } };
    const second = await post(designer, `/api/decks/${deckId}/versions`, { deck: wider, message: 'seven girders', basedOnVersionId: v1.id });
    expect(second.status).toBe(201);
    expect(second.body.version.number).toBe(2);
    expect(second.body.version.basedOnVersionId).toBe(v1.id);

    const v1again = (await designer.get(`/api/decks/${deckId}/versions/1`)).body.version;
    expect(v1again).toEqual(v1);
    const list = (await designer.get(`/api/decks/${deckId}`)).body;
    expect(list.versions.map((v: { number: number }) => v.number)).toEqual([2, 1]);
    expect(list.deck.latestVersion.number).toBe(2);
  });

  it('the database itself refuses to change or delete a saved version', async () => {
    const v = ctx.db.select().from(deckVersions).all()[0];
    expect(() => ctx.db.update(deckVersions).set({ message: 'rewritten' }).where(eq(deckVersions.id, v.id)).run()).toThrow(/immutable/);
    expect(() => ctx.db.delete(deckVersions).where(eq(deckVersions.id, v.id)).run()).toThrow(/immutable/);
  });

  it('refuses a bad deck with the field path and rule, writing nothing', async () => {
    const before = ctx.db.select().from(deckVersions).all().length;
    const deck = { ...quarryCreekDeck(), girders: { kind: 'uniform', count: 6, spacing: -1 } };
    const res = await post(designer, `/api/projects/${projectId}/decks`, { deck, message: 'bad' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toContainEqual({ path: 'body.deck.girders.spacing', message: 'girder spacing must be greater than 0' });
    // A deck that passes the schema but leaves no design lane is refused by the solver.
    const narrow = { ...quarryCreekDeck(), girders: { kind: 'uniform', count: 2, spacing: 1.5 }, overhangLeft: 0.5, overhangRight: 0.5 };
    const res2 = await post(designer, `/api/projects/${projectId}/decks`, { deck: narrow, message: 'narrow' });
    expect(res2.status).toBe(400);
    expect(res2.body.error.details[0].path).toMatch(/^body\.deck/);
    expect(ctx.db.select().from(deckVersions).all().length).toBe(before);
  });

  it('a huge or non-physical value is refused with its unit, the server keeps serving and nothing is written', async () => {
    // An overhang of 1e308 once ended the process (a fatal "invalid size" while laying out
    // design lanes): every length now has a physical range (shared/deck/limits.ts).
    const before = ctx.db.select().from(deckVersions).all().length;
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ overhangLeft: 1e308 }, 'body.deck.overhangLeft', /^left overhang must be at most 6 m \(19\.69 ft\)$/],
      [{ overhangRight: 1e5 }, 'body.deck.overhangRight', /at most 6 m/],
      [{ spans: [{ length: 1e308 }], supports: [{ skew: 0 }, { skew: 0 }] }, 'body.deck.spans.0.length', /at most 300 m \(984\.3 ft\)/],
      [{ girders: { kind: 'uniform', count: 40, spacing: 8 } }, 'body.deck.girders', /wide \(girders plus overhangs\): at most 80 m/],
      [{ slab: { thickness: 1e-9 } }, 'body.deck.slab.thickness', /at least 50 mm \(1\.969 in\)/],
    ];
    for (const [change, path, message] of cases) {
      const res = await post(designer, `/api/projects/${projectId}/decks`, { deck: { ...quarryCreekDeck(), ...change }, message: 'huge' });
      expect(res.status, path).toBe(400);
      expect(res.body.error.details, path).toContainEqual({ path, message: expect.stringMatching(message) });
    }
    expect((await designer.get('/api/health')).status).toBe(200);
    expect(ctx.db.select().from(deckVersions).all().length).toBe(before);
  });

  it('another firm gets 404 for a deck and its versions', async () => {
    const deckId = (await designer.get(`/api/projects/${projectId}/decks`)).body.decks[0].id;
    expect((await outsider.get(`/api/decks/${deckId}`)).status).toBe(404);
    expect((await outsider.get(`/api/decks/${deckId}/versions/1`)).status).toBe(404);
    expect((await post(outsider, `/api/decks/${deckId}/versions`, { deck: quarryCreekDeck(), message: 'x' })).status).toBe(404);
  });
});
