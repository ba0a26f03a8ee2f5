// @vitest-environment happy-dom
/**
 * The version history pages through a long list: it opens with the server's first page and
 * "Show older versions" appends the next one, from the previous page's cursor, until none is
 * left (the API side is tests/server/pagination.test.ts).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory, createRouter } from 'vue-router';
import type { Page, VersionSummary } from '@/api/types';

const TOTAL = 120;
const summaries = (from: number, n: number): VersionSummary[] =>
  Array.from({ length: n }, (_, i) => ({
    id: from - i,
    deckId: 7,
    number: from - i,
    message: `version ${from - i}`,
    createdAt: '2026-12-01T10:00:00Z',
    createdBy: { id: 2, name: 'Dana Okonkwo' },
    basedOnVersionId: null,
  }));
const page = (nextCursor: string | null): Page => ({ limit: 50, total: TOTAL, nextCursor });

vi.mock('@/api/decks', () => ({
  getDeck: vi.fn(async () => ({ deck: { id: 7, projectId: 1, name: 'Deck', createdAt: '', createdBy: { id: 2, name: '' }, latestVersion: summaries(TOTAL, 1)[0] }, versions: summaries(TOTAL, 50), page: page('c1') })),
  listVersions: vi.fn(async (_deckId: number, cursor: string) =>
    cursor === 'c1' ? { versions: summaries(70, 50), page: page('c2') } : { versions: summaries(20, 20), page: page(null) },
  ),
  getVersion: vi.fn(),
  listDecks: vi.fn(),
  createDeck: vi.fn(),
  saveVersion: vi.fn(),
}));

import * as decksApi from '@/api/decks';
import { useDeckStore } from '@/stores/useDeckStore';
import VersionHistory from '@/components/deck/VersionHistory.vue';

let pinia: ReturnType<typeof createPinia>;
beforeEach(() => {
  pinia = createPinia();
  setActivePinia(pinia);
});
const router = createRouter({ history: createMemoryHistory(), routes: [{ path: '/decks/:deckId/versions/:versionNumber', name: 'deck-version', component: { template: '<div />' } }, { path: '/:any(.*)*', component: { template: '<div />' } }] });
afterEach(() => {
  document.body.innerHTML = '';
});

describe('version history of a long deck', () => {
  it('shows the newest page, then appends older pages until the list is complete', async () => {
    const store = useDeckStore();
    store.deckId = 7;
    // the store's refresh is what `open` calls first; drive it directly, without opening a version
    const answer = await decksApi.getDeck(7);
    store.versions = answer.versions;
    store.versionsPage = answer.page;
    const wrapper = mount(VersionHistory, { props: { open: true }, global: { plugins: [pinia, router] }, attachTo: document.body });
    await flushPromises();
    const text = () => document.body.textContent ?? '';
    expect(text()).toContain('Showing 50 of 120 versions, newest first.');
    const button = () => document.querySelector<HTMLButtonElement>('[data-test="show-more-button"]');
    button()!.click();
    await flushPromises();
    expect(decksApi.listVersions).toHaveBeenLastCalledWith(7, 'c1');
    expect(store.versions.map((v) => v.number).slice(48, 52)).toEqual([72, 71, 70, 69]);
    expect(text()).toContain('Showing 100 of 120 versions');
    button()!.click();
    await flushPromises();
    expect(decksApi.listVersions).toHaveBeenLastCalledWith(7, 'c2');
    expect(store.versions.map((v) => v.number)).toEqual(Array.from({ length: TOTAL }, (_, i) => TOTAL - i));
    expect(button()).toBeNull();
    wrapper.unmount();
  });
});
