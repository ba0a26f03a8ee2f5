/**
 * Design lanes and the multiple presence factor.
 *
 * Units: roadway width and lane width in m (internal SI). The code states its rule in feet
 * (12 ft lanes), so widths go through `toUs.ft` for the rule and come back in m.
 *
 * AASHTO LRFD Bridge Design Specifications:
 * - Art. 3.6.1.1.1 — number of design lanes: the integer part of w / 12.0 ft, w the clear
 *   roadway width between curbs and/or barriers; roadways from 20.0 to 24.0 ft wide have two
 *   design lanes, each one-half the roadway width.
 * - Table 3.6.1.1.2-1 — multiple presence factor m: 1 lane 1.20, 2 lanes 1.00, 3 lanes 0.85,
 *   more than 3 lanes 0.65.
 */
import { DeckInputError } from '../deck/schema.js';
import { MAX_DESIGN_LANES } from '../deck/limits.js';
import type { TraceStep } from '../trace.js';
import { fromUs, toUs } from '../units.js';
import { lengthInText } from '../quantities/inText.js';

/** Width of a design lane, 12 ft in m (Art. 3.6.1.1.1). */
export const DESIGN_LANE_WIDTH: number = fromUs.ft(12);

/** Relative tolerance for widths that land on a whole number of lanes after unit conversion. */
const LANE_TOLERANCE_FT = 1e-9;

/**
 * Number and width of design lanes on a roadway.
 * @param roadwayWidth clear roadway width w between curb or barrier faces, m.
 * @returns count (whole lanes), width of each design lane (m) and the trace step.
 * @throws DeckInputError when w is not a finite number, is narrower than one 12 ft lane, or gives
 *   more than MAX_DESIGN_LANES lanes.
 */
export function designLanes(roadwayWidth: number): { count: number; width: number; trace: TraceStep } {
  if (!Number.isFinite(roadwayWidth)) {
    throw new DeckInputError(['roadwayWidth'], 'the clear roadway width must be a finite number');
  }
  const wFt = toUs.ft(roadwayWidth);
  if (wFt < 12 - LANE_TOLERANCE_FT) {
    throw new DeckInputError(
      ['roadwayWidth'],
      `the clear roadway width ${wFt.toFixed(2)} ft is narrower than one 12 ft design lane (Art. 3.6.1.1.1)`,
    );
  }
  const inTwentyToTwentyFour = wFt >= 20 - LANE_TOLERANCE_FT && wFt <= 24 + LANE_TOLERANCE_FT;
  const count = inTwentyToTwentyFour ? 2 : Math.floor(wFt / 12 + LANE_TOLERANCE_FT);
  if (count > MAX_DESIGN_LANES) {
    // A guard behind the deck schema's width range: no lane array is sized from an unchecked width.
    throw new DeckInputError(
      ['roadwayWidth'],
      `the clear roadway width ${wFt.toFixed(2)} ft gives ${count} design lanes: at most ${MAX_DESIGN_LANES} are computed`,
    );
  }
  const width = inTwentyToTwentyFour ? roadwayWidth / 2 : DESIGN_LANE_WIDTH;
  const trace: TraceStep = {
    label: 'Number of design lanes',
    // the lengths are tokens: a reader sees them in their units (shared/quantities/inText.ts)
    formula: inTwentyToTwentyFour
      ? `NL = 2 for ${lengthInText(fromUs.ft(20))} ≤ w ≤ ${lengthInText(fromUs.ft(24))}, each lane w/2 wide`
      : `NL = INT(w / ${lengthInText(DESIGN_LANE_WIDTH)})`,
    inputs: [{ symbol: 'w', description: 'clear roadway width between curb faces', value: roadwayWidth, kind: 'length', formulaValue: wFt, formulaUnit: 'ft' }],
    value: count,
    kind: 'none',
    article: 'AASHTO LRFD Art. 3.6.1.1.1',
    note: inTwentyToTwentyFour ? `two lanes of ${lengthInText(roadwayWidth / 2)}` : undefined,
  };
  return { count, width, trace };
}

/**
 * Multiple presence factor m, Table 3.6.1.1.2-1.
 * @param loadedLanes number of loaded lanes, a whole number ≥ 1.
 * @throws DeckInputError when loadedLanes is not a whole number ≥ 1.
 */
export function multiplePresenceFactor(loadedLanes: number): number {
  if (!Number.isInteger(loadedLanes) || loadedLanes < 1) {
    throw new DeckInputError(['loadedLanes'], `the number of loaded lanes must be a whole number of at least 1, not ${loadedLanes}`);
  }
  if (loadedLanes === 1) return 1.2;
  if (loadedLanes === 2) return 1.0;
  if (loadedLanes === 3) return 0.85;
  return 0.65;
}
