/**
 * Common ground of the empirical formulas: the parameters a formula reads (each carried
 * both as an internal SI value and in the US customary unit the code prints the formula
 * in), the outcome a table gives for one girder, effect and lane case, and a helper that
 * writes the trace step.
 *
 * Units: `FormulaParameter.value` internal (m, m⁴, degrees); `.us` in ft, in, in⁴ as the
 * AASHTO LRFD tables use them. Distribution factors are in lanes per girder (dimensionless).
 */
import type { SectionType } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { traceInput, type Finding, type FormulaParameter } from './findings.js';
import type { FormulaFamily } from './sectionTypes.js';

export interface FormulaContext {
  family: FormulaFamily;
  sectionType: SectionType;
  /** Girder spacing S used by the interior formulas (see the non-uniform spacing rule in factors.ts). */
  S: FormulaParameter;
  /** Span length L for the force effect (Table C4.6.2.2.1-1). */
  L: FormulaParameter;
  /** Number of girders (webs for type d). */
  Nb: number;
  /** Number of design lanes (Art. 3.6.1.1.1). */
  NL: number;
  /** Structural slab thickness ts. */
  ts: FormulaParameter;
  /** Longitudinal stiffness parameter Kg (types using it). */
  Kg?: FormulaParameter;
  /** Girder or web depth d. */
  d?: FormulaParameter;
  /** Beam width b. */
  b?: FormulaParameter;
  /** Girder moment of inertia I and torsional inertia J (types f, g). */
  I?: FormulaParameter;
  J?: FormulaParameter;
  /** Number of cells Nc (type d). */
  Nc?: number;
  /** Edge-to-edge width of the bridge W (S/D method). */
  W?: FormulaParameter;
  /** Constant K of the S/D method. */
  K?: number;
}

export type Lanes = 'one' | 'multiple';

/** What a table prescribes for one girder kind, effect and lane case. */
export type TableOutcome =
  /** A closed-form lane fraction. */
  | { kind: 'formula'; value: number; steps: TraceStep[]; findings: Finding[] }
  /** The lever rule (prescribed by the table, or the code's fallback). */
  | { kind: 'lever-rule'; steps: TraceStep[]; findings: Finding[] }
  /** Three girders: the lesser of the formula and the lever rule. */
  | { kind: 'lesser-of-formula-and-lever-rule'; value: number; steps: TraceStep[]; findings: Finding[] }
  /** Exterior girder: g = e · g_interior · extra (extra = 48/b for types f, g shear). */
  | {
      kind: 'e-times-interior';
      e: number;
      extra: number;
      steps: TraceStep[];
      findings: Finding[];
      /** Three girders: the lesser of e·g_interior and the lever rule. */
      lesserWithLeverRule?: boolean;
    };

export function formulaStep(
  label: string,
  formula: string,
  params: (FormulaParameter | { symbol: string; description: string; value: number })[],
  value: number,
  article: string,
  note?: string,
): TraceStep {
  const step: TraceStep = {
    label,
    formula,
    inputs: params.map((p) => ('kind' in p ? traceInput(p) : { symbol: p.symbol, description: p.description, value: p.value, kind: 'none' as const })),
    value,
    kind: 'none',
    article,
  };
  if (note) step.note = note;
  return step;
}

/** A plain-number parameter for a trace (Nb, Nc, NL, K, …). */
export function count(symbol: string, description: string, value: number) {
  return { symbol, description, value };
}
