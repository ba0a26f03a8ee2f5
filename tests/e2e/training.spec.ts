/**
 * A training exercise end to end in a real browser, instructor and trainee in two browser
 * contexts: the instructor makes a "governing truck position" exercise from a saved deck
 * version; the trainee drags the lane on the cross-section sketch, sets the wheels 2 ft from
 * the barrier face, enters the factor and a step, and is graded; the instructor sees the grade;
 * the notices are in the outbox, and the grade's e-mail says about answers what the page says.
 * A factor question made in the form says whether the skew correction is in the value and takes
 * the literal answer to it. Before submitting, the trainee sees the deck version's inputs
 * and lanes but none of its results (screen or API); an exercise opened to all shows its whole
 * trace, every candidate of a governing value included. Screenshots go to tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH, DEMO_USERS, chooseByLabel, selectByLabel, signIn, signOut, startHarness, type Harness } from './harness';
import { quarryCreekDeck, quarryCreekUs } from '../fixtures/decks';

const DECK_NAME = `Training deck ${Date.now()}`;
// Hand calculation (AASHTO LRFD Art. 4.6.2.2.1 lever rule, Art. 3.6.1.3.1 wheel 2 ft from the
// barrier face, Table 3.6.1.1.2-1 m = 1.20): de = 2 ft puts the outer wheel over girder 1.
const S = quarryCreekUs.girders.spacing;
const LEVER = 1.2 * 0.5 * (1 + (S - 6) / S);


describe('training exercise in the browser', () => {
  let h: Harness;
  let instructor: Page;
  let traineeContext: BrowserContext;
  let trainee: Page;
  let profile: string;
  let exerciseUrl: string;
  let gradedRule = '';

  beforeAll(async () => {
    h = await startHarness({ env: { LOCAL_SMTP_PORT: '0' } });
    instructor = h.page;
    profile = await mkdtemp(join(tmpdir(), 'deckshare-e2e-trainee-'));
    traineeContext = await chromium.launchPersistentContext(profile, { executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS, viewport: { width: 1366, height: 900 }, locale: 'en-US', timezoneId: 'UTC' });
    trainee = traineeContext.pages()[0] ?? (await traineeContext.newPage());
    trainee.setDefaultTimeout(15_000);
    trainee.on('pageerror', (e) => h.pageErrors.push(`trainee pageerror: ${e.message}`));
  });

  afterAll(async () => {
    await traineeContext?.close().catch(() => undefined);
    if (profile) await rm(profile, { recursive: true, force: true });
    await h?.stop();
  });

  it('the instructor makes a truck-position exercise and assigns it', async () => {
    await signIn(instructor, h.baseUrl, DEMO_USERS.instructor);
    const made = await instructor.evaluate(async (deck) => {
      const csrf = decodeURIComponent(document.cookie.split('; ').find((c) => c.startsWith('ds_csrf='))!.slice(8));
      const projects = await (await fetch('/api/projects')).json();
      const id = projects.projects.find((p: { name: string }) => p.name === 'Quarry Creek Overpass').id;
      const res = await fetch(`/api/projects/${id}/decks`, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf }, body: JSON.stringify({ deck, message: 'for the training session' }) });
      return res.status;
    }, { ...quarryCreekDeck(), name: DECK_NAME });
    expect(made).toBe(201);

    await instructor.goto(h.url('/training'));
    await instructor.locator('[data-test="new-exercise"]').click();
    await instructor.waitForURL(/\/training\/new$/);
    // Every field found by its label.
    await chooseByLabel(instructor, 'Project', 'Quarry Creek Overpass');
    await chooseByLabel(instructor, 'Deck', DECK_NAME);
    await selectByLabel(instructor, 'Version').getByText('Version 1').waitFor();
    await chooseByLabel(instructor, 'Question', 'The governing truck position for the exterior girder');
    await instructor.locator('[data-test="truck-params"]').waitFor();
    await instructor.getByLabel('Tolerance (%)', { exact: true }).fill('1');
    await chooseByLabel(instructor, 'Trainees', 'Theo Brandt');
    await instructor.getByLabel('Instructions (optional)', { exact: true }).fill('Place the wheels by the rules of Art. 3.6.1.3.1 and give the lever-rule factor.');
    await h.screenshot('training-01-new-exercise', instructor);
    await instructor.locator('[data-test="create-exercise"]').click();
    await instructor.waitForURL(/\/training\/\d+$/);
    exerciseUrl = instructor.url();
    const expected = Number(await instructor.locator('[data-test="expected-value"]').innerText());
    // Shown with 4 decimals: relative difference below 1e-4.
    expect(Math.abs(expected - LEVER) / LEVER).toBeLessThan(1e-4);
    // Left without a title, the exercise is titled by its question.
    expect(await instructor.locator('[data-test="exercise-title"]').innerText()).toBe('The governing position of the design lanes and wheel lines for girder 1 by the lever rule (1 loaded lane), and the factor it gives');
  });

  it('a factor question says whether the skew correction is in the value, and a literal answer to it passes', async () => {
    await instructor.goto(h.url('/training/new'));
    await chooseByLabel(instructor, 'Project', 'Quarry Creek Overpass');
    await chooseByLabel(instructor, 'Deck', DECK_NAME);
    await selectByLabel(instructor, 'Version').getByText('Version 1').waitFor();
    await chooseByLabel(instructor, 'Question', 'The lever-rule factor for shear of the exterior girder, one lane, before');
    const skew = instructor.locator('[data-test="exercise-skew"]');
    expect(await skew.innerText()).toContain('before the skew correction');
    await instructor.getByLabel('Tolerance (%)', { exact: true }).fill('1');
    await chooseByLabel(instructor, 'Trainees', 'Theo Brandt');
    await instructor.keyboard.press('Escape'); // close the trainees' list, which stays open for more choices
    await h.screenshot('training-01b-new-factor-exercise', instructor);
    await instructor.locator('[data-test="create-exercise"]').click();
    await instructor.waitForURL(/\/training\/\d+$/);
    const question = 'the lever-rule shear factor of the exterior girder (girder 1) with one loaded lane, in span 1, before the skew correction';
    expect(await instructor.locator('[data-test="exercise-question"]').innerText()).toBe(question);
    // The product's trace is the lever rule alone: no span length, no skew step (AASHTO LRFD Art. 4.6.2.2.1).
    expect(await instructor.locator('[data-test="expected-answer"] li').count()).toBe(1);
    const url = instructor.url();

    await signIn(trainee, h.baseUrl, DEMO_USERS.trainee);
    await trainee.goto(url);
    expect(await trainee.locator('[data-test="exercise-question"]').innerText()).toBe(question);
    // The literal lever-rule answer (hand calculation: 1.2 · ½ (1 + (S − 6)/S) = 0.828).
    await trainee.getByLabel('Your value of the factor (lanes per girder)', { exact: true }).fill('0.828');
    await trainee.locator('[data-test="submit-answer"]').click();
    await trainee.locator('[data-test="grade-banner"]').waitFor();
    expect(await trainee.locator('[data-test="grade-banner"]').innerText()).toContain('Within tolerance');
    expect(await trainee.locator('[data-test="trace-comparison"]').innerText()).not.toMatch(/L for shear/);
    await h.screenshot('training-01c-factor-graded', trainee);
  });

  it('before submitting, the trainee sees the deck and its lanes but no result of its version, on screen or through the API', async () => {
    await trainee.goto(exerciseUrl);
    await trainee.locator('[data-test="placement-sketch"]').waitFor();
    expect(await trainee.locator('[data-test="expected-answer"]').count()).toBe(0);
    // The exercise links to its deck version: the workspace shows the inputs and the deck, no factor.
    await trainee.locator('.ant-descriptions a', { hasText: DECK_NAME }).click();
    await trainee.locator('[data-test="results-withheld"]').waitFor();
    await trainee.locator('[data-test="deck-inputs-scene"] [data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
    expect(await trainee.locator('[data-test="workspace-analysis"]').count()).toBe(0);
    expect(await trainee.locator('[data-test="results-tabs"], [data-test="comparison-table"]').count()).toBe(0);
    await h.screenshot('training-02a-withheld-workspace', trainee);
    const deckId = Number(/\/decks\/(\d+)/.exec(trainee.url())![1]);
    const answers = await trainee.evaluate(async (id) => {
      const out: Record<string, number> = {};
      for (const u of [`/api/decks/${id}/versions/1?include=results`, `/api/reports/decks/${id}/versions/1/package.pdf`, `/api/reports/decks/${id}/versions/1/factors.csv`]) out[u] = (await fetch(u)).status;
      const plain = await (await fetch(`/api/decks/${id}/versions/1`)).json();
      out.resultHeadings = plain.version.results.length;
      return out;
    }, deckId);
    expect(answers[`/api/decks/${deckId}/versions/1?include=results`]).toBe(403);
    expect(answers[`/api/reports/decks/${deckId}/versions/1/package.pdf`]).toBe(403);
    expect(answers[`/api/reports/decks/${deckId}/versions/1/factors.csv`]).toBe(403);
    expect(answers.resultHeadings).toBe(0);
  });

  it('the trainee places the truck, enters the factor and a step, and is graded', async () => {
    await trainee.goto(h.url('/training'));
    const row = trainee.locator('[data-test="exercises-table"] tbody tr', { hasText: DECK_NAME.slice(0, 8) }).first();
    await row.waitFor();
    expect(await row.innerText()).toContain('to do');
    await row.locator('a').first().click();
    await trainee.waitForURL(exerciseUrl);
    await trainee.locator('[data-test="placement-sketch"]').waitFor();

    // Drag the lane as far left as it goes: it stops at the barrier face.
    const lane = trainee.locator('[data-test="lane-0"]');
    const box = (await lane.boundingBox())!;
    await trainee.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await trainee.mouse.down();
    await trainee.mouse.move(box.x - 500, box.y + box.height / 2, { steps: 8 });
    await trainee.mouse.up();
    await expect.poll(async () => Number(await trainee.getByLabel('Lane 1 left edge from girder 1 (ft)', { exact: true }).inputValue())).toBeCloseTo(-2, 3);
    // Wheels 2 ft from the lane edge; the sketch refuses less (it clamps to the 2 ft rule).
    const wheel = trainee.getByLabel('Lane 1 left wheel from the lane edge (ft)', { exact: true });
    await wheel.fill('1');
    await wheel.press('Tab');
    await expect.poll(async () => Number(await wheel.inputValue())).toBeCloseTo(2, 3);

    expect(await trainee.locator('[data-test="answer-rule"]').innerText()).toMatch(/^You submit once: /);
    // Submitting without a value is refused beside the value box, which is marked and described by it.
    const value = trainee.getByLabel('Your value of the factor (lanes per girder)', { exact: true });
    await trainee.locator('[data-test="submit-answer"]').click();
    await trainee.getByRole('alert').filter({ hasText: 'Enter your value of the factor.' }).waitFor();
    expect(await value.getAttribute('aria-invalid')).toBe('true');
    expect(await value.getAttribute('aria-describedby')).toBe('answer-value-message');
    await value.fill(LEVER.toFixed(3));
    await trainee.locator('[data-test="add-step"]').click();
    await trainee.getByLabel('Step 1: what it computes', { exact: true }).fill('Lane share, outer wheel over girder 1');
    await trainee.getByLabel('Step 1: value', { exact: true }).fill((LEVER / 1.2).toFixed(4));
    expect(await value.getAttribute('aria-invalid')).toBeNull();
    await h.screenshot('training-02-answer', trainee);
    await trainee.locator('[data-test="submit-answer"]').click();
    const banner = trainee.locator('[data-test="grade-banner"]');
    await banner.waitFor();
    expect(await banner.innerText()).toContain('Within tolerance');
    // What the page says about answers once graded; the e-mail must say the same (checked in the outbox below).
    gradedRule = (await trainee.locator('[data-test="answer-rule"]').innerText()).trim();
    expect(gradedRule).toMatch(/grade is final/);
    expect(await trainee.locator('[data-test="check-placement"]').innerText()).toContain('within');
    await trainee.locator('[data-test="trace-comparison"] [data-test="step-matched"]').first().waitFor();
    await h.screenshot('training-03-graded', trainee);
    // Graded: the version's results are the trainee's to read now.
    await trainee.locator('.ant-descriptions a', { hasText: DECK_NAME }).click();
    await trainee.locator('[data-test="workspace-analysis"]').waitFor();
    expect(await trainee.locator('[data-test="results-withheld"]').count()).toBe(0);
  });

  it('an exercise opened to all shows a trainee who has not answered the whole trace, every candidate included', async () => {
    // A governing-value question on the same version (AASHTO LRFD Art. 4.6.2.2.2d: on this deck the
    // exterior girder's two-lane value is the larger of the formula and the rigid-section check).
    const id = await instructor.evaluate(async (name) => {
      const csrf = decodeURIComponent(document.cookie.split('; ').find((c) => c.startsWith('ds_csrf='))!.slice(8));
      const projects = await (await fetch('/api/projects')).json();
      const pid = projects.projects.find((p: { name: string }) => p.name === 'Quarry Creek Overpass').id;
      const decks = await (await fetch(`/api/projects/${pid}/decks`)).json();
      const deck = decks.decks.find((d: { name: string }) => d.name === name);
      const trainees = await (await fetch('/api/training/trainees')).json();
      const res = await fetch('/api/training/assignments', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrf },
        body: JSON.stringify({ kind: 'factor', versionId: deck.latestVersion.id, params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' }, tolerancePercent: 1, dueAt: new Date(Date.now() + 7 * 86400_000).toISOString(), traineeIds: trainees.trainees.map((t: { id: number }) => t.id) }),
      });
      return (await res.json()).assignment.id as number;
    }, DECK_NAME);
    await instructor.goto(h.url(`/training/${id}`));
    await instructor.locator('[data-test="open-to-all"]').click();
    await instructor.locator('.ant-modal-confirm .ant-btn-primary').click();
    await instructor.locator('[data-test="opened-to-all"]').waitFor();

    await trainee.goto(h.url(`/training/${id}`));
    await trainee.locator('[data-test="expected-answer"]').waitFor();
    expect(await trainee.locator('[data-test="answer-form"]').count()).toBe(0);
    const steps = await trainee.locator('[data-test="expected-answer"] li').allInnerTexts();
    const last = steps.at(-1)!;
    expect(last).toMatch(/candidates/);
    expect(last).toMatch(/g\(formula\) = 0\.\d+/);
    expect(last).toMatch(/g\(rigid section\) = 0\.\d+/);
    await h.screenshot('training-03a-open-to-all', trainee);
  });

  it('the instructor sees the grade; the notices are in the outbox', async () => {
    await instructor.goto(exerciseUrl);
    const table = instructor.locator('[data-test="submissions-table"]');
    await table.locator('tbody tr', { hasText: 'Theo Brandt' }).waitFor();
    expect(await table.innerText()).toContain('within tolerance');
    await h.screenshot('training-04-instructor', instructor);

    await signOut(instructor);
    await signIn(instructor, h.baseUrl, DEMO_USERS.admin);
    await instructor.goto(h.url('/mail'));
    const outbox = instructor.locator('[data-test="outbox-table"]');
    // The mail service receives each notice a moment after the action: refresh until both are in.
    await expect
      .poll(
        async () => {
          await instructor.locator('[data-test="outbox-refresh"]').click();
          return (await outbox.locator('tbody tr.ant-table-row').allInnerTexts()).length;
        },
        { timeout: 20_000, interval: 500 },
      )
      .toBeGreaterThanOrEqual(4);
    const text = await outbox.innerText();
    expect(text).toContain('New exercise: The governing position of the design lanes and wheel lines for girder 1');
    expect(text).toContain('Within tolerance: The governing position of the design lanes and wheel lines for girder 1');
    expect(text).toContain(DEMO_USERS.trainee);
    expect(text).not.toMatch(/attempt|Not yet/i);
    // The grade's e-mail says about answers what the exercise page said.
    const body = await instructor.evaluate(async () => {
      const list = await (await fetch('/api/mail/outbox?kind=submission-graded')).json();
      const one = await (await fetch(`/api/mail/outbox/${list.messages.find((m: { subject: string }) => m.subject.includes('wheel lines')).id}`)).json();
      return one.message.text as string;
    });
    expect(gradedRule.length).toBeGreaterThan(20);
    expect(body.replace(/\s+/g, ' ')).toContain(gradedRule.replace(/\s+/g, ' '));
    expect(body).not.toMatch(/attempt|Not yet/i);
    expect(h.pageErrors.filter((e) => !/status of 401/.test(e))).toEqual([]);
  });
});
