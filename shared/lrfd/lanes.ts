/**
 * Design lanes and the multiple presence factor.
 *
 * Units: roadway width and lane width in m (internal SI). The rule is tested in the unit the
 * deck's design values write it in (shared/loads/designValues.ts): feet for the US customary
 * values (12 ft lanes), metres for the SI edition's (3.6 m lanes), and comes back in m.
 *
 * AASHTO LRFD Bridge Design Specifications:
 * - Art. 3.6.1.1.1 — number of design lanes: the integer part of w / 12.0 ft, w the clear
 *   roadway width between curbs and/or barriers; roadways from 20.0 to 24.0 ft wide have two
 *   design lanes, each one-half the roadway width. SI edition (AASHTO LRFD (SI), same article;
 *   from memory): INT(w / 3600 mm), two lanes of w/2 from 6000 to 7200 mm.
 * - Table 3.6.1.1.2-1 — multiple presence factor m: 1 lane 1.20, 2 lanes 1.00, 3 lanes 0.85,
 *   more than 3 lanes 0.65.
 */
import { DeckInputError } from '../deck/schema.js';
import { MAX_DESIGN_LANES } from '../deck/limits.js';
import type { TraceStep } from '../trace.js';
import { citeArticle, formulaLength, US_CUSTOMARY_VALUES, type DesignValues } from '../loads/designValues.js';
import { lengthInText } from '../quantities/inText.js';

/** Width of a design lane, 12 ft in m (Art. 3.6.1.1.1; the US customary values). */
export const DESIGN_LANE_WIDTH: number = US_CUSTOMARY_VALUES.laneWidth;

/** Tolerance, in the rule's unit, for widths that land on a whole number of lanes after unit conversion. */
const LANE_TOLERANCE = 1e-9;

/**
 * Number and width of design lanes on a roadway.
 * @param roadwayWidth clear roadway width w between curb or barrier faces, m.
 * @param values the deck's design values (designValuesOf(deck)); the US customary ones by default.
 * @returns count (whole lanes), width of each design lane (m) and the trace step.
 * @throws DeckInputError when w is not a finite number, is narrower than one design lane, or gives
 *   more than MAX_DESIGN_LANES lanes.
 */
export function designLanes(roadwayWidth: number, values: DesignValues = US_CUSTOMARY_VALUES): { count: number; width: number; trace: TraceStep } {
  if (!Number.isFinite(roadwayWidth)) {
    throw new DeckInputError(['roadwayWidth'], 'the clear roadway width must be a finite number');
  }
  const rule = values.laneRule;
  const wRule = roadwayWidth / rule.unitMetres; // w in the unit the code writes the rule in
  const shown = `${wRule.toFixed(2)} ${rule.unitSymbol}`;
  if (wRule < rule.laneWidth - LANE_TOLERANCE) {
    throw new DeckInputError(
      ['roadwayWidth'],
      `the clear roadway width ${shown} is narrower than one ${values.printed.laneWidth} design lane (${citeArticle(values, 'Art. 3.6.1.1.1')})`,
    );
  }
  const inTwoLaneRange = wRule >= rule.twoLanes.min - LANE_TOLERANCE && wRule <= rule.twoLanes.max + LANE_TOLERANCE;
  const count = inTwoLaneRange ? 2 : Math.floor(wRule / rule.laneWidth + LANE_TOLERANCE);
  if (count > MAX_DESIGN_LANES) {
    // A guard behind the deck schema's width range: no lane array is sized from an unchecked width.
    throw new DeckInputError(
      ['roadwayWidth'],
      `the clear roadway width ${shown} gives ${count} design lanes: at most ${MAX_DESIGN_LANES} are computed`,
    );
  }
  const width = inTwoLaneRange ? roadwayWidth / 2 : values.laneWidth;
  const unit = rule.unitMetres;
  const trace: TraceStep = {
    label: 'Number of design lanes',
    // the lengths are tokens: a reader sees them in their units (shared/quantities/inText.ts)
    formula: inTwoLaneRange
      ? `NL = 2 for ${lengthInText(rule.twoLanes.min * unit)} ≤ w ≤ ${lengthInText(rule.twoLanes.max * unit)}, each lane w/2 wide`
      : `NL = INT(w / ${lengthInText(values.laneWidth)})`,
    inputs: [{ symbol: 'w', description: 'clear roadway width between curb faces', value: roadwayWidth, kind: 'length', ...formulaLength(values, roadwayWidth) }],
    value: count,
    kind: 'none',
    article: citeArticle(values, 'AASHTO LRFD Art. 3.6.1.1.1'),
    note: inTwoLaneRange ? `two lanes of ${lengthInText(roadwayWidth / 2)}` : undefined,
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
