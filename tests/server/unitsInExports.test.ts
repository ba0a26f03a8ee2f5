/**
 * Every example deck (the demo decks and the starting decks a new deck offers), saved in a
 * US customary project and in an SI one: the calculation package (PDF text by poppler's
 * pdftotext), the factor table and the girder envelopes (CSV) print no quantity in the other
 * unit system and no number with an exponent. Unit symbols: tests/fixtures/unitsInText.ts
 * (NIST SP 811 and the AASHTO LRFD editions' symbols; common practice, no source). An SI
 * package may give, in brackets and labelled "in the formula", the US customary value an
 * empirical formula of the US customary edition works with; those are allowed and counted.
 * In the SI project each deck is also saved with the SI edition's design values (deck field
 * designValues, shared/loads/designValues.ts), whose traces name their own loads and lanes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exampleDecks } from '../fixtures/exampleDecks.js';
import { unitsReport, type UnitSystem } from '../fixtures/unitsInText.js';
import { binary, pdfText } from './pdfText.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;


const projects: Record<UnitSystem, number> = { US: 0, SI: 0 };

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  for (const units of ['US', 'SI'] as const) {
    projects[units] = (await send.post(designer, '/api/projects', { name: `Unit check, ${units}`, units })).body.project.id;
  }
});
afterAll(() => ctx.close());

describe.each(exampleDecks())('$name', ({ deck }) => {
  it.each([
    ['US', 'us-customary'],
    ['SI', 'us-customary'],
    ['SI', 'si-edition'],
  ] as const)('in a %s project with the %s design values, the package and the CSV tables print its units only, and no exponent', async (units, designValues) => {
    const saved = await send.post(designer, `/api/projects/${projects[units]}/decks`, { deck: { ...deck, designValues }, message: 'unit check' });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    const base = `/api/reports/decks/${saved.body.deck.id}/versions/1`;
    const pdf = await designer.get(`${base}/package.pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    const texts = {
      package: pdfText(pdf.body as Buffer),
      'factor table': (await designer.get(`${base}/factors.csv`)).text,
      envelopes: (await designer.get(`${base}/envelopes.csv`)).text,
    };
    // the grillage rows and their findings are in it too (the refined run finished before the package)
    expect(texts.package).toContain('Grillage g');
    for (const [what, text] of Object.entries(texts)) {
      expect(text.length, what).toBeGreaterThan(200);
      const r = unitsReport(text, units);
      expect(r.foreign, `${what}: quantities in the other unit system`).toEqual([]);
      expect(r.exponents, `${what}: numbers with an exponent`).toEqual([]);
      if (units === 'US') expect(r.formulaValues).toBe(0);
    }
  }, 120_000);
});
