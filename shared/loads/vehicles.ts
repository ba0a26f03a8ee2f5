/**
 * HL-93 vehicular live load and the fatigue truck (AASHTO LRFD Art. 3.6.1.2 and 3.6.1.4).
 *
 * Units: internal SI (shared/units.ts). Axle weights are whole-axle forces in N (two wheels
 * of half the weight each, `gauge` apart); axle positions are m behind the front axle;
 * the lane load is N/m over a width of 10 ft. The code's values are printed in kip and ft
 * and are converted here once, through the named conversions.
 *
 * - Design truck: 8, 32, 32 kip; 14 ft from the front to the middle axle; the rear spacing
 *   varies from 14 ft to 30 ft and is chosen to give the extreme effect (Art. 3.6.1.2.2,
 *   Figure 3.6.1.2.2-1). Transverse wheel spacing 6 ft.
 * - Design tandem: two 25 kip axles 4 ft apart, wheels 6 ft apart (Art. 3.6.1.2.3).
 * - Design lane load: 0.64 klf uniformly distributed over a 10 ft width (Art. 3.6.1.2.4).
 * - Fatigue truck: one design truck with a constant 30 ft rear spacing (Art. 3.6.1.4.1).
 *
 * The SI edition's own values (AASHTO LRFD (SI), the same articles; from memory of the 4th
 * edition 2007 SI and earlier, the truck, tandem and lane load as a scanned page of that
 * edition's Figure 3.6.1.2.2-1 and Art. 3.6.1.2.3–3.6.1.2.4 prints them; the fatigue truck's
 * 9000 mm from memory only) are the `SI_` vehicles below: 35, 145, 145 kN at 4300 mm, then
 * 4300–9000 mm; 2 × 110 kN at 1200 mm; 9.3 N/mm over 3000 mm; 1800 mm gauge; fatigue truck
 * with a constant 9000 mm rear spacing. They are not conversions of the US values (8 kip is
 * 35.6 kN, 14 ft is 4.267 m). Which set a deck uses is `designValuesOf(deck)` (designValues.ts).
 */
import { DeckInputError } from '../deck/schema.js';
import { fromUs, toUs } from '../units.js';

export interface Axle {
  /** Whole-axle weight (both wheels), N. */
  weight: number;
  /** Distance behind the front axle, m (the front axle is at 0). */
  position: number;
}

export interface Vehicle {
  /** 'design truck', 'design tandem', 'fatigue truck'. */
  name: string;
  /** Axles, front first, positions non-decreasing. */
  axles: Axle[];
  /** Transverse wheel spacing, m: 6 ft (Art. 3.6.1.2.2). */
  gauge: number;
  /** The spacing between axles[axleIndex-1] and axles[axleIndex] may vary in [min, max] m. */
  variableSpacing?: { axleIndex: number; min: number; max: number };
}

/** Transverse spacing of the wheels of the design truck and tandem, 6 ft (Art. 3.6.1.2.2). */
export const WHEEL_GAUGE = fromUs.ft(6);

/**
 * HL-93 design truck (Art. 3.6.1.2.2): 8 kip front axle, 32 kip middle axle 14 ft behind it,
 * 32 kip rear axle 14 ft to 30 ft behind the middle axle. Stored with the 14 ft rear spacing
 * and the variable range [14 ft, 30 ft].
 */
export const DESIGN_TRUCK: Vehicle = Object.freeze({
  name: 'design truck',
  axles: Object.freeze([
    Object.freeze({ weight: fromUs.kip(8), position: 0 }),
    Object.freeze({ weight: fromUs.kip(32), position: fromUs.ft(14) }),
    Object.freeze({ weight: fromUs.kip(32), position: fromUs.ft(28) }),
  ]) as Axle[],
  gauge: WHEEL_GAUGE,
  variableSpacing: Object.freeze({ axleIndex: 2, min: fromUs.ft(14), max: fromUs.ft(30) }),
}) as Vehicle;

/** HL-93 design tandem (Art. 3.6.1.2.3): a pair of 25 kip axles 4 ft apart. */
export const DESIGN_TANDEM: Vehicle = Object.freeze({
  name: 'design tandem',
  axles: Object.freeze([
    Object.freeze({ weight: fromUs.kip(25), position: 0 }),
    Object.freeze({ weight: fromUs.kip(25), position: fromUs.ft(4) }),
  ]) as Axle[],
  gauge: WHEEL_GAUGE,
}) as Vehicle;

/** Fatigue truck (Art. 3.6.1.4.1): one design truck with a constant 30 ft rear spacing. */
export const FATIGUE_TRUCK: Vehicle = Object.freeze({
  name: 'fatigue truck',
  axles: Object.freeze([
    Object.freeze({ weight: fromUs.kip(8), position: 0 }),
    Object.freeze({ weight: fromUs.kip(32), position: fromUs.ft(14) }),
    Object.freeze({ weight: fromUs.kip(32), position: fromUs.ft(44) }),
  ]) as Axle[],
  gauge: WHEEL_GAUGE,
}) as Vehicle;

/** Design lane load, 0.64 klf (Art. 3.6.1.2.4), N/m. */
export const DESIGN_LANE_LOAD = fromUs.klf(0.64);

/** Transverse width over which the design lane load is spread, 10 ft (Art. 3.6.1.2.4), m. */
export const LANE_LOAD_WIDTH = fromUs.ft(10);

/** SI edition (Art. 3.6.1.2.2): wheel gauge 1800 mm. */
export const SI_WHEEL_GAUGE = 1.8;

const axle = (kN: number, position: number): Axle => Object.freeze({ weight: kN * 1000, position });

/** SI edition design truck (Art. 3.6.1.2.2): 35, 145, 145 kN; 4300 mm, then 4300 mm to 9000 mm. */
export const SI_DESIGN_TRUCK: Vehicle = Object.freeze({
  name: 'design truck',
  axles: Object.freeze([axle(35, 0), axle(145, 4.3), axle(145, 8.6)]) as Axle[],
  gauge: SI_WHEEL_GAUGE,
  variableSpacing: Object.freeze({ axleIndex: 2, min: 4.3, max: 9.0 }),
}) as Vehicle;

/** SI edition design tandem (Art. 3.6.1.2.3): a pair of 110 kN axles 1200 mm apart. */
export const SI_DESIGN_TANDEM: Vehicle = Object.freeze({
  name: 'design tandem',
  axles: Object.freeze([axle(110, 0), axle(110, 1.2)]) as Axle[],
  gauge: SI_WHEEL_GAUGE,
}) as Vehicle;

/** SI edition fatigue truck (Art. 3.6.1.4.1): the design truck with a constant 9000 mm rear spacing. */
export const SI_FATIGUE_TRUCK: Vehicle = Object.freeze({
  name: 'fatigue truck',
  axles: Object.freeze([axle(35, 0), axle(145, 4.3), axle(145, 4.3 + 9.0)]) as Axle[],
  gauge: SI_WHEEL_GAUGE,
}) as Vehicle;

/** SI edition design lane load (Art. 3.6.1.2.4): 9.3 N/mm, N/m. */
export const SI_DESIGN_LANE_LOAD = 9300;
/** SI edition width of the design lane load (Art. 3.6.1.2.4): 3000 mm, m. */
export const SI_LANE_LOAD_WIDTH = 3.0;

/** Total weight of a vehicle, N. */
export function vehicleWeight(v: Vehicle): number {
  return v.axles.reduce((s, a) => s + a.weight, 0);
}

/**
 * The vehicle with its variable spacing fixed at `spacing` (m). The axles behind the variable
 * gap move with it; the result has no `variableSpacing`.
 * Throws `DeckInputError` (path ['axleSpacing']) when the vehicle has no variable spacing,
 * or when `spacing` is not finite or lies outside [min, max] (a relative tolerance of 1e-9
 * admits the limits themselves after a unit round trip).
 */
export function withAxleSpacing(v: Vehicle, spacing: number): Vehicle {
  const vs = v.variableSpacing;
  if (!vs) {
    throw new DeckInputError(['axleSpacing'], `the ${v.name} has no variable axle spacing`);
  }
  if (!Number.isFinite(spacing)) {
    throw new DeckInputError(['axleSpacing'], 'axle spacing must be a finite number of metres');
  }
  const tol = 1e-9 * vs.max;
  if (spacing < vs.min - tol || spacing > vs.max + tol) {
    throw new DeckInputError(
      ['axleSpacing'],
      `the ${v.name}'s variable axle spacing must lie between ${toUs.ft(vs.min).toFixed(2)} ft and ${toUs.ft(vs.max).toFixed(2)} ft ` +
        `(${vs.min.toFixed(4)} m to ${vs.max.toFixed(4)} m); got ${toUs.ft(spacing).toFixed(2)} ft`,
    );
  }
  const s = Math.min(Math.max(spacing, vs.min), vs.max);
  const k = vs.axleIndex;
  const current = v.axles[k].position - v.axles[k - 1].position;
  const shift = s - current;
  return {
    name: v.name,
    axles: v.axles.map((a, i) => ({ weight: a.weight, position: i >= k ? a.position + shift : a.position })),
    gauge: v.gauge,
  };
}
