/**
 * Every example deck in a real browser, read in US customary and in SI units: the workspace
 * (every results tab, and the trace behind every cell of the comparison) and the review page
 * print no quantity in the other unit system and no number with an exponent. The unit
 * symbols and the one allowance (an SI text may name, in brackets and labelled "in the
 * formula", the US customary value an empirical formula of the US customary edition works
 * with) are in tests/fixtures/unitsInText.ts; the package and the CSV tables are checked in
 * tests/server/unitsInExports.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_USERS, signIn, signOut, startHarness, type Harness } from './harness';
import { api } from './pageApi';
import { exampleDecks } from '../fixtures/exampleDecks';
import { unitsReport, type UnitSystem } from '../fixtures/unitsInText';

let h: Harness;
let page: Page;

/** What the page shows: the visible text and the text of its SVG drawings (charts, sketches). */
function shownText(p: Page): Promise<string> {
  return p.evaluate(() => {
    const app = document.querySelector<HTMLElement>('#app')!;
    const svg = [...document.querySelectorAll('svg text, svg title')].map((t) => t.textContent ?? '').join(' ');
    const titles = [...document.querySelectorAll<HTMLElement>('[title]')].map((e) => e.getAttribute('title')).join(' ');
    return `${app.innerText}\n${svg}\n${titles}`;
  });
}

function expectOwnUnits(text: string, units: UnitSystem, where: string): void {
  const r = unitsReport(text, units);
  expect(r.foreign, `${where}: quantities in the other unit system`).toEqual([]);
  expect(r.exponents, `${where}: numbers with an exponent`).toEqual([]);
}

/** Every tab of the results, and every comparison cell's trace, read in `units`. */
async function readWorkspace(units: UnitSystem, where: string): Promise<void> {
  await page.locator('[data-test="units-switch"] label', { hasText: units === 'US' ? 'US customary' : 'SI' }).click();
  const tabs = page.locator('[data-test="results-tabs"] .ant-tabs-tab');
  const count = await tabs.count();
  expect(count).toBeGreaterThanOrEqual(5);
  for (let t = 0; t < count; t++) {
    await tabs.nth(t).click();
    await page.waitForTimeout(300);
    expectOwnUnits(await shownText(page), units, `${where}, ${units}, tab “${await tabs.nth(t).innerText()}”`);
  }
  await tabs.first().click();
  const cells = page.locator('[data-test="comparison"] button.ds-cell');
  const n = await cells.count();
  expect(n).toBeGreaterThan(10);
  for (let i = 0; i < n; i++) {
    await cells.nth(i).click();
    const trace = page.locator('[data-test="comparison"] .ds-trace-row');
    await trace.waitFor();
    expectOwnUnits(await trace.innerText(), units, `${where}, ${units}, trace of cell ${i + 1}`);
    await cells.nth(i).click();
  }
}

beforeAll(async () => {
  h = await startHarness({ viewport: { width: 1600, height: 1000 } });
  page = h.page;
});
afterAll(async () => {
  await h?.stop();
});

describe('every example deck prints its own units only', () => {
  const decks = exampleDecks();
  const made: { name: string; deckId: number; reviewId: number; units: UnitSystem }[] = [];

  it('the designer saves each example deck in a US customary and an SI project and submits it for review', async () => {
    await signIn(page, h.baseUrl, DEMO_USERS.designer);
    const reviewers = await api<{ reviewers: { id: number; email: string }[] }>(page, 'GET', '/api/reviews/reviewers');
    const reviewerId = reviewers.body.reviewers.find((r) => r.email === DEMO_USERS.reviewer)!.id;
    for (const units of ['US', 'SI'] as const) {
      const project = await api<{ project: { id: number } }>(page, 'POST', '/api/projects', { name: `Units, ${units}`, units });
      for (const { name, deck } of decks) {
        const saved = await api<{ deck: { id: number }; version: { id: number } }>(page, 'POST', `/api/projects/${project.body.project.id}/decks`, { deck, message: 'unit check' });
        expect(saved.status).toBe(201);
        const review = await api<{ review: { id: number } }>(page, 'POST', '/api/reviews', { versionId: saved.body.version.id, reviewerId });
        expect(review.status).toBe(201);
        made.push({ name, deckId: saved.body.deck.id, reviewId: review.body.review.id, units });
      }
    }
  });

  it('the workspace of each, in its project’s units and switched to the other, every tab and every trace', async () => {
    for (const m of made.filter((x) => x.units === 'US')) {
      await page.goto(h.url(`/decks/${m.deckId}`));
      await page.locator('[data-test="comparison"] button.ds-cell').first().waitFor({ timeout: 90_000 });
      // the grillage column is filled once the refined run of every girder is in
      await page.locator('[data-test="solver-progress"]').waitFor({ state: 'detached', timeout: 180_000 });
      await readWorkspace('US', m.name);
      await readWorkspace('SI', m.name);
    }
  }, 900_000);

  it('the review page of each, in its project’s units', async () => {
    await signOut(page);
    await signIn(page, h.baseUrl, DEMO_USERS.reviewer);
    for (const m of made) {
      await page.goto(h.url(`/reviews/${m.reviewId}`));
      await page.locator('[data-test="review-title"]').waitFor();
      await page.locator('[data-test="refined-summary"]').waitFor({ timeout: 120_000 });
      expectOwnUnits(await shownText(page), m.units, `${m.name}, review, ${m.units}`);
    }
    expect(h.pageErrors).toEqual([]);
  }, 600_000);
});
