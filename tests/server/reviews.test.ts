/** Review rounds: the round trip with e-mail, every state change and its refusals, firm isolation. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { reviewComments, reviewRounds } from '../../server/db/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { fromUs } from '../../shared/units.js';
import { demo, signIn, type Agent } from './helpers.js';
import { addUser, makeWorkflowApp, otherFirm, outbox, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let instructor: Agent;
let trainee: Agent;
let admin: Agent;
let outsider: Agent;
let dual: Agent; // designer and reviewer at once
let projectId: number;
let reviewerId: number;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  instructor = await signIn(ctx.app, demo.instructor);
  trainee = await signIn(ctx.app, demo.trainee);
  admin = await signIn(ctx.app, demo.admin);
  outsider = await otherFirm(ctx);
  dual = (await addUser(ctx, 'dual@larchmont-ridge.example', ['designer', 'reviewer'])).agent;
  projectId = (await designer.get('/api/projects')).body.projects.find((p: { name: string }) => p.name === 'Quarry Creek Overpass').id;
  reviewerId = userId(ctx, demo.reviewer);
});
afterAll(() => ctx.close());

async function newDeck(a: Agent, name: string) {
  const res = await send.post(a, `/api/projects/${projectId}/decks`, { deck: { ...quarryCreekDeck(), name }, message: 'first layout' });
  expect(res.status).toBe(201);
  return { deckId: res.body.deck.id as number, versionId: res.body.version.id as number };
}

async function saveVersion(a: Agent, deckId: number, message: string) {
  const res = await send.post(a, `/api/decks/${deckId}/versions`, { deck: { ...quarryCreekDeck(), overhangLeft: 1.2 }, message });
  expect(res.status).toBe(201);
  return res.body.version.id as number;
}

describe('the review round trip', () => {
  it('submit → comments → send back → answer → resubmit → refined decision → approve, each step e-mailed and audited', async () => {
    const { deckId, versionId } = await newDeck(designer, 'Round trip deck');

    const reviewers = await designer.get('/api/reviews/reviewers');
    expect(reviewers.body.reviewers.map((r: { email: string }) => r.email)).toEqual(expect.arrayContaining([demo.reviewer, demo.instructor]));
    expect(reviewers.body.reviewers.map((r: { email: string }) => r.email)).not.toContain(demo.designer);

    const sub = await send.post(designer, '/api/reviews', { versionId, reviewerId, note: 'Please check the exterior girder.' });
    expect(sub.status).toBe(201);
    const r1 = sub.body.review;
    expect(r1).toMatchObject({ state: 'awaiting-review', stateLabel: 'awaiting review', version: { number: 1, isLatest: true }, reviewer: { id: reviewerId }, previousRoundId: null });
    expect(r1.allowed).toEqual({ comment: true, decide: false, withdraw: true, resubmit: false });

    let mail = await outbox(ctx);
    const requested = mail.filter((m) => m.kind === 'review-requested');
    expect(requested).toHaveLength(1);
    expect(requested[0].toAddresses).toBe(demo.reviewer);
    expect(requested[0].subject).toBe('Review requested: Round trip deck, version 1');
    expect(requested[0].textBody).toContain(`http://deckshare.test/reviews/${r1.id}`);
    expect(requested[0].textBody).toContain('Please check the exterior girder.');

    const status = await designer.get(`/api/reviews/status?deckId=${deckId}`);
    expect(status.body.versions).toEqual([{ versionId, number: 1, state: 'awaiting-review', stateLabel: 'awaiting review', roundId: r1.id }]);

    const view = await reviewer.get(`/api/reviews/${r1.id}`);
    expect(view.status).toBe(200);
    expect(view.body.review.allowed).toEqual({ comment: true, decide: true, withdraw: false, resubmit: false });
    expect(view.body.summary.skew.supports).toEqual([20, 20]);
    expect(view.body.summary.caution).toContain('licensed engineer');

    const c1 = await send.post(reviewer, `/api/reviews/${r1.id}/comments`, { body: 'The overhang looks wide for this barrier.' });
    expect(c1.status).toBe(201);
    expect(c1.body.comment).toMatchObject({ anchor: null, anchorText: 'the deck as a whole' });
    const c2 = await send.post(reviewer, `/api/reviews/${r1.id}/comments`, { body: 'Check the lever-rule wheel position.', anchor: { girder: 1, effect: 'moment', method: 'lever-rule', lanes: 'one' } });
    expect(c2.body.comment.anchorText).toBe('girder 1, moment, lever rule, one lane');
    const answer = await send.post(designer, `/api/reviews/${r1.id}/comments`, { body: 'Wheel at 2 ft from the barrier face, as Art. 3.6.1.3.1 requires.', parentId: c2.body.comment.id });
    expect(answer.status).toBe(201);

    const back = await send.post(reviewer, `/api/reviews/${r1.id}/decision`, { outcome: 'send-back', note: 'Reduce the left overhang and resubmit.' });
    expect(back.status).toBe(200);
    expect(back.body.review).toMatchObject({ state: 'sent-back', stateLabel: 'sent back', decision: { outcome: 'send-back', note: 'Reduce the left overhang and resubmit.' } });
    mail = await outbox(ctx);
    const sentBack = mail.filter((m) => m.kind === 'version-sent-back');
    expect(sentBack).toHaveLength(1);
    expect(sentBack[0].toAddresses).toBe(demo.designer);
    expect(sentBack[0].textBody).toContain('with 3 comments');
    expect(sentBack[0].textBody).toContain('Reduce the left overhang and resubmit.');

    // The designer may still answer on the sent-back round, but cannot resubmit the same version.
    expect((await send.post(designer, `/api/reviews/${r1.id}/comments`, { body: 'Will do.', parentId: c1.body.comment.id })).status).toBe(201);
    expect((await send.post(designer, '/api/reviews', { versionId, reviewerId })).status).toBe(409);
    expect((await designer.get(`/api/reviews/${r1.id}`)).body.review.allowed.resubmit).toBe(false);

    const v2 = await saveVersion(designer, deckId, 'left overhang reduced');
    expect((await designer.get(`/api/reviews/${r1.id}`)).body.review.allowed.resubmit).toBe(true);
    const sub2 = await send.post(designer, '/api/reviews', { versionId: v2, reviewerId, note: 'Overhang reduced to 1.2 m.' });
    expect(sub2.status).toBe(201);
    const r2 = sub2.body.review;
    expect(r2).toMatchObject({ previousRoundId: r1.id, version: { number: 2 } });
    const full = await reviewer.get(`/api/reviews/${r2.id}`);
    expect(full.body.review.earlierRounds).toHaveLength(1);
    expect(full.body.review.earlierRounds[0]).toMatchObject({ id: r1.id, versionNumber: 1, state: 'sent-back' });
    expect(full.body.review.earlierRounds[0].comments).toHaveLength(4);
    expect((await outbox(ctx)).filter((m) => m.kind === 'review-requested').at(-1)!.textBody).toContain('which answers your earlier comments');

    const early = await send.post(reviewer, `/api/reviews/${r2.id}/decision`, { outcome: 'approve', note: '' });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toContain('refined analysis');

    const refined = await send.put(reviewer, `/api/reviews/${r2.id}/refined-analysis`, { justified: false, reason: 'All formulas within their ranges; skew below 30°.' });
    expect(refined.status).toBe(200);
    expect(refined.body.review.refinedAnalysis).toMatchObject({ justified: false, label: 'refined analysis not justified' });
    const changed = await send.put(reviewer, `/api/reviews/${r2.id}/refined-analysis`, { justified: false, reason: 'All formulas within their ranges; skew 20° (below 30°).' });
    expect(changed.body.review.refinedAnalysis.reason).toBe('All formulas within their ranges; skew 20° (below 30°).');

    const ok = await send.post(reviewer, `/api/reviews/${r2.id}/decision`, { outcome: 'approve', note: 'Factors agree with my hand check.' });
    expect(ok.status).toBe(200);
    expect(ok.body.review).toMatchObject({ state: 'approved', decision: { outcome: 'approve', by: { id: reviewerId } } });
    expect(ok.body.review.allowed).toEqual({ comment: false, decide: false, withdraw: false, resubmit: false });
    const approved = (await outbox(ctx)).filter((m) => m.kind === 'version-approved');
    expect(approved).toHaveLength(1);
    expect(approved[0].toAddresses).toBe(demo.designer);
    expect(approved[0].textBody).toContain('refined analysis not justified — All formulas within their ranges; skew 20° (below 30°).');

    const audit = await designer.get(`/api/projects/${projectId}/audit`);
    const reviewActions = audit.body.entries.filter((e: { entityType: string }) => e.entityType === 'review').map((e: { action: string }) => e.action).reverse();
    expect(reviewActions).toEqual(['submit', 'comment', 'comment', 'comment', 'return', 'comment', 'submit', 'refined-decision', 'change', 'approve']);
  });
});

describe('the refined-analysis summary', () => {
  it('reports the skew effect, refined/code ratios and the possible moment reduction', async () => {
    const { versionId } = await newDeck(designer, 'Summary deck');
    const r = (await send.post(designer, '/api/reviews', { versionId, reviewerId })).body.review;
    const { summary } = (await reviewer.get(`/api/reviews/${r.id}`)).body;
    expect(summary.rangeFindings).toEqual([]);
    // Skew 20°: no moment reduction below 30° (Table 4.6.2.2.2e-1), a shear increase
    // (Table 4.6.2.2.3c-1): every skew effect listed is a shear or reaction increase.
    expect(summary.skew.effects.length).toBeGreaterThan(0);
    for (const e of summary.skew.effects) {
      expect(['shear', 'reaction']).toContain(e.effect);
      expect(e.skewFactor).toBeGreaterThan(1);
      expect(e.value).toBeRelativelyClose(e.baseValue * e.skewFactor, 1e-12);
    }
    expect(summary.refined.available).toBe(true);
    // the deck keeps the default loads of the refined run, and the summary says which
    expect(summary.refined.loads).toBe('design truck alone (strength); fatigue truck, one lane, no m (fatigue)');
    // The per-lane HL-93 LL+IM moment at midspan of the 110 ft simple span, by hand
    // (Art. 3.6.1.2.2 truck with the middle axle at midspan: 32·27.5 + 32·20.5 + 8·20.5 kip·ft,
    // IM 33 % per Art. 3.6.2.1; lane load 0.64·110²/8 per Art. 3.6.1.2.4).
    const perLane = fromUs.kipFt(1.33 * (32 * 27.5 + 32 * 20.5 + 8 * 20.5) + (0.64 * 110 ** 2) / 8);
    for (const m of summary.refined.momentReductions) {
      expect(m.perLaneMoment).toBeRelativelyClose(perLane, 1e-6);
      expect(m.codeMoment).toBeRelativelyClose(m.code * perLane, 1e-9);
      expect(m.reductionPercent).toBeRelativelyClose(((m.code - m.refined) / m.code) * 100, 1e-9);
    }
    expect(summary.refined.momentReductions).toHaveLength(6);
    // A reduction is claimed only from design girders whose stated bound meets the target and
    // whose mesh converges; on this 20° skewed deck none does today, so nothing is claimed and
    // the summary says why.
    const design = summary.refined.momentReductions.filter((m: { designGirder: number; girder: number }) => m.designGirder === m.girder);
    expect(design.length).toBe(2);
    for (const m of design) {
      // the review's grillage run checks each moment row at twice the mesh density
      expect(m.convergence.segmentsPerSpan).toBe(80);
      expect(m.claimable).toBe(m.bound.meetsTarget && m.convergence.within);
      expect(m.withheld).toEqual([...(m.bound.meetsTarget ? [] : ['bound-misses-target']), ...(m.convergence.within ? [] : ['mesh-unconverged'])]);
    }
    if (design.some((m: { claimable: boolean }) => m.claimable)) expect(summary.indicators.join(' ')).toMatch(/would lower the governing|do not lower/);
    else {
      expect(summary.refined.largestReduction).toBeNull();
      expect(summary.indicators.join(' ')).toContain('cannot back a reduction: their stated bounds miss the target');
    }
  });
});

describe('the refined-analysis decision keeps the conditions it was recorded under', () => {
  it('before the refined results exist it says so; after the reviewer has read them it keeps the same counts and largest reduction as the summary', async () => {
    const { versionId } = await newDeck(designer, 'Conditions deck');
    const r = (await send.post(designer, '/api/reviews', { versionId, reviewerId })).body.review;
    // decided before anyone opened the round: nothing refined was stored yet, and no run is started for it
    const early = await send.put(reviewer, `/api/reviews/${r.id}/refined-analysis`, { justified: true, reason: 'Skew 20°: a grillage is worth running.' });
    expect(early.status).toBe(200);
    expect(early.body.review.refinedAnalysis.conditions).toMatchObject({ refinedAvailable: false, designRows: 0, claimableRows: 0, largestReduction: null });
    expect(early.body.review.refinedAnalysis.conditionsWords).toMatch(/^Recorded without refined results: no refined \(grillage\) result was stored for this version/);

    // the reviewer reads the summary (the refined run is stored), then changes the decision
    const { summary } = (await reviewer.get(`/api/reviews/${r.id}`)).body;
    const later = await send.put(reviewer, `/api/reviews/${r.id}/refined-analysis`, { justified: false, reason: 'The refined rows cannot back a reduction.' });
    const c = later.body.review.refinedAnalysis.conditions;
    const design = summary.refined.momentReductions.filter((m: { designGirder: number; girder: number }) => m.designGirder === m.girder);
    expect(c.refinedAvailable).toBe(true);
    expect(c.solverVersion).toBe(summary.solverVersion);
    expect(c.boundTarget).toEqual({ lanes: 0.005, percent: 0.5 });
    expect(c.designRows).toBe(design.length);
    expect(c.claimableRows).toBe(design.filter((m: { claimable: boolean }) => m.claimable).length);
    expect(c.largestReduction === null ? null : c.largestReduction.percent).toBe(summary.refined.largestReduction === null ? null : summary.refined.largestReduction.reductionPercent);
    const reasons = [...new Set(design.flatMap((m: { withheld: string[] }) => m.withheld))].sort();
    expect(c.withheld.map((w: { reason: string }) => w.reason).sort()).toEqual(reasons);
    for (const w of c.withheld) expect(w.rows).toBe(design.filter((m: { withheld: string[] }) => m.withheld.includes(w.reason)).length);
    const words = later.body.review.refinedAnalysis.conditionsWords as string;
    expect(words).toContain(`${c.claimableRows} of ${c.designRows} design moment rows could back a reduction`);
    // the same sentence goes to the audit trail and stays with the round
    const audit = (await reviewer.get(`/api/projects/${projectId}/audit`)).body.entries as { summary: string }[];
    expect(audit.some((e) => e.summary.includes(words))).toBe(true);
    expect((await designer.get(`/api/reviews/${r.id}`)).body.review.refinedAnalysis.conditionsWords).toBe(words);
  });
});

describe('a mesh the code would not accept backs no reduction', () => {
  it('a short span meshed at 40 segments has panels more elongated than 5.0 (AASHTO LRFD Art. 4.6.3.3.1, quoted from memory): every design row says so', async () => {
    // 30 ft span at 20° skew, girders 9.67 ft apart, transverse members parallel to the supports:
    // panels 30/40 = 0.75 ft along by 9.67/cos 20° = 10.29 ft across, aspect ratio 13.7 (geometry)
    const res = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: { ...quarryCreekDeck(), name: 'Short span', spans: [{ length: fromUs.ft(30) }] }, message: 'short span' });
    expect(res.status).toBe(201);
    const r = (await send.post(designer, '/api/reviews', { versionId: res.body.version.id, reviewerId })).body.review;
    const { summary } = (await reviewer.get(`/api/reviews/${r.id}`)).body;
    expect(summary.refined.available).toBe(true);
    const design = summary.refined.momentReductions.filter((m: { designGirder: number; girder: number }) => m.designGirder === m.girder);
    expect(design.length).toBeGreaterThan(0);
    for (const m of design) {
      expect(m.claimable).toBe(false);
      expect(m.withheld).toContain('mesh-aspect-ratio');
      expect(m.panelAspect.limit).toBe(5);
      expect(m.panelAspect.ratio).toBeRelativelyClose(9.6667 / Math.cos((20 * Math.PI) / 180) / (30 / 40), 1e-3);
      expect(m.claim).toMatch(/a grid panel of the mesh has an aspect ratio of 13\.7\d, above 5 \(AASHTO LRFD Art\. 4\.6\.3\.3\.1\)/);
    }
    expect(summary.refined.largestReduction).toBeNull();
    expect(summary.indicators.join(' ')).toContain('more elongated than Art. 4.6.3.3.1 allows');
  });
});

describe('refusals', () => {
  let deckId: number;
  let v1: number;
  let roundId: number;

  beforeAll(async () => {
    ({ deckId, versionId: v1 } = await newDeck(designer, 'Refusals deck'));
    roundId = (await send.post(designer, '/api/reviews', { versionId: v1, reviewerId })).body.review.id;
  });

  it('a trainee cannot approve, nor read reviews; a plain designer cannot decide', async () => {
    const t = await send.post(trainee, `/api/reviews/${roundId}/decision`, { outcome: 'approve', note: '' });
    expect(t.status).toBe(403);
    expect(t.body.error.message).toContain('do not allow review:decide');
    expect((await trainee.get('/api/reviews')).status).toBe(403);
    expect((await send.post(designer, `/api/reviews/${roundId}/decision`, { outcome: 'approve', note: '' })).status).toBe(403);
    expect((await send.put(designer, `/api/reviews/${roundId}/refined-analysis`, { justified: true, reason: 'x' })).status).toBe(403);
  });

  it('a designer who is also a reviewer cannot approve their own version, nor pick themselves', async () => {
    const own = await newDeck(dual, 'Dual deck');
    const self = await send.post(dual, '/api/reviews', { versionId: own.versionId, reviewerId: userId(ctx, 'dual@larchmont-ridge.example') });
    expect(self.status).toBe(400);
    expect(self.body.error.details).toEqual([{ path: 'body.reviewerId', message: 'you cannot review your own submission: choose another reviewer' }]);
    const r = (await send.post(dual, '/api/reviews', { versionId: own.versionId, reviewerId })).body.review;
    // The round cannot be reassigned to its author around the API: the database keeps its reviewer.
    expect(() => ctx.db.update(reviewRounds).set({ reviewerId: userId(ctx, 'dual@larchmont-ridge.example') }).where(eq(reviewRounds.id, r.id)).run()).toThrow(
      /a review round keeps its version, submitter and reviewer/,
    );
    const res = await send.post(dual, `/api/reviews/${r.id}/decision`, { outcome: 'approve', note: '' });
    expect(res.status).toBe(403);
    // A reviewer cannot be the author of the version either.
    const other = await newDeck(dual, 'Dual deck 2');
    const byAuthor = await send.post(designer, '/api/reviews', { versionId: other.versionId, reviewerId: userId(ctx, 'dual@larchmont-ridge.example') });
    expect(byAuthor.status).toBe(400);
    expect(byAuthor.body.error.details[0].message).toBe('dual saved this version and cannot review it');
  });

  it('only the assigned reviewer decides; only participants comment', async () => {
    const res = await send.post(instructor, `/api/reviews/${roundId}/decision`, { outcome: 'approve', note: '' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toContain('only the assigned reviewer (Ruth Castellanos)');
    expect((await send.post(instructor, `/api/reviews/${roundId}/comments`, { body: 'drive-by' })).status).toBe(403);
    expect((await send.post(admin, `/api/reviews/${roundId}/comments`, { body: 'admin' })).status).toBe(403);
  });

  it('refuses bad input naming the field', async () => {
    const r = await send.post(designer, '/api/reviews', { versionId: v1, reviewerId: userId(ctx, demo.trainee) });
    expect(r.status).toBe(400);
    expect(r.body.error.details).toEqual([{ path: 'body.reviewerId', message: 'Theo Brandt does not hold the reviewer role' }]);
    const g = await send.post(reviewer, `/api/reviews/${roundId}/comments`, { body: 'x', anchor: { girder: 9 } });
    expect(g.status).toBe(400);
    expect(g.body.error.details).toEqual([{ path: 'body.anchor.girder', message: 'the deck has 6 girders (1 to 6)' }]);
    const empty = await send.post(reviewer, `/api/reviews/${roundId}/comments`, { body: 'x', anchor: {} });
    expect(empty.body.error.details[0].path).toBe('body.anchor');
    const bad = await send.post(reviewer, `/api/reviews/${roundId}/comments`, { body: 'x', anchor: { effect: 'torsion' } });
    expect(bad.body.error.details[0]).toEqual({ path: 'body.anchor.effect', message: expect.stringContaining('anchor.effect must be one of') });
    const noReason = await send.post(reviewer, `/api/reviews/${roundId}/decision`, { outcome: 'send-back', note: '  ' });
    expect(noReason.body.error.details).toEqual([{ path: 'body.note', message: 'say why the version is sent back' }]);
    const extra = await send.post(reviewer, `/api/reviews/${roundId}/decision`, { outcome: 'approve', note: '', force: true });
    expect(extra.body.error.details[0].message).toBe('unknown field(s): force');
    const parent = await send.post(designer, `/api/reviews/${roundId}/comments`, { body: 'x', parentId: 999999 });
    expect(parent.body.error.details).toEqual([{ path: 'body.parentId', message: 'no such comment in this review round' }]);
  });

  it('one open round per deck; only the newest version; withdrawal by the submitter only', async () => {
    expect((await send.post(designer, '/api/reviews', { versionId: v1, reviewerId: userId(ctx, demo.instructor) })).status).toBe(409);
    const v2 = await saveVersion(designer, deckId, 'second');
    const old = await send.post(designer, '/api/reviews', { versionId: v1, reviewerId });
    expect(old.status).toBe(409);
    const dup = await send.post(designer, '/api/reviews', { versionId: v2, reviewerId });
    expect(dup.status).toBe(409);
    expect(dup.body.error.message).toContain('already awaiting review by Ruth Castellanos');

    expect((await send.post(reviewer, `/api/reviews/${roundId}/withdraw`)).status).toBe(403);
    const w = await send.post(designer, `/api/reviews/${roundId}/withdraw`);
    expect(w.status).toBe(200);
    expect(w.body.review.state).toBe('withdrawn');
    expect((await send.post(designer, `/api/reviews/${roundId}/withdraw`)).status).toBe(409);
    expect((await send.post(reviewer, `/api/reviews/${roundId}/comments`, { body: 'late' })).status).toBe(409);
    const status = (await designer.get(`/api/reviews/status?deckId=${deckId}`)).body.versions;
    expect(status.map((s: { state: string }) => s.state)).toEqual(['in-progress', 'in-progress']);
    expect((await send.post(designer, '/api/reviews', { versionId: v2, reviewerId })).status).toBe(201);
  });

  it('an approved version cannot be changed; a new version starts a new round', async () => {
    const { deckId: d, versionId: v } = await newDeck(designer, 'Locked deck');
    const r = (await send.post(designer, '/api/reviews', { versionId: v, reviewerId })).body.review;
    await send.put(reviewer, `/api/reviews/${r.id}/refined-analysis`, { justified: true, reason: 'Skew effects merit a grillage.' });
    expect((await send.post(reviewer, `/api/reviews/${r.id}/decision`, { outcome: 'approve', note: '' })).status).toBe(200);

    const again = await send.post(reviewer, `/api/reviews/${r.id}/decision`, { outcome: 'send-back', note: 'changed my mind' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('version 1 is approved: an approved version is locked');
    expect((await send.put(reviewer, `/api/reviews/${r.id}/refined-analysis`, { justified: false, reason: 'x' })).status).toBe(409);
    expect((await send.post(reviewer, `/api/reviews/${r.id}/comments`, { body: 'one more thing' })).status).toBe(409);
    expect((await send.post(designer, `/api/reviews/${r.id}/withdraw`)).status).toBe(409);
    const resubmit = await send.post(designer, '/api/reviews', { versionId: v, reviewerId });
    expect(resubmit.status).toBe(409);
    expect(resubmit.body.error.message).toBe('version 1 is already approved: an approved version is locked');
    // The database refuses too.
    expect(() => ctx.db.update(reviewRounds).set({ state: 'sent-back' }).where(eq(reviewRounds.id, r.id)).run()).toThrow(/locked|moves only from awaiting review/);
    expect(() => ctx.db.insert(reviewComments).values({ roundId: r.id, authorId: reviewerId, body: 'sneaky' }).run()).toThrow(/locked/);
    expect(() => ctx.db.delete(reviewRounds).where(eq(reviewRounds.id, r.id)).run()).toThrow(/kept for the record/);

    const v2 = await saveVersion(designer, d, 'after approval');
    const status = (await designer.get(`/api/reviews/status?deckId=${d}`)).body;
    expect(status.versions.map((s: { number: number; state: string }) => [s.number, s.state])).toEqual([
      [2, 'in-progress'],
      [1, 'approved'],
    ]);
    expect(status.latestApprovedNumber).toBe(1);
    const next = await send.post(designer, '/api/reviews', { versionId: v2, reviewerId });
    expect(next.status).toBe(201);
    expect(next.body.review.previousRoundId).toBeNull();
  });

  it('refuses on an archived project', async () => {
    const p = await send.post(designer, '/api/projects', { name: 'Archived review project', units: 'US' });
    const d = await send.post(designer, `/api/projects/${p.body.project.id}/decks`, { deck: quarryCreekDeck(), message: 'x' });
    await send.patch(designer, `/api/projects/${p.body.project.id}`, { archived: true });
    const res = await send.post(designer, '/api/reviews', { versionId: d.body.version.id, reviewerId });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('archived');
  });

  it('another firm gets 404 for every review route', async () => {
    expect((await outsider.get(`/api/reviews/${roundId}`)).status).toBe(404);
    expect((await send.post(outsider, `/api/reviews/${roundId}/comments`, { body: 'x' })).status).toBe(404);
    expect((await send.post(outsider, `/api/reviews/${roundId}/decision`, { outcome: 'send-back', note: 'x' })).status).toBe(404);
    expect((await send.put(outsider, `/api/reviews/${roundId}/refined-analysis`, { justified: true, reason: 'x' })).status).toBe(404);
    expect((await send.post(outsider, `/api/reviews/${roundId}/withdraw`)).status).toBe(404);
    expect((await send.post(outsider, '/api/reviews', { versionId: v1, reviewerId })).status).toBe(404);
    expect((await outsider.get(`/api/reviews/status?deckId=${deckId}`)).status).toBe(404);
    expect((await outsider.get('/api/reviews')).body.reviews).toEqual([]);
    expect((await outsider.get('/api/reviews/reviewers')).body.reviewers).toEqual([]);
  });

  it('lists rounds by view and state', async () => {
    const assigned = (await reviewer.get('/api/reviews?view=assigned')).body.reviews;
    expect(assigned.length).toBeGreaterThan(0);
    expect(assigned.every((r: { reviewer: { id: number } }) => r.reviewer.id === reviewerId)).toBe(true);
    const approved = (await designer.get('/api/reviews?view=submitted&state=approved')).body.reviews;
    expect(approved.every((r: { state: string }) => r.state === 'approved')).toBe(true);
    expect((await designer.get('/api/reviews?state=finished')).status).toBe(400);
  });
});
