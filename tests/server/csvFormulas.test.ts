/** CSV exports cannot attack the reader: text that a spreadsheet would run as a formula
 *  (first character =, +, -, @, tab, carriage return) is written with a leading apostrophe,
 *  numbers stay numbers (a negative number stays negative, not text). The formula-injection
 *  characters are those of the OWASP "CSV Injection" page and papaparse's escapeFormulae. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { toCsv } from '../../server/reports/csvText.js';
import { girderLayoutTemplate } from '../../server/api/imports/girderLayoutCsv.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';

const HOSTILE = ['=HYPERLINK("http://x")', '+cmd', '@SUM(A1)', '-2+3', '\t=1', '\r=1', '=1\n=2'];
const FORMULA_START = /^[=+\-@\t\r]/;

const cells = (text: string) => Papa.parse<string[]>(text, { skipEmptyLines: true }).data;

describe('toCsv', () => {
  it('puts an apostrophe before text that would run as a formula, and keeps the text otherwise', () => {
    const out = cells(toCsv([HOSTILE, ['plain', 'a=b', "it's", '']]));
    expect(out[0]).toEqual(HOSTILE.map((t) => `'${t}`));
    expect(out[1]).toEqual(['plain', 'a=b', "it's", '']);
  });

  it('writes numbers and booleans as they are: -1.25 stays a number', () => {
    const text = toCsv([[-1.25, 0, 3e-9, -0.5, true, null]]);
    expect(text).toBe('-1.25,0,3e-9,-0.5,true,');
    expect(Number(cells(text)[0][0])).toBe(-1.25);
  });

  it('the girder-layout template has no formula-like cell', () => {
    for (const units of ['US', 'SI'] as const) for (const c of cells(girderLayoutTemplate(units)).flat()) expect(c).not.toMatch(FORMULA_START);
  });
});

describe('factor and envelope exports of a deck with a hostile name', () => {
  let ctx: WorkflowContext;
  let designer: Agent;
  let deckId: number;

  beforeAll(async () => {
    ctx = await makeWorkflowApp();
    designer = await signIn(ctx.app, demo.designer);
    const project = await send.post(designer, '/api/projects', { name: '=HYPERLINK("http://x")', units: 'US' });
    const created = await send.post(designer, `/api/projects/${project.body.project.id}/decks`, { deck: { ...quarryCreekDeck(), name: '@SUM(A1)' }, message: '-2+3' });
    expect(created.status).toBe(201);
    deckId = created.body.deck.id;
  });
  afterAll(() => ctx.close());

  for (const file of ['factors.csv', 'envelopes.csv']) {
    it(`${file}: every formula-like cell is a number; negative numbers stay numbers`, async () => {
      const res = await designer.get(`/api/reports/decks/${deckId}/versions/1/${file}`);
      expect(res.status).toBe(200);
      const filename = /filename="?([^";]+)/.exec(res.headers['content-disposition'])![1];
      expect(filename).toMatch(/^SUM-A1-v1-/);
      const rows = cells(res.text);
      let negatives = 0;
      for (const c of rows.flat()) {
        if (!FORMULA_START.test(c)) continue;
        expect(Number.isFinite(Number(c)), `cell ${JSON.stringify(c)} would run as a formula`).toBe(true);
        negatives++;
      }
      if (file === 'envelopes.csv') expect(negatives, 'negative moments and shears are written as numbers').toBeGreaterThan(0);
    });
  }
});
