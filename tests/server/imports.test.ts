/** CSV import of girder layouts and section properties: template round trip, row-level errors
 *  naming the column and the rule, nothing imported from a file with any bad row. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fromUs } from '../../shared/units.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let trainee: Agent;
let reviewer: Agent;
let outsider: Agent;
let deckId: number;
let projectId: number;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  trainee = await signIn(ctx.app, demo.trainee);
  reviewer = await signIn(ctx.app, demo.reviewer);
  outsider = await otherFirm(ctx);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const res = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'before import' });
  deckId = res.body.deck.id;
});
afterAll(() => ctx.close());

function upload(a: Agent, csv: string | Buffer, fields: Record<string, string> = {}, name = 'layout.csv') {
  const req = a.post('/api/imports/girder-layout').set('X-CSRF-Token', a.csrf).field('deckId', String(fields.deckId ?? deckId));
  for (const [k, v] of Object.entries(fields)) if (k !== 'deckId') req.field(k, v);
  return req.attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv, 'utf8'), { filename: name, contentType: 'text/csv' });
}

async function versionCount() {
  return (await designer.get(`/api/decks/${deckId}`)).body.versions.length as number;
}

describe('template and import', () => {
  it('downloads the US template and imports it unchanged: six girders at 9.6667 ft', async () => {
    const t = await designer.get('/api/imports/girder-layout/template?units=US');
    expect(t.status).toBe(200);
    expect(t.headers['content-type']).toContain('text/csv');
    expect(t.headers['content-disposition']).toContain('girder-layout-template-US.csv');
    const lines = t.text.trim().split('\r\n');
    expect(lines[0]).toBe('girder,spacing_ft,area_in2,inertia_in4,centroid_from_top_in,depth_in');
    expect(lines).toHaveLength(7);

    const before = await versionCount();
    const res = await upload(designer, t.text, { message: 'girders from the template' }, 'girder-layout-template-US.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.imported.girderCount).toBe(6);
    expect(await versionCount()).toBe(before + 1);
    const v = (await designer.get(`/api/decks/${deckId}/versions/${res.body.version.number}`)).body.version;
    expect(v.message).toBe('girders from the template');
    expect(v.deck.girders.kind).toBe('offsets');
    v.deck.girders.offsets.forEach((o: number, i: number) => expect(o + 1).toBeRelativelyClose(1 + i * fromUs.ft(9.6667), 1e-12));
    expect(v.deck.section.area).toBeRelativelyClose(fromUs.in2(767), 1e-12);
    expect(v.deck.section.inertia).toBeRelativelyClose(fromUs.in4(545894), 1e-12);
    // The rest of the deck is carried over from the version it was based on.
    expect(v.deck.spans).toEqual(quarryCreekDeck().spans);
    expect(v.results.some((r: { method: string }) => r.method === 'code')).toBe(true);
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries;
    expect(audit[0]).toMatchObject({ action: 'import', entityType: 'deck', entityId: deckId });
    expect(audit[0].summary).toContain('imported 6 girders and the section properties from girder-layout-template-US.csv');
  });

  it('the SI template describes the same deck within rounding (units identity)', async () => {
    const us = await upload(designer, (await designer.get('/api/imports/girder-layout/template?units=US')).text, { dryRun: 'true' });
    const si = await upload(designer, (await designer.get('/api/imports/girder-layout/template?units=SI')).text, { dryRun: 'true' });
    expect(si.status).toBe(200);
    expect(si.body.dryRun).toBe(true);
    us.body.imported.offsets.forEach((o: number, i: number) => expect(si.body.imported.offsets[i] + 1).toBeRelativelyClose(o + 1, 1e-5));
    for (const k of ['area', 'inertia', 'centroidFromTop', 'depth']) expect(si.body.imported.section[k]).toBeRelativelyClose(us.body.imported.section[k], 1e-4);
  });

  it('a dry run saves nothing', async () => {
    const before = await versionCount();
    const res = await upload(designer, 'girder,spacing_m\n1,\n2,2.5\n3,2.5\n4,2.5\n', { dryRun: 'true' });
    expect(res.status).toBe(200);
    expect(res.body.version).toBeNull();
    expect(res.body.imported.offsets).toEqual([0, 2.5, 5, 7.5]);
    expect(await versionCount()).toBe(before);
  });
});

describe('bad files import nothing', () => {
  it('a missing column is named', async () => {
    const before = await versionCount();
    const res = await upload(designer, 'girder,area_in2\n1,767\n2,\n3,\n');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('the file has 1 problem: nothing was imported');
    expect(res.body.error.details).toEqual([{ path: 'file.spacing_ft', message: 'column spacing_ft (or spacing_m) is missing: the header row must name it' }]);
    expect(await versionCount()).toBe(before);
  });

  it('text in a number, a negative spacing and a second section are reported row by row, and nothing is imported', async () => {
    const before = await versionCount();
    const csv = [
      'girder,spacing_ft,area_in2,inertia_in4',
      '1,,767,545894',
      '2,9.6667,,abc',
      '3,-9.5,,',
      '4,9.6667,800,',
      '5,9.6667,,',
    ].join('\n');
    const res = await upload(designer, csv);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('the file has 3 problems: nothing was imported');
    expect(res.body.error.details).toEqual([
      { path: 'file.row3.inertia_in4', message: 'row 3, column inertia_in4: “abc” is not a number (use a point for decimals, no units or thousands separators)' },
      { path: 'file.row4.spacing_ft', message: 'row 4, column spacing_ft: the spacing must be greater than 0 (got -9.5)' },
      {
        path: 'file.row5.area_in2',
        message: expect.stringMatching(/^row 5, column area_in2: 800 differs from girder 1's 767; the deck holds one section for all girders/),
      },
    ]);
    expect(await versionCount()).toBe(before);
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries;
    expect(audit.filter((e: { action: string }) => e.action === 'import')).toHaveLength(1);
  });

  it('header and numbering problems are named', async () => {
    const res = await upload(designer, 'girder,spacing_ft,spacing_m,colour\n1,,,\n3,9,,\n');
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { message: string }) => d.message)).toEqual([
      'row 1, column spacing_m: the spacing from the previous girder is already given in column spacing_ft; give it once',
      expect.stringMatching(/^row 1, column colour: unknown column \(known columns: girder, spacing_ft, spacing_m, /),
    ]);
    const order = await upload(designer, 'girder,spacing_ft\n1,\n3,9\n2,\n');
    expect(order.body.error.details.map((d: { message: string }) => d.message)).toEqual([
      'row 3, column girder: expected girder 2 (girders are numbered 1, 2, 3 … in order from the left), got 3',
      'row 4, column girder: expected girder 3 (girders are numbered 1, 2, 3 … in order from the left), got 2',
      'row 4, column spacing_ft: the spacing from girder 2 is missing',
    ]);
    const first = await upload(designer, 'girder,spacing_ft,area_in2\n1,4,\n2,9,\n');
    expect(first.body.error.details.map((d: { message: string }) => d.message)).toEqual([
      'row 2, column spacing_ft: leave it blank for girder 1 (the spacing is measured from the previous girder)',
      "row 2, column area_in2: give girder 1's value (later rows may leave it blank)",
    ]);
    expect((await upload(designer, '')).body.error.details[0].message).toBe('the file is empty: it needs a header row and one row per girder');
    expect((await upload(designer, 'girder,spacing_ft\n1,\n')).body.error.details[0].message).toBe('the file has 1 girder row: a deck needs at least 2 girders');
  });

  it('huge spacings and section values are refused row by row before anything is computed', async () => {
    // A spacing of 1,000,000 m or 1e300 once ran the server out of memory; each value is now
    // checked against its physical range (shared/deck/limits.ts) with the row and column named.
    const before = await versionCount();
    for (const huge of ['1000000', '1e300', '1e999']) {
      const res = await upload(designer, `girder,spacing_m,area_m2\n1,,0.5\n2,2.5,\n3,${huge},\n`, { dryRun: 'true' });
      expect(res.status, huge).toBe(400);
      expect(res.body.error.details).toContainEqual({ path: 'file.row4.spacing_m', message: expect.stringMatching(/^row 4, column spacing_m: the spacing must be at most 8 m \(26\.25 ft\)/) });
    }
    const bigArea = await upload(designer, 'girder,spacing_ft,area_in2\n1,,1e12\n2,8,\n', { dryRun: 'true' });
    expect(bigArea.status).toBe(400);
    expect(bigArea.body.error.details).toContainEqual({ path: 'file.row2.area_in2', message: expect.stringMatching(/^row 2, column area_in2: must be at most .* in²\) \(got 1000000000000\)/) });
    const tiny = await upload(designer, 'girder,spacing_ft\n1,\n2,0.01\n', { dryRun: 'true' });
    expect(tiny.body.error.details[0].message).toMatch(/must be at least 0\.3 m \(0\.9843 ft\)/);
    expect(await versionCount()).toBe(before);
    expect((await designer.get('/api/health')).status).toBe(200);
  });

  it('a roadway too narrow for a lane is traced back to the spacing column', async () => {
    const res = await upload(designer, 'girder,spacing_ft\n1,\n2,2\n');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].message).toContain('narrower than one 12 ft design lane');
  });

  it('refuses a binary file, a file too large, the wrong roles and another firm', async () => {
    expect((await upload(designer, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0xff, 0xfe]))).body.error.details[0]).toEqual({ path: 'file', message: 'the file is not UTF-8 text (save it as CSV UTF-8)' });
    const big = await upload(designer, 'girder,spacing_ft\n' + '1,\n'.repeat(100_000));
    expect(big.status).toBe(413);
    expect((await upload(trainee, 'girder,spacing_ft\n1,\n2,9\n')).status).toBe(403);
    expect((await upload(reviewer, 'girder,spacing_ft\n1,\n2,9\n')).status).toBe(403);
    expect((await upload(outsider, 'girder,spacing_ft\n1,\n2,9\n')).status).toBe(404);
    const noFile = await designer.post('/api/imports/girder-layout').set('X-CSRF-Token', designer.csrf).field('deckId', String(deckId));
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.details[0].path).toBe('file');
    expect((await upload(designer, 'girder,spacing_ft\n1,\n2,9\n', { deckId: 'seven' })).body.error.details[0]).toEqual({ path: 'body.deckId', message: 'deckId must be a number' });
    expect((await designer.get('/api/imports/girder-layout/template?units=metric')).status).toBe(400);
  });
});
