/**
 * The deck workspace's results fit the screen from 1280 px up (common practice, no source: a
 * checker must see every column and every tab without hunting for them): at 1280 and 1920 px
 * wide, every tab of the results is in view (none folded into the tab bar's "…" menu), and
 * the comparison table, both ways of listing it, ends inside its card with nothing to scroll
 * to (its last column, the grillage ÷ code ratio, in the viewport). On a 390 px phone the
 * header's user menu stays in view and the page never scrolls sideways. The caution shows once
 * per screen and stays in view (the shell's sticky footer).
 *
 * Screenshots go to tests/e2e/screenshots/layout-*.png.
 */
import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_USERS, signIn, startHarness, type Harness } from './harness';

async function openNewDeck(h: Harness): Promise<Page> {
  const page = h.page;
  await signIn(page, h.baseUrl, DEMO_USERS.designer);
  await page.goto(h.url('/projects'));
  await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().click();
  await page.locator('[data-test="new-deck"]').click();
  await page.locator('[data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
  await page.locator('[data-test="results-tabs"] .ant-tabs-tab', { hasText: 'Comparison of methods' }).click();
  await page.locator('.ds-compare-bar', { hasText: 'Refined run:' }).waitFor({ timeout: 120_000 });
  await page.locator('[data-test="solver-progress"]').waitFor({ state: 'detached', timeout: 120_000 });
  return page;
}

/** The comparison's scroll box: how wide its content is, how wide it shows, and where its last header cell ends. */
async function tableFit(page: Page): Promise<{ scrollWidth: number; clientWidth: number; lastRight: number }> {
  return page.evaluate(() => {
    const box = document.querySelector<HTMLElement>('[data-test="comparison"] .ds-compare-scroll');
    if (!box) throw new Error('no comparison table');
    const ths = box.querySelectorAll('thead th');
    const last = ths[ths.length - 1];
    return { scrollWidth: box.scrollWidth, clientWidth: box.clientWidth, lastRight: last.getBoundingClientRect().right };
  });
}

describe.each([1280, 1920])('the workspace at %i px wide', (width) => {
  let h: Harness | undefined;

  afterAll(async () => {
    await h?.stop();
  });

  it('shows every results tab and the whole comparison table', async () => {
    h = await startHarness({ viewport: { width, height: 1000 } });
    const page = await openNewDeck(h);
    const tabs = await page.locator('[data-test="results-tabs"] .ant-tabs-tab').evaluateAll((els) =>
      els.map((e) => ({ text: e.textContent ?? '', right: e.getBoundingClientRect().right, visible: getComputedStyle(e).visibility !== 'hidden' })),
    );
    expect(tabs.map((t) => t.text)).toEqual(['Comparison of methods', 'Influence surface', 'Girder envelopes', 'Lever rule and rigid section', 'Findings and model']);
    for (const t of tabs) {
      expect(t.visible, t.text).toBe(true);
      expect(t.right, t.text).toBeLessThanOrEqual(width);
    }
    // antd folds tabs that do not fit into a "…" menu, hidden when every tab fits
    expect(await page.locator('[data-test="results-tabs"] .ant-tabs-nav-operations:not(.ant-tabs-nav-operations-hidden)').count()).toBe(0);

    // the 3D view's legend sits below the drawing, never over it (it hid G6's label in the plan)
    await page.locator('[data-test="scene-view"] label', { hasText: 'Plan' }).click();
    const canvas = await page.locator('[data-test="scene-canvas"]').boundingBox();
    const legend = await page.locator('[data-test="deck-scene"] .ds-scene-legend').boundingBox();
    expect(legend!.y).toBeGreaterThanOrEqual(canvas!.y + canvas!.height - 0.5);
    await page.locator('[data-test="scene-view"] label', { hasText: '3D' }).click();

    for (const mode of ['Interior and exterior', 'Every girder']) {
      await page.locator('[data-test="comparison-mode"] label', { hasText: mode }).click();
      await page.waitForTimeout(300);
      const fit = await tableFit(page);
      expect(fit.scrollWidth, mode).toBeLessThanOrEqual(fit.clientWidth + 1);
      expect(fit.lastRight, mode).toBeLessThanOrEqual(width);
      await h.screenshot(`layout-${width}-${mode === 'Every girder' ? 'every-girder' : 'kinds'}`);
    }
    // findings are marked by level, with a legend; the template deck is within every range, so
    // its marks are notes and assumptions only (shared/findings/levels.ts)
    expect(await page.locator('[data-test="finding-legend"] [data-level]').evaluateAll((els) => els.map((e) => e.getAttribute('data-level')))).toEqual(['note', 'assumption', 'warning', 'out-of-range']);
    await page.locator('[data-test="comparison-mode"] label', { hasText: 'Interior and exterior' }).click();
    const levels = await page.locator('[data-test="comparison"] [data-test="finding-mark"]').evaluateAll((els) => [...new Set(els.map((e) => e.getAttribute('data-level')))]);
    expect(levels.length).toBeGreaterThan(0);
    expect(levels.every((l) => l === 'note' || l === 'assumption')).toBe(true);

    // the caution: once on the screen, and in view wherever the page is scrolled to
    expect(await page.getByText('licensed engineer').count()).toBe(1);
    for (const y of [0, 2000]) {
      await page.evaluate((top) => window.scrollTo(0, top), y);
      const box = await page.locator('[data-test="caution-footer"]').boundingBox();
      expect(box, `scrolled to ${y}`).not.toBeNull();
      expect(box!.y + box!.height, `scrolled to ${y}`).toBeLessThanOrEqual(1000 + 0.5);
      expect(box!.y, `scrolled to ${y}`).toBeGreaterThanOrEqual(0);
    }
  }, 240_000);
});

describe('a phone, 390 px wide', () => {
  let h: Harness | undefined;

  afterAll(async () => {
    await h?.stop();
  });

  it('keeps the header’s user menu in view, and the page does not scroll sideways (the projects table scrolls in its box)', async () => {
    h = await startHarness({ viewport: { width: 390, height: 800 } });
    const page = h.page;
    await signIn(page, h.baseUrl, DEMO_USERS.designer);
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().waitFor();
    const menu = await page.locator('[data-test="user-menu"]').boundingBox();
    expect(menu).not.toBeNull();
    expect(menu!.x + menu!.width).toBeLessThanOrEqual(390);
    expect(await page.locator('[data-test="user-menu"]').getAttribute('aria-label')).toBe('Account menu for Dana Okonkwo');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.locator('[data-test="user-menu"]').click();
    await page.getByText('Sign out').waitFor();
    await h.screenshot('layout-390-projects');
  }, 120_000);
});
