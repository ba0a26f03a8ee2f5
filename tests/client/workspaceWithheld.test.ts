// @vitest-environment happy-dom
/**
 * The deck workspace for a trainee whose exercise on the version is still open: the server
 * withholds the version's results (resultsWithheld), so the workspace shows why, with a link
 * to the exercise, instead of the factors; once the results are readable the factors show.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory, createRouter } from 'vue-router';
import { shallowRef, ref } from 'vue';
import DeckWorkspaceView from '@/views/DeckWorkspaceView.vue';
import { useAuthStore } from '@/stores/auth';
import { deckTemplate } from '@/components/deck/deckTemplates';

// The solver runs in a Web Worker in the browser; this screen test needs none of its numbers.
vi.mock('@/composables/useSolverWorker', () => ({
  useSolverWorker: () => ({ status: ref('idle'), progress: ref(null), error: shallowRef(null), analysis: shallowRef(null), live: shallowRef(null), governing: shallowRef({ moment: [], shear: [] }), codeFactors: async () => [] }),
}));

const fetchMock = vi.fn<(input: string, init: RequestInit) => Promise<Response>>();
const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

const person = { id: 5, name: 'Tara Trainee' };
const summary = { id: 11, deckId: 3, number: 1, message: 'first', createdAt: '2026-12-01T10:00:00Z', createdBy: person, basedOnVersionId: null };
const withheld = { reason: 'open-exercise', message: 'The results of this version are hidden until you submit your exercise “Exterior moment”.', exercises: [{ id: 7, title: 'Exterior moment' }] };

function serve(resultsWithheld: typeof withheld | null) {
  fetchMock.mockImplementation(async (url: string) => {
    if (url.includes('/api/decks/3/versions/1')) return json({ version: { ...summary, deck: deckTemplate('precast-one-span').build(), placements: null, results: [], resultsWithheld } });
    if (url.includes('/api/decks/3')) return json({ deck: { id: 3, projectId: 1, name: 'Quarry', createdAt: summary.createdAt, createdBy: person, latestVersion: summary }, versions: [summary] });
    if (url.includes('/api/projects/1')) return json({ project: { id: 1, name: 'Quarry Creek Overpass', units: 'US', archived: false } });
    return json({ error: { code: 'not_found', message: `no route ${url}`, details: [] } }, 404);
  });
}

async function mountWorkspace() {
  const pinia = createPinia();
  setActivePinia(pinia);
  useAuthStore().me = { id: 5, email: 'trainee@larchmont-ridge.example', name: 'Tara Trainee', firmId: 1, firmName: 'Larchmont Ridge Engineering', roles: ['trainee'], mustChangePassword: false };
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/decks/:deckId/versions/:versionNumber', name: 'deck-version', component: DeckWorkspaceView },
      { path: '/decks/:deckId', name: 'deck', component: { template: '<p>deck</p>' } },
      { path: '/projects/:projectId', name: 'project', component: { template: '<p>project</p>' } },
      { path: '/training/:exerciseId', name: 'training-exercise', component: { template: '<p>exercise</p>' } },
      { path: '/:any(.*)*', name: 'other', component: { template: '<p>other</p>' } },
    ],
  });
  await router.push('/decks/3/versions/1');
  await router.isReady();
  const wrapper = mount(DeckWorkspaceView, {
    props: { deckId: 3, versionNumber: 1 },
    global: { plugins: [pinia, router], stubs: { WorkspaceAnalysis: { template: '<div data-test="analysis">factors</div>' }, DeckEditor: true, VersionHistory: true } },
  });
  await flushPromises();
  return wrapper;
}

beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => vi.unstubAllGlobals());

describe('deck workspace for a trainee', () => {
  it('shows why the results are hidden and links to the open exercise, without the factors', async () => {
    serve(withheld);
    const wrapper = await mountWorkspace();
    const note = wrapper.find('[data-test="results-withheld"]');
    expect(note.exists()).toBe(true);
    expect(note.text()).toContain('hidden until you submit');
    expect(note.find('a').attributes('href')).toBe('/training/7');
    expect(wrapper.find('[data-test="analysis"]').exists()).toBe(false);
  });

  it('shows the factors when the results are readable', async () => {
    serve(null);
    const wrapper = await mountWorkspace();
    expect(wrapper.find('[data-test="results-withheld"]').exists()).toBe(false);
    expect(wrapper.find('[data-test="analysis"]').exists()).toBe(true);
  });
});
