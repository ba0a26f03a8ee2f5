/** The grillage result of a version is computed once, stored append-only with the solver
 *  version, and reused (API, in-process). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type TestContext } from './helpers.js';
import { analysisResults } from '../../server/db/schema.js';
import { decodeResult } from '../../server/storage/storedResults.js';
import { SOLVER_VERSION } from '../../shared/version.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await makeTestApp();
});
afterAll(() => ctx.close());

describe('stored grillage results', () => {
  it('stores the refined result at first use and reuses it', async () => {
    const designer = await signIn(ctx.app, demo.designer);
    const projectId = (await designer.get('/api/projects')).body.projects[0].id;
    const created = await designer.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', designer.csrf).send({ deck: quarryCreekDeck(), message: 'for the grillage' });
    expect(created.status).toBe(201);
    const { id: deckId } = created.body.deck;
    const versionId = created.body.version.id;
    const grillageRows = () =>
      ctx.db.select().from(analysisResults).where(and(eq(analysisResults.versionId, versionId), eq(analysisResults.method, 'grillage'))).all();
    expect(grillageRows()).toHaveLength(0);

    const first = await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
    expect(first.status).toBe(200);
    const stored = grillageRows();
    expect(stored).toHaveLength(1);
    expect(stored[0].solverVersion).toBe(SOLVER_VERSION);
    expect(stored[0].encoding).toBe('brotli-json');
    const data = decodeResult(stored[0]) as { rows: { method: string; value: number }[] };
    expect(data.rows.length).toBeGreaterThan(0);
    expect(data.rows.every((r) => r.method === 'grillage' && Number.isFinite(r.value))).toBe(true);

    const second = await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
    expect(second.status).toBe(200);
    // same grillage values (the export stamps its own time, so compare the grillage lines)
    const grillageLines = (t: string) => t.split("\n").filter((l) => l.includes("grillage"));
    expect(grillageLines(second.text)).toEqual(grillageLines(first.text));
    expect(grillageLines(first.text).length).toBeGreaterThan(0);
    expect(grillageRows()).toHaveLength(1);
  });
});
