/**
 * The lever rule (AASHTO LRFD Art. 4.6.2.2.1 and C4.6.2.2.1): the deck is taken as hinged
 * over the girders next to the girder considered, and the girder's share of the loaded
 * lanes is the statical reaction of the wheel loads. Wheels are placed per Art. 3.6.1.3.1:
 * 6 ft gauge (Art. 3.6.1.2.2), each wheel centre at least 2 ft from the edge of its design
 * lane (the SI edition's values: 1800 mm and 600 mm; `options.values`, shared/loads/designValues.ts); design lanes may lie anywhere within the roadway (Art. 3.6.1.1.1), side by side.
 * Multiple presence per Table 3.6.1.1.2-1 (1.2 for one lane unless an owner policy says 1.0).
 *
 * Units: all offsets in m, measured from girder 1's centreline, positive to the right.
 * Results are lane fractions (a factor of one means one full lane, i.e. two wheel lines).
 *
 * The lane positions are found exactly: the girder's reaction is piecewise linear in the
 * lane positions, so the optimum has every lane at a kink of its response, at a roadway
 * bound, or butted against a neighbouring lane; the search walks that finite set with a
 * dynamic programme over the lanes, left to right.
 */
import { DeckInputError } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { citeArticle, formulaLength, US_CUSTOMARY_VALUES, type DesignValues } from '../loads/designValues.js';
import { multiplePresenceFactor } from './lanes.js';
import { closeOnGoverningCase } from './choice.js';

/** Transverse spacing of the wheels of the design truck and tandem, 6 ft (Art. 3.6.1.2.2; US customary values). */
export const WHEEL_GAUGE = US_CUSTOMARY_VALUES.gauge;
/** Least distance from a wheel centre to the edge of its design lane, 2 ft (Art. 3.6.1.3.1; US customary values). */
export const WHEEL_TO_LANE_EDGE = US_CUSTOMARY_VALUES.wheelToLaneEdge;

const LEVER_ARTICLE = 'AASHTO LRFD Art. 4.6.2.2.1 (lever rule), Art. 3.6.1.3.1 (wheel placement), Table 3.6.1.1.2-1';
const EPS = 1e-9;

export interface LeverRuleWheel {
  /** Wheel centre, m from girder 1. */
  offset: number;
  /** Reaction of the girder considered per unit wheel load (the lever-rule ordinate). */
  ordinate: number;
}

export interface LeverRuleTruck {
  /** Design lane occupied: edges in m from girder 1. */
  laneLeft: number;
  laneRight: number;
  wheels: [LeverRuleWheel, LeverRuleWheel];
}

export interface LeverRuleCase {
  loadedLanes: number;
  /** Multiple presence factor applied. */
  multiplePresence: number;
  /** The trucks that load the girder (a wheel with a non-zero ordinate), left to right. */
  trucks: LeverRuleTruck[];
  /** Loaded lanes whose trucks stand beyond the hinges (every ordinate 0): counted in m, not drawn. */
  trucksBeyondHinges: number;
  /** Σ ordinates of all wheels. */
  sumOrdinates: number;
  /** Reaction in lanes before multiple presence: Σ ordinates / 2. */
  reaction: number;
  /** m × reaction. */
  value: number;
}

export interface LeverRuleWorksheet {
  /** Girder considered, 0-based. */
  girder: number;
  girderOffset: number;
  /** Girders over which the deck is taken as hinged. */
  hinges: { girder: number; offset: number }[];
  curbLeft: number;
  curbRight: number;
  laneWidth: number;
  gauge: number;
  wheelToLaneEdge: number;
  /** One case per number of loaded lanes that was examined. */
  cases: LeverRuleCase[];
  /** Index into `cases` of the largest value. */
  governingCase: number;
}

export interface LeverRuleResult {
  value: number;
  loadedLanes: number;
  worksheet: LeverRuleWorksheet;
  trace: TraceStep[];
}

export interface LeverRuleOptions {
  /** Lane counts to examine, e.g. [1] or [2, 3, 4]. */
  loadedLanes: number[];
  /** Multiple presence factor for one loaded lane (1.2 by Table 3.6.1.1.2-1; 1.0 under an owner policy). */
  oneLaneFactor?: number;
  /** The deck's design values (gauge, wheel-to-lane-edge distance); the US customary ones by default. */
  values?: DesignValues;
}

/** Lever-rule ordinate of girder `i` at transverse position x (m), deck hinged at the neighbouring girders. */
export function leverOrdinate(offsets: number[], i: number, x: number): number {
  const n = offsets.length;
  const xi = offsets[i];
  if (i > 0 && x <= xi) {
    const xl = offsets[i - 1];
    if (x <= xl) return 0;
    return (x - xl) / (xi - xl);
  }
  if (i < n - 1 && x >= xi) {
    const xr = offsets[i + 1];
    if (x >= xr) return 0;
    return (xr - x) / (xr - xi);
  }
  // Exterior girder on its cantilever side: the ordinate keeps growing past the girder.
  if (i === 0) {
    const xr = offsets[1];
    return (xr - x) / (xr - xi);
  }
  const xl = offsets[n - 2];
  return (x - xl) / (xi - xl);
}

/**
 * Lever-rule distribution factor of girder `girder`.
 * @param offsets girder centreline offsets, m (girder 1 at 0, increasing).
 * @param girder girder considered, 0-based.
 * @param curbLeft inside face of the left barrier, m from girder 1.
 * @param curbRight inside face of the right barrier, m from girder 1.
 * @param laneWidth width of a design lane, m (Art. 3.6.1.1.1).
 * @param designLaneCount number of design lanes NL.
 */
export function leverRule(
  offsets: number[],
  girder: number,
  curbLeft: number,
  curbRight: number,
  laneWidth: number,
  designLaneCount: number,
  options: LeverRuleOptions,
): LeverRuleResult {
  const n = offsets.length;
  const values = options.values ?? US_CUSTOMARY_VALUES;
  const gauge = values.gauge;
  const toEdge = values.wheelToLaneEdge;
  const eta = (x: number) => leverOrdinate(offsets, girder, x);
  const hinges: { girder: number; offset: number }[] = [];
  if (girder > 0) hinges.push({ girder: girder - 1, offset: offsets[girder - 1] });
  if (girder < n - 1) hinges.push({ girder: girder + 1, offset: offsets[girder + 1] });

  // Kinks of the ordinate and of the truck response r(a) = η(a) + η(a + gauge), a = left wheel.
  const etaKinks = [girder - 1, girder, girder + 1].filter((j) => j >= 0 && j < n).map((j) => offsets[j]);
  const truckKinks = etaKinks.flatMap((k) => [k, k - gauge]);
  const wMin = toEdge; // left wheel offset within the lane
  const wMax = laneWidth - toEdge - gauge;
  const truck = (a: number) => eta(a) + eta(a + gauge);

  /** Best left-wheel position and response for a lane with its left edge at L. */
  const lane = (L: number): { a: number; r: number } => {
    const lo = L + wMin;
    const hi = L + Math.max(wMin, wMax);
    let best = { a: lo, r: truck(lo) };
    const consider = (a: number) => {
      const r = truck(a);
      if (r > best.r + EPS) best = { a, r };
    };
    consider(hi);
    for (const k of truckKinks) if (k > lo && k < hi) consider(k);
    return best;
  };

  const lMin = curbLeft;
  const lMax = curbRight - laneWidth;
  const maxLanes = Math.max(...options.loadedLanes, 1);
  const base = [lMin, lMax, ...truckKinks.flatMap((k) => [k - wMin, k - Math.max(wMin, wMax)])];
  const cand: number[] = [];
  for (const b of base) {
    for (let m = -maxLanes; m <= maxLanes; m++) {
      const L = b + m * laneWidth;
      if (L >= lMin - EPS && L <= lMax + EPS) cand.push(Math.min(Math.max(L, lMin), lMax));
    }
  }
  cand.sort((p, q) => p - q);
  const Ls: number[] = [];
  for (const L of cand) if (Ls.length === 0 || L - Ls[Ls.length - 1] > 1e-7) Ls.push(L);
  const f = Ls.map(lane);

  // best[k][c]: largest Σ response of k lanes with the rightmost lane at candidate c.
  const best: number[][] = [f.map((x) => x.r)];
  const back: number[][] = [Ls.map(() => -1)];
  for (let k = 2; k <= maxLanes; k++) {
    const prev = best[k - 2];
    const row: number[] = [];
    const ptr: number[] = [];
    let runMax = -Infinity;
    let runArg = -1;
    let p = 0;
    for (let c = 0; c < Ls.length; c++) {
      while (p < Ls.length && Ls[p] <= Ls[c] - laneWidth + 1e-7) {
        if (prev[p] > runMax) {
          runMax = prev[p];
          runArg = p;
        }
        p++;
      }
      row.push(runArg >= 0 ? f[c].r + runMax : -Infinity);
      ptr.push(runArg);
    }
    best.push(row);
    back.push(ptr);
  }

  const cases: LeverRuleCase[] = [];
  for (const k of options.loadedLanes) {
    if (k < 1 || k > designLaneCount || k > maxLanes) continue;
    const row = best[k - 1];
    let arg = -1;
    for (let c = 0; c < row.length; c++) if (row[c] > (arg < 0 ? -Infinity : row[arg]) + EPS) arg = c;
    if (arg < 0 || !Number.isFinite(row[arg])) continue;
    const trucks: LeverRuleTruck[] = [];
    let c = arg;
    for (let j = k; j >= 1; j--) {
      const L = Ls[c];
      const a = f[c].a;
      trucks.unshift({
        laneLeft: L,
        laneRight: L + laneWidth,
        wheels: [
          { offset: a, ordinate: eta(a) },
          { offset: a + gauge, ordinate: eta(a + gauge) },
        ],
      });
      c = back[j - 1][c];
    }
    const sumOrdinates = trucks.reduce((s, t) => s + t.wheels[0].ordinate + t.wheels[1].ordinate, 0);
    const m = k === 1 && options.oneLaneFactor !== undefined ? options.oneLaneFactor : multiplePresenceFactor(k);
    const reaction = sumOrdinates / 2;
    // Trucks beyond the hinges add nothing to this girder: kept out of the worksheet and the
    // trace (on a wide deck they are most of the trucks), and counted.
    const loading = trucks.filter((t) => t.wheels.some((w) => w.ordinate !== 0));
    cases.push({ loadedLanes: k, multiplePresence: m, trucks: loading, trucksBeyondHinges: trucks.length - loading.length, sumOrdinates, reaction, value: m * reaction });
  }
  if (cases.length === 0) {
    throw new DeckInputError(['barrierRight', 'width'], `no design lane fits between the barrier faces, so the lever rule cannot place a truck (${citeArticle(values, 'Art. 3.6.1.1.1')})`);
  }
  let governingCase = 0;
  cases.forEach((cs, i) => {
    if (cs.value > cases[governingCase].value + EPS) governingCase = i;
  });
  const worksheet: LeverRuleWorksheet = {
    girder,
    girderOffset: offsets[girder],
    hinges,
    curbLeft,
    curbRight,
    laneWidth,
    gauge,
    wheelToLaneEdge: toEdge,
    cases,
    governingCase,
  };
  const hingeText = hinges.map((h) => `girder ${h.girder + 1}`).join(' and ');
  const trace: TraceStep[] = cases.map((cs) => ({
    label: `Lever rule, girder ${girder + 1}, ${cs.loadedLanes} loaded lane${cs.loadedLanes > 1 ? 's' : ''}`,
    formula: 'g = m · Σ ηᵢ / 2   (ηᵢ: reaction of the girder per unit wheel load, deck hinged at the adjacent girders)',
    inputs: [
      ...cs.trucks.flatMap((t, ti) =>
        t.wheels.map((w, wi) => ({
          symbol: `x${ti + 1}.${wi + 1}`,
          description: `wheel ${wi + 1} of truck ${ti + 1}, offset from girder 1 (ordinate ${w.ordinate.toFixed(4)})`,
          value: w.offset,
          kind: 'length' as const,
          ...formulaLength(values, w.offset),
        })),
      ),
      { symbol: 'Σηᵢ', description: 'sum of the wheel ordinates', value: cs.sumOrdinates, kind: 'none' as const },
      { symbol: 'm', description: 'multiple presence factor', value: cs.multiplePresence, kind: 'none' as const },
    ],
    value: cs.value,
    kind: 'none',
    article: citeArticle(values, LEVER_ARTICLE),
    note: `hinged at ${hingeText}; reaction ${cs.reaction.toFixed(4)} lanes before m${
      cs.trucksBeyondHinges ? `; ${cs.trucksBeyondHinges} more loaded lane${cs.trucksBeyondHinges > 1 ? 's stand' : ' stands'} beyond the hinges (ordinates 0)` : ''
    }`,
  }));
  const g = cases[governingCase];
  return { value: g.value, loadedLanes: g.loadedLanes, worksheet, trace: closeOnGoverningCase(trace, cases, g, 'Lever rule', citeArticle(values, LEVER_ARTICLE)) };
}
