/**
 * A deck's design values through the API (deck field designValues, shared/loads/designValues.ts):
 * a deck that names the SI edition's values is computed with them (AASHTO LRFD (SI)
 * Art. 3.6.1.1.1: 3.6 m design lanes); one without the field, as every deck stored before it,
 * with the converted US customary ones (12 ft lanes, Art. 3.6.1.1.1), whatever its project's
 * units (the workspace names the SI edition's for a new deck of an SI project); a later save
 * that leaves the field out keeps the deck's; the stored code results follow them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { fromUs } from '../../shared/units.js';

let ctx: TestContext;
let designer: Agent;

beforeAll(async () => {
  ctx = await makeTestApp();
  designer = await signIn(ctx.app, demo.designer);
});
afterAll(() => ctx.close());

const post = (url: string, body: unknown) => designer.post(url).set('X-CSRF-Token', designer.csrf).send(body as object);

async function project(units: 'US' | 'SI'): Promise<number> {
  const res = await post('/api/projects', { name: `Design values ${units} ${Math.random().toString(36).slice(2, 8)}`, units });
  expect(res.status).toBe(201);
  return res.body.project.id;
}

/** The design lane width of the stored code results of a version, m. */
async function storedLaneWidth(deckId: number, number: number): Promise<number> {
  const res = await designer.get(`/api/decks/${deckId}/versions/${number}?include=results`);
  expect(res.status).toBe(200);
  const code = (res.body.version.results as { method: string; data: { derived: { designLaneWidth: number } } }[]).find((r) => r.method === 'code');
  return code!.data.derived.designLaneWidth;
}

describe('design values of a deck through the API', () => {
  it('an SI project: a deck naming the SI edition values is computed with them, and a later save without the field keeps them', async () => {
    const id = await project('SI');
    const { designValues: _none, ...deck } = quarryCreekDeck() as Record<string, unknown>;
    const created = await post(`/api/projects/${id}/decks`, { deck: { ...deck, designValues: 'si-edition' }, message: 'first' });
    expect(created.status).toBe(201);
    expect(created.body.version.deck.designValues).toBe('si-edition');
    const deckId = created.body.deck.id;
    expect(await storedLaneWidth(deckId, 1)).toBe(3.6);
    const again = await post(`/api/decks/${deckId}/versions`, { deck, message: 'second, the field left out' });
    expect(again.status).toBe(201);
    expect(again.body.version.deck.designValues).toBe('si-edition');
    const switched = await post(`/api/decks/${deckId}/versions`, { deck: { ...deck, designValues: 'us-customary' }, message: 'third, converted US values' });
    expect(switched.body.version.deck.designValues).toBe('us-customary');
    expect(await storedLaneWidth(deckId, 3)).toBeRelativelyClose(fromUs.ft(12), 1e-12);
  });

  it('an SI project: a deck that names the converted US values keeps them', async () => {
    const id = await project('SI');
    const created = await post(`/api/projects/${id}/decks`, { deck: { ...quarryCreekDeck(), designValues: 'us-customary' }, message: 'named' });
    expect(created.body.version.deck.designValues).toBe('us-customary');
  });

  it.each(['US', 'SI'] as const)('a %s project: a deck without the field has the converted US values, as a deck stored before it', async (units) => {
    const id = await project(units);
    const { designValues: _none, ...deck } = quarryCreekDeck() as Record<string, unknown>;
    const created = await post(`/api/projects/${id}/decks`, { deck, message: 'first' });
    expect(created.body.version.deck.designValues).toBe('us-customary');
    expect(await storedLaneWidth(created.body.deck.id, 1)).toBeRelativelyClose(fromUs.ft(12), 1e-12);
  });

  it('refuses an unknown set of design values, naming the field', async () => {
    const id = await project('SI');
    const res = await post(`/api/projects/${id}/decks`, { deck: { ...quarryCreekDeck(), designValues: 'metric' }, message: 'bad' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual(expect.arrayContaining([{ path: 'body.deck.designValues', message: "design values must be 'us-customary' or 'si-edition'" }]));
  });
});
