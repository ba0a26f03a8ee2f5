/**
 * Physical ranges of every deck quantity: what a slab-on-girder highway bridge can have.
 *
 * Units: internal SI base units (m, m², m⁴, Pa, N/m³; angles in degrees), as in
 * `shared/units.ts`. Messages state each bound in both SI and US customary units so that a
 * user of either system reads it in their own.
 *
 * Why: the schema's types alone let a deck through whose overhang is 1e308 m; the code
 * methods then size arrays from such numbers (design lanes from the roadway width) and the
 * process dies. Every length, count and stiffness therefore has a range, chosen wide enough for
 * any real deck and narrow enough that no computation grows without bound. The ranges are
 * not the formulas' ranges of applicability (Art. 4.6.2.2, checked and reported as findings
 * in `lrfd/applicability.ts`); they are much wider, and a deck outside them is not a bridge
 * but a typing error. The values are engineering judgement (common practice, no source).
 */
import { M_PER_FT, M_PER_IN, N_PER_KIP, PA_PER_KSI } from '../units.js';

/** A closed physical range [min, max] of one quantity, internal units. */
export interface PhysicalRange {
  min: number;
  max: number;
  /** How the bound is printed: which pair of display units. */
  kind: 'length' | 'dimension' | 'area' | 'inertia' | 'stress' | 'unitWeight' | 'none';
}

const KCF = N_PER_KIP / M_PER_FT ** 3;

/** Display pairs (SI, US) for each kind: factor = internal units per display unit. */
const DISPLAY: Record<PhysicalRange['kind'], { si: [string, number]; us: [string, number] } | null> = {
  length: { si: ['m', 1], us: ['ft', M_PER_FT] },
  dimension: { si: ['mm', 1e-3], us: ['in', M_PER_IN] },
  area: { si: ['mm²', 1e-6], us: ['in²', M_PER_IN ** 2] },
  inertia: { si: ['mm⁴', 1e-12], us: ['in⁴', M_PER_IN ** 4] },
  stress: { si: ['MPa', 1e6], us: ['ksi', PA_PER_KSI] },
  unitWeight: { si: ['kN/m³', 1e3], us: ['kcf', KCF] },
  none: null,
};

/** A number to about four significant figures, plain or in e-notation for large and small. */
function sig(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e7 || a < 1e-3) {
    const [m, e] = v.toExponential(3).split('e');
    return `${String(Number(m))}e${Number(e)}`;
  }
  return String(Number(v.toPrecision(4)));
}

/** A bound in both unit systems, e.g. "6 m (19.69 ft)". */
export function formatBound(value: number, kind: PhysicalRange['kind']): string {
  const d = DISPLAY[kind];
  if (!d) return sig(value);
  return `${sig(value / d.si[1])} ${d.si[0]} (${sig(value / d.us[1])} ${d.us[0]})`;
}

/** The physical ranges, internal units. */
export const PHYSICAL_LIMITS = {
  /** Centre-to-centre girder spacing: adjacent box beams (~0.9 m) to the widest girder decks. */
  girderSpacing: { min: 0.3, max: 8, kind: 'length' },
  /** Girder offsets in an offsets layout, from any reference. */
  girderOffset: { min: -200, max: 200, kind: 'length' },
  /** Whole deck width, edge to edge (girder spread plus overhangs). */
  deckWidth: { min: 0, max: 80, kind: 'length' },
  /** Overhang from the exterior girder's centreline to the deck edge. */
  overhang: { min: 0, max: 6, kind: 'length' },
  /** Barrier or curb (with sidewalk) width from the deck edge to its traffic face. */
  barrierWidth: { min: 0, max: 6, kind: 'length' },
  barrierHeight: { min: 0, max: 3, kind: 'length' },
  /** Structural slab thickness ts. */
  slabThickness: { min: 0.05, max: 1, kind: 'dimension' },
  haunch: { min: 0, max: 1, kind: 'dimension' },
  wearingSurface: { min: 0, max: 0.3, kind: 'dimension' },
  /** Girder area A. */
  girderArea: { min: 1e-4, max: 20, kind: 'area' },
  /** Girder moment of inertia I (and the diaphragm's, and J). */
  girderInertia: { min: 1e-7, max: 100, kind: 'inertia' },
  torsion: { min: 1e-10, max: 100, kind: 'inertia' },
  /** Girder centroid depth, eg, girder depth d, beam width b. */
  sectionDimension: { min: 0.01, max: 10, kind: 'dimension' },
  /** Number of cells of a multicell box. */
  cells: { min: 1, max: 40, kind: 'none' },
  /** Modulus of elasticity (timber and FRP to steel). */
  modulus: { min: 1e9, max: 250e9, kind: 'stress' },
  /** Concrete compressive strength f'c (low-strength to ultra-high-performance). */
  concreteStrength: { min: 10e6, max: 250e6, kind: 'stress' },
  /** Concrete unit weight wc (lightweight to heavyweight). */
  concreteUnitWeight: { min: 5e3, max: 40e3, kind: 'unitWeight' },
  /** Aggregate correction factor K1 of Art. 5.4.2.4. */
  K1: { min: 0.5, max: 2, kind: 'none' },
  /** Modular ratio n = E_girder / E_deck. */
  modularRatio: { min: 0.1, max: 20, kind: 'none' },
  /** Span length along the girders. */
  spanLength: { min: 1, max: 300, kind: 'length' },
  /** Diaphragm moment of inertia. */
  diaphragmInertia: { min: 1e-9, max: 10, kind: 'inertia' },
  /** Concrete diaphragm web width and depth below the slab. */
  diaphragmDimension: { min: 0.05, max: 5, kind: 'dimension' },
  /** Cross-frame chord and diagonal areas (a small angle to a heavy built-up member). */
  crossFrameArea: { min: 1e-4, max: 0.05, kind: 'area' },
  /** Cross-frame depth, chord centroid to chord centroid. */
  crossFrameDepth: { min: 0.2, max: 5, kind: 'dimension' },
  /** Load modifiers ηD, ηR, ηI: Art. 1.3.3–1.3.5 give values from 0.95 to 1.05. */
  loadModifier: { min: 0.95, max: 1.05, kind: 'none' },
} as const satisfies Record<string, PhysicalRange>;

/**
 * Largest number of design lanes any computation will lay out: a guard behind the deck-width
 * range (80 m gives 21 lanes of 12 ft), so that no array is ever sized from an unchecked number.
 */
export const MAX_DESIGN_LANES = 30;
