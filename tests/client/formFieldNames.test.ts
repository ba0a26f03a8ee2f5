// @vitest-environment happy-dom
/**
 * Every field of the client's forms has a name a screen reader reads with it, tied to it (a
 * <label for> naming its id, aria-labelledby or aria-label; HTML Living Standard §4.10.4 "The
 * label element", WAI-ARIA 1.2 §6.6 aria-labelledby / aria-label, W3C Accessible Name and
 * Description Computation 1.2 §4.3.2), and a field shown with a problem is marked
 * aria-invalid="true" (WAI-ARIA 1.2 §6.7) and described by the problem's text
 * (aria-describedby, accname 1.2 §4.3.1) in a region with role="alert" (WAI-ARIA 1.2 §5.4,
 * "alert": announced when it appears). The deck editor is walked with every panel open and
 * in each of its variants (layouts, section types, materials, diaphragms, plate calculator).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { defineComponent, h, reactive } from 'vue';
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory, createRouter, type RouteRecordRaw } from 'vue-router';
import { Form, FormItem, Input } from 'ant-design-vue';
import DeckEditor from '@/components/deck/DeckEditor.vue';
import ProjectForm from '@/components/project/ProjectForm.vue';
import SignInView from '@/views/SignInView.vue';
import TrainingNewView from '@/views/TrainingNewView.vue';
import TrainingExerciseView from '@/views/TrainingExerciseView.vue';
import { useDeckStore } from '@/stores/useDeckStore';
import { useAuthStore } from '@/stores/auth';
import { emptyDraft } from '@/components/project/projectDraft';
import { accessibleName, announcedDescriptions, duplicateIds, unnamedControls, untiedProblems } from './accessibleFields';

const fetchMock = vi.fn<(input: string, init?: RequestInit) => Promise<Response>>();
const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

beforeEach(() => {
  document.body.innerHTML = '';
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

/** Both checks over a rendered form: names and problems, and no id used twice. */
function expectAccessible(root: Element, what: string): void {
  expect(unnamedControls(root), `${what}: controls without a name`).toEqual([]);
  expect(untiedProblems(root), `${what}: problems not tied to their field`).toEqual([]);
  expect(duplicateIds(root), `${what}: ids used twice`).toEqual([]);
}

/** The control a visible label names (label[for] → element with that id). */
function controlLabelled(root: Element, text: string): HTMLElement {
  const label = [...root.querySelectorAll('label')].find((l) => l.textContent?.trim() === text);
  if (!label) throw new Error(`no label "${text}"`);
  const id = label.htmlFor;
  const el = id ? document.getElementById(id) : null;
  if (!el) throw new Error(`label "${text}" names no element (for=${id})`);
  return el;
}

describe('the checks themselves', () => {
  it('find an unnamed box, a placeholder-only box, a group without a role and an untied problem', async () => {
    const Bare = defineComponent({
      render: () =>
        h(Form, { layout: 'vertical' }, () => [
          h('input', { type: 'text', 'data-test': 'bare' }),
          h(Input, { placeholder: 'Only a placeholder', 'data-test': 'placeholder-only' }),
          h(FormItem, { label: 'Untied', validateStatus: 'error', help: 'something is wrong' }, () => h(Input, { 'data-test': 'untied' })),
          h('div', { class: 'ant-radio-group', 'aria-label': 'A group' }),
        ]),
    });
    const w = mount(Bare, { attachTo: document.body });
    const unnamed = unnamedControls(w.element);
    expect(unnamed.some((m) => m.includes('data-test=bare'))).toBe(true);
    expect(unnamed.some((m) => m.includes('data-test=placeholder-only'))).toBe(true);
    expect(unnamed.some((m) => m.includes('no group role'))).toBe(true);
    expect(untiedProblems(w.element)).toEqual(['a field with the problem "something is wrong" has no control tied to its label']);
    w.unmount();
  });
});

// ---- the deck editor ------------------------------------------------------------------------

const PANELS = ['general', 'girders', 'roadway', 'slab', 'section', 'materials', 'spans', 'diaphragms', 'policy'];

describe('the deck editor', () => {
  let wrapper: VueWrapper;
  let store: ReturnType<typeof useDeckStore>;

  async function mountEditor(template: 'precast-one-span' | 'blank' = 'precast-one-span'): Promise<void> {
    const pinia = createPinia();
    setActivePinia(pinia);
    store = useDeckStore();
    store.startNew(1, 'US', template);
    wrapper = mount(DeckEditor, { global: { plugins: [pinia] }, attachTo: document.body });
    await flushPromises();
    for (const key of PANELS) {
      const panel = wrapper.find(`[data-test="panel-${key}"]`);
      if (!panel.find('.ant-collapse-content-active').exists()) {
        await panel.find('.ant-collapse-header').trigger('click');
        await flushPromises();
      }
    }
  }
  async function set(path: (string | number)[], value: unknown): Promise<void> {
    store.setField(path, value);
    await flushPromises();
  }
  async function type(key: string, text: string): Promise<void> {
    const el = wrapper.find<HTMLInputElement>(`input[data-test="field-${key}"]`);
    await el.trigger('focus');
    await el.setValue(text);
    await flushPromises();
  }

  afterEach(() => wrapper?.unmount());

  it('names every field of every panel, in every variant of the deck', async () => {
    await mountEditor();
    const root = wrapper.element;
    const count = () => root.querySelectorAll('input, textarea, button[role="switch"]').length;
    expect(count()).toBeGreaterThan(30);
    expectAccessible(root, 'template deck, every panel open');

    await wrapper.find('[data-test="girder-layout-kind"] input[value="offsets"]').setValue(true);
    await flushPromises();
    expect(root.querySelector('[data-test="girder-offsets"] input')).not.toBeNull();
    expectAccessible(root, 'table of offsets');

    // Type f: beam shape and connection between beams appear, with the schema's problems
    // (type f needs J and b) on the section fields.
    await set(['sectionType'], 'f');
    expect(root.querySelector('[data-field="section.beamShape"]')).not.toBeNull();
    expect(root.querySelector('[data-field="section.actsAsUnit"] [role="radiogroup"]')).not.toBeNull();
    expect(root.querySelectorAll('.ant-form-item-has-error').length).toBeGreaterThan(0);
    expectAccessible(root, 'section type f');

    // The plate calculator of a welded steel I (types a, b, c).
    await set(['sectionType'], 'a');
    await wrapper.find('[data-test="toggle-built-up"]').trigger('click');
    await flushPromises();
    expect(root.querySelector('[data-test="built-up-form"]')).not.toBeNull();
    expectAccessible(root, 'plate calculator');

    // Materials given by a modulus, the modular ratio entered.
    for (const side of ['deck', 'girder']) {
      await wrapper.find(`[data-test="material-kind-${side}"] input[value="modulus"]`).setValue(true);
      await flushPromises();
    }
    await wrapper.find('[data-test="modular-override"]').trigger('click');
    await flushPromises();
    expect(store.draft.materials.modularRatio).toBeDefined();
    expectAccessible(root, 'moduli and modular ratio');

    // Two spans (a pier, continuity) and each kind of diaphragm.
    await wrapper.find('[data-test="add-span"]').trigger('click');
    await flushPromises();
    for (const type of ['concrete-diaphragms', 'steel-cross-frames', 'none']) {
      await set(['diaphragms', 'type'], type);
      expectAccessible(root, `two spans, diaphragms ${type}`);
    }
  });

  it('a blank deck: every field with a problem is invalid and described by it, the section type too', async () => {
    await mountEditor('blank');
    const root = wrapper.element;
    const withProblem = root.querySelectorAll('.ant-form-item-has-error');
    expect(withProblem.length).toBeGreaterThan(5);
    expectAccessible(root, 'blank deck');
    // The cross-section type is a Select: its combobox input carries the label's id and the problem.
    const type = controlLabelled(root, 'Cross-section type');
    expect(type.getAttribute('role')).toBe('combobox');
    expect(type.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(type)).toEqual(['choose the cross-section type (a to k)']);
  });

  it('ties a typed problem to its box, reads the unit with it, and clears both when fixed', async () => {
    await mountEditor();
    const box = () => wrapper.find<HTMLInputElement>('input[data-test="field-slab.thickness"]').element;
    expect(accessibleName(box())).toEqual({ name: 'Structural thickness ts', source: 'label[for]' });
    expect(controlLabelled(wrapper.element, 'Structural thickness ts')).toBe(box());
    // described by its unit only while there is no problem
    expect(box().getAttribute('aria-invalid')).toBeNull();
    expect(document.getElementById(box().getAttribute('aria-describedby')!)?.textContent).toBe('in');

    await type('slab.thickness', '-2');
    expect(box().getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(box())).toEqual(['slab thickness must be greater than 0']);
    const ids = box().getAttribute('aria-describedby')!.split(' ');
    expect(ids.map((id) => document.getElementById(id)?.textContent)).toEqual(['in', 'slab thickness must be greater than 0']);
    expectAccessible(wrapper.element, 'slab thickness refused');

    await type('slab.thickness', '8.5');
    expect(box().getAttribute('aria-invalid')).toBeNull();
    expect(box().getAttribute('aria-describedby')!.split(' ')).toHaveLength(1);
    // a hint is a description too, but not a problem: the haunch's
    const haunch = wrapper.find('input[data-test="field-slab.haunch"]').element;
    expect(haunch.getAttribute('aria-invalid')).toBeNull();
    expect(haunch.getAttribute('aria-describedby')!.split(' ').map((id) => document.getElementById(id)?.textContent)).toEqual(['in', 'girder top to slab soffit']);
  });

  it('names the deck name box and marks it invalid until it is filled', async () => {
    await mountEditor();
    const name = controlLabelled(wrapper.element, 'Deck name') as HTMLInputElement;
    expect(name.getAttribute('data-test')).toBe('field-name');
    expect(name.getAttribute('aria-invalid')).toBe('true');
    expect(name.getAttribute('aria-required')).toBe('true');
    expect(announcedDescriptions(name)).toEqual(['deck name is required']);
    await type('name', 'Main span');
    expect(name.getAttribute('aria-invalid')).toBeNull();
    expect(name.getAttribute('aria-describedby')).toBeNull();
  });

  it('a bad plate of the plate calculator is marked beside its box, which says whose dimension it is', async () => {
    await mountEditor();
    await set(['sectionType'], 'a');
    await wrapper.find('[data-test="toggle-built-up"]').trigger('click');
    await flushPromises();
    const web = wrapper.find<HTMLInputElement>('input[data-test="plate-web-width"]');
    expect(accessibleName(web.element).name).toBe('Web depth');
    await web.trigger('focus');
    await web.setValue('0');
    await flushPromises();
    expect(web.element.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(web.element)).toEqual(['web depth must be a number greater than 0']);
    expectAccessible(wrapper.element, 'plate calculator with a bad web');
  });
});

// ---- sign-in ---------------------------------------------------------------------------------

async function withRouter(routes: RouteRecordRaw[], path: string) {
  const pinia = createPinia();
  setActivePinia(pinia);
  const elsewhere = (path: string, name: string): RouteRecordRaw => ({ path, name, component: { template: `<p>${name}</p>` } });
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [...routes, elsewhere('/training', 'training'), elsewhere('/decks/:deckId/versions/:versionNumber', 'deck-version'), elsewhere('/:any(.*)*', 'other')],
  });
  await router.push(path);
  await router.isReady();
  return { pinia, router };
}

describe('the sign-in form', () => {
  it('names both boxes by their labels and ties each refusal to its box', async () => {
    const { pinia, router } = await withRouter([
      { path: '/sign-in', name: 'sign-in', component: SignInView },
      { path: '/projects', name: 'projects', component: { template: '<p>projects</p>' } },
      { path: '/change-password', name: 'change-password', component: { template: '<p>change</p>' } },
    ], '/sign-in');
    const wrapper = mount(SignInView, { global: { plugins: [pinia, router] }, attachTo: document.body });
    await flushPromises();
    const root = wrapper.element;
    expectAccessible(root, 'sign-in, untouched');
    const email = controlLabelled(root, 'E-mail') as HTMLInputElement;
    const password = controlLabelled(root, 'Password') as HTMLInputElement;
    expect(email.getAttribute('data-test')).toBe('email');
    expect(password.type).toBe('password');

    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(fetchMock).not.toHaveBeenCalled();
    expect(email.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(email)).toEqual(['Enter your e-mail address.']);
    expect(announcedDescriptions(password)).toEqual(['Enter your password.']);
    expectAccessible(root, 'sign-in, both refused');

    // Editing a field takes its problem away, and its mark.
    await wrapper.find('input[data-test="email"]').setValue('designer-at-larchmont');
    await flushPromises();
    expect(email.getAttribute('aria-invalid')).toBeNull();
    expect(password.getAttribute('aria-invalid')).toBe('true');
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(announcedDescriptions(email)).toEqual(['This does not look like an e-mail address (name@firm.example).']);
    expectAccessible(root, 'sign-in, address refused');
    wrapper.unmount();
  });
});

// ---- the project form ------------------------------------------------------------------------

describe('the project form', () => {
  it('names every field, the units choice as a group, and ties the server’s problems to their fields', async () => {
    const draft = reactive(emptyDraft());
    const errors = reactive<Record<string, string | undefined>>({});
    const wrapper = mount(ProjectForm, { props: { draft, errors }, attachTo: document.body });
    await flushPromises();
    const root = wrapper.element.parentElement!;
    expectAccessible(root, 'project form');
    expect(controlLabelled(root, 'Name').getAttribute('data-test')).toBe('project-name');
    expect(controlLabelled(root, 'Notes').tagName).toBe('TEXTAREA');
    const units = root.querySelector('[data-test="project-units"]')!;
    expect(units.getAttribute('role')).toBe('radiogroup');
    expect(accessibleName(units)).toEqual({ name: 'Preferred units', source: 'aria-labelledby' });

    errors.name = 'Give the project a name.';
    errors.units = 'Choose US customary or SI units.';
    await flushPromises();
    const name = controlLabelled(root, 'Name');
    expect(name.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(name)).toEqual(['Give the project a name.']);
    expect(announcedDescriptions(units)).toEqual(['Choose US customary or SI units.']);
    expectAccessible(root, 'project form with problems');
    wrapper.unmount();
  });
});

// ---- training: a new exercise, and the trainee's answer -----------------------------------------

const person = { id: 3, name: 'Ines Instructor' };
const trainee = { id: 5, email: 'trainee@larchmont-ridge.example', name: 'Theo Brandt', firmId: 1, firmName: 'Larchmont Ridge Engineering', roles: ['trainee'], mustChangePassword: false };

describe('the new-exercise form', () => {
  it('names every field, the question’s details too, and ties its own checks to their fields', async () => {
    fetchMock.mockImplementation(async (url: string) => {
      if (url.startsWith('/api/projects')) return json({ projects: [{ id: 1, name: 'Quarry Creek Overpass', units: 'US', archived: false }] });
      if (url.startsWith('/api/training/questions'))
        return json({
          questions: [
            { id: 'ext-moment', title: 'Exterior girder moment', kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' } },
            { id: 'truck', title: 'The governing truck position', kind: 'truck-position', params: { girder: 1, line: 'lever-rule' } },
          ],
        });
      if (url.startsWith('/api/training/trainees')) return json({ trainees: [{ id: 5, name: 'Theo Brandt', email: trainee.email }] });
      return json({ error: { code: 'not_found', message: `no route ${url}`, details: [] } }, 404);
    });
    const { pinia, router } = await withRouter([{ path: '/training/new', name: 'training-new', component: TrainingNewView }], '/training/new');
    const wrapper = mount(TrainingNewView, { global: { plugins: [pinia, router] }, attachTo: document.body });
    await flushPromises();
    const root = wrapper.element;
    expect(root.querySelector('[data-test="factor-params"]')).not.toBeNull();
    expectAccessible(root, 'new exercise, factor question');
    const version = controlLabelled(root, 'Version');
    expect(version.getAttribute('role')).toBe('combobox');
    expect(controlLabelled(root, 'Tolerance (%)').getAttribute('role')).toBe('spinbutton');

    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(version.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(version)).toEqual(['Choose the deck version the exercise is about.']);
    expect(announcedDescriptions(controlLabelled(root, 'Trainees'))).toEqual(['Assign the exercise to at least one trainee.']);
    expectAccessible(root, 'new exercise refused');

    // The truck-position question's details: the girder number and the method.
    const question = controlLabelled(root, 'Question');
    expect(question.getAttribute('role')).toBe('combobox');
    await (wrapper.vm as unknown as { $: { setupState: { pickPreset(id: string): void } } }).$.setupState.pickPreset('truck');
    await flushPromises();
    expect(root.querySelector('[data-test="truck-params"]')).not.toBeNull();
    expectAccessible(root, 'new exercise, truck-position question');
    wrapper.unmount();
  });
});

describe('the answer form', () => {
  it('names the value, the placement boxes of each lane and every step box; ties the value’s and a step’s problem', async () => {
    const exercise = {
      id: 9,
      kind: 'truck-position',
      params: { girder: 1, line: 'lever-rule' },
      title: 'The governing truck position',
      question: 'Place the truck for the exterior girder and give the lever-rule factor.',
      instructions: '',
      tolerancePercent: 1,
      dueAt: '2026-12-20T17:00:00Z',
      overdue: false,
      project: { id: 1, name: 'Quarry Creek Overpass', units: 'US' },
      deck: { id: 4, name: 'Training deck' },
      version: { id: 40, number: 1 },
      createdBy: person,
      createdAt: '2026-12-01T10:00:00Z',
      openedToAll: null,
      // Invented roadway, in m: curbs 0.6 m inside the girder lines, 3.6 m lanes.
      roadway: { curbLeft: -0.6, curbRight: 14.1, laneWidth: 3.6, laneCount: 4, girderOffsets: [0, 2.9, 5.8, 8.7, 11.6, 14.5] },
      expected: null,
      caution: '',
      submissions: [],
    };
    fetchMock.mockImplementation(async (url: string) => {
      if (url.startsWith('/api/training/mine/9')) return json({ assignment: exercise });
      return json({ error: { code: 'not_found', message: `no route ${url}`, details: [] } }, 404);
    });
    const { pinia, router } = await withRouter([{ path: '/training/:exerciseId', name: 'training-exercise', component: TrainingExerciseView }], '/training/9');
    useAuthStore().me = trainee as never;
    const wrapper = mount(TrainingExerciseView, { props: { exerciseId: 9 }, global: { plugins: [pinia, router] }, attachTo: document.body });
    await flushPromises();
    const form = wrapper.find('[data-test="answer-form"]');
    expect(form.exists()).toBe(true);
    const root = form.element;
    const value = controlLabelled(root, 'Your value of the factor (lanes per girder)');
    expect(value.getAttribute('data-test')).toBe('answer-value');
    await wrapper.find('[data-test="add-step"]').trigger('click');
    await wrapper.find('[data-test="add-step"]').trigger('click');
    await flushPromises();
    expectAccessible(root, 'answer form with two steps');
    expect(accessibleName(root.querySelector('input[data-test="lane-left-0"]')!).name).toBe('Lane 1 left edge from girder 1 (ft)');
    expect(accessibleName(root.querySelector('input[data-test="step-label-1"]')!).name).toBe('Step 2: what it computes');

    // No value: the value box is refused.
    await wrapper.find('[data-test="submit-answer"]').trigger('click');
    await flushPromises();
    expect(value.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(value)).toEqual(['Enter your value of the factor.']);
    expectAccessible(root, 'answer without a value');

    // A value, but step 1 without a label: the step's label box is refused, the value no more.
    await wrapper.find('input[data-test="answer-value"]').setValue('0.76');
    await flushPromises();
    await wrapper.find('[data-test="submit-answer"]').trigger('click');
    await flushPromises();
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(false);
    expect(value.getAttribute('aria-invalid')).toBeNull();
    const step = root.querySelector('input[data-test="step-label-0"]')!;
    expect(step.getAttribute('aria-invalid')).toBe('true');
    expect(announcedDescriptions(step)).toEqual(['Step 1 needs a label (what it computes), or remove it.']);
    expectAccessible(root, 'answer with an unlabelled step');
    wrapper.unmount();
  });
});
