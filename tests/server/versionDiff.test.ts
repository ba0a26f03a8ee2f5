/**
 * The comparison of two saved versions compares like with like, from the results the review
 * summary and the package read: GET …/versions/:n/factors answers each version's code rows and
 * governing values and its grillage rows and governing values per girder (the grillage run on
 * the pool and stored first when it is not, followed as a job with `Prefer: respond-async`), and
 * diffVersionFactors (shared/versionDiff) sets them row for row by girder, effect, place and
 * lane case.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';
import { deckVersions } from '../../server/db/schema.js';
import { storedResult, codeResultsOf } from '../../server/api/reviews/versionResults.js';
import { compareFactors } from '../../shared/grillage/compare.js';
import type { RefinedResult } from '../../shared/grillage/refinedFactors.js';
import { factorText } from '../../shared/lrfd/words.js';
import { diffVersionFactors, type FactorDiff } from '../../shared/versionDiff/factorDiff.js';
import type { VersionFactors } from '../../shared/versionDiff/versionFactors.js';
import { fromUs } from '../../shared/units.js';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let deckId: number;
const factorsOf = new Map<number, VersionFactors>();
/** Versions whose first answer was 202: their grillage was not stored yet and ran as a job. */
const ranAsJob = new Set<number>();

/** The version's factors as the workspace asks for them: at once, then following the grillage job until it is done. */
async function fetchFactors(number: number): Promise<VersionFactors> {
  const url = `/api/decks/${deckId}/versions/${number}/factors`;
  let res = await designer.get(url).set('Prefer', 'respond-async');
  for (let polls = 0; res.status === 202; polls++) {
    ranAsJob.add(number);
    expect(res.body.factors.refined).toMatchObject({ available: false, missing: 'computing' });
    expect(res.body.factors.code.rows.length).toBeGreaterThan(0);
    expect(polls).toBeLessThan(600);
    let job = res.body.job;
    while (job.state === 'queued' || job.state === 'running') {
      await new Promise((r) => setTimeout(r, 100));
      job = (await designer.get(job.url)).body.job;
    }
    expect(job.state).toBe('done');
    res = await designer.get(url).set('Prefer', 'respond-async');
  }
  expect(res.status).toBe(200);
  expect(res.body.factors.refined.available).toBe(true);
  return res.body.factors as VersionFactors;
}

function versionRow(number: number) {
  return ctx.db.select().from(deckVersions).where(and(eq(deckVersions.deckId, deckId), eq(deckVersions.number, number))).get()!;
}

const diffOf = (a: number, b: number): FactorDiff => diffVersionFactors({ number: a, factors: factorsOf.get(a)! }, { number: b, factors: factorsOf.get(b)! });

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  const projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'first layout' });
  expect(created.status).toBe(201);
  deckId = created.body.deck.id;
  // v2: the same inputs saved again; v3: both overhangs 0.5 ft shorter (symmetric, same lanes).
  expect((await send.post(designer, `/api/decks/${deckId}/versions`, { deck: quarryCreekDeck(), message: 'saved again, nothing changed' })).status).toBe(201);
  const shorter = { ...quarryCreekDeck(), overhangLeft: fromUs.ft(3), overhangRight: fromUs.ft(3) };
  expect((await send.post(designer, `/api/decks/${deckId}/versions`, { deck: shorter, message: 'overhangs 3 ft' })).status).toBe(201);
  for (const n of [1, 2, 3]) factorsOf.set(n, await fetchFactors(n));
}, 120_000);
afterAll(() => ctx.close());

describe('comparing two versions with equal inputs', () => {
  it('computes a grillage that is not stored yet as a job, and then reads it stored', async () => {
    expect([...ranAsJob].sort()).toEqual([1, 2, 3]);
    // once stored, the answer is at once and the same
    const again = await designer.get(`/api/decks/${deckId}/versions/1/factors`).set('Prefer', 'respond-async');
    expect(again.status).toBe(200);
    expect(again.body.factors).toEqual(factorsOf.get(1));
  });

  it('lists every code and grillage row of both, with values on both sides, each "no change"', () => {
    const diff = diffOf(1, 2);
    const f = factorsOf.get(2)!;
    if (!f.refined.available) throw new Error('no grillage');
    const sections = (s: string) => diff.rows.filter((r) => r.section === s).length;
    expect(sections('code')).toBe(f.code.rows.length);
    expect(sections('grillage')).toBe(f.refined.rows.length);
    expect(sections('governing')).toBe(f.code.governing.length + f.refined.governing.length);
    expect(f.refined.rows.length).toBeGreaterThan(0);
    for (const r of diff.rows) {
      expect(r.state, r.key).toBe('same');
      expect(r.change, r.key).toBe('no change');
      expect(r.before.value, r.key).toBeTypeOf('number');
      expect(r.after.value, r.key).toBeTypeOf('number');
      expect(r.before.text).toBe(r.after.text);
    }
    expect(diff.counts).toEqual({ same: diff.rows.length, changed: 0, added: 0, removed: 0, 'not-compared': 0 });
  });
});

describe('comparing a version whose input changed', () => {
  it('marks as changed exactly the rows whose values differ as written, and no other', () => {
    const diff = diffOf(2, 3);
    const changed = diff.rows.filter((r) => r.state !== 'same');
    expect(changed.length).toBeGreaterThan(0);
    expect(changed.length).toBeLessThan(diff.rows.length);
    for (const r of diff.rows) {
      expect(r.before.value, r.key).toBeTypeOf('number');
      expect(r.after.value, r.key).toBeTypeOf('number');
      const differs = factorText(r.before.value!) !== factorText(r.after.value!);
      expect(r.state, r.key).toBe(differs ? 'changed' : 'same');
      if (differs) expect(r.change).toMatch(/^[+\u2212]\d\.\d{4} \([+\u2212]\d+\.\d+ %\)$/);
    }
  });

  it('keeps the interior formula rows and changes the exterior lever rule', () => {
    const diff = diffOf(2, 3);
    // The interior moment and shear formulas take S, L, Kg and ts only (AASHTO LRFD Tables
    // 4.6.2.2.2b-1 and 4.6.2.2.3a-1): an overhang is not among them.
    const interiorFormula = diff.rows.filter((r) => r.section === 'code' && r.girder === 'interior girders' && r.method === 'empirical formula' && (r.effect === 'moment' || r.effect === 'shear'));
    expect(interiorFormula.length).toBe(4);
    for (const r of interiorFormula) expect(r.state, r.key).toBe('same');
    // The exterior girder's one-lane lever rule moves with the wheel line the overhang carries
    // (Art. 4.6.2.2.2d and 4.6.2.2.3b, lever rule): a shorter overhang lowers it.
    const lever = diff.rows.find((r) => r.section === 'code' && r.girder.startsWith('exterior girder') && r.effect === 'moment' && r.method === 'lever rule' && r.lanes === 'one lane');
    expect(lever?.state).toBe('changed');
    expect(lever!.after.value!).toBeLessThan(lever!.before.value!);
  });
});

describe('the governing grillage shear of each girder', () => {
  it('is the review summary\'s value for the same version, as written there, and the larger of the span\'s two ends', async () => {
    // Only the newest version can be submitted: version 3, the later side of the comparison with 2.
    const v = versionRow(3);
    const round = await send.post(designer, '/api/reviews', { versionId: v.id, reviewerId: userId(ctx, demo.reviewer) });
    expect(round.status).toBe(201);
    const review = await reviewer.get(`/api/reviews/${round.body.review.id}`);
    expect(review.status).toBe(200);
    const ratios = (review.body.summary.refined.ratios as { girder: number; effect: string; locationKey: string; refined: number }[]).filter((r) => r.effect === 'shear');
    const diff = diffOf(2, 3);
    const governingShear = diff.rows.filter((r) => r.section === 'governing' && r.method === 'grillage, governing value' && r.effect === 'shear');
    expect(governingShear.length).toBe(6);
    expect(ratios.length).toBe(6);
    for (const ratio of ratios) {
      const row = governingShear.find((r) => r.girder.startsWith(`G${ratio.girder} `));
      expect(row, `girder ${ratio.girder}`).toBeDefined();
      expect(row!.location).toBe('span 1, both ends');
      expect(row!.after.value).toBe(ratio.refined);
      expect(row!.after.text).toBe(factorText(ratio.refined));
    }

    // The stored grillage result of the version: each end of the span read on its own.
    const stored = storedResult(ctx.db, v.id, 'grillage')!.data as RefinedResult;
    const atEnd = (girder: number, support: number, side: 'left' | 'right') =>
      Math.max(...stored.factors.filter((f) => f.effect === 'shear' && f.girder === girder && f.point.kind === 'shear' && f.point.support === support && f.point.side === side).map((f) => f.value));
    let endsDiffer = 0;
    for (let g = 0; g < 6; g++) {
      const near = atEnd(g, 0, 'right');
      const far = atEnd(g, 1, 'left');
      const row = governingShear.find((r) => r.girder.startsWith(`G${g + 1} `))!;
      expect(row.after.value).toBe(Math.max(near, far));
      if (factorText(near) !== factorText(far)) endsDiffer++;
    }
    // On a skewed deck the two ends of a girder differ (the obtuse corner's shear, AASHTO LRFD
    // Art. 4.6.2.2.3c): reading one end only would miss the larger on some girder.
    expect(endsDiffer).toBeGreaterThan(0);
  });

  it('has the comparison table\'s values: each lane case per girder, and their larger as the governing value', () => {
    const v = versionRow(3);
    const stored = storedResult(ctx.db, v.id, 'grillage')!.data as RefinedResult;
    // The workspace's comparison table ("every girder") shows compareFactors of the code and refined results.
    const table = compareFactors(codeResultsOf(ctx.db, v).result, stored).rows.filter((r) => r.effect === 'shear' && r.locationKey === 'span1');
    const diff = diffOf(2, 3);
    for (let n = 1; n <= 6; n++) {
      const mine = table.filter((r) => r.girderNumber === n);
      expect(mine.length).toBe(2);
      for (const t of mine) {
        const row = diff.rows.find((r) => r.section === 'grillage' && r.girder.startsWith(`G${n} `) && r.effect === 'shear' && r.lanes === (t.lanes === 'one' ? 'one lane' : 'two or more lanes'));
        expect(row?.after.value, `G${n} ${t.lanes}`).toBe(t.grillage);
      }
      const governing = diff.rows.find((r) => r.section === 'governing' && r.girder.startsWith(`G${n} `) && r.effect === 'shear');
      expect(governing?.after.value).toBe(Math.max(...mine.map((t) => t.grillage!)));
    }
  });
});

describe('the route', () => {
  it('answers 404 for a version the deck does not have and 400 for a bad number, naming it', async () => {
    const missing = await designer.get(`/api/decks/${deckId}/versions/99/factors`);
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toMatch(/version 99/);
    const bad = await designer.get(`/api/decks/${deckId}/versions/x/factors`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toMatch(/number/);
  });
});
