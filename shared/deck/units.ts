/**
 * Units of the deck's fields. A deck is stored in internal units (`shared/units.ts`); deck
 * files and forms may be in US customary or SI display units, converted here at the edge.
 *
 * US customary display units: layout lengths ft, slab and section dimensions in, A in²,
 * I and J in⁴, moduli and f'c ksi, unit weight kcf. SI: m, mm, mm², mm⁴, MPa, kN/m³.
 */
import { fromDisplay, toDisplay, type QuantityKind, type UnitSystem } from '../units.js';

/** Field path pattern ('*' matches any array index) → quantity kind. */
export const DECK_FIELD_KINDS: Record<string, QuantityKind> = {
  'girders.spacing': 'length',
  'girders.offsets.*': 'length',
  overhangLeft: 'length',
  overhangRight: 'length',
  'barrierLeft.width': 'length',
  'barrierRight.width': 'length',
  'barrierLeft.height': 'dimension',
  'barrierRight.height': 'dimension',
  'slab.thickness': 'dimension',
  'slab.haunch': 'dimension',
  'slab.wearingSurface': 'dimension',
  'section.area': 'area',
  'section.inertia': 'inertia',
  'section.centroidFromTop': 'dimension',
  'section.eg': 'dimension',
  'section.torsion': 'inertia',
  'section.depth': 'dimension',
  'section.width': 'dimension',
  'materials.deck.modulus': 'stress',
  'materials.deck.fc': 'stress',
  'materials.deck.unitWeight': 'unitWeight',
  'materials.girder.modulus': 'stress',
  'materials.girder.fc': 'stress',
  'materials.girder.unitWeight': 'unitWeight',
  'spans.*.length': 'length',
  'supports.*.skew': 'angle',
  'diaphragms.inertia': 'inertia',
  'diaphragms.modulus': 'stress',
  'diaphragms.width': 'dimension',
  'diaphragms.depth': 'dimension',
  'diaphragms.topChordArea': 'area',
  'diaphragms.bottomChordArea': 'area',
  'diaphragms.diagonalArea': 'area',
  'diaphragms.frameDepth': 'dimension',
};

/** The quantity kind of a deck field, or undefined for a field without units. */
export function deckFieldKind(path: (string | number)[]): QuantityKind | undefined {
  const key = path.map((p) => (typeof p === 'number' ? '*' : p)).join('.');
  return DECK_FIELD_KINDS[key];
}

function mapNumbers(value: unknown, path: (string | number)[], fn: (v: number, kind: QuantityKind) => number): unknown {
  if (typeof value === 'number') {
    const kind = deckFieldKind(path);
    return kind ? fn(value, kind) : value;
  }
  if (Array.isArray(value)) return value.map((v, i) => mapNumbers(v, [...path, i], fn));
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = mapNumbers(v, [...path, k], fn);
    return out;
  }
  return value;
}

/**
 * A deck (or part-filled form) written in `system`'s display units → internal units.
 * Fields that are not numbers are left as they are, so validation can report them.
 */
export function deckFromDisplay<T>(deck: T, system: UnitSystem): T {
  return mapNumbers(deck, [], (v, kind) => fromDisplay(v, kind, system)) as T;
}

/** A deck in internal units → `system`'s display units. */
export function deckToDisplay<T>(deck: T, system: UnitSystem): T {
  return mapNumbers(deck, [], (v, kind) => toDisplay(v, kind, system)) as T;
}
