/**
 * Design values in the browser: a new deck of an SI project starts with the SI edition's
 * values (AASHTO LRFD (SI) Art. 3.6.1.1.1: 3.6 m design lanes, from memory of the 4th edition
 * 2007 SI), and switching it to the converted US customary values shows 12 ft = 3.658 m lanes
 * (AASHTO LRFD Art. 3.6.1.1.1; 1 ft = 0.3048 m, NIST SP 811).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS, signIn, startHarness, type Harness } from './harness';

describe('design values of a deck in the browser', () => {
  let h: Harness;

  beforeAll(async () => {
    h = await startHarness({ viewport: { width: 1500, height: 1000 } });
    await signIn(h.page, h.baseUrl, DEMO_USERS.designer);
  });

  afterAll(async () => {
    await h?.stop();
  });

  it('a new deck of an SI project uses the SI edition values; the editor switches them', async () => {
    const { page } = h;
    await page.goto(h.url('/projects'));
    await page.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Ashgrove Street Viaduct' }).first().click();
    await page.locator('[data-test="new-deck"]').click();
    await page.waitForURL(/\/projects\/\d+\/decks\/new$/);
    await page.locator('[data-test="deck-editor"]').waitFor();
    await page.locator('[data-test="panel-policy"] .ant-collapse-header').click();
    const si = page.locator('[data-test="design-values-si"] input');
    await si.waitFor({ state: 'attached' });
    expect(await si.isChecked()).toBe(true);
    await expect.poll(() => page.locator('[data-test="design-values-summary"]').innerText()).toContain('Design lane 3.600 m');
    await page.locator('[data-test="panel-roadway"] .ant-collapse-header').click();
    await expect.poll(() => page.locator('[data-test="design-lanes"]').innerText()).toMatch(/× 3\.600 m/);
    await page.locator('[data-test="design-values"]').scrollIntoViewIfNeeded();
    await h.screenshot('design-values-si-edition');
    await page.locator('[data-test="design-values-us"]').click();
    await expect.poll(() => page.locator('[data-test="design-lanes"]').innerText()).toMatch(/× 3\.658 m/);
    await expect.poll(() => page.locator('[data-test="design-values-summary"]').innerText()).toContain('35.6 kN');
    expect(h.pageErrors.filter((e) => !e.includes('401'))).toEqual([]);
  });
});
