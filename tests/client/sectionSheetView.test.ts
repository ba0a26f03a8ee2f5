// @vitest-environment happy-dom
/**
 * The cross-section sheet component (SectionSheet.vue): it draws the deck's girders and
 * dimension texts, turns a drag of a lane strip or a wheel pair into transverse positions
 * through the sheet's one scale (x = x0 + (y − deckLeft)·scale, inverted; plane geometry,
 * hand derivation), studies a girder that is clicked, and says why a deck that cannot be
 * drawn is not drawn.
 */
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { assertDeck, type Deck } from '@shared/deck/schema';
import { deckGeometry } from '@shared/deck/geometry';
import { fromUs } from '@shared/units';
import { deckTemplate } from '@/components/deck/deckTemplates';
import SectionSheet from '@/components/scene/SectionSheet.vue';

const deck = assertDeck(deckTemplate('precast-one-span').build());
const g = deckGeometry(deck);
const lanes = [{ left: g.curbLeft, wheelOffset: fromUs.ft(2) }];

function mountSheet(d: Deck = deck) {
  return mount(SectionSheet, {
    props: { deck: d, lanes, laneWidth: fromUs.ft(12), gauge: fromUs.ft(6), studiedGirder: 1, selectedLane: 0, units: 'US' },
  });
}

/** Lays the SVG out on screen at `width` px, as the browser would at its viewBox width (960 when unmeasured). */
function placeOnScreen(svg: Element, left: number, width: number): void {
  (svg as SVGSVGElement).getBoundingClientRect = () => ({ left, top: 0, width, height: 400, right: left + width, bottom: 400, x: left, y: 0, toJSON: () => ({}) }) as DOMRect;
}

describe('the cross-section sheet', () => {
  it('draws G1..G6 with the studied girder marked, and the bays in ft', () => {
    const w = mountSheet();
    expect(w.findAll('[data-test="section-girder-label"]').map((t) => t.text())).toEqual(['G1', 'G2', 'G3', 'G4', 'G5', 'G6']);
    expect(w.find('[data-test="section-girder-2"]').attributes('data-studied')).toBe('true');
    expect(w.findAll('[data-test="dim-girders"]').map((t) => t.text())).toEqual(['3.500 ft', ...Array(5).fill('9.667 ft'), '3.500 ft']);
  });

  it('reports the transverse position under the pointer while a lane is dragged', async () => {
    const w = mountSheet();
    const svg = w.find('[data-test="section-sheet"]');
    const scale = Number(svg.attributes('data-scale'));
    // on screen at half its drawing width: one screen px is two drawing px
    placeOnScreen(svg.element, 100, 480);
    const band = w.find('[data-test="section-lane-1"]');
    const bandX = Number(band.attributes('x'));
    await band.trigger('pointerdown', { button: 0, clientX: 100 + bandX / 2, pointerId: 1 });
    await svg.trigger('pointermove', { clientX: 100 + bandX / 2 + 30, pointerId: 1 });
    await svg.trigger('pointerup', { pointerId: 1 });
    const grab = w.emitted('grab')?.[0]?.[0] as { lane: number; kind: string; y: number };
    const move = w.emitted('move')?.[0]?.[0] as { y: number };
    expect(grab.lane).toBe(0);
    expect(grab.kind).toBe('lane');
    expect(grab.y).toBeRelativelyClose(lanes[0].left, 1e-3);
    // 30 screen px = 60 drawing px = 60 / scale m
    expect(move.y - grab.y).toBeRelativelyClose(60 / scale, 1e-4); // data-scale is written to 4 decimals
    expect(w.emitted('release')).toHaveLength(1);
  });

  it('drags the wheels as wheels, and studies a girder that is clicked', async () => {
    const w = mountSheet();
    placeOnScreen(w.find('[data-test="section-sheet"]').element, 0, 960);
    await w.find('[data-test="section-wheels-1"]').trigger('pointerdown', { button: 0, clientX: 300, pointerId: 1 });
    expect((w.emitted('grab')?.[0]?.[0] as { kind: string }).kind).toBe('wheels');
    await w.find('[data-test="section-girder-4"]').trigger('click');
    expect(w.emitted('select-girder')?.[0]).toEqual([3]);
  });

  it('says why a deck cannot be drawn instead of drawing it', () => {
    const w = mountSheet({ ...deck, barrierLeft: { width: 9, height: 0.8 }, barrierRight: { width: 9, height: 0.8 } } as Deck);
    expect(w.find('[data-test="section-sheet"]').exists()).toBe(false);
    expect(w.find('[data-test="section-problem"]').text()).toContain('The cross-section cannot be drawn: the barriers leave no roadway between their inside faces.');
  });
});
