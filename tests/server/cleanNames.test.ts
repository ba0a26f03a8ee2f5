/** Text a person types follows one rule in every form (shared/text.ts): normalised to Unicode
 *  NFC (a decomposed accent is stored composed), NUL and other control characters and the
 *  bidirectional override U+202E refused with the field named; nothing is written from a
 *  refused request. (Unicode Standard Annex #15 for NFC; Unicode Technical Report #36 on
 *  bidirectional spoofing.) */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { forbiddenCharacter } from '../../shared/text.js';
import { parseDeck } from '../../shared/deck/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';
import { auditLog, decks, deckVersions, projects, reviewComments, users } from '../../server/db/schema.js';

const DECOMPOSED = 'Pont de l’Aube\u0301'; // "e" + COMBINING ACUTE ACCENT
const COMPOSED = 'Pont de l’Aubé';
const NUL = 'Ridge\u0000Road';
const RLO = 'Quarry\u202Egpj.exe';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let admin: Agent;
let projectId: number;
let deckId: number;
let reviewId: number;

function rows() {
  return [projects, decks, deckVersions, users, reviewComments, auditLog].map((t) => ctx.db.select({ n: count() }).from(t).get()!.n);
}

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  admin = await signIn(ctx.app, demo.admin);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const d = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'for the name checks' });
  deckId = d.body.deck.id;
  const reviewerId = ctx.db.select().from(users).all().find((u) => u.email === demo.reviewer)!.id;
  reviewId = (await send.post(designer, '/api/reviews', { versionId: d.body.version.id, reviewerId })).body.review.id;
});
afterAll(() => ctx.close());

/** Every form that takes a name or a comment: method, url, body with the text at `field`. */
function forms(text: string): { who: () => Agent; method: 'post' | 'patch'; url: () => string; body: () => object; field: string }[] {
  return [
    { who: () => designer, method: 'post', url: () => '/api/projects', body: () => ({ name: text, units: 'US' }), field: 'body.name' },
    { who: () => designer, method: 'patch', url: () => `/api/projects/${projectId}`, body: () => ({ location: text }), field: 'body.location' },
    { who: () => designer, method: 'post', url: () => `/api/projects/${projectId}/decks`, body: () => ({ deck: { ...quarryCreekDeck(), name: text }, message: 'm' }), field: 'body.deck.name' },
    { who: () => designer, method: 'post', url: () => `/api/decks/${deckId}/versions`, body: () => ({ deck: quarryCreekDeck(), message: text }), field: 'body.message' },
    { who: () => admin, method: 'post', url: () => '/api/admin/users', body: () => ({ email: `n${Math.random().toString(36).slice(2)}@larchmont-ridge.example`, name: text, roles: ['designer'] }), field: 'body.name' },
    { who: () => reviewer, method: 'post', url: () => `/api/reviews/${reviewId}/comments`, body: () => ({ body: text }), field: 'body.body' },
  ];
}

describe('names and comments', () => {
  it.each([
    ['NUL', NUL, /control character, U\+0000, at character 6/],
    ['right-to-left override', RLO, /bidirectional control character.*U\+202E, at character 7/],
  ])('%s is refused in every form, naming the field, writing nothing', async (_label, text, message) => {
    for (const f of forms(text)) {
      const before = rows();
      const res = await send[f.method](f.who(), f.url(), f.body());
      expect(res.status, f.url()).toBe(400);
      expect(res.body.error.details, f.url()).toContainEqual({ path: f.field, message: expect.stringMatching(message) });
      expect(rows(), f.url()).toEqual(before);
    }
  });

  it('a decomposed accent is stored composed (NFC), so screen, PDF and audit show one name', async () => {
    const p = await send.post(designer, '/api/projects', { name: DECOMPOSED, units: 'SI', notes: 'line one\r\nline two\ttabbed' });
    expect(p.status).toBe(201);
    expect(p.body.project.name).toBe(COMPOSED);
    expect(p.body.project.notes).toBe('line one\nline two\ttabbed');
    const stored = ctx.db.select().from(projects).all().find((r) => r.id === p.body.project.id)!;
    expect(stored.name).toBe(COMPOSED);
    expect(stored.name.length).toBe(COMPOSED.length);
    const d = await send.post(designer, `/api/projects/${p.body.project.id}/decks`, { deck: { ...quarryCreekDeck(), name: DECOMPOSED }, message: DECOMPOSED });
    expect(d.status).toBe(201);
    expect(d.body.deck.name).toBe(COMPOSED);
    expect(d.body.version.message).toBe(COMPOSED);
  });

  it('one rule for the deck files and forms too (the shared deck schema)', () => {
    const bad = parseDeck({ ...quarryCreekDeck(), name: RLO });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0].path).toEqual(['name']);
    const good = parseDeck({ ...quarryCreekDeck(), name: DECOMPOSED });
    expect(good.ok && good.deck.name).toBe(COMPOSED);
  });

  it('the rule itself: C0, DEL, C1, bidi embeddings and isolates, lone surrogates; emoji and CJK pass', () => {
    for (const cp of [0x00, 0x07, 0x1b, 0x7f, 0x85, 0x9f, 0x202a, 0x202d, 0x2066, 0x2069, 0xd800]) {
      expect(forbiddenCharacter(`a${String.fromCharCode(cp)}`, false)?.codePoint, cp.toString(16)).toBe(cp);
    }
    expect(forbiddenCharacter('a\nb\tc', false)?.codePoint).toBe(0x0a);
    expect(forbiddenCharacter('a\nb\tc', true)).toBeNull();
    expect(forbiddenCharacter('橋梁 🦀 ü-ñ Ωμ', false)).toBeNull();
    // positions count characters, not UTF-16 units: the crab is one character
    expect(forbiddenCharacter('🦀\u0000', false)?.position).toBe(2);
  });
});
