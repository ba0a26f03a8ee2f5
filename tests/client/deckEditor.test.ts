// @vitest-environment happy-dom
/**
 * The deck editor: the shared schema's messages appear beside the field as the user types,
 * and the units switch converts what is shown, never what is stored (internal SI).
 * Conversions: 1 ft = 0.3048 m, 1 in = 0.0254 m exactly (NIST SP 811, Appendix B).
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import DeckEditor from '@/components/deck/DeckEditor.vue';
import { useDeckStore } from '@/stores/useDeckStore';
import { deckTemplate } from '@/components/deck/deckTemplates';

let wrapper: VueWrapper;
let store: ReturnType<typeof useDeckStore>;

async function mountEditor(): Promise<void> {
  const pinia = createPinia();
  setActivePinia(pinia);
  store = useDeckStore();
  store.startNew(1, 'US', 'precast-one-span');
  wrapper = mount(DeckEditor, { global: { plugins: [pinia] }, attachTo: document.body });
  await flushPromises();
}

/** The editor with the new deck named, as a user names it first. */
async function mountNamedEditor(): Promise<void> {
  await mountEditor();
  await type('name', 'Main span');
}

function input(key: string) {
  const el = wrapper.find<HTMLInputElement>(`input[data-test="field-${key}"]`);
  if (!el.exists()) throw new Error(`no input for ${key}`);
  return el;
}

/** The message shown beside a field (ant-design's form item help text). */
function messageOf(key: string): string {
  const item = wrapper.find(`[data-field="${key}"]`);
  if (!item.exists()) throw new Error(`no form item for ${key}`);
  return item.find('.ant-form-item-explain').exists() ? item.find('.ant-form-item-explain').text() : '';
}

async function openPanel(key: string): Promise<void> {
  const panel = wrapper.find(`[data-test="panel-${key}"]`);
  if (!panel.find('.ant-collapse-content-active').exists()) {
    await panel.find('.ant-collapse-header').trigger('click');
    await flushPromises();
  }
}

async function type(key: string, text: string): Promise<void> {
  await input(key).trigger('focus');
  await input(key).setValue(text);
  await flushPromises();
}

beforeEach(async () => {
  document.body.innerHTML = '';
  await mountNamedEditor();
});

describe('a new deck', () => {
  it('starts with an empty name: it computes, and cannot be saved until it is named', async () => {
    document.body.innerHTML = '';
    await mountEditor();
    expect(input('name').element.value).toBe('');
    expect(input('name').attributes('placeholder')).toBe('e.g. Main span');
    expect(store.computable).toBe(true);
    expect(store.valid).toBe(false);
    expect(messageOf('name')).toContain('deck name is required');
    expect(wrapper.find('[data-test="deck-problems"]').text()).toContain('1 problem to fix before the deck can be saved');
    // another starting deck keeps the name typed so far, or none
    store.useTemplate('steel-three-span');
    await flushPromises();
    expect(store.draft.name).toBe('');
    await type('name', 'North approach');
    store.useTemplate('precast-one-span');
    await flushPromises();
    expect(store.draft.name).toBe('North approach');
    expect(store.valid).toBe(true);
  });
});

describe('a blank deck', () => {
  it('starts with every dimension empty, asks for each in words, and computes once they are typed', async () => {
    store.useTemplate('blank');
    await flushPromises();
    expect(store.computable).toBe(false);
    // Nothing of the deck before it is kept to compute or show.
    expect(store.lastValidDeck).toBeNull();
    expect(input('girders.spacing').element.value).toBe('');
    expect(store.draft.name).toBe('Main span');
    const messages = store.issues.map((i) => i.message);
    expect(messages).toContain('choose the cross-section type (a to k)');
    expect(messages).toContain('girder count must be a number');
    for (const m of messages) expect(m).not.toMatch(/Invalid input|undefined|NaN/);
    expect(wrapper.find('[data-test="section-type-none"]').exists()).toBe(true);
    // The blank deck has a template's shape: typing a template's values field by field computes.
    const filled = deckTemplate('precast-one-span').build() as unknown as Record<string, unknown>;
    const leaves = (o: unknown, path: (string | number)[] = []): [(string | number)[], unknown][] =>
      o !== null && typeof o === 'object' ? Object.entries(o).flatMap(([k, v]) => leaves(v, [...path, Array.isArray(o) ? Number(k) : k])) : [[path, o]];
    for (const [path, value] of leaves(filled)) if (path[0] !== 'name') store.setField(path, value);
    await flushPromises();
    expect(store.computable).toBe(true);
    expect(store.lastValidDeck).not.toBeNull();
  });
});

describe('validation beside each field', () => {
  it('starts from a valid deck with no problems shown', () => {
    expect(store.valid).toBe(true);
    expect(wrapper.find('[data-test="deck-problems"]').exists()).toBe(false);
  });

  it('names the slab thickness rule as the user types', async () => {
    await openPanel('slab');
    await type('slab.thickness', '');
    expect(messageOf('slab.thickness')).toContain('slab thickness must be a number');
    await type('slab.thickness', '-2');
    expect(messageOf('slab.thickness')).toContain('slab thickness must be greater than 0');
    await type('slab.thickness', 'eight');
    expect(messageOf('slab.thickness')).toContain('slab thickness must be a number');
    expect(store.valid).toBe(false);
    expect(wrapper.find('[data-test="deck-problems"]').text()).toContain('1 problem');
    await type('slab.thickness', '8.5');
    expect(messageOf('slab.thickness')).toBe('');
    expect(store.valid).toBe(true);
    // 8.5 in stored as 0.2159 m.
    expect(store.draft.slab.thickness).toBeRelativelyClose(0.2159, 1e-12);
  });

  it('refuses a single girder and a fractional girder count', async () => {
    await type('girders.count', '1');
    expect(messageOf('girders.count')).toContain('a deck needs at least 2 girders');
    await type('girders.count', '4.5');
    expect(messageOf('girders.count')).toContain('girder count must be a whole number');
  });

  it('names the girder that overlaps its neighbour in the table of offsets', async () => {
    await wrapper.find('[data-test="girder-layout-kind"] input[value="offsets"]').setValue(true);
    await flushPromises();
    expect(store.draft.girders.kind).toBe('offsets');
    // The table starts from the equal spacing: 0, 9.667, 19.333 … ft (shown to 3 decimals
    // as an engineer writes feet; the value kept has every digit, given in the tooltip).
    expect(input('girders.offsets.2').element.value).toBe('19.333');
    expect(input('girders.offsets.2').attributes('title')).toContain('the value kept is 19.33333 ft');
    expect(store.draft.girders.kind === 'offsets' && store.draft.girders.offsets[2]).toBeRelativelyClose(2 * (9 + 8 / 12) * 0.3048, 1e-12);
    await type('girders.offsets.2', '5');
    // Girder 3 moved to 5 ft, left of girder 2 at 9.667 ft: the message sits on girder 3.
    expect(messageOf('girders.offsets.2')).toContain('girder 3 must lie to the right of girder 2');
    expect(messageOf('girders.offsets.3')).toBe('');
    await type('girders.offsets.2', '19');
    expect(messageOf('girders.offsets.2')).toBe('');
    expect(store.valid).toBe(true);
    // Girder 4 (29 ft) moved to 15 ft, left of girder 3 at 19 ft.
    await type('girders.offsets.3', '15');
    expect(messageOf('girders.offsets.3')).toContain('girder 4 must lie to the right of girder 3');
  });

  it('says which section property the chosen type needs', async () => {
    store.setField(['sectionType'], 'f');
    await flushPromises();
    await openPanel('section');
    expect(messageOf('section.torsion')).toContain('section type f needs the torsional inertia J');
    expect(messageOf('section.width')).toContain('section type f needs the beam width b');
    await type('section.torsion', '300000');
    expect(messageOf('section.torsion')).toBe('');
  });

  it('reports a roadway narrower than one design lane', async () => {
    await type('girders.count', '2');
    await type('girders.spacing', '4');
    await type('overhangLeft', '2');
    await type('overhangRight', '2');
    expect(store.valid).toBe(false);
    expect(wrapper.find('[data-test="deck-problems"]').text()).toContain('narrower than one 12 ft design lane');
  });

  it('keeps the number of support lines equal to spans + 1 when spans are added', async () => {
    await openPanel('spans');
    await wrapper.find('[data-test="add-span"]').trigger('click');
    await flushPromises();
    expect(store.draft.spans).toHaveLength(2);
    expect(store.draft.supports).toHaveLength(3);
    expect(store.valid).toBe(true);
    expect(input('supports.2.skew').element.value).toBe('20');
  });
});

describe('units switch', () => {
  it('converts what is shown and leaves what is stored alone, both ways', async () => {
    await type('girders.spacing', '10');
    await input('girders.spacing').trigger('blur');
    const stored = store.draft.girders.kind === 'uniform' ? store.draft.girders.spacing : Number.NaN;
    expect(stored).toBeRelativelyClose(3.048, 1e-15);

    store.units = 'SI';
    await flushPromises();
    expect(input('girders.spacing').element.value).toBe('3.048');
    expect(wrapper.find('[data-field="girders.spacing"] .ant-input-group-addon').text()).toBe('m');
    expect(store.draft.girders.kind === 'uniform' && store.draft.girders.spacing).toBe(stored);

    store.units = 'US';
    await flushPromises();
    expect(input('girders.spacing').element.value).toBe('10');
    expect(store.draft.girders.kind === 'uniform' && store.draft.girders.spacing).toBe(stored);
  });

  it('round-trips a value typed in SI through US customary and back', async () => {
    store.units = 'SI';
    await flushPromises();
    await openPanel('slab');
    await type('slab.thickness', '215');
    await input('slab.thickness').trigger('blur');
    expect(store.draft.slab.thickness).toBeRelativelyClose(0.215, 1e-15);
    store.units = 'US';
    await flushPromises();
    // 215 mm / 25.4 = 8.464567 in, shown as 8.46 in (inches to 2 decimals) while the value
    // kept stays 215 mm exactly
    expect(input('slab.thickness').element.value).toBe('8.46');
    expect(input('slab.thickness').attributes('title')).toContain('the value kept is 8.464567 in');
    expect(store.draft.slab.thickness).toBeRelativelyClose(0.215, 1e-15);
    store.units = 'SI';
    await flushPromises();
    expect(input('slab.thickness').element.value).toBe('215');
    expect(store.draft.slab.thickness).toBeRelativelyClose(0.215, 1e-15);
  });

  it('shows every field of the deck converted, and switching never changes the stored deck', async () => {
    for (const panel of ['slab', 'section', 'materials', 'spans', 'diaphragms', 'policy']) await openPanel(panel);
    const before = JSON.stringify(store.draft);
    const us = wrapper.findAll('input[data-test^="field-"]').map((i) => (i.element as HTMLInputElement).value);
    store.units = 'SI';
    await flushPromises();
    const si = wrapper.findAll('input[data-test^="field-"]').map((i) => (i.element as HTMLInputElement).value);
    expect(si).not.toEqual(us);
    // A 110 ft span is 33.528 m; an 8 in slab 203.2 mm.
    expect(input('spans.0.length').element.value).toBe('33.528');
    expect(input('slab.thickness').element.value).toBe('203.2');
    store.units = 'US';
    await flushPromises();
    expect(wrapper.findAll('input[data-test^="field-"]').map((i) => (i.element as HTMLInputElement).value)).toEqual(us);
    expect(JSON.stringify(store.draft)).toBe(before);
  });
});

describe('plate calculator', () => {
  it('writes A, I and the centroid of a welded I into the deck', async () => {
    store.setField(['sectionType'], 'a');
    await flushPromises();
    await openPanel('section');
    await wrapper.find('[data-test="toggle-built-up"]').trigger('click');
    await flushPromises();
    await wrapper.find('[data-test="apply-built-up"]').trigger('click');
    await flushPromises();
    // Default plates 16 × 1, 60 × 9/16, 18 × 1 3/8 in: A = 74.5 in² (hand sum of the plates).
    expect(input('section.area').element.value).toBe('74.5');
    expect(store.draft.section.area).toBeRelativelyClose(74.5 * 0.0254 ** 2, 1e-12);
    expect(store.valid).toBe(true);
  });
});

describe('owner-policy switches', () => {
  it('each switch has a label tied to it; the rigid-section switch sets the deck policy', async () => {
    await openPanel('policy');
    for (const key of ['exteriorNotLessThanInterior', 'leverRuleWithoutMultiplePresence', 'floorAtEqualShare', 'rigidSectionAnyType']) {
      const sw = wrapper.find(`[data-test="policy-${key}"]`);
      const label = wrapper.find(`label[data-test="policy-label-${key}"]`);
      expect(sw.exists() && label.exists(), key).toBe(true);
      expect(label.attributes('for')).toBe(sw.attributes('id'));
    }
    // The commentary to AASHTO LRFD Art. 4.6.2.2.2d names types a, e, k; the label says so.
    expect(wrapper.find('label[data-test="policy-label-rigidSectionAnyType"]').text()).toContain('not only types a, e, k');
    expect(store.draft.policy?.rigidSectionAnyType ?? false).toBe(false);
    await wrapper.find('[data-test="policy-rigidSectionAnyType"]').trigger('click');
    await flushPromises();
    expect(store.draft.policy?.rigidSectionAnyType).toBe(true);
  });
});

describe('loads of the refined analysis', () => {
  it('offers the design truck alone (the default) or HL-93 with the lane load, and sets the deck field', async () => {
    await openPanel('policy');
    const group = wrapper.find('[data-test="refined-loading"]');
    expect(group.exists()).toBe(true);
    // the group is named by its heading (a screen reader reads the question with the choices)
    const labelId = group.attributes('aria-labelledby');
    expect(wrapper.find(`#${labelId}`).text()).toBe('Loads of the refined (grillage) analysis');
    expect(store.draft.refinedLoading ?? 'design-truck').toBe('design-truck');
    expect(wrapper.find('[data-test="refined-loading-hl93"]').text()).toContain('0.64 klf lane load in every loaded lane');
    await wrapper.find('[data-test="refined-loading-hl93"] input').trigger('change');
    await flushPromises();
    expect(store.draft.refinedLoading).toBe('hl93');
    expect(store.issues).toEqual([]);
    await wrapper.find('[data-test="refined-loading-truck"] input').trigger('change');
    await flushPromises();
    expect(store.draft.refinedLoading).toBe('design-truck');
  });
});

describe('design values', () => {
  // Sources: AASHTO LRFD (SI) Art. 3.6.1.1.1 and Figure 3.6.1.2.2-1 (3.6 m lanes, 1.8 m gauge,
  // 35/145/145 kN truck; from memory of the 4th edition 2007 SI); AASHTO LRFD Art. 3.6.1.1.1
  // (12 ft lanes), converted exactly (1 ft = 0.3048 m, NIST SP 811).
  it('a new deck in an SI project starts with the SI edition values; one in a US project with the converted US values', async () => {
    expect(store.draft.designValues).toBe('us-customary');
    document.body.innerHTML = '';
    const pinia = createPinia();
    setActivePinia(pinia);
    store = useDeckStore();
    store.startNew(1, 'SI', 'precast-one-span');
    wrapper = mount(DeckEditor, { global: { plugins: [pinia] }, attachTo: document.body });
    await flushPromises();
    expect(store.draft.designValues).toBe('si-edition');
    // another starting deck keeps the choice
    store.useTemplate('steel-three-span');
    expect(store.draft.designValues).toBe('si-edition');
  });

  it('switches between the SI edition and the converted US values; the lanes shown follow', async () => {
    await openPanel('policy');
    const group = wrapper.find('[data-test="design-values"]');
    expect(wrapper.find(`#${group.attributes('aria-labelledby')}`).text()).toBe('Design values');
    await wrapper.find('[data-test="design-values-si"] input').trigger('change');
    await flushPromises();
    expect(store.draft.designValues).toBe('si-edition');
    expect(store.issues).toEqual([]);
    store.units = 'SI';
    await flushPromises();
    const summary = wrapper.find('[data-test="design-values-summary"]').text();
    expect(summary).toContain('Design lane 3.600 m');
    expect(summary).toContain('35.0 kN, 145.0 kN, 145.0 kN');
    await openPanel('roadway');
    expect(wrapper.find('[data-test="design-lanes"]').text()).toContain('3.600 m');
    await wrapper.find('[data-test="design-values-us"] input').trigger('change');
    await flushPromises();
    expect(store.draft.designValues).toBe('us-customary');
    expect(wrapper.find('[data-test="design-values-summary"]').text()).toContain(`Design lane ${(12 * 0.3048).toFixed(3)} m`);
  });
});
