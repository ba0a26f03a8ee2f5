/**
 * Starting points for a new deck. Each is written in US customary display units (the deck
 * field units of shared/deck/units.ts: ft, in, in², in⁴, ksi, kcf) and converted to internal
 * units with the product's own edge conversion. The decks are invented examples for a
 * designer to edit, not published designs. The blank deck has the shape of a deck (one span on
 * two supports, equal spacing) and no dimension at all: every number is typed from the
 * drawings; only the code's own defaults are filled in (K1 = 1, Art. 5.4.2.4; load modifiers
 * 1.0, Art. 1.3.2; every owner policy off).
 */
import type { DeckInput } from '@shared/deck/schema';
import { deckFromDisplay } from '@shared/deck/units';
import { builtUpISection } from './builtUpSection';

export type DeckTemplateKey = 'blank' | 'precast-one-span' | 'steel-three-span' | 'steel-wide-twelve';

export interface DeckTemplate {
  key: DeckTemplateKey;
  title: string;
  description: string;
  build: () => DeckInput;
}

/** Built-up plate girder (inches in, inches out: the plate arithmetic is unit-free). */
const plateGirderIn = builtUpISection({
  topFlange: { width: 16, thickness: 1 },
  web: { width: 60, thickness: 0.5625 },
  bottomFlange: { width: 18, thickness: 1.375 },
});

const wideGirderIn = builtUpISection({
  topFlange: { width: 14, thickness: 0.875 },
  web: { width: 48, thickness: 0.5 },
  bottomFlange: { width: 16, thickness: 1.25 },
});

function fromUs(deck: Record<string, unknown>): DeckInput {
  return deckFromDisplay(structuredClone(deck), 'US') as unknown as DeckInput;
}

/** A deck with no dimension typed yet (undefined numbers: the editor asks for each). */
function blankDeck(): DeckInput {
  const none = undefined as unknown as number;
  const concrete = { kind: 'concrete', fc: none, unitWeight: none, K1: 1, modulusEquation: 'current' };
  return {
    name: '',
    sectionType: undefined,
    girders: { kind: 'uniform', count: none, spacing: none },
    overhangLeft: none,
    overhangRight: none,
    barrierLeft: { width: none, height: none },
    barrierRight: { width: none, height: none },
    slab: { thickness: none, haunch: none, wearingSurface: none },
    section: {},
    materials: { deck: { ...concrete }, girder: { ...concrete } },
    spans: [{ length: none }],
    continuous: false,
    supports: [{ skew: none }, { skew: none }],
    diaphragms: { type: 'none' },
    policy: { exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: false },
    loadModifiers: { ductility: 1, redundancy: 1, importance: 1 },
  } as unknown as DeckInput;
}

export const DECK_TEMPLATES: DeckTemplate[] = [
  {
    key: 'blank',
    title: 'Blank deck',
    description: 'One span on two supports with every dimension empty: enter the deck from its drawings.',
    build: blankDeck,
  },
  {
    key: 'precast-one-span',
    title: 'Precast bulb-tee girders, one span',
    description: 'Six bulb-tee girders at 9 ft 8 in, a 110 ft simple span, 20° skew, 8 in slab.',
    build: () =>
      fromUs({
        name: 'Main span',
        sectionType: 'k',
        girders: { kind: 'uniform', count: 6, spacing: 9 + 8 / 12 },
        overhangLeft: 3.5,
        overhangRight: 3.5,
        barrierLeft: { width: 1.5, height: 34 },
        barrierRight: { width: 1.5, height: 34 },
        slab: { thickness: 8, haunch: 0, wearingSurface: 0.5 },
        section: { area: 767, inertia: 545894, centroidFromTop: 35.4, depth: 72 },
        materials: {
          deck: { kind: 'concrete', fc: 4, unitWeight: 0.15, K1: 1, modulusEquation: 'pre-2015' },
          girder: { kind: 'concrete', fc: 6, unitWeight: 0.15, K1: 1, modulusEquation: 'pre-2015' },
        },
        spans: [{ length: 110 }],
        continuous: false,
        supports: [{ skew: 20 }, { skew: 20 }],
        diaphragms: { type: 'concrete-diaphragms', atSupports: true, intermediatePerSpan: 1, width: 10, depth: 48 },
        policy: { exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: false },
        loadModifiers: { ductility: 1, redundancy: 1, importance: 1 },
      }),
  },
  {
    key: 'steel-three-span',
    title: 'Steel plate girders, three continuous spans',
    description: 'Five welded plate girders at 10 ft, 120–150–120 ft continuous, cross-frames, square supports.',
    build: () =>
      fromUs({
        name: 'Three-span unit',
        sectionType: 'a',
        girders: { kind: 'uniform', count: 5, spacing: 10 },
        overhangLeft: 3.5,
        overhangRight: 3.5,
        barrierLeft: { width: 1.5, height: 34 },
        barrierRight: { width: 1.5, height: 34 },
        slab: { thickness: 8.5, haunch: 2, wearingSurface: 0 },
        section: {
          area: plateGirderIn.area,
          inertia: plateGirderIn.inertia,
          centroidFromTop: plateGirderIn.centroidFromTop,
          depth: plateGirderIn.depth,
          torsion: plateGirderIn.torsion,
        },
        materials: {
          deck: { kind: 'concrete', fc: 4, unitWeight: 0.15, K1: 1, modulusEquation: 'current' },
          girder: { kind: 'modulus', modulus: 29000 },
        },
        spans: [{ length: 120 }, { length: 150 }, { length: 120 }],
        continuous: true,
        supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }, { skew: 0 }],
        diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 4, topChordArea: 3.75, bottomChordArea: 3.75, diagonalArea: 2.86, frameDepth: 40 },
        policy: { exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: false },
        loadModifiers: { ductility: 1, redundancy: 1, importance: 1 },
      }),
  },
  {
    key: 'steel-wide-twelve',
    title: 'Wide steel deck, twelve girders',
    description: 'Twelve plate girders at 8 ft carrying seven design lanes, one 100 ft span, 15° skew.',
    build: () =>
      fromUs({
        name: 'Wide span',
        sectionType: 'a',
        girders: { kind: 'uniform', count: 12, spacing: 8 },
        overhangLeft: 3,
        overhangRight: 3,
        barrierLeft: { width: 1.5, height: 34 },
        barrierRight: { width: 1.5, height: 34 },
        slab: { thickness: 8, haunch: 1.5, wearingSurface: 0 },
        section: {
          area: wideGirderIn.area,
          inertia: wideGirderIn.inertia,
          centroidFromTop: wideGirderIn.centroidFromTop,
          depth: wideGirderIn.depth,
          torsion: wideGirderIn.torsion,
        },
        materials: {
          deck: { kind: 'concrete', fc: 4, unitWeight: 0.15, K1: 1, modulusEquation: 'current' },
          girder: { kind: 'modulus', modulus: 29000 },
        },
        spans: [{ length: 100 }],
        continuous: false,
        supports: [{ skew: 15 }, { skew: 15 }],
        diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 3, topChordArea: 3.75, bottomChordArea: 3.75, diagonalArea: 2.86, frameDepth: 36 },
        policy: { exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: false },
        loadModifiers: { ductility: 1, redundancy: 1, importance: 1 },
      }),
  },
];

export function deckTemplate(key: DeckTemplateKey): DeckTemplate {
  const t = DECK_TEMPLATES.find((d) => d.key === key);
  if (!t) throw new Error(`no deck template named ${key}`);
  return t;
}
