/**
 * Demo decks of the invented projects, written in the display units an engineer of each
 * project would use and converted at the edge. Invented structures for the demo only —
 * not published examples and not checks of the engineering.
 */
import { deckFromDisplay } from '../../shared/deck/units.js';
import { assertDeck, type Deck } from '../../shared/deck/schema.js';

/** Quarry Creek Overpass: one 110 ft span, six precast bulb-tees at 9'-8", 20° skew (US customary). */
const quarryCreekUs = {
  name: 'Main span — six bulb-tees',
  sectionType: 'k',
  girders: { kind: 'uniform', count: 6, spacing: 9.6667 },
  overhangLeft: 3.5,
  overhangRight: 3.5,
  barrierLeft: { width: 1.5, height: 34 },
  barrierRight: { width: 1.5, height: 34 },
  slab: { thickness: 8, haunch: 1, wearingSurface: 0.5 },
  section: { area: 767, inertia: 545894, centroidFromTop: 35.4, depth: 72 },
  materials: {
    deck: { kind: 'concrete', fc: 4, unitWeight: 0.15 },
    girder: { kind: 'concrete', fc: 6, unitWeight: 0.15 },
  },
  spans: [{ length: 110 }],
  continuous: false,
  supports: [{ skew: 20 }, { skew: 20 }],
  diaphragms: { type: 'concrete-diaphragms', atSupports: true, intermediatePerSpan: 1, width: 10, depth: 54 }, // in
};

/** Ashgrove Street Viaduct: three continuous spans of steel plate girders, 35° skew (SI). */
const ashgroveSi = {
  name: 'Three-span steel girders — existing width',
  sectionType: 'a',
  girders: { kind: 'uniform', count: 5, spacing: 3.0 },
  overhangLeft: 1.0,
  overhangRight: 1.0,
  barrierLeft: { width: 0.45, height: 810 },
  barrierRight: { width: 0.45, height: 810 },
  slab: { thickness: 225, haunch: 50, wearingSurface: 0 },
  section: { area: 45000, inertia: 2.4e10, centroidFromTop: 820, torsion: 4.5e6, depth: 1700 },
  materials: {
    deck: { kind: 'concrete', fc: 30, unitWeight: 23.5 },
    girder: { kind: 'modulus', modulus: 200000 },
  },
  spans: [{ length: 36 }, { length: 45 }, { length: 36 }],
  continuous: true,
  supports: [{ skew: 35 }, { skew: 35 }, { skew: 35 }, { skew: 35 }],
  // X cross-frames of equal-leg angles: chords ~L100×100×10 (1920 mm²), diagonals ~L90×90×8 (1390 mm²), 1100 mm deep
  diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 3, topChordArea: 1920, bottomChordArea: 1920, diagonalArea: 1390, frameDepth: 1100 },
};

export function demoDecks(): { project: string; deck: Deck; message: string }[] {
  return [
    { project: 'Quarry Creek Overpass', deck: assertDeck(deckFromDisplay(quarryCreekUs, 'US')), message: 'Preliminary layout from the type study' },
    { project: 'Ashgrove Street Viaduct', deck: assertDeck(deckFromDisplay(ashgroveSi, 'SI')), message: 'Existing cross-section as surveyed' },
  ];
}
