/**
 * The whole review round trip in a real browser, with two users in two browser contexts: the
 * demo designer submits a deck version to the demo reviewer, the reviewer reads the
 * refined-analysis summary, comments on one value, records the refined-analysis decision and
 * sends the version back; the designer answers, saves a new version and resubmits; the
 * reviewer approves. The e-mail notices are then read in the admins' outbox, and the
 * calculation package downloads as a PDF. Screenshots go to tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH, DEMO_USERS, chooseByLabel, selectByLabel, signIn, signOut, startHarness, type Harness } from './harness';
import { quarryCreekDeck } from '../fixtures/decks';
import { api } from './pageApi';

const DECK_NAME = `Quarry Creek review deck ${Date.now()}`;

/**
 * Chooses a file through the upload button with this text, as a user does: the button opens
 * the browser's file chooser (its file input is hidden inside the button).
 */
async function chooseFile(page: Page, button: string, file: { name: string; mimeType: string; buffer: Buffer }): Promise<void> {
  // (the button's name also reads its icon: "upload Choose a CSV file")
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: button }).last().click()]);
  await chooser.setFiles(file);
}

/** Calls the API from inside the signed-in page (same cookies, CSRF header from the cookie). */
describe('review round trip in the browser', () => {
  let h: Harness;
  let designer: Page;
  let reviewerContext: BrowserContext;
  let reviewer: Page;
  let profile: string;
  let deckId: number;
  let firstReviewUrl: string;

  beforeAll(async () => {
    h = await startHarness({ env: { LOCAL_SMTP_PORT: '0' } });
    designer = h.page;
    profile = await mkdtemp(join(tmpdir(), 'deckshare-e2e-reviewer-'));
    reviewerContext = await chromium.launchPersistentContext(profile, { executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS, viewport: { width: 1366, height: 900 }, locale: 'en-US', timezoneId: 'UTC' });
    reviewer = reviewerContext.pages()[0] ?? (await reviewerContext.newPage());
    reviewer.setDefaultTimeout(15_000);
    reviewer.on('pageerror', (e) => h.pageErrors.push(`reviewer pageerror: ${e.message}`));
  });

  afterAll(async () => {
    await reviewerContext?.close().catch(() => undefined);
    if (profile) await rm(profile, { recursive: true, force: true });
    await h?.stop();
  });

  it('the designer submits version 1 to the reviewer', async () => {
    await signIn(designer, h.baseUrl, DEMO_USERS.designer);
    const projects = await api<{ projects: { id: number; name: string }[] }>(designer, 'GET', '/api/projects');
    const project = projects.body.projects.find((p) => p.name === 'Quarry Creek Overpass')!;
    const created = await api<{ deck: { id: number } }>(designer, 'POST', `/api/projects/${project.id}/decks`, { deck: { ...quarryCreekDeck(), name: DECK_NAME }, message: 'layout from the general arrangement' });
    expect(created.status).toBe(201);
    deckId = created.body.deck.id;

    await designer.goto(h.url('/reviews'));
    await designer.locator('nav[aria-label="Main"] a', { hasText: 'Reviews' }).waitFor();
    await designer.locator('[data-test="new-review"]').click();
    await designer.waitForURL(/\/reviews\/new/);
    // Every field found by its label.
    await chooseByLabel(designer, 'Project', 'Quarry Creek Overpass');
    await chooseByLabel(designer, 'Deck', DECK_NAME);
    await designer.locator('[data-test="submit-version"]').getByText('Version 1').waitFor();
    await chooseByLabel(designer, 'Reviewer', 'Ruth Castellanos');
    await designer.getByLabel('Note to the reviewer (optional)', { exact: true }).fill('Please check the exterior girder factors.');
    await h.screenshot('review-01-submit-form', designer);
    await designer.locator('[data-test="submit-review"]').click();
    await designer.waitForURL(/\/reviews\/\d+$/);
    firstReviewUrl = designer.url();
    await designer.locator('[data-test="state-awaiting-review"]').first().waitFor();
    expect(await designer.locator('[data-test="review-title"]').innerText()).toBe(`${DECK_NAME}, version 1`);
  });

  it('the reviewer reads the summary, comments on one value, decides and sends it back', async () => {
    await signIn(reviewer, h.baseUrl, DEMO_USERS.reviewer);
    await reviewer.goto(h.url('/reviews'));
    const row = reviewer.locator('[data-test="reviews-table"] tbody tr', { hasText: DECK_NAME });
    await row.waitFor();
    await row.locator('a').first().click();
    await reviewer.locator('[data-test="review-title"]', { hasText: `${DECK_NAME}, version 1` }).waitFor();
    expect(reviewer.url()).toBe(firstReviewUrl);
    const summary = reviewer.locator('[data-test="refined-summary"]');
    await summary.waitFor();
    expect(await summary.locator('[data-test="skew-words"]').innerText()).toContain('support 1: 20.0°');
    // the caution, once on the screen and in view beside the factors (the shell's footer)
    const caution = reviewer.locator('[data-test="caution-footer"]');
    expect(await caution.innerText()).toContain('licensed engineer');
    expect(await caution.isVisible()).toBe(true);
    expect(await reviewer.getByText('licensed engineer').count()).toBe(1);
    expect(await summary.locator('[data-test="no-range-findings"]').count()).toBe(1);

    await reviewer.getByLabel('Your comment', { exact: true }).fill('Check the lever-rule wheel position over girder 1.');
    await reviewer.getByLabel('About one value', { exact: true }).check();
    await chooseByLabel(reviewer, 'Girder', 'Girder 1');
    await chooseByLabel(reviewer, 'Effect', 'moment');
    await reviewer.locator('[data-test="send-comment"]').click();
    await reviewer.locator('[data-test="comment-anchor"]', { hasText: 'girder 1, moment' }).waitFor();

    // Recording the decision without a reason is refused, tied to the reason's box.
    const reason = reviewer.getByLabel('Reason for the refined-analysis decision', { exact: true });
    await reviewer.getByLabel('Refined analysis not justified', { exact: true }).check();
    await reviewer.locator('[data-test="record-refined"]').click();
    await reviewer.getByRole('alert').filter({ hasText: 'Give the reason for the refined-analysis decision.' }).waitFor();
    expect(await reason.getAttribute('aria-invalid')).toBe('true');
    const describedBy = await reason.getAttribute('aria-describedby');
    expect(await reviewer.locator(`[id="${describedBy}"]`).getAttribute('role')).toBe('alert');
    await reason.fill('Every formula within its range; skew 20°, below 30°.');
    await reviewer.locator('[data-test="record-refined"]').click();
    await reviewer.locator('[data-test="refined-recorded"]').waitFor();
    await reviewer.getByLabel('Note to the designer (required to send back)', { exact: true }).fill('Answer the comment and reduce the left overhang.');
    await h.screenshot('review-02-reviewer-page', reviewer);
    await reviewer.locator('[data-test="send-back"]').click();
    await reviewer.locator('[data-test="sent-back-banner"]').waitFor();
    await reviewer.locator('[data-test="state-sent-back"]').first().waitFor();
  });

  it('the designer answers, saves version 2 and resubmits', async () => {
    await designer.reload();
    await designer.locator('[data-test="sent-back-banner"]').waitFor();
    const comment = designer.locator('[data-test="comments"] > li').first();
    await comment.locator('button', { hasText: 'Answer' }).click();
    await designer.getByLabel('Your answer', { exact: true }).fill('The outer wheel is 2 ft from the barrier face, over girder 1 (Art. 3.6.1.3.1). Overhang reduced in version 2.');
    await designer.locator('[data-test="send-answer"]').click();
    await designer.getByText('Overhang reduced in version 2.').waitFor();

    const saved = await api<{ version: { number: number } }>(designer, 'POST', `/api/decks/${deckId}/versions`, { deck: { ...quarryCreekDeck(), name: DECK_NAME, overhangLeft: 0.9 }, message: 'left overhang reduced' });
    expect(saved.body.version.number).toBe(2);
    await designer.reload();
    await designer.locator('[data-test="resubmit"]').click();
    await designer.waitForURL(/\/reviews\/new\?/);
    await designer.locator('[data-test="submit-version"]').getByText('Version 2').waitFor();
    await selectByLabel(designer, 'Reviewer').getByText('Ruth Castellanos').waitFor();
    await designer.locator('[data-test="submit-review"]').click();
    await designer.waitForURL((u) => /\/reviews\/\d+$/.test(u.pathname) && u.href !== firstReviewUrl);
    expect(await designer.locator('[data-test="review-title"]').innerText()).toBe(`${DECK_NAME}, version 2`);
  });

  it('the reviewer approves version 2, which is then locked', async () => {
    await reviewer.goto(h.url('/reviews'));
    const row = reviewer.locator('[data-test="reviews-table"] tbody tr', { hasText: `${DECK_NAME}, version 2` });
    await row.waitFor();
    await row.locator('a').first().click();
    await reviewer.locator('[data-test="refined-summary"]').waitFor();
    expect(await reviewer.getByText('Earlier rounds of this deck').count()).toBe(1);
    await reviewer.getByLabel('Refined analysis not justified', { exact: true }).check();
    await reviewer.getByLabel('Reason for the refined-analysis decision', { exact: true }).fill('Within every range; no refined analysis needed.');
    await reviewer.locator('[data-test="record-refined"]').click();
    await reviewer.locator('[data-test="refined-recorded"]').waitFor();
    await reviewer.locator('[data-test="approve"]').click();
    await reviewer.locator('.ant-popover .ant-btn-primary', { hasText: 'Approve' }).click();
    await reviewer.locator('[data-test="approved-banner"]').waitFor();
    expect(await reviewer.locator('[data-test="decision-panel"]').count()).toBe(0);
    expect(await reviewer.locator('[data-test="comment-body"]').count()).toBe(0);
    await h.screenshot('review-03-approved', reviewer);

    const pdf = await reviewerContext.request.get(h.url(`/api/reports/decks/${deckId}/versions/2/package.pdf`));
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('the e-mail notices are in the admins’ outbox', async () => {
    await signOut(designer);
    await signIn(designer, h.baseUrl, DEMO_USERS.admin);
    await designer.goto(h.url('/mail'));
    const table = designer.locator('[data-test="outbox-table"]');
    // The mail service receives each notice a moment after the action: refresh until all four are in.
    await expect
      .poll(
        async () => {
          await designer.locator('[data-test="outbox-refresh"]').click();
          return (await table.locator('tbody tr.ant-table-row').allInnerTexts()).length;
        },
        { timeout: 20_000, interval: 500 },
      )
      .toBeGreaterThanOrEqual(4);
    const joined = (await table.locator('tbody tr.ant-table-row').allInnerTexts()).join('\n');
    expect(joined).toContain(`Review requested: ${DECK_NAME}, version 1`);
    expect(joined).toContain(`Sent back: ${DECK_NAME}, version 1`);
    expect(joined).toContain(`Review requested: ${DECK_NAME}, version 2`);
    expect(joined).toContain(`Approved: ${DECK_NAME}, version 2`);
    expect(joined).toContain(DEMO_USERS.reviewer);
    expect(joined).toContain(DEMO_USERS.designer);
    await table.locator('a', { hasText: `Approved: ${DECK_NAME}, version 2` }).click();
    const body = designer.locator('[data-test="message-body"]');
    await body.waitFor();
    expect(await body.innerText()).toContain('refined analysis not justified');
    expect(await body.locator('a').first().getAttribute('href')).toMatch(new RegExp(`^${h.baseUrl}/reviews/\\d+$`));
    await h.screenshot('review-04-outbox', designer);
  });

  it('an invited user chooses a password from the e-mailed link', async () => {
    const created = await api<{ user: { id: number } }>(designer, 'POST', '/api/admin/users', { email: 'noor.halvorsen@larchmont-ridge.example', name: 'Noor Halvorsen', roles: ['designer'] });
    expect(created.status).toBe(201);
    // Creating the user e-mails the invitation; the admin reads it in the outbox.
    await designer.goto(h.url('/mail'));
    const subject = designer.locator('[data-test="outbox-table"] a', { hasText: 'You are invited to Deckshare' });
    // The mail service receives the invitation a moment after the user is created: refresh until it is in.
    await expect
      .poll(
        async () => {
          await designer.locator('[data-test="outbox-refresh"]').click();
          return subject.count();
        },
        { timeout: 20_000, interval: 500 },
      )
      .toBeGreaterThan(0);
    await subject.first().waitFor();
    await subject.click();
    const link = await designer.locator('[data-test="message-body"] a').first().getAttribute('href');
    expect(link).toMatch(new RegExp(`^${h.baseUrl}/set-password/[A-Za-z0-9_-]{40,}$`));

    // The reviewer's browser stands in for the new user's: the link signs them in.
    await reviewer.goto(link!);
    await reviewer.getByText('Welcome, ').waitFor();
    const password = reviewer.getByLabel('New password (at least 10 characters)', { exact: true });
    const repeat = reviewer.getByLabel('The same password again', { exact: true });
    await password.fill('short');
    await repeat.fill('short');
    await reviewer.locator('[data-test="set-password"]').click();
    await reviewer.getByText('The password must have at least 10 characters.').waitFor();
    expect(await password.getAttribute('aria-invalid')).toBe('true');
    await password.fill('noor-chose-this-1');
    await repeat.fill('noor-chose-this-1');
    await h.screenshot('review-05-set-password', reviewer);
    await reviewer.locator('[data-test="set-password"]').click();
    await reviewer.waitForURL(/\/projects$/);
    await reviewer.locator('[data-test="user-menu"]', { hasText: 'Noor Halvorsen' }).waitFor();
    // The link works once.
    await reviewer.goto(link!);
    await reviewer.locator('[data-test="invitation-invalid"]').waitFor();

  });

  it('the project page leads to drawings and imports; the import lists row-by-row errors of a bad girder CSV and imports a good one', async () => {
    // The designer's browser is signed in as the admin now, who may save decks too.
    await designer.goto(h.url('/projects'));
    await designer.locator('[data-test="projects-table"] tbody tr a', { hasText: 'Quarry Creek Overpass' }).first().click();
    // The project page lists the drawings itself and links to the imports.
    await designer.locator('[data-test="drawings"]').waitFor();
    // A 1 × 1 PNG (the smallest valid one: signature, IHDR, IDAT, IEND).
    const png = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000' + '1f15c4890000000d49444154789c6360000002000100e221bc330000000049454e44ae426082', 'hex');
    await designer.getByLabel('Title of the drawing (optional)', { exact: true }).fill('General arrangement, sheet 2');
    await chooseFile(designer, 'Attach PDF, PNG or JPEG', { name: 'ga-sheet-2.png', mimeType: 'image/png', buffer: png });
    await designer.locator('[data-test="drawings"] tbody tr', { hasText: 'General arrangement, sheet 2' }).waitFor();
    await designer.locator('[data-test="import-girders"]').click();
    await designer.locator('[data-test="girder-import"]').waitFor();
    await chooseByLabel(designer, 'Deck to import into', DECK_NAME);
    await chooseFile(designer, 'Choose a CSV file', { name: 'girders.csv', mimeType: 'text/csv', buffer: Buffer.from('girder,spacing_ft,inertia_in4\n1,,545894\n2,9.6667,abc\n3,-9.5,\n') });
    await designer.locator('[data-test="check-csv"]').click();
    const error = designer.locator('[data-test="import-error"]');
    await error.waitFor();
    const text = await error.innerText();
    expect(text).toContain('nothing was imported');
    expect(text).toContain('row 3, column inertia_in4: “abc” is not a number');
    expect(text).toContain('row 4, column spacing_ft: the spacing must be greater than 0 (got -9.5)');
    await h.screenshot('review-06-csv-errors', designer);
    await chooseFile(designer, 'Choose a CSV file', { name: 'girders-fixed.csv', mimeType: 'text/csv', buffer: Buffer.from('girder,spacing_ft\n1,\n2,9.5\n3,9.5\n4,9.5\n5,9.5\n6,9.5\n') });
    // One file at a time: the new one replaces the first in the list.
    await expect.poll(() => designer.locator('[data-test="girder-import"] .ant-upload-list-item:not(.ant-upload-animate-leave)').allInnerTexts()).toEqual([expect.stringContaining('girders-fixed.csv')]);
    await designer.locator('[data-test="import-csv"]').click();
    await designer.waitForURL(/\/decks\/\d+\/versions\/3$/);

    // Expected resource errors: the 401 of the "who am I" check after signing out and the 400
    // answering the bad CSV. Nothing else may have gone wrong in the pages.
    expect(h.pageErrors.filter((e) => !/status of (400|401)/.test(e)), h.pageErrors.join('\n')).toEqual([]);
  });
});
