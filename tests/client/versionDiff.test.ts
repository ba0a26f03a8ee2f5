// @vitest-environment happy-dom
/**
 * The history's comparison of two versions in the workspace: it asks the server for each
 * version's factors without waiting (`Prefer: respond-async`), shows where a grillage run of
 * the server is while it computes (its rows say so, never a bare dash), fills the rows when the
 * job is done, and then lists every row "no change" for equal inputs, or only the rows that
 * differ for a changed input; its labels are the app's words. A version withheld from the
 * reader is not compared. The server is a stand-in whose answers are the shared solver's
 * results of the decks, shaped as the server shapes them (shared/versionDiff/versionFactors.ts).
 */
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory, createRouter } from 'vue-router';
import { assertDeck, type DeckInput } from '@shared/deck/schema';
import { computeCodeFactors } from '@shared/lrfd/factors';
import { computeRefinedFactors } from '@shared/grillage/refinedFactors';
import { governingPerGirder } from '@shared/review/reductions';
import { SOLVER_VERSION } from '@shared/version';
import { fromUs } from '@shared/units';
import { codeFactorsPart, refinedFactorsPart, type VersionFactors } from '@shared/versionDiff/versionFactors';
import { deckTemplate } from '@/components/deck/deckTemplates';
import { useDeckStore } from '@/stores/useDeckStore';
import VersionHistory from '@/components/deck/VersionHistory.vue';

const person = { id: 2, name: 'Dana Okonkwo' };
const summary = (number: number) => ({ id: 100 + number, deckId: 7, number, message: `version ${number}`, createdAt: '2026-12-01T10:00:00Z', createdBy: person, basedOnVersionId: null });
const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
const job = (state: string) => ({ id: 11, url: '/api/jobs/11', kind: 'refined', state, error: null, createdAt: new Date().toISOString(), startedAt: state === 'queued' ? null : new Date().toISOString(), progress: state === 'running' ? { phase: 'search', done: 12, total: 48 } : null });

/** A deck's factors as the server answers them once its grillage is stored. */
function factorsOf(deck: DeckInput): VersionFactors {
  const d = assertDeck(deck);
  const refined = computeRefinedFactors(d);
  return {
    code: codeFactorsPart(computeCodeFactors(d), SOLVER_VERSION, 'stored'),
    refined: refinedFactorsPart({ factors: governingPerGirder(refined.rows), rows: refined.rows, source: `grillage stored with the version, solver ${SOLVER_VERSION}`, note: '', solverVersion: SOLVER_VERSION }),
  };
}
const computing = (f: VersionFactors): VersionFactors => ({ code: f.code, refined: { available: false, missing: 'computing', note: 'The grillage of this version is being computed on the server.' } });

const decks: Record<number, DeckInput> = {};
let stored: Record<number, VersionFactors> = {};
let withheld: number | null = null;
/** Versions whose grillage is not stored yet: their first answer is 202 with the job. */
let pendingVersions = new Set<number>();
let jobStates: string[] = [];
const fetchMock = vi.fn<(input: string, init: RequestInit) => Promise<Response>>();

function serve(): void {
  fetchMock.mockImplementation(async (url: string) => {
    const factors = /\/api\/decks\/7\/versions\/(\d+)\/factors$/.exec(url);
    if (factors) {
      const n = Number(factors[1]);
      if (pendingVersions.has(n)) {
        pendingVersions.delete(n);
        return json(202, { factors: computing(stored[n]), job: job('queued') });
      }
      return json(200, { factors: stored[n], job: null, refusal: null });
    }
    if (url === '/api/jobs/11') return json(200, { job: job(jobStates.shift() ?? 'done') });
    const version = /\/api\/decks\/7\/versions\/(\d+)$/.exec(url);
    if (version) {
      const n = Number(version[1]);
      const resultsWithheld = withheld === n ? { reason: 'open-exercise', message: 'The results of this version are hidden until you submit your exercise “Exterior shear”.', exercises: [{ id: 4, title: 'Exterior shear' }] } : null;
      return json(200, { version: { ...summary(n), deck: decks[n], placements: null, results: [], resultsWithheld } });
    }
    return json(404, { error: { code: 'not_found', message: `no route ${url}`, details: [] } });
  });
}

let base: VersionFactors;
let shorter: VersionFactors;
beforeAll(() => {
  // the one-span precast starting deck (six girders, 20° skew); v3 with both overhangs 0.5 ft shorter
  const deck = () => deckTemplate('precast-one-span').build();
  decks[1] = deck();
  decks[2] = deck();
  decks[3] = { ...deck(), overhangLeft: fromUs.ft(3), overhangRight: fromUs.ft(3) };
  base = factorsOf(decks[1]);
  shorter = factorsOf(decks[3]);
});

beforeEach(() => {
  setActivePinia(createPinia());
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
  stored = { 1: base, 2: structuredClone(base), 3: shorter };
  withheld = null;
  pendingVersions = new Set();
  jobStates = [];
  serve();
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/decks/:deckId/versions/:versionNumber', name: 'deck-version', component: { template: '<div />' } }, { path: '/:any(.*)*', component: { template: '<div />' } }] });

/** The history open on deck 7, comparing version `before` with `after`. */
async function compare(before: number, after: number) {
  const store = useDeckStore();
  store.deckId = 7;
  store.versions = [after, before].map(summary);
  const wrapper = mount(VersionHistory, { props: { open: true }, global: { plugins: [router] }, attachTo: document.body });
  await flushPromises();
  document.querySelector<HTMLButtonElement>('[data-test="compare"]')!.click();
  await flushPromises();
  return wrapper;
}

const rows = () => [...document.querySelectorAll<HTMLTableRowElement>('[data-test="factor-diff-row"]')];
const cells = (r: HTMLTableRowElement) => [...r.querySelectorAll('td')].map((td) => td.textContent!.trim());
const factorRequests = () => fetchMock.mock.calls.filter(([url]) => url.endsWith('/factors'));

describe('comparing two versions in the history', () => {
  it('follows the grillage job of a version not yet computed, says so in its rows, then shows every row "no change"', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setInterval', 'clearInterval'] });
    pendingVersions = new Set([1]);
    jobStates = ['running', 'done'];
    const wrapper = await compare(1, 2);
    for (const [, init] of factorRequests()) expect((init.headers as Record<string, string>).Prefer).toBe('respond-async');

    // While v1's grillage is computed: its progress, and its rows say why they wait.
    expect(document.querySelector('[data-test="grillage-progress"]')?.textContent).toMatch(/Grillage of v1: Waiting for a free analysis worker/);
    const waiting = rows().filter((r) => r.dataset.state === 'not-compared');
    expect(waiting.length).toBe(base.refined.available ? base.refined.rows.length + base.refined.governing.length : -1);
    for (const r of waiting) {
      expect(r.querySelector('[data-test="diff-before"]')!.textContent!.trim()).toBe('grillage still being computed');
      expect(r.querySelector('[data-test="diff-change"]')!.textContent!.trim()).toBe('not compared, v1: grillage still being computed');
    }
    await vi.advanceTimersByTimeAsync(1000);
    expect(document.querySelector('[data-test="grillage-progress"]')?.textContent).toMatch(/Running on the server for \d+ s: finding the governing truck positions, 12 of 48 factors done/);
    await vi.advanceTimersByTimeAsync(1000);
    await flushPromises();

    // Filled: every row of both versions, each "no change", none missing a value.
    expect(document.querySelector('[data-test="grillage-progress"]')).toBeNull();
    const all = rows();
    const total = base.code.rows.length + base.code.governing.length + (base.refined.available ? base.refined.rows.length + base.refined.governing.length : 0);
    expect(all.length).toBe(total);
    for (const r of all) {
      expect(r.dataset.state).toBe('same');
      const [, , , , , before, after, change] = cells(r);
      expect(before).toMatch(/^\d\.\d{4}/);
      expect(after).toBe(before);
      expect(change).toBe('no change');
    }
    expect(all.filter((r) => r.dataset.section === 'grillage').length).toBeGreaterThan(0);
    expect(document.querySelector('[data-test="factor-summary"]')!.textContent).toContain(`No factor changed: all ${total} rows have the same value in both versions.`);
    wrapper.unmount();
  });

  it('lists only the rows that differ for a changed input, and every row on request', async () => {
    const wrapper = await compare(2, 3);
    const shown = rows();
    expect(shown.length).toBeGreaterThan(0);
    for (const r of shown) {
      expect(r.dataset.state).toBe('changed');
      const [, , , , , before, after, change] = cells(r);
      expect(before).not.toBe(after);
      expect(change).toMatch(/^[+\u2212]\d\.\d{4} \([+\u2212]\d+\.\d+ %\)$/);
    }
    document.querySelector<HTMLAnchorElement>('[data-test="factor-show-all"]')!.click();
    await flushPromises();
    const all = rows();
    expect(all.length).toBeGreaterThan(shown.length);
    expect(all.filter((r) => r.dataset.state === 'changed').length).toBe(shown.length);
    expect(all.filter((r) => r.dataset.state === 'same').every((r) => cells(r)[7] === 'no change')).toBe(true);
    wrapper.unmount();
  });

  it('labels every row in the app\'s words: no internal id, no nested parentheses', async () => {
    pendingVersions = new Set([2]);
    jobStates = ['running'];
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setInterval', 'clearInterval'] });
    const wrapper = await compare(2, 3);
    document.querySelector<HTMLAnchorElement>('[data-test="factor-show-all"]')?.click();
    await flushPromises();
    const texts = rows().flatMap((r) => [...cells(r), r.querySelector('[data-test="diff-before"]')!.getAttribute('title') ?? '', r.querySelector('[data-test="diff-after"]')!.getAttribute('title') ?? '']);
    texts.push(...[...document.querySelectorAll('[data-test="factor-diff"] th, [data-test="factor-diff"] .ds-section td')].map((e) => e.textContent ?? ''));
    expect(texts.length).toBeGreaterThan(100);
    // internal ids are lower-case words joined by hyphens (lever-rule, fatigue-moment, not-compared)
    const ids = texts.filter((t) => /\b[a-z]+(?:-[a-z]+)+\b/.test(t));
    expect(ids).toEqual([]);
    const nested = texts.filter((t) => /\([^()]*\(/.test(t));
    expect(nested).toEqual([]);
    for (const words of ['lever rule', 'fatigue moment', 'two or more lanes', 'span 1, both ends', 'support 1', 'grillage still being computed']) expect(texts.some((t) => t.includes(words)), words).toBe(true);
    wrapper.unmount();
  });

  it('leaves the factors of a version withheld from the reader out, and says why', async () => {
    withheld = 1;
    const wrapper = await compare(1, 2);
    expect(document.querySelector('[data-test="factors-withheld"]')?.textContent).toContain('hidden until you submit');
    expect(document.querySelector('[data-test="factor-diff"]')).toBeNull();
    expect(factorRequests()).toEqual([]);
    // the inputs are still compared: the trainee needs them
    expect(document.body.textContent).toContain('No input changed.');
    wrapper.unmount();
  });
});
