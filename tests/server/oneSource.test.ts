/**
 * One source per value, over every example deck (tests/fixtures/exampleDecks.ts): each
 * governing value — the code's per girder kind, effect and place, the grillage's per girder,
 * effect, place and lane case, and its governing value per girder, effect and place — is the
 * same number in every view that shows it:
 *  - the workspace, computed as the solver worker computes it (src/workers/solverCore.ts):
 *    the comparison of methods by girder kind and per girder (comparisonLines.ts, the data of
 *    ComparisonTable.vue) and the placement panel's governing value (placementGoverning.ts);
 *  - the server's results of the saved version, as the version comparison reads them
 *    (GET …/factors), for two versions with equal inputs;
 *  - the review summary (GET /api/reviews/:id), the calculation package (PDF text by poppler's
 *    pdftotext) and the factor and envelope tables (CSV);
 *  - the exercise answer to a governing-value question (server/api/training/trainingQuestions.ts).
 * Numbers are compared exactly where they are numbers (the CSV writes full precision); printed
 * text is compared with factorText / ratioText of the value (shared/lrfd/words.ts: the one
 * rounding rule). The grillage values of the workspace and of the server are the same run of
 * the same deck, so they agree exactly too. The one engineering statement: a span's governing
 * value and the studied point's are searches of legal placements (AASHTO LRFD Art. 3.6.1.3.1),
 * each within its stated bound of the largest, so at the same point they differ by no more
 * than the larger bound, and the studied point's value does not exceed the span's by more.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { assertDeck, type Deck } from '../../shared/deck/schema.js';
import type { CodeFactorResult, FactorRow, GoverningFactor } from '../../shared/lrfd/factors.js';
import { adoptedValue, grillageRowOfKind } from '../../shared/grillage/compare.js';
import { governingPerGirder, type RefinedFactor } from '../../shared/review/reductions.js';
import { factorText, ratioText } from '../../shared/lrfd/words.js';
import { diffVersionFactors } from '../../shared/versionDiff/factorDiff.js';
import type { VersionFactors } from '../../shared/versionDiff/versionFactors.js';
import { SolverSession, type GoverningSummary, type RefinedSummary, type StudyEffect, type StudySummary } from '../../src/workers/solverCore.js';
import { comparisonLines, perGirderRows, type GoverningRecord } from '../../src/components/factors/comparisonLines.js';
import { spanGoverning } from '../../src/components/factors/placementGoverning.js';
import { expectedFactor } from '../../server/api/training/trainingQuestions.js';
import { exampleDecks } from '../fixtures/exampleDecks.js';
import { binary, pdfText } from './pdfText.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let projectId: number;


function readCsv(text: string): Record<string, string>[] {
  const lines = text.trimEnd().split('\r\n');
  return Papa.parse<Record<string, string>>(lines.slice(0, -1).join('\n'), { header: true }).data;
}

/** The part of `text` from the heading `from` to the heading `to` (after the cover's list of contents, which names them too). */
function section(text: string, from: string, to: string): string {
  const contents = text.indexOf('9 Review record and signatures');
  expect(contents).toBeGreaterThan(0);
  const a = text.indexOf(from, contents);
  const b = text.indexOf(to, a + from.length);
  expect(a, from).toBeGreaterThanOrEqual(0);
  expect(b, to).toBeGreaterThan(a);
  return text.slice(a, b);
}

/** The needles that are not found in `text` one after the other, in order (each after the one before). */
function missingInOrder(text: string, needles: string[]): string[] {
  const missing: string[] = [];
  let at = 0;
  for (const n of needles) {
    const i = text.indexOf(n, at);
    if (i < 0) missing.push(n);
    else at = i + n.length;
  }
  return missing;
}

/** A version's factors as the workspace's version comparison asks for them: following the grillage job until it is stored. */
async function versionFactors(deckId: number, number: number): Promise<VersionFactors> {
  const url = `/api/decks/${deckId}/versions/${number}/factors`;
  let res = await designer.get(url).set('Prefer', 'respond-async');
  while (res.status === 202) {
    let job = res.body.job;
    while (job.state === 'queued' || job.state === 'running') {
      await new Promise((r) => setTimeout(r, 100));
      job = (await designer.get(job.url)).body.job;
    }
    expect(job.state).toBe('done');
    res = await designer.get(url).set('Prefer', 'respond-async');
  }
  expect(res.status).toBe(200);
  return res.body.factors as VersionFactors;
}

/** What the workspace computes for a deck, as its solver worker does: the code result, the refined run, and each span's studied-point search. */
async function workspaceOf(deck: Deck): Promise<{ code: CodeFactorResult; refined: RefinedSummary; studies: { span: number; study: StudySummary; governing: GoverningRecord; fatigue: GoverningRecord }[] }> {
  const session = new SolverSession();
  const analysis = await session.analyse(deck, {});
  const refined = session.refinedComparison();
  const studies = [];
  for (let span = 0; span < deck.spans.length; span++) {
    const study = await session.study(span, 'design truck');
    const governing: GoverningRecord = { moment: [], shear: [] };
    const fatigue: GoverningRecord = { moment: [], shear: [] };
    for (const g of await session.governingAll()) governing[g.effect][g.girder] = g;
    for (const effect of ['moment', 'shear'] as const) for (let g = 0; g < analysis.girderCount; g++) fatigue[effect][g] = session.governing(g, effect, 'fatigue truck');
    studies.push({ span, study, governing, fatigue });
  }
  return { code: analysis.code, refined, studies };
}

const sameRow = (a: Pick<FactorRow, 'girderNumber' | 'effect' | 'lanes' | 'location'>) => (b: Pick<FactorRow, 'girderNumber' | 'effect' | 'lanes' | 'location'>) =>
  a.girderNumber === b.girderNumber && a.effect === b.effect && a.lanes === b.lanes && a.location.key === b.location.key;
const codeGoverningOf = (code: CodeFactorResult, kind: string, effect: string, key: string): GoverningFactor | undefined => code.governing.find((g) => g.girder === kind && g.effect === effect && g.location.key === key);

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  projectId = (await send.post(designer, '/api/projects', { name: 'One source per value', units: 'US' })).body.project.id;
});
afterAll(() => ctx.close());

describe.each(exampleDecks())('$name', ({ deck: input }) => {
  const deck = assertDeck(input);
  let ws: Awaited<ReturnType<typeof workspaceOf>>;
  let v1: VersionFactors;
  let v2: VersionFactors;
  let deckId: number;
  let reviewId: number;
  /** The one source: the server's grillage rows of the saved version, and their governing value per girder. */
  let rows: FactorRow[];
  let perGirder: RefinedFactor[];

  beforeAll(async () => {
    const saved = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: input, message: 'one source' });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    deckId = saved.body.deck.id;
    const round = await send.post(designer, '/api/reviews', { versionId: saved.body.version.id, reviewerId: userId(ctx, demo.reviewer) });
    expect(round.status, JSON.stringify(round.body)).toBe(201);
    reviewId = round.body.review.id;
    const again = await send.post(designer, `/api/decks/${deckId}/versions`, { deck: input, message: 'saved again, nothing changed' });
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    v1 = await versionFactors(deckId, 1);
    v2 = await versionFactors(deckId, 2);
    if (!v1.refined.available) throw new Error(`no grillage for ${deck.name}: ${v1.refined.note}`);
    rows = (await designer.get(`/api/decks/${deckId}/versions/1?include=results`)).body.version.results.find((r: { method: string }) => r.method === 'grillage').data.rows;
    perGirder = governingPerGirder(rows);
    ws = await workspaceOf(deck);
  }, 180_000);

  it('the workspace computes the server’s values: its code governing values and every grillage row, exactly', () => {
    expect(ws.code.governing).toEqual(v1.code.governing.map((g) => expect.objectContaining({ value: g.value, effect: g.effect, girder: g.girderKind })));
    expect(ws.refined.refined.rows.length).toBe(rows.length);
    for (const r of rows) expect(ws.refined.refined.rows.find(sameRow(r))?.value, r.id).toBe(r.value);
  });

  it('the comparison of methods shows them: by girder kind (each span) and per girder', () => {
    const code = ws.code;
    for (const { span, governing, fatigue } of ws.studies) {
      const lines = comparisonLines({ code, governing, fatigue, vehicle: 'design truck', span, girderCount: code.derived.girderCount, refined: ws.refined.refined });
      expect(lines.length).toBeGreaterThan(0);
      for (const l of lines) {
        const codeRows = code.factors.filter((r) => r.girderKind === l.kind && r.effect === l.effect && r.lanes === l.lanes && r.location.key === l.locationKey);
        expect(l.adopted, l.key).toBe(adoptedValue(codeRows));
        const g = grillageRowOfKind(rows, { kind: l.kind, effect: l.effect, lanes: l.lanes, locationKey: l.locationKey });
        expect(l.grillage?.value, l.key).toBe(g?.value);
        if (!g) continue;
        // the cell opens the trace, lanes and load of that very row
        expect(l.grillage!.partial).toBe(false);
        expect(l.grillage!.row!.trace.at(-1)!.value, l.key).toBe(g.value);
        expect(l.grillage!.loadedLanes, l.key).toBe(g.loadedLanes);
        expect(l.grillage!.lanes.length, l.key).toBe(g.loadedLanes);
        expect(l.grillage!.vehicle, l.key).toBe(g.vehicle);
      }
      // each code governing value of the span is the adopted value of the lane case marked governing
      for (const g of code.governing.filter((x) => lines.some((l) => l.locationKey === x.location.key))) {
        const own = lines.filter((l) => l.kind === g.girder && l.effect === g.effect && l.locationKey === g.location.key);
        expect(own.find((l) => l.governing)?.adopted, `${g.girder} ${g.effect} ${g.location.key}`).toBe(g.value);
      }
      for (const r of perGirderRows(ws.refined.comparison.rows, span)) {
        const g = rows.find((x) => x.girderNumber === r.girderNumber && x.effect === r.effect && x.lanes === r.lanes && x.location.key === r.locationKey);
        expect(r.grillage, `G${r.girderNumber} ${r.effect} ${r.locationKey} ${r.lanes}`).toBe(g?.value);
        if (r.grillage !== undefined && r.code !== undefined) expect(r.ratios.toCode).toBe(r.grillage / r.code);
      }
    }
  });

  it('the placement panel states each girder’s governing value of the span; its studied point agrees with the refined factor read there', () => {
    let checked = 0;
    let points = 0;
    for (const { span, study, governing, fatigue } of ws.studies) {
      for (const [vehicle, record] of [['design truck', governing], ['fatigue truck', fatigue]] as const) {
        for (const effect of ['moment', 'shear'] as StudyEffect[]) {
          for (let girder = 0; girder < ws.code.derived.girderCount; girder++) {
            const what = `G${girder + 1} ${vehicle} ${effect} span ${span + 1}`;
            const shown = spanGoverning(ws.refined.refined.rows, { girder, effect, vehicle, span });
            const refinedEffect = vehicle === 'fatigue truck' ? `fatigue-${effect}` : effect;
            const one = perGirder.find((f) => f.girder === girder + 1 && f.effect === refinedEffect && f.locationKey === `span${span + 1}`)!;
            expect(shown?.value, what).toBe(one.value);
            expect(shown!.vehicle, what).toBe(one.vehicle);
            expect(shown!.loadedLanes, what).toBe(one.loadedLanes);
            checked++;
            // The studied point's search and the refined factor at the same point are both true
            // values of legal placements within their stated bounds of the largest: they differ
            // by no more than the larger bound.
            const at = ws.refined.refined.factors.find(
              (f) =>
                f.girder === girder &&
                f.effect === refinedEffect &&
                (effect === 'shear' ? f.point.kind === 'shear' && f.point.support === span && f.point.side === 'right' : f.point.kind === 'moment' && f.span === span && Math.abs(f.point.fraction - study.momentFraction) < 1e-9),
            );
            if (!at) continue;
            const studied = record[effect][girder] as GoverningSummary;
            expect(Math.abs(studied.factor - at.value), what).toBeLessThanOrEqual(Math.max(studied.toleranceFactor, at.tolerance.factor) + 1e-9);
            expect(studied.factor, what).toBeLessThanOrEqual(one.value + Math.max(studied.toleranceFactor, one.bound?.lanes ?? 0) + 1e-9);
            points++;
          }
        }
      }
    }
    expect(checked).toBe(4 * deck.spans.length * ws.code.derived.girderCount);
    expect(points).toBeGreaterThanOrEqual(2 * deck.spans.length * ws.code.derived.girderCount);
  });

  it('the version comparison of two saved versions with equal inputs: the same values, every row unchanged', () => {
    if (!v1.refined.available || !v2.refined.available) throw new Error('no grillage');
    expect(v1.code.governing.map((g) => g.value)).toEqual(ws.code.governing.map((g) => g.value));
    expect(v1.refined.governing).toEqual(perGirder);
    for (const r of v1.refined.rows) expect(r.value).toBe(rows.find((x) => x.girderNumber === r.girderNumber && x.effect === r.effect && x.lanes === r.lanes && x.location.key === r.location.key)!.value);
    const diff = diffVersionFactors({ number: 1, factors: v1 }, { number: 2, factors: v2 });
    expect(diff.rows.length).toBe(v1.code.rows.length + v1.code.governing.length + v1.refined.rows.length + v1.refined.governing.length);
    for (const r of diff.rows) {
      expect(r.state, r.key).toBe('same');
      expect(r.before.text, r.key).toBe(factorText(r.before.value!));
    }
    const governingGrillage = diff.rows.filter((r) => r.section === 'governing' && r.method === 'grillage, governing value');
    expect(governingGrillage.map((r) => r.before.value)).toEqual(expect.arrayContaining(perGirder.map((f) => f.value)));
  });

  it('the review summary, the package and the CSV tables print the same values', async () => {
    const code = ws.code;
    const summary = (await reviewer.get(`/api/reviews/${reviewId}`)).body.summary;
    expect(summary.refined.available).toBe(true);
    expect(summary.governing.map((g: { value: number }) => g.value)).toEqual(code.governing.map((g) => g.value));
    const ratios = summary.refined.ratios as { girder: number; girderKind: string; effect: string; locationKey: string; refined: number; code: number; ratio: number; vehicle?: string }[];
    expect(ratios.length).toBeGreaterThan(0);
    for (const r of ratios) {
      const f = perGirder.find((x) => x.girder === r.girder && x.effect === r.effect && x.locationKey === r.locationKey)!;
      expect(r.refined).toBe(f.value);
      expect(r.vehicle).toBe(f.vehicle);
      expect(r.code).toBe(codeGoverningOf(code, r.girderKind, r.effect, r.locationKey)!.value);
    }

    const pdf = await designer.get(`/api/reports/decks/${deckId}/versions/1/package.pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    const text = pdfText(pdf.body as Buffer);
    const gov = section(text, '2 Governing distribution factors', '3 Every factor with its trace');
    expect(missingInOrder(gov, code.governing.map((g) => factorText(g.value)))).toEqual([]);
    const table = section(text, 'Refined / code ratios and the possible reduction', 'Reviewer’s decision');
    expect(missingInOrder(table, ratios.flatMap((r) => [factorText(r.refined), `${factorText(r.code)} ${ratioText(r.ratio)}`]))).toEqual([]);
    // the comparison of methods: each group of code rows with the grillage value of its kind and the adopted value
    const cmp = section(text, '5 Comparison of methods', '6 Findings');
    const groups = new Map<string, FactorRow[]>();
    for (const r of code.factors) {
      const k = `${r.girderKind}|${r.effect}|${r.location.key}|${r.lanes}`;
      groups.set(k, [...(groups.get(k) ?? []), r]);
    }
    const cells = [...groups.values()].map((list) => {
      const g = grillageRowOfKind(rows, { kind: list[0].girderKind, effect: list[0].effect, lanes: list[0].lanes, locationKey: list[0].location.key });
      return `${g ? factorText(g.value) : '—'} ${factorText(adoptedValue(list)!)}`;
    });
    expect(missingInOrder(cmp, cells)).toEqual([]);

    const factors = readCsv((await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`)).text);
    expect(factors.length).toBe(code.factors.length + rows.length);
    code.factors.forEach((r, i) => {
      expect(factors[i].row_id).toBe(r.id);
      expect(Number(factors[i].value), r.id).toBe(r.value);
      expect(factors[i].governing).toBe(String(r.governing));
    });
    rows.forEach((r, i) => {
      const c = factors[code.factors.length + i];
      expect(c.row_id).toBe(r.id);
      expect(Number(c.value), r.id).toBe(r.value);
      expect(c.governing_load).toBe(r.vehicle);
    });
    for (const f of perGirder) {
      const mine = factors.filter((c) => c.method === 'grillage' && Number(c.girder_number) === f.girder && c.effect === f.effect && c.row_id.includes(`/${f.locationKey}/`));
      expect(Math.max(...mine.map((c) => Number(c.value)))).toBe(f.value);
    }
    // stations and span lengths as an engineer writes them: to 0.001 ft, and still numbers
    for (const c of factors) if (c.span_length_ft) expect(c.span_length_ft, c.row_id).toMatch(/^\d+(\.\d{1,3})?$/);
    const envelopes = readCsv((await designer.get(`/api/reports/decks/${deckId}/versions/1/envelopes.csv`)).text);
    expect(envelopes.length).toBeGreaterThan(0);
    for (const e of envelopes) {
      expect(e.x_ft).toMatch(/^\d+(\.\d{1,3})?$/);
      expect(Number(e.moment_factor)).toBe(codeGoverningOf(code, e.girder, 'moment', `span${e.span}`)!.value);
    }
  }, 120_000);

  it('the exercise answer to a governing-value question is the code’s governing value', () => {
    for (const g of ws.code.governing) {
      const answer = expectedFactor(ws.code, { girder: g.girder, effect: g.effect, lanes: 'governing', method: 'governing', location: g.location.key });
      expect(answer.value, `${g.girder} ${g.effect} ${g.location.key}`).toBe(g.value);
      expect(answer.trace.some((s) => s.value === g.value)).toBe(true);
    }
  });
});
