/**
 * Bending moment distribution factors, AASHTO LRFD Art. 4.6.2.2.2:
 * interior girders by Table 4.6.2.2.2b-1, exterior girders by Table 4.6.2.2.2d-1.
 * The tabulated lane fractions include multiple presence (Art. 3.6.1.1.2); where a table
 * calls for the lever rule, the caller applies it with multiple presence.
 *
 * Units: formulas are evaluated in the code's US customary units (S, L, de, W in ft; ts,
 * d, b in in; Kg, I, J in in⁴) read from internal SI values through `toUs`. Results are
 * lanes per girder. Every range of applicability is checked; each violation is a finding.
 */
import { toUs } from '../units.js';
import { checkRange, defined, parameter, type Finding, type FormulaParameter } from './findings.js';
import { count, formulaStep, type FormulaContext, type Lanes, type TableOutcome } from './formula.js';

const T_INT = 'AASHTO LRFD Table 4.6.2.2.2b-1';
const T_EXT = 'AASHTO LRFD Table 4.6.2.2.2d-1';
const GEN = 'AASHTO LRFD Art. 4.6.2.2.1';

const USED = 'formula used outside its range (engineering judgement)';
const LEVER = 'lever rule used';

/** Ask a context for a parameter that the family needs (validated upstream; a guard for direct callers). */
function need(p: FormulaParameter | undefined, what: string): FormulaParameter {
  if (!p) throw new TypeError(`the moment formula needs ${what}`);
  return p;
}

function nbParam(n: number) {
  return parameter('Nb', 'number of girders', n, 'none');
}

/** Interior girder, bending moment (Table 4.6.2.2.2b-1). */
export function interiorMoment(ctx: FormulaContext, lanes: Lanes): TableOutcome {
  const S = ctx.S.us;
  const L = ctx.L.us;
  const label = `Interior girder, moment, ${lanes === 'one' ? 'one design lane' : 'two or more design lanes'}`;
  switch (ctx.family) {
    case 'beam-slab': {
      const Kg = need(ctx.Kg, 'Kg');
      const ts = ctx.ts.us;
      const sOut = checkRange(ctx.S, { max: 16.0 }, T_INT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(
        checkRange(ctx.S, { min: 3.5 }, T_INT, USED),
        checkRange(ctx.ts, { min: 4.5, max: 12.0 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 240 }, T_INT, USED),
        checkRange(Kg, { min: 10000, max: 7000000 }, T_INT, USED),
      );
      const stiff = Kg.us / (12.0 * L * ts ** 3);
      const value =
        lanes === 'one'
          ? 0.06 + (S / 14) ** 0.4 * (S / L) ** 0.3 * stiff ** 0.1
          : 0.075 + (S / 9.5) ** 0.6 * (S / L) ** 0.2 * stiff ** 0.1;
      const formula =
        lanes === 'one'
          ? 'g = 0.06 + (S/14)^0.4 · (S/L)^0.3 · (Kg/(12.0·L·ts³))^0.1'
          : 'g = 0.075 + (S/9.5)^0.6 · (S/L)^0.2 · (Kg/(12.0·L·ts³))^0.1';
      const steps = [formulaStep(label, formula, [ctx.S, ctx.L, ctx.ts, Kg], value, T_INT, `Kg/(12.0·L·ts³) = ${stiff.toFixed(4)}`)];
      if (ctx.Nb === 3) {
        findings.push({
          code: 'fallback',
          message: 'Nb = 3: the lesser of the formula (with Nb = 3) and the lever rule is used',
          article: T_INT,
          parameter: 'Nb',
          value: 3,
          limit: 4,
          bound: 'min',
          excess: 1,
          unit: '',
        });
        return { kind: 'lesser-of-formula-and-lever-rule', value, steps, findings };
      }
      return { kind: 'formula', value, steps, findings };
    }
    case 'spread-box': {
      const d = need(ctx.d, 'the girder depth d');
      const sOut = checkRange(ctx.S, { max: 18.0 }, T_INT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(
        checkRange(ctx.S, { min: 6.0 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 140 }, T_INT, USED),
        checkRange(d, { min: 18, max: 65 }, T_INT, USED),
        checkRange(nbParam(ctx.Nb), { min: 3 }, T_INT, USED),
      );
      const ratio = (S * d.us) / (12.0 * L * L);
      const value = lanes === 'one' ? (S / 3.0) ** 0.35 * ratio ** 0.25 : (S / 6.3) ** 0.6 * ratio ** 0.125;
      const formula = lanes === 'one' ? 'g = (S/3.0)^0.35 · (S·d/(12.0·L²))^0.25' : 'g = (S/6.3)^0.6 · (S·d/(12.0·L²))^0.125';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [ctx.S, ctx.L, d], value, T_INT)], findings };
    }
    case 'multicell': {
      const sOut = checkRange(ctx.S, { max: 13.0 }, `${T_INT}; ${GEN}`, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const ncIn = ctx.Nc ?? 0;
      const ncP = parameter('Nc', 'number of cells', ncIn, 'none');
      const findings = defined(
        checkRange(ctx.S, { min: 7.0 }, T_INT, USED),
        checkRange(ctx.L, { min: 60, max: 240 }, T_INT, USED),
        checkRange(ncP, { min: 3 }, T_INT, USED),
      );
      let Nc = ncIn;
      if (Nc > 8) {
        findings.push({ code: 'capped', message: `Nc = ${ncIn} exceeds 8: Nc = 8 used`, article: T_INT, parameter: 'Nc', value: ncIn, limit: 8, bound: 'max', excess: ncIn - 8, unit: '' });
        Nc = 8;
      }
      const value =
        lanes === 'one' ? (1.75 + S / 3.6) * (1 / L) ** 0.35 * (1 / Nc) ** 0.45 : (13 / Nc) ** 0.3 * (S / 5.8) * (1 / L) ** 0.25;
      const formula = lanes === 'one' ? 'g = (1.75 + S/3.6) · (1/L)^0.35 · (1/Nc)^0.45' : 'g = (13/Nc)^0.3 · (S/5.8) · (1/L)^0.25';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [ctx.S, ctx.L, count('Nc', 'number of cells used', Nc)], value, T_INT)], findings };
    }
    case 'adjacent-box': {
      const b = need(ctx.b, 'the beam width b');
      const I = need(ctx.I, 'I');
      const J = need(ctx.J, 'J');
      const findings = defined(
        checkRange(b, { min: 35, max: 60 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 120 }, T_INT, USED),
        checkRange(nbParam(ctx.Nb), { min: 5, max: 20 }, T_INT, USED),
      );
      const kRaw = 2.5 * ctx.Nb ** -0.2;
      const k = Math.max(kRaw, 1.5);
      if (kRaw < 1.5) {
        findings.push({ code: 'capped', message: `k = 2.5·Nb^-0.2 = ${kRaw.toFixed(3)} is below 1.5: k = 1.5 used`, article: T_INT, parameter: 'k', value: kRaw, limit: 1.5, bound: 'min', excess: 1.5 - kRaw, unit: '' });
      }
      const IJ = I.us / J.us;
      const value =
        lanes === 'one'
          ? k * (b.us / (33.3 * L)) ** 0.5 * IJ ** 0.25
          : k * (b.us / 305) ** 0.6 * (b.us / (12.0 * L)) ** 0.2 * IJ ** 0.06;
      const formula =
        lanes === 'one' ? 'g = k · (b/(33.3·L))^0.5 · (I/J)^0.25,  k = 2.5·Nb^-0.2 ≥ 1.5' : 'g = k · (b/305)^0.6 · (b/(12.0·L))^0.2 · (I/J)^0.06,  k = 2.5·Nb^-0.2 ≥ 1.5';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [b, ctx.L, I, J, count('k', 'k = 2.5·Nb^-0.2 ≥ 1.5', k)], value, T_INT)], findings };
    }
    case 'keyed':
      return sdMethod(ctx, label);
  }
}

/** S/D method for types h; g, i, j connected only to prevent relative vertical displacement. */
function sdMethod(ctx: FormulaContext, label: string): TableOutcome {
  const W = need(ctx.W, 'the bridge width W');
  const K = ctx.K ?? 1;
  const L = ctx.L.us;
  const NL = ctx.NL;
  const findings: Finding[] = defined(checkRange(parameter('NL', 'number of design lanes', NL, 'none'), { max: 6 }, T_INT, USED));
  const cRaw = K * (W.us / L);
  const C = Math.min(cRaw, K);
  if (cRaw > K) {
    findings.push({ code: 'capped', message: `C = K·W/L = ${cRaw.toFixed(3)} exceeds K = ${K}: C = K used`, article: T_INT, parameter: 'C', value: cRaw, limit: K, bound: 'max', excess: cRaw - K, unit: '' });
  }
  const D = C <= 5 ? 11.5 - NL + 1.4 * NL * (1 - 0.2 * C) ** 2 : 11.5 - NL;
  if (!(D > 0)) {
    findings.push({ code: 'fallback', message: `D = ${D.toFixed(3)} ft is not positive for NL = ${NL} lanes: lever rule used`, article: T_INT, parameter: 'NL', value: NL, limit: 6, bound: 'max', excess: NL - 6, unit: '' });
    return { kind: 'lever-rule', steps: [], findings };
  }
  const value = ctx.S.us / D;
  const step = formulaStep(
    `${label} (S/D, regardless of the number of loaded lanes)`,
    'g = S/D,  C = K·(W/L) ≤ K,  D = 11.5 − NL + 1.4·NL·(1 − 0.2·C)² for C ≤ 5, else D = 11.5 − NL',
    [ctx.S, W, ctx.L, count('NL', 'number of design lanes', NL), count('K', 'constant for the beam shape', K), count('C', 'stiffness parameter', C), count('D', 'width, ft', D)],
    value,
    T_INT,
  );
  return { kind: 'formula', value, steps: [step], findings };
}

/**
 * Exterior girder, bending moment (Table 4.6.2.2.2d-1).
 * @param de distance from the exterior web centreline to the curb face, m (positive when the curb is outboard).
 * @param We type d only: half the web spacing plus the total overhang, m.
 * @param exteriorS spacing between the exterior girder and the next one, m.
 */
export function exteriorMoment(ctx: FormulaContext, lanes: Lanes, de: FormulaParameter, extra: { We?: FormulaParameter; exteriorS: FormulaParameter }): TableOutcome {
  const d = de.us;
  const label = `Exterior girder, moment, ${lanes === 'one' ? 'one design lane' : 'two or more design lanes'}`;
  switch (ctx.family) {
    case 'beam-slab': {
      if (lanes === 'one') return { kind: 'lever-rule', steps: [], findings: [] };
      const sOut = checkRange(extra.exteriorS, { max: 16.0 }, T_EXT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(checkRange(de, { min: -1.0, max: 5.5 }, T_EXT, USED));
      const e = 0.77 + d / 9.1;
      const steps = [formulaStep(`${label}: correction factor e`, 'e = 0.77 + de/9.1', [de], e, T_EXT)];
      if (ctx.Nb === 3) {
        findings.push({ code: 'fallback', message: 'Nb = 3: the lesser of e·g_interior and the lever rule is used', article: T_EXT, parameter: 'Nb', value: 3, limit: 4, bound: 'min', excess: 1, unit: '' });
      }
      return { kind: 'e-times-interior', e, extra: 1, steps, findings, lesserWithLeverRule: ctx.Nb === 3 };
    }
    case 'spread-box': {
      if (lanes === 'one') return { kind: 'lever-rule', steps: [], findings: [] };
      const sOut = checkRange(extra.exteriorS, { max: 18.0 }, T_EXT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(checkRange(de, { min: 0, max: 4.5 }, T_EXT, USED));
      const e = 0.97 + d / 28.5;
      return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, 'e = 0.97 + de/28.5', [de], e, T_EXT)], findings };
    }
    case 'multicell': {
      const We = need(extra.We, 'We');
      const findings = defined(checkRange(We, { max: extra.exteriorS.us }, T_EXT, `${USED} (We ≤ S)`));
      const value = We.us / 14;
      return { kind: 'formula', value, steps: [formulaStep(label, 'g = We/14   (We: half the web spacing plus the total overhang, ft)', [We], value, T_EXT)], findings };
    }
    case 'adjacent-box': {
      const findings = defined(checkRange(de, { max: 2.0 }, T_EXT, USED));
      const raw = lanes === 'one' ? 1.125 + d / 30 : 1.04 + d / 25;
      const e = Math.max(raw, 1.0);
      if (raw < 1.0) findings.push({ code: 'capped', message: `e = ${raw.toFixed(3)} is below 1.0: e = 1.0 used`, article: T_EXT, parameter: 'e', value: raw, limit: 1, bound: 'min', excess: 1 - raw, unit: '' });
      const formula = lanes === 'one' ? 'e = 1.125 + de/30 ≥ 1.0' : 'e = 1.04 + de/25 ≥ 1.0';
      return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, formula, [de], e, T_EXT)], findings };
    }
    case 'keyed':
      return { kind: 'lever-rule', steps: [], findings: [] };
  }
}

/** de as a formula parameter (internal m). */
export function deParameter(de: number): FormulaParameter {
  return parameter('de', 'exterior web centreline to the curb face (positive outboard)', de, 'length');
}

/** A formula parameter in US feet, for checks on derived lengths. */
export function feet(symbol: string, description: string, m: number): FormulaParameter {
  return { ...parameter(symbol, description, m, 'length'), us: toUs.ft(m) };
}
