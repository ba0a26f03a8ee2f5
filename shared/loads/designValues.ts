/**
 * The design values of a deck's live loads and lanes: one object for every consumer (design
 * lanes, wheel placement, the lever rule and rigid-section check, the beam-line envelopes, the
 * refined run, the workspace), chosen by the deck's `designValues` field.
 *
 * Units: internal SI (shared/units.ts): lengths m, axle weights N, the lane load N/m. The lane
 * rule keeps the unit the code writes it in (ft or m) so that its tests are made on the
 * code's own numbers.
 *
 * - 'us-customary' (the default; stored decks without the field): AASHTO LRFD, the US
 *   customary edition's values converted exactly to SI units: 12 ft design lanes, two lanes of
 *   w/2 from 20 ft to 24 ft (Art. 3.6.1.1.1); 6 ft gauge, wheel centres 2 ft from the lane
 *   edge and 1 ft from the curb face for the deck overhang (Art. 3.6.1.3.1); the 8/32/32 kip
 *   design truck, 2 × 25 kip tandem, 0.64 klf over 10 ft, fatigue truck with 30 ft rear
 *   spacing (Art. 3.6.1.2.2–3.6.1.2.4, 3.6.1.4.1); two trucks with 14 ft rear spacings at
 *   least 50 ft apart (Art. 3.6.1.3.1).
 * - 'si-edition': AASHTO LRFD (SI), the SI edition's own values (the same articles; from
 *   memory of the 4th edition 2007 SI and earlier): 3600 mm lanes, INT(w/3600 mm), two lanes
 *   of w/2 from 6000 to 7200 mm; 1800 mm gauge, 600 mm from the lane edge, 300 mm from the
 *   curb face for the deck overhang; 35/145/145 kN at 4300 mm then 4300–9000 mm; 2 × 110 kN
 *   at 1200 mm; 9.3 N/mm over 3000 mm; fatigue truck with a constant 9000 mm rear spacing; two
 *   trucks with 4300 mm between the 145 kN axles and at least 15 000 mm apart. The truck,
 *   tandem, lane load, gauge, 600/300 mm and 3600 mm lane were checked against a scanned page
 *   of the SI edition (Figure 3.6.1.2.2-1, Art. 3.6.1.2.3 and 3.6.1.2.4, © 2008); the 15 m
 *   headway against a secondary page that gives "50 ft (15 m)"; the lane-count rule and the
 *   fatigue truck's 9000 mm are from memory only.
 *
 * The empirical formulas of Art. 4.6.2.2 are not design values: they stay in US customary
 * units inside (shared/lrfd/formula.ts) whichever set a deck uses.
 */
import type { DesignValuesName } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { fromUs, toUs } from '../units.js';
import { lengthInText as len, quantityInText as q } from '../quantities/inText.js';
import {
  DESIGN_LANE_LOAD,
  DESIGN_TANDEM,
  DESIGN_TRUCK,
  FATIGUE_TRUCK,
  LANE_LOAD_WIDTH,
  SI_DESIGN_LANE_LOAD,
  SI_DESIGN_TANDEM,
  SI_DESIGN_TRUCK,
  SI_FATIGUE_TRUCK,
  SI_LANE_LOAD_WIDTH,
  SI_WHEEL_GAUGE,
  WHEEL_GAUGE,
  type Vehicle,
} from './vehicles.js';

/** The number-of-lanes rule of Art. 3.6.1.1.1 in the unit the code writes it in. */
export interface LaneRule {
  /** Metres per unit of the rule: 0.3048 (ft) or 1 (m). */
  unitMetres: number;
  unitSymbol: 'ft' | 'm';
  /** Width of a design lane in that unit: 12 (ft) or 3.6 (m). */
  laneWidth: number;
  /** Roadways from `min` to `max` wide (that unit) have two design lanes of w/2: 20–24 ft, 6.0–7.2 m. */
  twoLanes: { min: number; max: number };
}

export interface DesignValues {
  name: DesignValuesName;
  /** The code as a citation names it: 'AASHTO LRFD' or 'AASHTO LRFD (SI)'. */
  code: string;
  /** The set in a reader's words. */
  words: string;
  laneRule: LaneRule;
  /** Width of a design lane, m (Art. 3.6.1.1.1). */
  laneWidth: number;
  /** Transverse spacing of the wheels of the truck and tandem, m (Art. 3.6.1.2.2). */
  gauge: number;
  /** Least distance from a wheel centre to its lane's edge, m (Art. 3.6.1.3.1). */
  wheelToLaneEdge: number;
  /** Least distance from a wheel centre to the curb face for deck-overhang design, m (Art. 3.6.1.3.1). */
  wheelToCurbForOverhang: number;
  truck: Vehicle;
  tandem: Vehicle;
  fatigueTruck: Vehicle;
  /** Design lane load, N/m (Art. 3.6.1.2.4). */
  laneLoad: number;
  /** Transverse width of the design lane load, m (Art. 3.6.1.2.4). */
  laneLoadWidth: number;
  /** Two design trucks (Art. 3.6.1.3.1): each truck's fixed rear spacing and the least headway, m. */
  twoTrucks: { rearSpacing: number; minHeadway: number };
  /** The values as the code prints them, for messages that cite them. */
  printed: { laneWidth: string; laneLoadWidth: string; wheelToLaneEdge: string; laneLoad: string; rearSpacing: string; minHeadway: string };
}

export const US_CUSTOMARY_VALUES: DesignValues = Object.freeze({
  name: 'us-customary',
  code: 'AASHTO LRFD',
  words: 'converted US customary values',
  laneRule: Object.freeze({ unitMetres: fromUs.ft(1), unitSymbol: 'ft', laneWidth: 12, twoLanes: Object.freeze({ min: 20, max: 24 }) }),
  laneWidth: fromUs.ft(12),
  gauge: WHEEL_GAUGE,
  wheelToLaneEdge: fromUs.ft(2),
  wheelToCurbForOverhang: fromUs.ft(1),
  truck: DESIGN_TRUCK,
  tandem: DESIGN_TANDEM,
  fatigueTruck: FATIGUE_TRUCK,
  laneLoad: DESIGN_LANE_LOAD,
  laneLoadWidth: LANE_LOAD_WIDTH,
  twoTrucks: Object.freeze({ rearSpacing: fromUs.ft(14), minHeadway: fromUs.ft(50) }),
  printed: Object.freeze({ laneWidth: '12 ft', laneLoadWidth: '10 ft', wheelToLaneEdge: '2 ft', laneLoad: '0.64 klf', rearSpacing: '14 ft', minHeadway: '50 ft' }),
}) as DesignValues;

export const SI_EDITION_VALUES: DesignValues = Object.freeze({
  name: 'si-edition',
  code: 'AASHTO LRFD (SI)',
  words: 'SI edition values',
  laneRule: Object.freeze({ unitMetres: 1, unitSymbol: 'm', laneWidth: 3.6, twoLanes: Object.freeze({ min: 6.0, max: 7.2 }) }),
  laneWidth: 3.6,
  gauge: SI_WHEEL_GAUGE,
  wheelToLaneEdge: 0.6,
  wheelToCurbForOverhang: 0.3,
  truck: SI_DESIGN_TRUCK,
  tandem: SI_DESIGN_TANDEM,
  fatigueTruck: SI_FATIGUE_TRUCK,
  laneLoad: SI_DESIGN_LANE_LOAD,
  laneLoadWidth: SI_LANE_LOAD_WIDTH,
  twoTrucks: Object.freeze({ rearSpacing: 4.3, minHeadway: 15.0 }),
  printed: Object.freeze({ laneWidth: '3600 mm', laneLoadWidth: '3000 mm', wheelToLaneEdge: '600 mm', laneLoad: '9.3 N/mm', rearSpacing: '4300 mm', minHeadway: '15 000 mm' }),
}) as DesignValues;

export const DESIGN_VALUES: Record<DesignValuesName, DesignValues> = { 'us-customary': US_CUSTOMARY_VALUES, 'si-edition': SI_EDITION_VALUES };

/** The design values of a deck (a deck without the field: the US customary ones). */
export function designValuesOf(deck: { designValues?: DesignValuesName }): DesignValues {
  return DESIGN_VALUES[deck.designValues ?? 'us-customary'] ?? US_CUSTOMARY_VALUES;
}

/**
 * An article of the code as this set cites it. The US customary citation is returned as it
 * is; the SI edition's begins "AASHTO LRFD (SI)" ("Art. 3.6.1.1.1" → "AASHTO LRFD (SI)
 * Art. 3.6.1.1.1").
 */
export function citeArticle(values: DesignValues, article: string): string {
  if (values.name === 'us-customary') return article;
  return `${values.code} ${article.replace(/^AASHTO LRFD\s+/, '')}`;
}

/**
 * The code-unit companion of a length in a trace input (`formulaValue`, `formulaUnit`): ft for
 * the US customary values, whose rules are written in feet; none for the SI edition's, whose
 * rules are written in the internal unit itself.
 */
export function formulaLength(values: DesignValues, metres: number): { formulaValue?: number; formulaUnit?: string } {
  return values.name === 'us-customary' ? { formulaValue: toUs.ft(metres), formulaUnit: 'ft' } : {};
}

/** The design truck in a trace's words: axle weights and spacings as quantity tokens. */
export function truckWords(values: DesignValues): string {
  const t = values.truck;
  const vs = t.variableSpacing!;
  return `${t.axles.map((a) => q(a.weight, 'force')).join(', ')} axles at ${len(t.axles[1].position)}, then ${len(vs.min)} to ${len(vs.max)}`;
}

/** The trace step that names the design values a deck's loads and lanes come from. */
export function designValuesStep(values: DesignValues): TraceStep {
  const t = values.tandem;
  const fatigueRear = values.fatigueTruck.axles[2].position - values.fatigueTruck.axles[1].position;
  return {
    label: `Design values: ${values.words}`,
    formula:
      `design truck ${truckWords(values)}; design tandem 2 × ${q(t.axles[0].weight, 'force')} at ${len(t.axles[1].position)}; ` +
      `design lane load ${q(values.laneLoad, 'lineLoad')} over ${len(values.laneLoadWidth)}; fatigue truck rear spacing ${len(fatigueRear)}; ` +
      `design lanes ${len(values.laneWidth)} wide, wheels ${len(values.gauge)} apart and at least ${len(values.wheelToLaneEdge)} from the lane edge`,
    inputs: [],
    value: values.laneWidth,
    kind: 'length',
    article: citeArticle(values, 'AASHTO LRFD Art. 3.6.1.1.1, 3.6.1.2.2, 3.6.1.2.3, 3.6.1.2.4, 3.6.1.3.1, 3.6.1.4.1'),
    note:
      values.name === 'si-edition'
        ? 'the SI edition\u2019s own values (from memory of the 4th edition 2007 SI and earlier), not conversions of the US customary ones; the empirical formulas of Art. 4.6.2.2 are evaluated in US customary units as before'
        : 'the US customary values converted exactly to SI units',
  };
}

/** The vehicles a placement can carry, by the name the workspace and saved placements use. */
export type VehicleKey = 'design truck' | 'design tandem' | 'fatigue truck';

/** A set's vehicle by its key; undefined for an unknown key. */
export function vehicleOf(values: DesignValues, key: VehicleKey): Vehicle | undefined {
  if (key === 'design truck') return values.truck;
  if (key === 'design tandem') return values.tandem;
  if (key === 'fatigue truck') return values.fatigueTruck;
  return undefined;
}
