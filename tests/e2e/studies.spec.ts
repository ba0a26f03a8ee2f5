/**
 * Parameter studies in a real browser against the built client and a real server: the demo
 * designer starts a sweep of the skew of every support (0° to 50° by 10°) of the demo deck
 * with the grillage at every point, from the project page; the progress bar counts the
 * points as they are stored; the chart shows a line per method (the grillage's among them);
 * clicking a point opens its deck in the workspace as an unsaved draft with that skew.
 * Screenshots at 1280 px: tests/e2e/screenshots/studies-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS, signIn, startHarness, type Harness } from './harness';

describe('studies', () => {
  let h: Harness;

  beforeAll(async () => {
    h = await startHarness({ viewport: { width: 1280, height: 1000 } });
    await signIn(h.page, h.baseUrl, DEMO_USERS.designer);
  });
  afterAll(async () => {
    await h?.stop();
  });

  it('creates a sweep, shows its progress and chart, and opens a point as a draft deck', async () => {
    const { page } = h;
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().click();
    await page.locator('[data-test="new-study"]').click();
    await page.locator('[data-test="study-name"]').fill('Skew from 0 to 50 degrees');
    await page.locator('[data-test="study-deck"]').click();
    await page.locator('.ant-select-item-option', { hasText: 'Main span — six bulb-tees' }).first().click();
    await page.locator('[data-test="axis-0-from"] input, input[data-test="axis-0-from"]').first().fill('0');
    await page.locator('[data-test="axis-0-to"] input, input[data-test="axis-0-to"]').first().fill('50');
    await page.locator('[data-test="axis-0-step"] input, input[data-test="axis-0-step"]').first().fill('10');
    await page.locator('[data-test="study-grillage"]').click();
    await page.locator('.ant-select-item-option', { hasText: 'at every point' }).click();
    await h.screenshot('studies-form');
    await page.locator('[data-test="start-study"]').click();

    const progress = page.locator('[data-test="study-progress"]');
    await progress.waitFor({ timeout: 30_000 });
    expect(await progress.getAttribute('data-total')).toBe('6');
    const seen = new Set<number>();
    for (let i = 0; i < 600; i++) {
      seen.add(Number(await progress.getAttribute('data-done')));
      if ((await page.locator('[data-test="study-state"]').getAttribute('data-state')) === 'done') break;
      await page.waitForTimeout(200);
    }
    expect(await page.locator('[data-test="study-state"]').getAttribute('data-state')).toBe('done');
    // the bar counted points on the way, not only at the end
    expect([...seen].some((n) => n > 0 && n < 6)).toBe(true);
    expect(await page.locator('[data-test="study-count"]').innerText()).toBe('6 / 6 points');

    const chart = page.locator('[data-test="study-chart-interior/moment"]');
    expect((await chart.getAttribute('data-lines'))!.split(',')).toEqual(expect.arrayContaining(['formula', 'grillage', 'governing']));
    // the exterior girder's moment: the lever rule too (AASHTO LRFD Table 4.6.2.2.2d-1, one lane)
    const exterior = page.locator('[data-test="study-chart-exterior/moment"]');
    expect((await exterior.getAttribute('data-lines'))!.split(',')).toEqual(expect.arrayContaining(['formula', 'lever-rule', 'grillage', 'governing']));
    expect(await chart.locator('canvas').count()).toBeGreaterThan(0);
    await page.locator('[data-test="study-points"] tbody tr.ant-table-row').nth(5).waitFor();
    // project units (US customary): the skew reads in degrees
    expect(await page.locator('[data-test="study-points"] tbody tr.ant-table-row').nth(3).innerText()).toContain('30.0°');
    await h.screenshot('studies-chart');

    await page.locator('[data-test="open-point-3"]').click();
    await page.waitForURL(/\/decks\/new\?study=\d+&point=3/);
    const name = page.locator('[data-test="field-name"]');
    await name.waitFor({ timeout: 30_000 });
    expect(await name.inputValue()).toMatch(/study point 4$/);
    await page.locator('[data-test="panel-spans"] .ant-collapse-header').click();
    const skew = page.locator('[data-test="field-supports.0.skew"] input, input[data-test="field-supports.0.skew"]').first();
    await skew.waitFor();
    expect(Number(await skew.inputValue())).toBe(30);
    await h.screenshot('studies-draft');
    expect(h.pageErrors).toEqual([]);
  }, 240_000);
});
