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
}

export type Trace = TraceStep[];

export function step(s: TraceStep): TraceStep {
  return s;
}
