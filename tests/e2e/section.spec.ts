/**
 * The deck view's cross-section sheet and the framing of the 3D view, in a real browser
 * (headless Chromium) against the built client and a real server on a fresh database. The
 * demo designer opens the demo deck of Quarry Creek Overpass (six girders at 9 ft 8 in):
 * the 3D view fills its canvas on open and again after a zoom with Fit; the cross-section is
 * a to-scale SVG whose dimensions print in the deck's unit (9.667 ft bays, 2.946 m in SI),
 * whose texts do not overlap as the browser lays them out, at 1280 and 1920 px; dragging a
 * lane and its wheels in the section moves them as the 3D view does (the lane list's edge
 * and wheel offsets change). Drafting legibility (texts at least 10 px, none over another)
 * is common practice, no source.
 *
 * Screenshots go to tests/e2e/screenshots/section-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { join } from 'node:path';
import { DEMO_USERS, SCREENSHOT_DIR, signIn, startHarness, type Harness } from './harness';

/** The scene's clear colour (src/components/scene/sceneColours.ts), RGB. */
const BACKGROUND = [0xee, 0xf1, 0xec];

/** Share of the canvas's width and height that the drawn deck spans (its non-background pixels' box). */
async function drawnExtent(page: Page): Promise<{ width: number; height: number }> {
  return page.evaluate((bg) => {
    const canvas = document.querySelector<HTMLCanvasElement>('[data-test="scene-canvas"] canvas');
    if (!canvas) throw new Error('no scene canvas');
    const w = canvas.width;
    const h = canvas.height;
    const off = document.createElement('canvas');
    off.width = w;
    off.height = h;
    const ctx = off.getContext('2d');
    if (!ctx) throw new Error('no 2D context');
    ctx.drawImage(canvas, 0, 0);
    const data = ctx.getImageData(0, 0, w, h).data;
    let x0 = w;
    let x1 = 0;
    let y0 = h;
    let y1 = 0;
    for (let y = 0; y < h; y += 2) {
      for (let x = 0; x < w; x += 2) {
        const k = (y * w + x) * 4;
        if (Math.abs(data[k] - bg[0]) + Math.abs(data[k + 1] - bg[1]) + Math.abs(data[k + 2] - bg[2]) > 24) {
          x0 = Math.min(x0, x);
          x1 = Math.max(x1, x);
          y0 = Math.min(y0, y);
          y1 = Math.max(y1, y);
        }
      }
    }
    return { width: Math.max(0, x1 - x0) / w, height: Math.max(0, y1 - y0) / h };
  }, BACKGROUND);
}

/** The section's dimension texts as the browser lays them out. */
async function sectionTexts(page: Page): Promise<{ row: string; text: string; left: number; right: number; top: number; bottom: number }[]> {
  return page.locator('[data-test="section-sheet"] text[data-test^="dim-"]').evaluateAll((els) =>
    els.map((e) => {
      const r = e.getBoundingClientRect();
      return { row: e.getAttribute('data-test') ?? '', text: e.textContent ?? '', left: r.left, right: r.right, top: r.top, bottom: r.bottom };
    }),
  );
}

function overlapping(texts: { text: string; left: number; right: number; top: number; bottom: number }[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < texts.length; i++) {
    for (let j = i + 1; j < texts.length; j++) {
      const a = texts[i];
      const b = texts[j];
      // the glyphs, not the line box: a text box holds ~2 px of ascent and descent room above and below
      const apart = a.right <= b.left + 0.5 || b.right <= a.left + 0.5 || a.bottom - 2 <= b.top + 2 || b.bottom - 2 <= a.top + 2;
      if (!apart) out.push(`${a.text} over ${b.text}`);
    }
  }
  return out;
}

/** The page, and the deck view alone at its full resolution (the page's shot is read shrunk). */
async function shoot(h: Harness, name: string): Promise<void> {
  await h.screenshot(name);
  await h.page.locator('[data-test="deck-scene"]').screenshot({ path: join(SCREENSHOT_DIR, `${name}-view.png`), animations: 'disabled' });
}

async function chooseView(page: Page, label: string): Promise<void> {
  await page.locator('[data-test="scene-view"] label', { hasText: label }).click();
  await page.waitForTimeout(600);
}

async function laneItem(page: Page): Promise<string> {
  return page.locator('[data-test="lane-item-1"]').innerText();
}

/** Drags from the centre of `selector` by dx px, in small steps as a hand does. */
async function dragBy(page: Page, selector: string, dx: number): Promise<void> {
  const box = await page.locator(selector).boundingBox();
  if (!box) throw new Error(`nothing at ${selector}`);
  const x = box.x + box.width / 2;
  const y = box.y + box.height / 2;
  await page.mouse.move(x, y);
  await page.mouse.down();
  for (let i = 1; i <= 10; i++) {
    await page.mouse.move(x + (dx * i) / 10, y);
    await page.waitForTimeout(30);
  }
  await page.mouse.up();
}

describe('the cross-section sheet and the 3D framing', () => {
  let h: Harness;

  beforeAll(async () => {
    h = await startHarness({ viewport: { width: 1280, height: 1000 } });
    await signIn(h.page, h.baseUrl, DEMO_USERS.designer);
  });

  afterAll(async () => {
    await h?.stop();
  });

  it('opens the demo deck with the 3D deck filling its view, and Fit frames it again after a zoom', async () => {
    const { page } = h;
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().click();
    await page.locator('[data-test="decks-table"] a', { hasText: 'Main span — six bulb-tees' }).first().click();
    await page.locator('[data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-test="share-g1"]').waitFor({ timeout: 60_000 });
    await page.waitForTimeout(800);
    const opened = await drawnExtent(page);
    // framed to ~90 % of the view in its tighter direction
    expect(Math.max(opened.width, opened.height)).toBeGreaterThan(0.8);
    await shoot(h, 'section-01-3d-framed-1280');

    const canvas = await page.locator('[data-test="scene-canvas"] canvas').boundingBox();
    if (!canvas) throw new Error('no canvas');
    await page.mouse.move(canvas.x + canvas.width / 2, canvas.y + canvas.height / 2);
    for (let i = 0; i < 6; i++) {
      await page.mouse.wheel(0, 400);
      await page.waitForTimeout(60);
    }
    await page.waitForTimeout(300);
    const zoomedOut = await drawnExtent(page);
    expect(Math.max(zoomedOut.width, zoomedOut.height)).toBeLessThan(Math.max(opened.width, opened.height) - 0.15);
    await page.locator('[data-test="scene-fit"]').click();
    await page.waitForTimeout(500);
    const fitted = await drawnExtent(page);
    expect(Math.max(fitted.width, fitted.height)).toBeCloseTo(Math.max(opened.width, opened.height), 1);

    await chooseView(page, 'Plan');
    const plan = await drawnExtent(page);
    expect(Math.max(plan.width, plan.height)).toBeGreaterThan(0.8);
    await shoot(h, 'section-02-plan-framed-1280');
  });

  it('draws the cross-section to scale with dimensions in ft, and the texts do not overlap', async () => {
    const { page } = h;
    await chooseView(page, 'Cross-section');
    await page.locator('[data-test="section-sheet"]').waitFor();
    expect(await page.locator('[data-test="scene-canvas"]').isVisible()).toBe(false);
    const bays = await page.locator('[data-test="section-sheet"] text[data-test="dim-girders"]').allTextContents();
    expect(bays).toEqual(['3.500 ft', '9.667 ft', '9.667 ft', '9.667 ft', '9.667 ft', '9.667 ft', '3.500 ft']);
    // 5 × 9.6667 ft + 2 × 3.5 ft = 55.3335 ft overall, less 2 × 1.5 ft of barriers for the roadway
    const [barrierL, roadway, barrierR] = await page.locator('[data-test="section-sheet"] text[data-test="dim-barriers"]').allTextContents();
    expect([barrierL, barrierR]).toEqual(['1.500 ft', '1.500 ft']);
    expect(roadway).toMatch(/^52\.33[34] ft$/);
    expect(await page.locator('[data-test="section-sheet"] text[data-test="dim-overall"]').textContent()).toMatch(/^55\.33[34] ft$/);
    expect(await page.locator('[data-test="section-girder-label"]').allTextContents()).toEqual(['G1', 'G2', 'G3', 'G4', 'G5', 'G6']);
    const texts = await sectionTexts(page);
    for (const t of texts) {
      expect(t.text).toMatch(/^\d+\.\d{3} ft$/);
      expect(t.bottom - t.top, t.text).toBeGreaterThanOrEqual(10);
    }
    expect(overlapping(texts)).toEqual([]);
    await shoot(h, 'section-03-sheet-1280');
  });

  it('moves lane 1 and its wheels when they are dragged in the section', async () => {
    const { page } = h;
    const before = await laneItem(page);
    const wheelsBefore = await page.locator('[data-test="section-sheet"] text[data-test="dim-wheels"]').allTextContents();
    await dragBy(page, '[data-test="section-lane-1"]', 140);
    await expect.poll(() => laneItem(page), { timeout: 10_000 }).not.toBe(before);
    const moved = await laneItem(page);
    // the lane's left edge from the left curb is no longer what it was; the wheels kept their offset
    expect(moved.match(/edge ([\d.]+) ft/)?.[1]).not.toBe(before.match(/edge ([\d.]+) ft/)?.[1]);
    expect(moved.match(/wheels ([\d.]+) ft/)?.[1]).toBe(before.match(/wheels ([\d.]+) ft/)?.[1]);
    await dragBy(page, '[data-test="section-wheels-1"]', 40);
    await expect.poll(() => laneItem(page).then((t) => t.match(/wheels ([\d.]+) ft/)?.[1]), { timeout: 10_000 }).not.toBe(moved.match(/wheels ([\d.]+) ft/)?.[1]);
    expect(await page.locator('[data-test="section-sheet"] text[data-test="dim-wheels"]').allTextContents()).not.toEqual(wheelsBefore);
    // choosing a girder in the section studies it
    await page.locator('[data-test="section-girder-3"] polygon').click();
    await expect.poll(() => page.locator('[data-test="section-girder-3"]').getAttribute('data-studied')).toBe('true');
    expect(overlapping(await sectionTexts(page))).toEqual([]);
    await shoot(h, 'section-04-lane-dragged-1280');
    expect(h.pageErrors.filter((e) => !e.includes('401'))).toEqual([]);
  });

  it('lays the sheet out again at 1920 px and in SI prints metres only', async () => {
    const { page } = h;
    await page.setViewportSize({ width: 1920, height: 1000 });
    await page.waitForTimeout(800);
    const wide = await sectionTexts(page);
    for (const t of wide) expect(t.bottom - t.top, t.text).toBeGreaterThanOrEqual(10);
    expect(overlapping(wide)).toEqual([]);
    const sheet = await page.locator('[data-test="section-sheet"]').boundingBox();
    const host = await page.locator('[data-test="section-sheet-host"]').boundingBox();
    expect(sheet!.width).toBeCloseTo(host!.width, 0);
    await shoot(h, 'section-05-sheet-1920');

    await page.locator('[data-test="units-switch"] label', { hasText: 'SI' }).click();
    await expect.poll(() => page.locator('[data-test="section-sheet"] text[data-test="dim-girders"]').allTextContents()).toEqual([
      '1.067 m',
      '2.946 m',
      '2.946 m',
      '2.946 m',
      '2.946 m',
      '2.946 m',
      '1.067 m',
    ]);
    const si = await sectionTexts(page);
    for (const t of si) {
      expect(t.text).toMatch(/^\d+\.\d{3} m$/);
      expect(t.text).not.toContain('ft');
    }
    expect(overlapping(si)).toEqual([]);
    await shoot(h, 'section-06-sheet-si-1920');

    // back in 3D, the canvas is framed for its new width
    await chooseView(page, '3D');
    await page.waitForTimeout(500);
    const framed = await drawnExtent(page);
    expect(Math.max(framed.width, framed.height)).toBeGreaterThan(0.8);
    await shoot(h, 'section-07-3d-framed-1920');
    expect(h.pageErrors.filter((e) => !e.includes('401'))).toEqual([]);
  });

  it('draws the SI demo deck with three loaded lanes in metres, texts apart, at 1280 px', async () => {
    const { page } = h;
    await page.setViewportSize({ width: 1280, height: 1000 });
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Ashgrove Street Viaduct' }).first().click();
    await page.locator('[data-test="decks-table"] a', { hasText: 'Three-span steel girders' }).first().click();
    await page.locator('[data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-test="share-g1"]').waitFor({ timeout: 60_000 });
    await chooseView(page, 'Cross-section');
    await page.locator('[data-test="loaded-lanes-3"]').click();
    await expect.poll(() => page.locator('[data-test^="section-lane-"]').count(), { timeout: 10_000 }).toBe(3);
    // five steel girders at 3.0 m with 1.0 m overhangs (server/db/demoDecks.ts)
    expect(await page.locator('[data-test="section-sheet"] text[data-test="dim-girders"]').allTextContents()).toEqual(['1.000 m', '3.000 m', '3.000 m', '3.000 m', '3.000 m', '1.000 m']);
    const texts = await sectionTexts(page);
    for (const t of texts) {
      expect(t.text).toMatch(/^\d+\.\d{3} m$/);
      expect(t.bottom - t.top, t.text).toBeGreaterThanOrEqual(10);
    }
    expect(overlapping(texts)).toEqual([]);
    await shoot(h, 'section-08-si-three-lanes-1280');
    expect(h.pageErrors.filter((e) => !e.includes('401'))).toEqual([]);
  });

  it('draws the twelve-girder starting deck with seven loaded lanes, texts apart, at 1280 px', async () => {
    const { page } = h;
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().click();
    await page.locator('[data-test="new-deck"]').click();
    await page.locator('[data-test="template-steel-wide-twelve"]').click();
    await page.locator('[data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
    await expect.poll(async () => page.locator('[data-test^="share-bar-g"]').count(), { timeout: 60_000 }).toBe(12);
    await chooseView(page, 'Cross-section');
    await page.locator('[data-test="loaded-lanes-7"]').click();
    await expect.poll(() => page.locator('[data-test^="section-lane-"]').count(), { timeout: 10_000 }).toBe(7);
    const texts = await sectionTexts(page);
    for (const t of texts) expect(t.bottom - t.top, t.text).toBeGreaterThanOrEqual(10);
    expect(overlapping(texts)).toEqual([]);
    // the sheet still fits its container: nothing to scroll sideways
    const sheet = await page.locator('[data-test="section-sheet"]').boundingBox();
    const host = await page.locator('[data-test="section-sheet-host"]').boundingBox();
    expect(sheet!.width).toBeLessThanOrEqual(host!.width + 0.5);
    await shoot(h, 'section-09-twelve-girders-seven-lanes-1280');
  });
});
