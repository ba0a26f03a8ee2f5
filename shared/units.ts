/**
 * Deckshare's one internal unit system: SI base units — length m, force N, stress Pa,
 * moment N·m, line load N/m, unit weight N/m³, area m², second moment of area m⁴ —
 * and angles in degrees. Everything inside `shared/` computes in these units.
 *
 * Conversion happens only at the edges (forms, display, reports, deck files) through the
 * named helpers below. Formulas that the AASHTO LRFD specifications print in US customary
 * form (S in ft, ts in in, Kg in in⁴) are fed through `toUs(...)`, never with a stray 12.
 *
 * Conversion constants are exact by definition (international foot and pound-force):
 * 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N.
 */

export const M_PER_FT = 0.3048;
export const M_PER_IN = 0.0254;
export const N_PER_KIP = 4448.2216152605;
export const PA_PER_KSI = N_PER_KIP / (M_PER_IN * M_PER_IN);
export const PA_PER_MPA = 1e6;

/** The kinds of quantity a deck or a result holds; each has one display unit per system. */
export type QuantityKind =
  | 'length' // layout lengths: spans, spacings, overhangs
  | 'dimension' // thicknesses and section dimensions
  | 'area'
  | 'lengthSquared' // squares of layout lengths (Σx² of the rigid-section check): ft², m²
  | 'inertia' // second moment of area, torsion constant, Kg
  | 'stress' // moduli, f'c
  | 'unitWeight'
  | 'force'
  | 'moment'
  | 'lineLoad'
  | 'angle'
  | 'none';

export type UnitSystem = 'US' | 'SI';

export interface DisplayUnit {
  /** Symbol shown to users, e.g. "ft" or "kN·m". */
  symbol: string;
  /** Internal (SI base) units per one display unit. */
  factor: number;
}

const KIP_PER_FT3 = N_PER_KIP / M_PER_FT ** 3;

export const DISPLAY_UNITS: Record<UnitSystem, Record<QuantityKind, DisplayUnit>> = {
  US: {
    length: { symbol: 'ft', factor: M_PER_FT },
    dimension: { symbol: 'in', factor: M_PER_IN },
    area: { symbol: 'in²', factor: M_PER_IN ** 2 },
    lengthSquared: { symbol: 'ft²', factor: M_PER_FT ** 2 },
    inertia: { symbol: 'in⁴', factor: M_PER_IN ** 4 },
    stress: { symbol: 'ksi', factor: PA_PER_KSI },
    unitWeight: { symbol: 'kcf', factor: KIP_PER_FT3 },
    force: { symbol: 'kip', factor: N_PER_KIP },
    moment: { symbol: 'kip·ft', factor: N_PER_KIP * M_PER_FT },
    lineLoad: { symbol: 'kip/ft', factor: N_PER_KIP / M_PER_FT },
    angle: { symbol: '°', factor: 1 },
    none: { symbol: '', factor: 1 },
  },
  SI: {
    length: { symbol: 'm', factor: 1 },
    dimension: { symbol: 'mm', factor: 1e-3 },
    area: { symbol: 'mm²', factor: 1e-6 },
    lengthSquared: { symbol: 'm²', factor: 1 },
    inertia: { symbol: 'mm⁴', factor: 1e-12 },
    stress: { symbol: 'MPa', factor: PA_PER_MPA },
    unitWeight: { symbol: 'kN/m³', factor: 1e3 },
    force: { symbol: 'kN', factor: 1e3 },
    moment: { symbol: 'kN·m', factor: 1e3 },
    lineLoad: { symbol: 'kN/m', factor: 1e3 },
    angle: { symbol: '°', factor: 1 },
    none: { symbol: '', factor: 1 },
  },
};

/** Internal value → the display unit of `kind` in `system`. */
export function toDisplay(value: number, kind: QuantityKind, system: UnitSystem): number {
  return value / DISPLAY_UNITS[system][kind].factor;
}

/** Display value in `system` → internal value. */
export function fromDisplay(value: number, kind: QuantityKind, system: UnitSystem): number {
  return value * DISPLAY_UNITS[system][kind].factor;
}

export function unitSymbol(kind: QuantityKind, system: UnitSystem): string {
  return DISPLAY_UNITS[system][kind].symbol;
}

/**
 * Named US customary conversions for the code's empirical formulas, which are printed in
 * ft, in, in⁴, kip and ksi. Each takes an internal (SI) value.
 */
export const toUs = {
  ft: (m: number) => m / M_PER_FT,
  in: (m: number) => m / M_PER_IN,
  in2: (m2: number) => m2 / M_PER_IN ** 2,
  in4: (m4: number) => m4 / M_PER_IN ** 4,
  kip: (n: number) => n / N_PER_KIP,
  kipFt: (nm: number) => nm / (N_PER_KIP * M_PER_FT),
  klf: (nPerM: number) => nPerM / (N_PER_KIP / M_PER_FT),
  ksi: (pa: number) => pa / PA_PER_KSI,
  kcf: (nPerM3: number) => nPerM3 / KIP_PER_FT3,
} as const;

/** Named conversions from US customary values to internal (SI) values. */
export const fromUs = {
  ft: (ft: number) => ft * M_PER_FT,
  in: (inch: number) => inch * M_PER_IN,
  in2: (in2: number) => in2 * M_PER_IN ** 2,
  in4: (in4: number) => in4 * M_PER_IN ** 4,
  kip: (kip: number) => kip * N_PER_KIP,
  kipFt: (kipFt: number) => kipFt * N_PER_KIP * M_PER_FT,
  klf: (klf: number) => klf * (N_PER_KIP / M_PER_FT),
  ksi: (ksi: number) => ksi * PA_PER_KSI,
  kcf: (kcf: number) => kcf * KIP_PER_FT3,
} as const;
