/**
 * The comparison of two versions in a real browser: the demo designer opens a demo deck, saves
 * it again without a change, opens the history and compares version 1 with version 2. Neither
 * version's grillage is stored yet, so the server computes both while the drawer shows where
 * the runs are; when they are done every row — code and grillage — has a value on both sides
 * and says "no change", and the governing grillage shear of each girder is the review summary's.
 * Screenshots go to tests/e2e/screenshots/version-diff-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { DEMO_USERS, SCREENSHOT_DIR, signIn, startHarness, type Harness } from './harness';
import { api } from './pageApi';

describe('comparing two saved versions', () => {
  let h: Harness;
  let page: Page;
  let deckId = 0;

  beforeAll(async () => {
    h = await startHarness({ viewport: { width: 1440, height: 1000 } });
    page = h.page;
    await signIn(page, h.baseUrl, DEMO_USERS.designer);
    const projects = await api<{ projects: { id: number; name: string }[] }>(page, 'GET', '/api/projects');
    const project = projects.body.projects.find((p) => p.name === 'Quarry Creek Overpass')!;
    const decks = await api<{ decks: { id: number }[] }>(page, 'GET', `/api/projects/${project.id}/decks`);
    deckId = decks.body.decks[0].id;
  });

  afterAll(async () => {
    await h?.stop();
  });

  it('saves the demo deck again without a change', async () => {
    await page.goto(h.url(`/decks/${deckId}`));
    await page.locator('[data-test="version-tag"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-test="save-deck"]:not([disabled])').click();
    await page.getByLabel('What changed', { exact: true }).fill('Saved again, nothing changed');
    await page.locator('.ant-modal .ant-btn-primary', { hasText: 'Save' }).click();
    await page.locator('.ant-message', { hasText: 'Saved version 2' }).waitFor({ timeout: 30_000 });
  });

  it('compares version 1 with version 2: the grillage rows fill in, and every row says "no change"', async () => {
    await page.locator('[data-test="open-history"]').click();
    await page.locator('[data-test="versions-table"] tbody tr').nth(1).waitFor();
    await page.locator('[data-test="compare"]').click();
    await page.locator('[data-test="factor-diff"]').waitFor({ timeout: 30_000 });
    // While a grillage is computed its rows say so, never a bare dash.
    const progress = page.locator('[data-test="grillage-progress"]');
    if (await progress.count()) {
      expect(await progress.first().innerText()).toMatch(/^Grillage of v[12]: (Waiting for a free analysis worker|Running on the server)/);
      await h.screenshot('version-diff-01-computing');
    }
    await expect
      .poll(async () => page.locator('[data-test="factor-diff-row"][data-state="not-compared"]').count(), { timeout: 90_000 })
      .toBe(0);
    expect(await progress.count()).toBe(0);

    const rows = page.locator('[data-test="factor-diff-row"]');
    const grillage = page.locator('[data-test="factor-diff-row"][data-section="grillage"]');
    expect(await grillage.count()).toBeGreaterThan(12);
    const changes = await page.locator('[data-test="diff-change"]').allInnerTexts();
    expect(changes.length).toBe(await rows.count());
    expect(new Set(changes)).toEqual(new Set(['no change']));
    const values = await page.locator('[data-test="factor-diff-row"][data-section="grillage"] [data-test="diff-before"]').allInnerTexts();
    for (const v of values) expect(v).toMatch(/^\d\.\d{4}$/);
    expect(await page.locator('[data-test="factor-summary"]').innerText()).toMatch(/^No factor changed: all \d+ rows have the same value in both versions\./);
    expect(await page.locator('[data-test="input-diff"]').count()).toBe(0);
    await h.screenshot('version-diff-02-no-change');
    await page.locator('[data-test="factor-diff-row"][data-section="grillage"]').first().scrollIntoViewIfNeeded();
    await page.locator('.ant-drawer-content').screenshot({ path: join(SCREENSHOT_DIR, 'version-diff-03-grillage-rows.png'), animations: 'disabled' });
  });

  it('gives each girder the governing grillage shear the review summary gives', async () => {
    const texts = await page.locator('[data-test="factor-diff-row"][data-section="governing"]').evaluateAll((trs) =>
      trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? '')),
    );
    const shear = texts.filter((c) => c[1] === 'shear' && c[4] === 'grillage, governing value');
    expect(shear.length).toBe(6);
    const versions = await api<{ versions: { id: number; number: number }[] }>(page, 'GET', `/api/decks/${deckId}/versions`);
    const v2 = versions.body.versions.find((v) => v.number === 2)!;
    const reviewers = await api<{ reviewers: { id: number; email: string }[] }>(page, 'GET', '/api/reviews/reviewers');
    const round = await api<{ review: { id: number } }>(page, 'POST', '/api/reviews', { versionId: v2.id, reviewerId: reviewers.body.reviewers.find((r) => r.email === DEMO_USERS.reviewer)!.id });
    expect(round.status).toBe(201);
    const review = await api<{ summary: { refined: { ratios: { girder: number; effect: string; refined: number }[] } } }>(page, 'GET', `/api/reviews/${round.body.review.id}`);
    for (const r of review.body.summary.refined.ratios.filter((x) => x.effect === 'shear')) {
      const row = shear.find((c) => c[0].startsWith(`G${r.girder} `));
      expect(row?.[2]).toBe('span 1, both ends');
      expect(row?.[6].slice(0, 6)).toBe(r.refined.toFixed(4));
    }
    expect(h.pageErrors.filter((e) => !e.includes('401'))).toEqual([]);
  });
});
