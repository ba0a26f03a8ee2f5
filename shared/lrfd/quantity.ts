/**
 * One quantity of a factor row and the steps of its trace that it rests on: the row's value
 * with its skew correction, or its value before the correction. A training question grades
 * such a quantity and compares a trainee's steps with these steps only.
 *
 * A location row's trace is assembled in this order (shared/lrfd/factors.ts): the span length
 * L of the location (part 'span-length', Table C4.6.2.2.1-1), the method's own steps, then —
 * on a skewed deck — the skew correction and the product g₀ · skew factor (part 'skew',
 * Art. 4.6.2.2.2e, 4.6.2.2.3c). A fatigue row appends its own step after the trace of the
 * one-lane row it comes from, so its skew correction (if any) sits inside it.
 *
 *  - before the skew correction: the method's own steps; value `baseValue`;
 *  - with it: the method's steps and the skew steps; value `value`;
 *  - the span-length step belongs when a chosen step reads L (has the location's L among its
 *    inputs): the empirical formulas and the skew corrections do; the lever rule, the
 *    rigid-section check and the equal share m·NL/Nb do not.
 *
 * Units: factors dimensionless (lanes per girder); L in m (internal).
 */
import type { TraceStep } from '../trace.js';
import type { CodeFactorResult, FactorRow } from './factors.js';

export type SkewChoice = 'with' | 'before';

/**
 * Where a row's skew correction is: 'none' (no skew step: a right deck at this location, or a
 * row without a correction of its own such as the deflection share), 'own' (the row applies it
 * last: value = baseValue × skewFactor), 'inherited' (inside the value it starts from: a
 * fatigue row divides the corrected one-lane value by the multiple presence factor).
 */
export type RowSkew = 'none' | 'own' | 'inherited';

export function rowSkew(row: Pick<FactorRow, 'trace'>): RowSkew {
  if (!row.trace.some((s) => s.part === 'skew')) return 'none';
  return row.trace[row.trace.length - 1].part === 'skew' ? 'own' : 'inherited';
}

/** Whether the quantity "before the skew correction" exists for the row. */
export function canLeaveOutSkew(row: Pick<FactorRow, 'trace'>): boolean {
  return rowSkew(row) !== 'inherited';
}

function near(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

/** A step reads the span length when L, of the location's length, is one of its inputs. */
function readsSpanLength(s: TraceStep, L: number): boolean {
  return s.inputs.some((i) => i.kind === 'length' && i.symbol === 'L' && near(i.value, L));
}

/**
 * The value and the steps of one quantity of a row, in the trace's order.
 * @throws RangeError for 'before' on a row whose correction is inherited (`canLeaveOutSkew`).
 */
export function rowQuantity(row: Pick<FactorRow, 'trace' | 'value' | 'baseValue' | 'location'>, skew: SkewChoice): { value: number; trace: TraceStep[] } {
  const where = rowSkew(row);
  if (skew === 'before' && where === 'inherited') throw new RangeError('the skew correction is inside the value this row starts from: there is no value before it');
  const keepSkew = skew === 'with';
  const chosen = new Set(row.trace.filter((s) => s.part === undefined || (s.part === 'skew' && keepSkew)));
  const L = row.location.spanLength;
  const withL = L !== undefined && [...chosen].some((s) => readsSpanLength(s, L));
  return {
    value: skew === 'before' && where === 'own' ? row.baseValue : row.value,
    trace: row.trace.filter((s) => chosen.has(s) || (s.part === 'span-length' && withL)),
  };
}

/** Whether a code result records the parts of its rows' traces (results stored before it did not). */
export function hasTraceParts(result: Pick<CodeFactorResult, 'factors'>): boolean {
  return result.factors.some((r) => r.trace.some((s) => s.part !== undefined));
}

/**
 * A stored result without trace parts, with the parts of a fresh computation of the same deck
 * copied row by row where the row's steps agree (same id, same number of steps, same values);
 * a row that does not agree keeps its trace as stored.
 */
export function withTraceParts(stored: CodeFactorResult, fresh: CodeFactorResult): CodeFactorResult {
  const byId = new Map(fresh.factors.map((r) => [r.id, r]));
  const factors = stored.factors.map((r) => {
    const f = byId.get(r.id);
    if (!f || f.trace.length !== r.trace.length || !f.trace.every((s, i) => near(s.value, r.trace[i].value))) return r;
    return { ...r, trace: r.trace.map((s, i) => (f.trace[i].part ? { ...s, part: f.trace[i].part } : s)) };
  });
  return { ...stored, factors };
}
