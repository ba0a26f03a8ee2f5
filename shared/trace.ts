/**
 * A calculation trace: the record of how one number was obtained. The workspace, the
 * calculation package and the training comparison all render this one structure.
 *
 * Values in a trace are stored in internal units (see `units.ts`) together with their
 * quantity kind, so that each renderer shows them in the user's unit system. Values of
 * formulas that the code prints in US customary units may instead carry `usValue` with
 * the US symbol, because the formula text is written in those units.
 */
import type { QuantityKind } from './units.js';

export interface TraceInput {
  /** Symbol as the code writes it, e.g. "S", "Kg", "ts". */
  symbol: string;
  /** Plain description, e.g. "girder spacing". */
  description?: string;
  /** Internal (SI) value. */
  value: number;
  kind: QuantityKind;
  /** Value in the unit the code's formula uses, where that differs from the display. */
  formulaValue?: number;
  formulaUnit?: string;
}

export interface TraceStep {
  /** What the step computes, e.g. "Interior girder, moment, two or more lanes". */
  label: string;
  /** The formula as text, in the code's notation. */
  formula: string;
  inputs: TraceInput[];
  /** Result of the step (internal units for dimensional results). */
  value: number;
  kind: QuantityKind;
  /** Article, equation or table of the AASHTO LRFD specifications (or another source). */
  article: string;
  /** Optional remark, e.g. "lever rule governs". */
  note?: string;
  /**
   * What the step stands for in a factor row's trace, where the solver records it
   * (shared/lrfd/factors.ts): 'span-length' — the span length L of the row's location
   * (Table C4.6.2.2.1-1); 'skew' — the skew correction and the product g₀ · skew factor.
   * Absent: a step of the method itself. shared/lrfd/quantity.ts reads it.
   */
  part?: 'span-length' | 'skew';
}

export type Trace = TraceStep[];

export function step(s: TraceStep): TraceStep {
  return s;
}

/**
 * Values that are zero within rounding. A trace carries round-off residue — a wheel right
 * over a girder lands at 3.6e-16 ft from it — that would otherwise print in exponent form.
 * A value reads as 0 when it is below `NEGLIGIBLE_RATIO` times the largest value of the same
 * quantity kind in its step (`scale`), or when it rounds to zero at the `decimals` shown.
 * Units: whatever unit `value` and `scale` share (internal or display); no sign convention.
 */
export const NEGLIGIBLE_RATIO = 1e-9;

export function zeroIfNegligible(value: number, scale: number, decimals?: number): number {
  if (!Number.isFinite(value)) return value;
  const a = Math.abs(value);
  if (a === 0) return 0; // also turns −0 into 0
  if (Number.isFinite(scale) && a < NEGLIGIBLE_RATIO * Math.abs(scale)) return 0;
  if (decimals !== undefined && a < 0.5 * 10 ** -decimals) return 0;
  return value;
}

/** The largest |value| of one quantity kind among a step's inputs and its result. */
export function stepScale(s: TraceStep, kind: QuantityKind): number {
  let scale = s.kind === kind && Number.isFinite(s.value) ? Math.abs(s.value) : 0;
  for (const i of s.inputs) if (i.kind === kind && Number.isFinite(i.value)) scale = Math.max(scale, Math.abs(i.value));
  return scale;
}

/**
 * A copy of a step for display: every input and the result that is negligible beside the
 * step's largest value of its kind reads 0 (its formula-unit value too). The stored step is
 * not changed.
 */
export function stepForDisplay(s: TraceStep): TraceStep {
  const clean = (i: TraceInput): TraceInput => {
    const value = zeroIfNegligible(i.value, stepScale(s, i.kind));
    if (Object.is(value, i.value)) return i;
    return i.formulaValue === undefined ? { ...i, value } : { ...i, value, formulaValue: 0 };
  };
  return { ...s, inputs: s.inputs.map(clean), value: zeroIfNegligible(s.value, stepScale(s, s.kind)) };
}
