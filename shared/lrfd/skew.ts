/**
 * Skew corrections.
 * - Moment reduction, AASHTO LRFD Art. 4.6.2.2.2e, Table 4.6.2.2.2e-1: allowed when the
 *   skews of the two support lines of a span differ by no more than 10°.
 *     a, e, k; i, j acting as a unit: 1 − c1·(tanθ)^1.5, c1 = 0.25·(Kg/(12.0·L·ts³))^0.25·(S/L)^0.5;
 *       c1 = 0 for θ < 30°; θ > 60° taken as 60°. Where inputs far outside the table's
 *       ranges make 1 − c1·(tanθ)^1.5 ≤ 0, no reduction is taken (a finding says so).
 *     b, c, d, f, g: 1.05 − 0.25·tanθ ≤ 1.0; θ > 60° taken as 60°.
 *     other types: no reduction tabulated.
 * - Shear correction at the obtuse corner, Art. 4.6.2.2.3c, Table 4.6.2.2.3c-1:
 *     a, e, k; i, j acting as a unit: 1.0 + 0.20·(12.0·L·ts³/Kg)^0.3·tanθ
 *     d: 1.0 + (0.25 + 12.0·L/(70·d))·tanθ
 *     b, c: 1.0 + (√(12.0·L/d) / (6·S))·tanθ
 *     f, g: 1.0 + (12.0·L/(90·d))·√(tanθ)
 *     other types: no correction tabulated.
 *
 * Units: θ in degrees (the code uses |θ|); L, S in ft; ts, d in in; Kg in in⁴ (from
 * internal SI values). Factors are dimensionless multipliers of the lane fractions.
 */
import type { SectionType } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { checkRange, defined, parameter, type Finding, type FormulaParameter } from './findings.js';
import { formulaStep } from './formula.js';

const T_M = 'AASHTO LRFD Art. 4.6.2.2.2e, Table 4.6.2.2.2e-1';
const T_V = 'AASHTO LRFD Art. 4.6.2.2.3c, Table 4.6.2.2.3c-1';
const USED = 'correction used outside its range (engineering judgement)';

export interface SkewInputs {
  sectionType: SectionType;
  /** Whether the beams act as a unit (types g, i, j). */
  actsAsUnit: boolean;
  S: FormulaParameter;
  L: FormulaParameter;
  ts: FormulaParameter;
  Kg?: FormulaParameter;
  d?: FormulaParameter;
  b?: FormulaParameter;
  Nb: number;
  Nc?: number;
}

export interface SkewFactor {
  factor: number;
  steps: TraceStep[];
  findings: Finding[];
}

const rad = (deg: number) => (deg * Math.PI) / 180;

/** Which row of Table 4.6.2.2.2e-1 applies. */
function momentRow(t: SectionType, unit: boolean): 'beam-slab' | 'box' | 'none' {
  if (['a', 'e', 'k'].includes(t) || (['i', 'j'].includes(t) && unit)) return 'beam-slab';
  if (['b', 'c', 'd', 'f', 'g'].includes(t)) return 'box';
  return 'none';
}

/**
 * Moment reduction factor for a span.
 * @param skews |θ| of the span's two support lines, degrees.
 */
export function momentSkewFactor(inp: SkewInputs, skews: [number, number]): SkewFactor {
  const a = Math.abs(skews[0]);
  const b = Math.abs(skews[1]);
  const findings: Finding[] = [];
  if (a === 0 && b === 0) return { factor: 1, steps: [], findings };
  const diff = Math.abs(skews[0] - skews[1]);
  if (diff > 10 + 1e-9) {
    findings.push({
      code: 'not-applicable',
      message: `the skews of the span's support lines differ by ${diff.toFixed(1)}°, more than 10°: no moment reduction`,
      article: T_M,
      parameter: 'Δθ',
      value: diff,
      limit: 10,
      bound: 'max',
      excess: diff - 10,
      unit: '°',
    });
    return { factor: 1, steps: [], findings };
  }
  let theta = Math.min(a, b);
  if (a !== b) {
    findings.push({
      code: 'assumption',
      message: `support skews ${a.toFixed(1)}° and ${b.toFixed(1)}°: the smaller, ${theta.toFixed(1)}°, is used for the moment reduction (common practice, no source)`,
      article: 'common practice, no source',
    });
  }
  const row = momentRow(inp.sectionType, inp.actsAsUnit);
  if (row === 'none') {
    findings.push({ code: 'not-applicable', message: `no moment reduction for skew is tabulated for section type ${inp.sectionType} as connected`, article: T_M });
    return { factor: 1, steps: [], findings };
  }
  if (theta > 60) {
    findings.push({ code: 'capped', message: `θ = ${theta.toFixed(1)}° exceeds 60°: θ = 60° used`, article: T_M, parameter: 'θ', value: theta, limit: 60, bound: 'max', excess: theta - 60, unit: '°' });
    theta = 60;
  }
  const thetaP = parameter('θ', 'skew angle used', theta, 'angle');
  const t = Math.tan(rad(theta));
  if (row === 'beam-slab') {
    if (theta < 30) {
      findings.push({
        code: 'not-applicable',
        message: `θ = ${theta.toFixed(1)}° is below 30°: c1 = 0, no moment reduction`,
        article: T_M,
        parameter: 'θ',
        value: theta,
        limit: 30,
        bound: 'min',
        excess: 30 - theta,
        unit: '°',
      });
      return { factor: 1, steps: [formulaStep('Skew reduction, moment', '1 − c1·(tanθ)^1.5, c1 = 0 for θ < 30°', [thetaP], 1, T_M)], findings };
    }
    const Kg = inp.Kg;
    if (!Kg) throw new TypeError('the moment skew reduction needs Kg');
    findings.push(
      ...defined(
        checkRange(inp.S, { min: 3.5, max: 16.0 }, T_M, USED),
        checkRange(inp.L, { min: 20, max: 240 }, T_M, USED),
        checkRange(parameter('Nb', 'number of girders', inp.Nb, 'none'), { min: 4 }, T_M, USED),
      ),
    );
    const c1 = 0.25 * (Kg.us / (12.0 * inp.L.us * inp.ts.us ** 3)) ** 0.25 * (inp.S.us / inp.L.us) ** 0.5;
    const computed = 1 - c1 * t ** 1.5;
    if (!(computed > 0)) {
      findings.push({
        code: 'not-applicable',
        message: `1 − c1·(tanθ)^1.5 = ${computed.toFixed(3)} is not positive for these inputs (c1 = ${c1.toFixed(3)}): no moment reduction taken (engineering judgement)`,
        article: T_M,
        parameter: 'c1',
        value: c1,
      });
      return { factor: 1, steps: [formulaStep('Skew reduction, moment', '1 − c1·(tanθ)^1.5 (not positive: no reduction)', [thetaP, inp.S, inp.L, inp.ts, Kg], 1, T_M, `c1 = ${c1.toFixed(4)}`)], findings };
    }
    const factor = computed;
    return {
      factor,
      steps: [formulaStep('Skew reduction, moment', '1 − c1·(tanθ)^1.5,  c1 = 0.25·(Kg/(12.0·L·ts³))^0.25·(S/L)^0.5', [thetaP, inp.S, inp.L, inp.ts, Kg], factor, T_M, `c1 = ${c1.toFixed(4)}`)],
      findings,
    };
  }
  const raw = 1.05 - 0.25 * t;
  const factor = Math.min(raw, 1.0);
  return { factor, steps: [formulaStep('Skew reduction, moment', '1.05 − 0.25·tanθ ≤ 1.0', [thetaP], factor, T_M)], findings };
}

/**
 * Shear correction factor at the obtuse corner.
 * @param skewDeg |θ| of the support line concerned, degrees.
 */
export function shearSkewFactor(inp: SkewInputs, skewDeg: number): SkewFactor {
  const theta = Math.abs(skewDeg);
  const findings: Finding[] = [];
  if (theta === 0) return { factor: 1, steps: [], findings };
  const t = Math.tan(rad(theta));
  const thetaP = parameter('θ', 'skew angle', theta, 'angle');
  const T = inp.sectionType;
  const unit = inp.actsAsUnit;
  const thetaRange = (minExclusive: boolean) => checkRange(thetaP, { min: 0, minExclusive, max: 60 }, T_V, USED);
  if (['a', 'e', 'k'].includes(T) || (['i', 'j'].includes(T) && unit)) {
    const Kg = inp.Kg;
    if (!Kg) throw new TypeError('the shear skew correction needs Kg');
    findings.push(
      ...defined(
        thetaRange(false),
        checkRange(inp.S, { min: 3.5, max: 16.0 }, T_V, USED),
        checkRange(inp.L, { min: 20, max: 240 }, T_V, USED),
        checkRange(parameter('Nb', 'number of girders', inp.Nb, 'none'), { min: 4 }, T_V, USED),
      ),
    );
    const r = (12.0 * inp.L.us * inp.ts.us ** 3) / Kg.us;
    const factor = 1.0 + 0.2 * r ** 0.3 * t;
    return { factor, steps: [formulaStep('Skew correction, shear at the obtuse corner', '1.0 + 0.20·(12.0·L·ts³/Kg)^0.3·tanθ', [thetaP, inp.L, inp.ts, Kg], factor, T_V)], findings };
  }
  if (T === 'd') {
    const d = inp.d;
    if (!d) throw new TypeError('the shear skew correction needs d');
    findings.push(
      ...defined(
        thetaRange(true),
        checkRange(inp.S, { min: 6.0, minExclusive: true, max: 13.0 }, T_V, USED),
        checkRange(inp.L, { min: 20, max: 240 }, T_V, USED),
        checkRange(d, { min: 35, max: 110 }, T_V, USED),
        checkRange(parameter('Nc', 'number of cells', inp.Nc ?? 0, 'none'), { min: 3 }, T_V, USED),
      ),
    );
    const factor = 1.0 + (0.25 + (12.0 * inp.L.us) / (70 * d.us)) * t;
    return { factor, steps: [formulaStep('Skew correction, shear at the obtuse corner', '1.0 + (0.25 + 12.0·L/(70·d))·tanθ', [thetaP, inp.L, d], factor, T_V)], findings };
  }
  if (T === 'b' || T === 'c') {
    const d = inp.d;
    if (!d) throw new TypeError('the shear skew correction needs d');
    findings.push(
      ...defined(
        thetaRange(true),
        checkRange(inp.S, { min: 6.0, max: 11.5 }, T_V, USED),
        checkRange(inp.L, { min: 20, max: 140 }, T_V, USED),
        checkRange(d, { min: 18, max: 65 }, T_V, USED),
        checkRange(parameter('Nb', 'number of girders', inp.Nb, 'none'), { min: 3 }, T_V, USED),
      ),
    );
    const factor = 1.0 + (Math.sqrt((12.0 * inp.L.us) / d.us) / (6 * inp.S.us)) * t;
    return { factor, steps: [formulaStep('Skew correction, shear at the obtuse corner', '1.0 + (√(12.0·L/d) / (6·S))·tanθ', [thetaP, inp.S, inp.L, d], factor, T_V)], findings };
  }
  if (T === 'f' || T === 'g') {
    const d = inp.d;
    if (!d) throw new TypeError('the shear skew correction needs d');
    findings.push(
      ...defined(
        thetaRange(true),
        checkRange(inp.L, { min: 20, max: 120 }, T_V, USED),
        checkRange(d, { min: 17, max: 60 }, T_V, USED),
        inp.b ? checkRange(inp.b, { min: 35, max: 60 }, T_V, USED) : undefined,
        checkRange(parameter('Nb', 'number of girders', inp.Nb, 'none'), { min: 5, max: 20 }, T_V, USED),
      ),
    );
    const factor = 1.0 + ((12.0 * inp.L.us) / (90 * d.us)) * Math.sqrt(t);
    return { factor, steps: [formulaStep('Skew correction, shear at the obtuse corner', '1.0 + (12.0·L/(90·d))·√(tanθ)', [thetaP, inp.L, d], factor, T_V)], findings };
  }
  findings.push({ code: 'not-applicable', message: `no shear correction for skew is tabulated for section type ${T} as connected`, article: T_V });
  return { factor: 1, steps: [], findings };
}
