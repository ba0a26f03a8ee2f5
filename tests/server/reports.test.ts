/** The calculation package (PDF text extracted and checked) and the CSV exports (re-read and
 *  compared with the API's values and with a hand calculation of the HL-93 midspan moment). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { deckFromDisplay } from '../../shared/deck/units.js';
import type { DeckInput } from '../../shared/deck/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { SOLVER_VERSION } from '../../shared/version.js';
import { FINDING_LEVEL_WORDS, findingLevel } from '../../shared/findings/levels.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let trainee: Agent;
let outsider: Agent;
let deckId: number;
let projectId: number;
let codeRows: { id: string; value: number; adopted: boolean; governing: boolean; findings: { code: string; severity?: string }[] }[];
let governing: { girder: string; effect: string; value: number }[];
let reviewId: number;

function binary(res: { on(e: string, f: (c?: Buffer) => void): void }, cb: (e: Error | null, b: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c) => chunks.push(c!));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

/** Text of a PDF by poppler's pdftotext (Debian package poppler-utils). */
function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-pdf-'));
  const file = join(dir, 'package.pdf');
  writeFileSync(file, pdf);
  const r = spawnSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
  if (r.error) throw new Error(`pdftotext is needed to read the PDF (apt-get install -y poppler-utils): ${r.error.message}`);
  expect(r.status, r.stderr).toBe(0);
  return r.stdout.replace(/\s+/g, ' ');
}

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  trainee = await signIn(ctx.app, demo.trainee);
  outsider = await otherFirm(ctx);
  projectId = (await designer.get('/api/projects')).body.projects.find((p: { name: string }) => p.name === 'Quarry Creek Overpass').id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'layout from the general arrangement' });
  deckId = created.body.deck.id;
  const round = await send.post(designer, '/api/reviews', { versionId: created.body.version.id, reviewerId: userId(ctx, demo.reviewer) });
  await send.put(reviewer, `/api/reviews/${round.body.review.id}/refined-analysis`, { justified: false, reason: 'Every formula within its range; skew below 30°.' });
  await send.post(reviewer, `/api/reviews/${round.body.review.id}/decision`, { outcome: 'approve', note: '' });
  reviewId = round.body.review.id;
  const code = (await designer.get(`/api/decks/${deckId}/versions/1?include=results`)).body.version.results.find((r: { method: string }) => r.method === 'code').data;
  codeRows = code.factors;
  governing = code.governing;
});
afterAll(() => ctx.close());

describe('calculation package (PDF)', () => {
  let text: string;
  let pdf: Buffer;

  it('is a PDF with Open Sans embedded', async () => {
    const res = await designer.get(`/api/reports/decks/${deckId}/versions/1/package.pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toContain('Quarry-Creek-Overpass-main-span-v1-calculation-package.pdf');
    pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pdf.includes(Buffer.from('/FontFile2'))).toBe(true);
    expect(pdf.includes(Buffer.from('OpenSans-Regular'))).toBe(true);
    // A package of Latin text only embeds no fallback font (they load only for the characters that need them).
    expect(pdf.includes(Buffer.from('NotoSansSC'))).toBe(false);
    expect(pdf.includes(Buffer.from('NotoEmoji'))).toBe(false);
    // laid out on the package pool's worker thread, not on the request thread
    expect(ctx.packagePool.stats()).toMatchObject({ jobs: 1, completed: 1, failed: 0 });
    text = pdfText(pdf);
  });

  it('has the cover: project, deck, version, author, reviewer, status', () => {
    for (const s of ['Calculation package', 'Quarry Creek Overpass', 'Harlow County Highway Department', 'Quarry Creek Overpass — main span — version 1', 'Author Dana Okonkwo', 'Reviewer Ruth Castellanos', 'Review status approved']) {
      expect(text, s).toContain(s);
    }
    // the product's version from package.json (its one source), beside the solver's
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    expect(text.replace(/\s+/g, ' ')).toContain(`Software Deckshare ${pkg.version}, solver ${SOLVER_VERSION}`);
  });

  it('prints every governing factor and its article, the findings and the decision', () => {
    for (const g of governing) expect(text, `${g.girder} ${g.effect}`).toContain(g.value.toFixed(4));
    for (const r of codeRows) expect(text, r.id).toContain(r.value.toFixed(4));
    // findings with their levels (shared/findings/levels.ts), as everywhere else
    expect(text.replace(/\s+/g, ' ')).toContain('note (not-applicable)');
    for (const s of ['Table 4.6.2.2.2b-1', 'Table 4.6.2.2.3a-1', 'Art. 4.6.2.2.1 (lever rule)', 'Kg = n · (I + A · eg²)', 'θ = 20.0° is below 30°', 'Governing placements on the cross-section', 'Lane 1', 'A refined analysis is not justified', 'Every formula within its range; skew below 30°.']) {
      expect(text, s).toContain(s);
    }
    // the conditions the decision was recorded under (shared/review/claimConditions.ts)
    expect(text.replace(/\s+/g, ' ')).toMatch(/Recorded (with the refined results of solver [\d.]+: \d+ of \d+ design moment rows? could back a reduction|without refined results)/);
  });

  it('carries the caution on every page and a signature block', () => {
    const caution = 'Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';
    expect(text).toContain(caution);
    const pages = Number(/page 1 of (\d+)/.exec(text)![1]);
    expect(pages).toBeGreaterThan(5);
    expect(text.split(caution).length - 1).toBeGreaterThanOrEqual(pages);
    for (const s of ['Signatures', 'Prepared by', 'Checked by', 'licence number and seal']) expect(text).toContain(s);
  });

  it('is audited as an export; trainees and other firms are refused', async () => {
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries;
    expect(audit.some((e: { action: string; summary: string }) => e.action === 'export' && e.summary.includes('calculation package (PDF)'))).toBe(true);
    expect((await trainee.get(`/api/reports/decks/${deckId}/versions/1/package.pdf`)).status).toBe(403);
    expect((await outsider.get(`/api/reports/decks/${deckId}/versions/1/package.pdf`)).status).toBe(404);
    expect((await outsider.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`)).status).toBe(404);
    expect((await designer.get(`/api/reports/decks/${deckId}/versions/9/package.pdf`)).status).toBe(404);
    expect((await designer.get(`/api/reports/decks/abc/versions/1/package.pdf`)).status).toBe(400);
  });
});

describe('calculation package with CJK, accented and emoji characters in names and notes', () => {
  it('prints them in fonts that have them (Noto Sans SC, Noto Emoji), not as "?"', async () => {
    const project = await send.post(designer, '/api/projects', { name: 'Brücke am Año 橋梁 🦀', ownerAgency: 'Kreis Süd 道路局', location: 'ü ñ 河川', units: 'US', notes: '' });
    expect(project.status).toBe(201);
    const created = await send.post(designer, `/api/projects/${project.body.project.id}/decks`, { deck: { ...quarryCreekDeck(), name: 'Hauptfeld 主桥 ü ñ 🦀' }, message: 'Trägerlage 橋梁 🦀' });
    expect(created.status).toBe(201);
    const round = await send.post(designer, '/api/reviews', { versionId: created.body.version.id, reviewerId: userId(ctx, demo.reviewer) });
    await send.put(reviewer, `/api/reviews/${round.body.review.id}/refined-analysis`, { justified: false, reason: 'Alle Formeln im Bereich 橋梁 ü ñ 🦀.' });
    const decided = await send.post(reviewer, `/api/reviews/${round.body.review.id}/decision`, { outcome: 'approve', note: 'Geprüft 橋梁 🦀' });
    expect(decided.status).toBe(200);
    const res = await designer.get(`/api/reports/decks/${created.body.deck.id}/versions/1/package.pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const pdf = res.body as Buffer;
    expect(pdf.includes(Buffer.from('NotoSansSC'))).toBe(true);
    expect(pdf.includes(Buffer.from('NotoEmoji'))).toBe(true);
    const text = pdfText(pdf);
    for (const s of ['Brücke am Año 橋梁 🦀', 'Kreis Süd 道路局', 'ü ñ 河川', 'Hauptfeld 主桥 ü ñ 🦀 — version 1', 'Trägerlage 橋梁 🦀', 'Alle Formeln im Bereich 橋梁 ü ñ 🦀.', 'Geprüft 橋梁 🦀']) {
      expect(text, s).toContain(s);
    }
    expect(text).not.toMatch(/\?\s?🦀|橋梁\s?\?/);
  });
});

function readCsv(text: string) {
  const lines = text.trimEnd().split('\r\n');
  expect(lines.at(-1)).toContain('licensed engineer');
  return Papa.parse<Record<string, string>>(lines.slice(0, -1).join('\n'), { header: true }).data;
}

describe('CSV exports', () => {
  it('the factor table re-reads to the API’s values', async () => {
    const res = await reviewer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    const all = readCsv(res.text);
    const rows = all.slice(0, codeRows.length);
    rows.forEach((r, i) => {
      expect(r.row_id).toBe(codeRows[i].id);
      expect(Number(r.value)).toBe(codeRows[i].value);
      expect(r.adopted).toBe(String(codeRows[i].adopted));
      expect(r.governing).toBe(String(codeRows[i].governing));
      // each finding with its level, as the workspace, the review and the package mark it
      const findings = r.findings ? r.findings.split(' | ') : [];
      expect(findings.length).toBe(codeRows[i].findings.length);
      findings.forEach((text, k) => expect(text.startsWith(`${FINDING_LEVEL_WORDS[findingLevel(codeRows[i].findings[k])]}: `), text).toBe(true));
    });
    expect(rows.some((r) => r.findings !== '')).toBe(true);
    expect(Number(rows[0].span_length_ft)).toBe(110);

    // Then the grillage rows: the largest of each girder, effect and place is the refined
    // factor the review summary reports (API), exactly.
    const grillage = all.slice(codeRows.length);
    expect(grillage.length).toBeGreaterThan(0);
    expect(grillage.every((r) => r.method === 'grillage')).toBe(true);
    expect(all.slice(0, codeRows.length).every((r) => r.governing_load === '')).toBe(true);
    const summary = (await reviewer.get(`/api/reviews/${reviewId}`)).body.summary;
    expect(summary.refined.available).toBe(true);
    // 6 girders × (moment, shear, reaction at each of the 2 supports)
    expect(summary.refined.ratios.length).toBe(6 * 4);
    for (const ratio of summary.refined.ratios) {
      const mine = grillage.filter((r) => Number(r.girder_number) === ratio.girder && r.effect === ratio.effect && r.row_id.includes(`/${ratio.locationKey}/`));
      expect(Math.max(...mine.map((r) => Number(r.value))), `${ratio.girder} ${ratio.effect}`).toBe(ratio.refined);
      // the governing load of the row, the same in the CSV and the summary (the deck's default loading: the design truck)
      expect(ratio.vehicle).toBe('design truck');
      const top = mine.reduce((a, b) => (Number(b.value) > Number(a.value) ? b : a));
      expect(top.governing_load).toBe(ratio.vehicle);
      // the stated bound is in every table: the summary's ratio row and the CSV's row agree, and a miss is marked
      expect(Number(top.bound_lanes)).toBeRelativelyClose(ratio.bound.lanes, 1e-9);
      expect(top.bound_meets_target).toBe(String(ratio.bound.meetsTarget));
      expect(ratio.ratio).toBeRelativelyClose(ratio.refined / ratio.code, 1e-12);
    }
    // Symmetry of the symmetric deck: girder 1 and girder 6 have the same refined factors.
    const at = (g: number, e: string) => summary.refined.ratios.find((x: { girder: number; effect: string }) => x.girder === g && x.effect === e).refined;
    expect(at(1, 'moment')).toBeRelativelyClose(at(6, 'moment'), 1e-6);
    expect(at(2, 'shear')).toBeRelativelyClose(at(5, 'shear'), 1e-6);
  });

  it('the envelopes re-read to the API’s factors and the hand-calculated HL-93 midspan moment', async () => {
    const res = await designer.get(`/api/reports/decks/${deckId}/versions/1/envelopes.csv`);
    const rows = readCsv(res.text);
    const mid = rows.find((r) => r.girder === 'interior' && r.fraction === '0.5')!;
    const g = governing.find((x) => x.girder === 'interior' && x.effect === 'moment')!.value;
    expect(Number(mid.moment_factor)).toBe(g);
    // Per-lane LL+IM at midspan of a 110 ft simple span (AASHTO LRFD Art. 3.6.1.2.2 design truck,
    // Art. 3.6.1.2.4 lane load 0.64 klf, Art. 3.6.2.1 IM = 33 % on the truck only; ordinates of the
    // simple-span influence line, statics): middle axle at midspan, ordinate L/4 = 27.5 ft; the other
    // axles 14 ft away, ordinate 27.5·41/55 = 20.5 ft.
    const truck = 32 * 27.5 + 32 * 20.5 + 8 * 20.5;
    const lane = (0.64 * 110 ** 2) / 8;
    const perLane = 1.33 * truck + lane; // kip·ft
    expect(Number(mid.moment_max_kip_ft)).toBeRelativelyClose(g * perLane, 1e-6);
    expect(mid.governing_loading_moment_max).toBe('design truck');
    // Symmetry of the simple span: the moment at 0.3 L equals that at 0.7 L.
    const at = (f: string) => Number(rows.find((r) => r.girder === 'interior' && r.fraction === f)!.moment_max_kip_ft);
    expect(at('0.3')).toBeRelativelyClose(at('0.7'), 1e-9);
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries.filter((e: { action: string }) => e.action === 'export');
    expect(audit.map((e: { summary: string }) => e.summary.split(' of version')[0])).toEqual(['exported the girder envelopes (CSV)', 'exported the factor table (CSV)', 'exported the calculation package (PDF)']);
  });

  it('a project in SI units exports in SI units', async () => {
    const si = (await designer.get('/api/projects')).body.projects.find((p: { units: string }) => p.units === 'SI');
    const deck = deckFromDisplay(
      {
        name: 'Ashgrove Street Viaduct — three spans',
        sectionType: 'a',
        girders: { kind: 'uniform', count: 5, spacing: 3.0 },
        overhangLeft: 1.0,
        overhangRight: 1.0,
        barrierLeft: { width: 0.45, height: 0.85 },
        barrierRight: { width: 0.45, height: 0.85 },
        slab: { thickness: 225, haunch: 50, wearingSurface: 0 },
        section: { area: 30000, inertia: 1.8e10, centroidFromTop: 700, depth: 1500 },
        materials: { deck: { kind: 'concrete', fc: 30, unitWeight: 24, K1: 1, modulusEquation: 'current' }, girder: { kind: 'modulus', modulus: 200000 } },
        spans: [{ length: 30 }, { length: 40 }, { length: 30 }],
        continuous: true,
        supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }, { skew: 0 }],
        diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 3, topChordArea: 1920, bottomChordArea: 1920, diagonalArea: 1390, frameDepth: 1100 },
      },
      'SI',
    ) as unknown as DeckInput;
    const created = await send.post(designer, `/api/projects/${si.id}/decks`, { deck, message: 'three-span study' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const id = created.body.deck.id;
    const env = readCsv((await designer.get(`/api/reports/decks/${id}/versions/1/envelopes.csv`)).text);
    expect(Object.keys(env[0])).toEqual(expect.arrayContaining(['x_m', 'moment_max_kN_m', 'shear_max_kN']));
    // Continuity: over the first interior support the minimum moment is negative.
    const overPier = env.find((r) => r.girder === 'interior' && r.span === '1' && r.fraction === '1')!;
    expect(Number(overPier.moment_min_kN_m)).toBeLessThan(0);
    const f = readCsv((await designer.get(`/api/reports/decks/${id}/versions/1/factors.csv`)).text);
    expect(Object.keys(f[0])).toContain('span_length_m');
    const pdf = await designer.get(`/api/reports/decks/${id}/versions/1/package.pdf`).buffer(true).parse(binary);
    const t = pdfText(pdf.body as Buffer);
    expect(t).toContain('kN·m');
    expect(t).toContain('Review status in progress');
    expect(t).toContain('Negative moment');
  });
});
