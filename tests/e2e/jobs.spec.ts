/**
 * The server's refined (grillage) jobs in a real browser: the review page shows the job's
 * progress while a worker runs it, the user who asked cancels it and is told so, a second
 * version's job runs to the end and its summary replaces the progress card; a report download
 * whose refined results are not ready follows the job too (and is cancelled), and a ready one
 * downloads as a file. Screenshots go to tests/e2e/screenshots/.
 */
import { readFile } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_USERS, signIn, startHarness, type Harness } from './harness';
import { quarryCreekUs } from '../fixtures/decks';
import { api } from './pageApi';
import { deckFromDisplay } from '../../shared/deck/units';

/** Quarry Creek with `count` girders at 8 ft over `spans` continuous 110 ft spans at 30° skew. */
function widened(count: number, spans: number, name: string) {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.name = name;
  us.girders = { kind: 'uniform', count, spacing: 8 };
  us.spans = Array.from({ length: spans }, () => ({ length: 110 }));
  us.continuous = spans > 1;
  us.supports = Array.from({ length: spans + 1 }, () => ({ skew: 30 }));
  return deckFromDisplay(us as never, 'US');
}

describe('refined jobs in the browser', () => {
  let h: Harness;
  let page: Page;
  /** Review rounds of a slow (twenty-girder, two-span) and an ordinary (twelve-girder) version. */
  const rounds: { slow: number; ordinary: number } = { slow: 0, ordinary: 0 };

  beforeAll(async () => {
    // one analysis thread, so the jobs run one at a time
    h = await startHarness({ env: { REFINED_THREADS: '1' } });
    page = h.page;
    await signIn(page, h.baseUrl, DEMO_USERS.designer);
    const projects = await api<{ projects: { id: number; name: string }[] }>(page, 'GET', '/api/projects');
    const project = projects.body.projects.find((p) => p.name === 'Quarry Creek Overpass')!;
    const reviewers = await api<{ reviewers: { id: number; email: string }[] }>(page, 'GET', '/api/reviews/reviewers');
    const reviewerId = reviewers.body.reviewers.find((r) => r.email === DEMO_USERS.reviewer)!.id;
    for (const [key, deck] of [['slow', widened(20, 2, 'Quarry Creek widened (twenty girders)')], ['ordinary', widened(12, 1, 'Quarry Creek widened (twelve girders)')]] as const) {
      const created = await api<{ version: { id: number } }>(page, 'POST', `/api/projects/${project.id}/decks`, { deck, message: 'for the refined job' });
      expect(created.status).toBe(201);
      const round = await api<{ review: { id: number } }>(page, 'POST', '/api/reviews', { versionId: created.body.version.id, reviewerId });
      expect(round.status).toBe(201);
      rounds[key] = round.body.review.id;
    }
  });

  afterAll(async () => {
    await h?.stop();
  });

  it('shows the running job with its progress, and the requester cancels it', async () => {
    await page.goto(h.url(`/reviews/${rounds.slow}`));
    const card = page.locator('[data-test="refined-job"]');
    await card.waitFor();
    await page.locator('[data-test="refined-job"][data-state="running"]').waitFor({ timeout: 60_000 });
    await expect.poll(async () => page.locator('[data-test="refined-job-line"]').innerText(), { timeout: 30_000 }).toMatch(/Running on the server for \d+ s: (building the grillage|finding the governing truck positions, \d+ of \d+ factors done)/);
    // the rest of the round is there meanwhile
    await page.locator('[data-test="review-title"]').waitFor();
    await h.screenshot('jobs-01-running', page);
    await page.locator('[data-test="refined-job-cancel"]').click();
    await page.locator('[data-test="refined-job"][data-state="cancelled"]').waitFor();
    expect(await card.innerText()).toContain('cancelled by Dana Okonkwo while it ran');
    await h.screenshot('jobs-02-cancelled', page);
  });

  it('a download that needs the refined results follows their job, and says so when it is cancelled', async () => {
    // the cancelled run stored nothing: the factor table needs a new job
    await page.locator('[data-test="download-factors"]').click();
    const waiting = page.locator('[data-test="report-waiting"]');
    await waiting.waitFor();
    await expect.poll(async () => waiting.getAttribute('data-state'), { timeout: 60_000 }).toBe('running');
    expect(await waiting.innerText()).toContain('Preparing the factor table (CSV)');
    await h.screenshot('jobs-03-download-waiting', page);
    await page.locator('[data-test="report-cancel"]').click();
    const problem = page.locator('[data-test="report-problem"]');
    await problem.waitFor({ timeout: 30_000 });
    expect(await problem.innerText()).toContain('The factor table (CSV) was not made');
    expect(await problem.innerText()).toContain('cancelled by Dana Okonkwo');
  });

  it('a job that runs to the end is replaced by the summary, and the package downloads as a file', async () => {
    await page.goto(h.url(`/reviews/${rounds.ordinary}`));
    await page.locator('[data-test="review-title"]').waitFor();
    const summary = page.locator('[data-test="refined-summary"]');
    await summary.waitFor({ timeout: 120_000 });
    expect(await page.locator('[data-test="refined-job"]').count()).toBe(0);
    // the caution, once on the screen and in view beside the factors (the shell's footer)
    const caution = page.locator('[data-test="caution-footer"]');
    expect(await caution.innerText()).toContain('licensed engineer');
    expect(await caution.isVisible()).toBe(true);
    expect(await page.getByText('licensed engineer').count()).toBe(1);
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.locator('[data-test="download-pdf"]').click()]);
    expect(download.suggestedFilename()).toMatch(/-v1-calculation-package\.pdf$/);
    expect((await readFile(await download.path())).subarray(0, 5).toString()).toBe('%PDF-');
    await h.screenshot('jobs-04-summary', page);
  });
});
