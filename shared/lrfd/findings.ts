/**
 * Findings: typed remarks attached to a distribution factor — a range of applicability
 * that failed, a fallback the code prescribes, a value capped by the code, an owner policy
 * that was applied, or an assumption the engine made. Findings are data for the UI and the
 * report, never console output.
 *
 * Units: `value`, `limit` and `excess` are in the unit the code's table uses (`unit`: ft,
 * in, in⁴, ° or none), because the ranges of applicability are printed in those units.
 */
import type { TraceInput } from '../trace.js';
import type { QuantityKind } from '../units.js';
import { toUs } from '../units.js';

export type FindingCode =
  /** An input lies outside a range of applicability; the formula was still used. */
  | 'out-of-range'
  /** An input lies outside a range and the code's fallback (usually the lever rule) was used. */
  | 'fallback'
  /** The code caps or floors a value (θ > 60° taken as 60°, Nc > 8 taken as 8, e ≥ 1.0 …). */
  | 'capped'
  /** A correction or method does not apply to this deck. */
  | 'not-applicable'
  /** An owner-policy switch changed the result. */
  | 'policy'
  /** A rule the engine applied where the code leaves the choice open (common practice). */
  | 'assumption'
  /** The governing method gives a girder no load at all (e.g. the lever rule with the nearest
   *  wheel right over the adjacent girder): a value to check, not one to design with. */
  | 'no-share';

export interface Finding {
  code: FindingCode;
  /** Plain sentence, e.g. "S = 17.20 ft exceeds 16.0 ft by 1.20 ft: lever rule used". */
  message: string;
  /** Article or table of the AASHTO LRFD specifications (or "common practice, no source"). */
  article: string;
  /** Symbol of the parameter concerned, e.g. "S", "Nb", "θ". */
  parameter?: string;
  /** Value of the parameter in the table's unit. */
  value?: number;
  /** The limit that failed, in the table's unit. */
  limit?: number;
  /** Which side of the range failed. */
  bound?: 'min' | 'max';
  /** How far outside the range, in the table's unit (always ≥ 0). */
  excess?: number;
  unit?: string;
}

/** A parameter of a code formula: its symbol, its value in the formula's unit, and the internal value. */
export interface FormulaParameter {
  symbol: string;
  description: string;
  /** Internal (SI) value. */
  value: number;
  kind: QuantityKind;
  /** Value in the unit the code's formula uses. */
  us: number;
  unit: string;
}

const US_OF_KIND: Partial<Record<QuantityKind, { convert: (v: number) => number; unit: string }>> = {
  length: { convert: toUs.ft, unit: 'ft' },
  dimension: { convert: toUs.in, unit: 'in' },
  area: { convert: toUs.in2, unit: 'in²' },
  inertia: { convert: toUs.in4, unit: 'in⁴' },
  angle: { convert: (v) => v, unit: '°' },
};

/**
 * Build a formula parameter from an internal value.
 * @param value internal (SI) value: m for 'length', m for 'dimension' (shown in in), m⁴ for 'inertia', degrees for 'angle'.
 */
export function parameter(symbol: string, description: string, value: number, kind: QuantityKind): FormulaParameter {
  const conv = US_OF_KIND[kind];
  return { symbol, description, value, kind, us: conv ? conv.convert(value) : value, unit: conv ? conv.unit : '' };
}

/** The parameter as a trace input. */
export function traceInput(p: FormulaParameter): TraceInput {
  return p.unit
    ? { symbol: p.symbol, description: p.description, value: p.value, kind: p.kind, formulaValue: p.us, formulaUnit: p.unit }
    : { symbol: p.symbol, description: p.description, value: p.value, kind: p.kind };
}

/** Format a number for a finding or trace note: up to `digits` decimals, trailing zeros kept to 2. */
export function fmt(v: number, digits = 2): string {
  if (Number.isInteger(v) && Math.abs(v) >= 1000) return v.toLocaleString('en-US');
  if (Math.abs(v) >= 10000) return Math.round(v).toLocaleString('en-US');
  return v.toFixed(digits);
}

function withUnit(v: number, unit: string, digits = 2): string {
  if (!unit) return fmt(v, digits);
  if (unit === '°') return `${fmt(v, 1)}°`;
  return `${fmt(v, digits)} ${unit}`;
}

/** Relative slack so that a value converted from SI exactly at a limit is not flagged. */
const RANGE_SLACK = 1e-9;

/**
 * Check `p` against [min, max] (either may be undefined). Returns a finding when outside.
 * @param consequence what the engine did, e.g. "lever rule used" or "formula used outside its range".
 */
export function checkRange(
  p: FormulaParameter,
  range: { min?: number; max?: number; minExclusive?: boolean },
  article: string,
  consequence: string,
  code: 'out-of-range' | 'fallback' = 'out-of-range',
): Finding | undefined {
  const v = p.us;
  const tol = (limit: number) => RANGE_SLACK * Math.max(1, Math.abs(limit));
  const digits = p.unit === 'in⁴' || p.unit === '' ? 2 : 2;
  if (range.min !== undefined) {
    const below = range.minExclusive ? v <= range.min + tol(range.min) : v < range.min - tol(range.min);
    if (below) {
      const excess = range.min - v;
      const rule = range.minExclusive ? `is not above ${withUnit(range.min, p.unit, 1)}` : `is below ${withUnit(range.min, p.unit, 1)} by ${withUnit(excess, p.unit, digits)}`;
      return {
        code,
        message: `${p.symbol} = ${withUnit(v, p.unit, digits)} ${rule}: ${consequence}`,
        article,
        parameter: p.symbol,
        value: v,
        limit: range.min,
        bound: 'min',
        excess: Math.max(0, excess),
        unit: p.unit,
      };
    }
  }
  if (range.max !== undefined && v > range.max + tol(range.max)) {
    const excess = v - range.max;
    return {
      code,
      message: `${p.symbol} = ${withUnit(v, p.unit, digits)} exceeds ${withUnit(range.max, p.unit, 1)} by ${withUnit(excess, p.unit, digits)}: ${consequence}`,
      article,
      parameter: p.symbol,
      value: v,
      limit: range.max,
      bound: 'max',
      excess,
      unit: p.unit,
    };
  }
  return undefined;
}

/** Collect the defined findings. */
export function defined(...fs: (Finding | undefined)[]): Finding[] {
  return fs.filter((f): f is Finding => f !== undefined);
}
