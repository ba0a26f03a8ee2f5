/**
 * Rigid-section check for exterior girders of beam-slab decks with diaphragms or
 * cross-frames (AASHTO LRFD Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1; also for shear by
 * Art. 4.6.2.2.3b): the cross-section is taken to deflect and rotate as a rigid body,
 *
 *   R = NL/Nb + X_ext · Σe / Σx²
 *
 * NL loaded lanes, Nb girders, X_ext the exterior girder's distance from the centre of
 * gravity of the girder pattern, e each loaded lane's truck-centre eccentricity from that
 * centre, x each girder's distance from it. Multiple presence (Table 3.6.1.1.2-1) applies
 * to each number of loaded lanes.
 *
 * Units: offsets in m from girder 1 (positive right); distances signed, positive right.
 * Truck placement: lanes side by side from the curb face nearest the exterior girder, the
 * truck in each lane as far toward that curb as Art. 3.6.1.3.1 allows (outer wheel 2 ft
 * from the lane edge, so the truck centre is 2 ft + 3 ft from it; with the SI edition's values
 * 600 mm + 900 mm: `values`, shared/loads/designValues.ts) — the placement giving each lane its
 * largest eccentricity toward the girder.
 */
import type { TraceStep } from '../trace.js';
import { citeArticle, formulaLength, US_CUSTOMARY_VALUES, type DesignValues } from '../loads/designValues.js';
import { lengthInText } from '../quantities/inText.js';
import { multiplePresenceFactor } from './lanes.js';

export interface RigidSectionCase {
  loadedLanes: number;
  multiplePresence: number;
  /** Truck-centre eccentricity of each loaded lane from the girder pattern's centre, m (signed). */
  eccentricities: number[];
  sumE: number;
  /** NL/Nb + X_ext·Σe/Σx², before multiple presence. */
  reaction: number;
  /** m × reaction. */
  value: number;
}

export interface RigidSectionWorksheet {
  /** Girder considered, 0-based (an exterior girder). */
  girder: number;
  /** Centre of gravity of the girder pattern, m from girder 1. */
  centroid: number;
  /** Each girder's signed distance x from the centre, m. */
  x: number[];
  sumX2: number;
  /** X_ext, signed, m. */
  xExt: number;
  cases: RigidSectionCase[];
  governingOne: number;
  governingMultiple?: number;
}

export interface RigidSectionResult {
  one: RigidSectionCase;
  multiple?: RigidSectionCase;
  worksheet: RigidSectionWorksheet;
  trace: TraceStep[];
}

/** Σx² in ft² beside its SI value for the US customary values (formulaLength squared); none for the SI edition's. */
function squaredFormulaLength(values: DesignValues, m2: number): { formulaValue?: number; formulaUnit?: string } {
  const once = formulaLength(values, m2).formulaValue;
  return once === undefined ? {} : { formulaValue: formulaLength(values, once).formulaValue, formulaUnit: 'ft²' };
}

/**
 * Rigid-section distribution factors of an exterior girder, every number of loaded lanes.
 * @param offsets girder offsets, m from girder 1 (increasing).
 * @param side which exterior girder: 'left' (girder 1) or 'right' (girder Nb).
 * @param curbLeft left curb face, m from girder 1; @param curbRight right curb face, m.
 * @param laneWidth design lane width, m; @param designLaneCount NL.
 * @param values the deck's design values (gauge, wheel-to-lane-edge); the US customary ones by default.
 */
export function rigidSection(
  offsets: number[],
  side: 'left' | 'right',
  curbLeft: number,
  curbRight: number,
  laneWidth: number,
  designLaneCount: number,
  values: DesignValues = US_CUSTOMARY_VALUES,
): RigidSectionResult {
  const nb = offsets.length;
  const centroid = offsets.reduce((s, o) => s + o, 0) / nb;
  const x = offsets.map((o) => o - centroid);
  const sumX2 = x.reduce((s, v) => s + v * v, 0);
  const girder = side === 'left' ? 0 : nb - 1;
  const xExt = x[girder];
  const toCentre = values.wheelToLaneEdge + values.gauge / 2;
  const e: number[] = [];
  for (let j = 0; j < designLaneCount; j++) {
    const centre = side === 'left' ? curbLeft + j * laneWidth + toCentre : curbRight - j * laneWidth - toCentre;
    e.push(centre - centroid);
  }
  const cases: RigidSectionCase[] = [];
  for (let k = 1; k <= designLaneCount; k++) {
    const ecc = e.slice(0, k);
    const sumE = ecc.reduce((s, v) => s + v, 0);
    const reaction = k / nb + (xExt * sumE) / sumX2;
    const m = multiplePresenceFactor(k);
    cases.push({ loadedLanes: k, multiplePresence: m, eccentricities: ecc, sumE, reaction, value: m * reaction });
  }
  let governingMultiple: number | undefined;
  for (let i = 1; i < cases.length; i++) {
    if (governingMultiple === undefined || cases[i].value > cases[governingMultiple].value) governingMultiple = i;
  }
  const worksheet: RigidSectionWorksheet = { girder, centroid, x, sumX2, xExt, cases, governingOne: 0, governingMultiple };
  const trace: TraceStep[] = cases.map((cs) => ({
    label: `Rigid-section check, girder ${girder + 1}, ${cs.loadedLanes} loaded lane${cs.loadedLanes > 1 ? 's' : ''}`,
    formula: 'R = m · (NL/Nb + X_ext·Σe / Σx²)',
    inputs: [
      { symbol: 'NL', description: 'number of loaded lanes', value: cs.loadedLanes, kind: 'none' },
      { symbol: 'Nb', description: 'number of girders', value: nb, kind: 'none' },
      { symbol: 'X_ext', description: 'exterior girder from the centre of the girders', value: xExt, kind: 'length', ...formulaLength(values, xExt) },
      { symbol: 'Σe', description: `sum of truck eccentricities (${cs.eccentricities.map((v) => lengthInText(v)).join(', ')})`, value: cs.sumE, kind: 'length', ...formulaLength(values, cs.sumE) },
      { symbol: 'Σx²', description: 'sum of squared girder distances from the centre', value: sumX2, kind: 'lengthSquared', ...squaredFormulaLength(values, sumX2) },
      { symbol: 'm', description: 'multiple presence factor', value: cs.multiplePresence, kind: 'none' },
    ],
    value: cs.value,
    kind: 'none',
    article: citeArticle(values, 'AASHTO LRFD Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1; Table 3.6.1.1.2-1'),
    note: `reaction ${cs.reaction.toFixed(4)} lanes before m`,
  }));
  return {
    one: cases[0],
    multiple: governingMultiple === undefined ? undefined : cases[governingMultiple],
    worksheet,
    trace,
  };
}
