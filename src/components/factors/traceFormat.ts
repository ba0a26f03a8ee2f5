/**
 * Text of a trace step's numbers on screen. Values arrive in internal units (see
 * shared/units.ts) and are shown in the reader's system; the formula-unit value is the
 * number the code's US customary formula takes. Round-off residue reads 0: a value below
 * 1e-9 of the largest value of its kind in the step, or one that rounds to zero at the
 * decimals shown (shared/trace.ts `stepForDisplay`, `zeroIfNegligible`).
 */
import { stepForDisplay, zeroIfNegligible, type TraceStep } from '@shared/trace';
import { unitSymbol, type QuantityKind, type UnitSystem } from '@shared/units';
import { formatValue } from '@/composables/useUnits';
import { showLengths } from '@shared/quantities/inText';
import { factorText } from '@shared/lrfd/words';

/** A value of the step (input or result) in the reader's units. */
export function traceValueText(value: number, kind: QuantityKind, units: UnitSystem): string {
  if (kind === 'none') {
    const v = zeroIfNegligible(value, 0, Math.abs(value) >= 100 ? 1 : 4);
    if (Number.isInteger(v)) return String(v);
    // a factor reads as every other view writes it (factorText: 4 decimals)
    return Math.abs(v) >= 100 ? v.toFixed(1) : factorText(v);
  }
  return formatValue(value, kind, units, { zeroBelowPrecision: true });
}

/** The number a US customary formula takes, e.g. "12.500" (ft) or "545,894" (in⁴). */
export function formulaValueText(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e5) return Math.round(v).toLocaleString('en-US');
  if (a >= 100) return v.toFixed(1);
  return zeroIfNegligible(v, 0, 3).toFixed(3);
}

export interface TraceInputLine {
  symbol: string;
  value: string;
  /** "(12.500 ft in the formula)" where the formula's unit differs from the one shown. */
  formula?: string;
  description?: string;
}

/** The step's inputs and result as text, residue shown as 0. */
export function traceStepText(s: TraceStep, units: UnitSystem): { inputs: TraceInputLine[]; value: string } {
  const d = stepForDisplay(s);
  const inputs = d.inputs.map((i) => {
    const line: TraceInputLine = { symbol: i.symbol, value: traceValueText(i.value, i.kind, units) };
    if (i.formulaValue !== undefined && i.formulaUnit && i.formulaUnit !== unitSymbol(i.kind, units)) line.formula = `(${formulaValueText(i.formulaValue)} ${i.formulaUnit} in the formula)`;
    if (i.description) line.description = showLengths(i.description, units);
    return line;
  });
  return { inputs, value: traceValueText(d.value, d.kind, units) };
}
