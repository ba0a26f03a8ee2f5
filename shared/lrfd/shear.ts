/**
 * Shear distribution factors, AASHTO LRFD Art. 4.6.2.2.3: interior girders by
 * Table 4.6.2.2.3a-1, exterior girders by Table 4.6.2.2.3b-1. The tabulated lane
 * fractions include multiple presence; where a table calls for the lever rule, the caller
 * applies it with multiple presence. The same factors serve for support reactions
 * (Table C4.6.2.2.1-1 gives the span length to use).
 *
 * Units: formulas evaluated in US customary units (S, L, de in ft; ts, d, b in in; I, J in
 * in⁴) read from internal SI values. Results in lanes per girder.
 */
import { checkRange, defined, parameter, type FormulaParameter } from './findings.js';
import { formulaStep, type FormulaContext, type Lanes, type TableOutcome } from './formula.js';

const T_INT = 'AASHTO LRFD Table 4.6.2.2.3a-1';
const T_EXT = 'AASHTO LRFD Table 4.6.2.2.3b-1';
const GEN = 'AASHTO LRFD Art. 4.6.2.2.1';
const USED = 'formula used outside its range (engineering judgement)';
const LEVER = 'lever rule used';

function need(p: FormulaParameter | undefined, what: string): FormulaParameter {
  if (!p) throw new TypeError(`the shear formula needs ${what}`);
  return p;
}

/** Interior girder, shear (Table 4.6.2.2.3a-1). */
export function interiorShear(ctx: FormulaContext, lanes: Lanes): TableOutcome {
  const S = ctx.S.us;
  const L = ctx.L.us;
  const label = `Interior girder, shear, ${lanes === 'one' ? 'one design lane' : 'two or more design lanes'}`;
  switch (ctx.family) {
    case 'beam-slab': {
      const sOut = checkRange(ctx.S, { max: 16.0 }, T_INT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      if (ctx.Nb < 4) {
        return {
          kind: 'lever-rule',
          steps: [],
          findings: [{ code: 'fallback', message: `Nb = ${ctx.Nb} is below 4: lever rule used`, article: T_INT, parameter: 'Nb', value: ctx.Nb, limit: 4, bound: 'min', excess: 4 - ctx.Nb, unit: '' }],
        };
      }
      const findings = defined(
        checkRange(ctx.S, { min: 3.5 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 240 }, T_INT, USED),
        checkRange(ctx.ts, { min: 4.5, max: 12.0 }, T_INT, USED),
      );
      const value = lanes === 'one' ? 0.36 + S / 25.0 : 0.2 + S / 12 - (S / 35) ** 2.0;
      const formula = lanes === 'one' ? 'g = 0.36 + S/25.0' : 'g = 0.2 + S/12 − (S/35)^2.0';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [ctx.S], value, T_INT)], findings };
    }
    case 'spread-box': {
      const d = need(ctx.d, 'the girder depth d');
      const sOut = checkRange(ctx.S, { max: 18.0 }, T_INT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(
        checkRange(ctx.S, { min: 6.0 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 140 }, T_INT, USED),
        checkRange(d, { min: 18, max: 65 }, T_INT, USED),
        checkRange(parameter('Nb', 'number of girders', ctx.Nb, 'none'), { min: 3 }, T_INT, USED),
      );
      const r = d.us / (12.0 * L);
      const value = lanes === 'one' ? (S / 10) ** 0.6 * r ** 0.1 : (S / 7.4) ** 0.8 * r ** 0.1;
      const formula = lanes === 'one' ? 'g = (S/10)^0.6 · (d/(12.0·L))^0.1' : 'g = (S/7.4)^0.8 · (d/(12.0·L))^0.1';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [ctx.S, ctx.L, d], value, T_INT)], findings };
    }
    case 'multicell': {
      const d = need(ctx.d, 'the web depth d');
      const sOut = checkRange(ctx.S, { max: 13.0 }, `${T_INT}; ${GEN}`, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(
        checkRange(ctx.S, { min: 6.0 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 240 }, T_INT, USED),
        checkRange(d, { min: 35, max: 110 }, T_INT, USED),
        checkRange(parameter('Nc', 'number of cells', ctx.Nc ?? 0, 'none'), { min: 3 }, T_INT, USED),
      );
      const r = d.us / (12.0 * L);
      const value = lanes === 'one' ? (S / 9.5) ** 0.6 * r ** 0.1 : (S / 7.3) ** 0.9 * r ** 0.1;
      const formula = lanes === 'one' ? 'g = (S/9.5)^0.6 · (d/(12.0·L))^0.1' : 'g = (S/7.3)^0.9 · (d/(12.0·L))^0.1';
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [ctx.S, ctx.L, d], value, T_INT)], findings };
    }
    case 'adjacent-box': {
      const b = need(ctx.b, 'the beam width b');
      const I = need(ctx.I, 'I');
      const J = need(ctx.J, 'J');
      const findings = defined(
        checkRange(b, { min: 35, max: 60 }, T_INT, USED),
        checkRange(ctx.L, { min: 20, max: 120 }, T_INT, USED),
        checkRange(parameter('Nb', 'number of girders', ctx.Nb, 'none'), { min: 5, max: 20 }, T_INT, USED),
        checkRange(J, { min: 25000, max: 610000 }, T_INT, USED),
        checkRange(I, { min: 40000, max: 610000 }, T_INT, USED),
      );
      const IJ = I.us / J.us;
      let value: number;
      let formula: string;
      if (lanes === 'one') {
        value = (b.us / (130 * L)) ** 0.15 * IJ ** 0.05;
        formula = 'g = (b/(130·L))^0.15 · (I/J)^0.05';
      } else {
        const rawB = b.us / 48;
        const bFactor = Math.max(rawB, 1.0);
        if (rawB < 1.0) findings.push({ code: 'capped', message: `b/48 = ${rawB.toFixed(3)} is below 1.0: 1.0 used`, article: T_INT, parameter: 'b/48', value: rawB, limit: 1, bound: 'min', excess: 1 - rawB, unit: '' });
        value = (b.us / 156) ** 0.4 * (b.us / (12.0 * L)) ** 0.1 * IJ ** 0.05 * bFactor;
        formula = 'g = (b/156)^0.4 · (b/(12.0·L))^0.1 · (I/J)^0.05 · (b/48),  b/48 ≥ 1.0';
      }
      return { kind: 'formula', value, steps: [formulaStep(label, formula, [b, ctx.L, I, J], value, T_INT)], findings };
    }
    case 'keyed':
      return { kind: 'lever-rule', steps: [], findings: [] };
  }
}

/** Exterior girder, shear (Table 4.6.2.2.3b-1). @param de exterior web to curb face, m. */
export function exteriorShear(ctx: FormulaContext, lanes: Lanes, de: FormulaParameter, extra: { exteriorS: FormulaParameter }): TableOutcome {
  const d = de.us;
  const label = `Exterior girder, shear, ${lanes === 'one' ? 'one design lane' : 'two or more design lanes'}`;
  switch (ctx.family) {
    case 'beam-slab': {
      if (lanes === 'one') return { kind: 'lever-rule', steps: [], findings: [] };
      if (ctx.Nb < 4) {
        return {
          kind: 'lever-rule',
          steps: [],
          findings: [{ code: 'fallback', message: `Nb = ${ctx.Nb} is below 4: lever rule used`, article: T_EXT, parameter: 'Nb', value: ctx.Nb, limit: 4, bound: 'min', excess: 4 - ctx.Nb, unit: '' }],
        };
      }
      const sOut = checkRange(extra.exteriorS, { max: 16.0 }, T_EXT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(checkRange(de, { min: -1.0, max: 5.5 }, T_EXT, USED));
      const e = 0.6 + d / 10;
      return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, 'e = 0.6 + de/10', [de], e, T_EXT)], findings };
    }
    case 'spread-box': {
      if (lanes === 'one') return { kind: 'lever-rule', steps: [], findings: [] };
      const sOut = checkRange(extra.exteriorS, { max: 18.0 }, T_EXT, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(checkRange(de, { min: 0, max: 4.5 }, T_EXT, USED));
      const e = 0.8 + d / 10;
      return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, 'e = 0.8 + de/10', [de], e, T_EXT)], findings };
    }
    case 'multicell': {
      if (lanes === 'one') return { kind: 'lever-rule', steps: [], findings: [] };
      const sOut = checkRange(extra.exteriorS, { max: 13.0 }, `${T_EXT}; ${GEN}`, LEVER, 'fallback');
      if (sOut) return { kind: 'lever-rule', steps: [], findings: [sOut] };
      const findings = defined(checkRange(de, { min: -2.0, max: 5.0 }, T_EXT, USED));
      const e = 0.64 + d / 12.5;
      return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, 'e = 0.64 + de/12.5', [de], e, T_EXT)], findings };
    }
    case 'adjacent-box': {
      const b = need(ctx.b, 'the beam width b');
      const findings = defined(checkRange(de, { max: 2.0 }, T_EXT, USED), checkRange(b, { min: 35, max: 60 }, T_EXT, USED));
      if (lanes === 'one') {
        const raw = 1.25 + d / 20;
        const e = Math.max(raw, 1.0);
        if (raw < 1.0) findings.push({ code: 'capped', message: `e = ${raw.toFixed(3)} is below 1.0: e = 1.0 used`, article: T_EXT, parameter: 'e', value: raw, limit: 1, bound: 'min', excess: 1 - raw, unit: '' });
        return { kind: 'e-times-interior', e, extra: 1, steps: [formulaStep(`${label}: correction factor e`, 'e = 1.25 + de/20 ≥ 1.0', [de], e, T_EXT)], findings };
      }
      const inner = (d + b.us / 12 - 2.0) / 40;
      const raw = inner > 0 ? 1 + Math.sqrt(inner) : 1.0;
      const e = Math.max(raw, 1.0);
      if (!(inner > 0)) {
        findings.push({ code: 'capped', message: `de + b/12 − 2.0 = ${(d + b.us / 12 - 2.0).toFixed(3)} ft is not positive: e = 1.0 used`, article: T_EXT, parameter: 'e', value: 1, limit: 1, bound: 'min', excess: 0, unit: '' });
      }
      const rawB = 48 / b.us;
      const bFactor = Math.min(rawB, 1.0);
      if (rawB > 1.0) findings.push({ code: 'capped', message: `48/b = ${rawB.toFixed(3)} exceeds 1.0: 1.0 used`, article: T_EXT, parameter: '48/b', value: rawB, limit: 1, bound: 'max', excess: rawB - 1, unit: '' });
      return {
        kind: 'e-times-interior',
        e,
        extra: bFactor,
        steps: [formulaStep(`${label}: correction factor e`, 'g = e · g_interior · (48/b), 48/b ≤ 1.0;  e = 1 + ((de + b/12 − 2.0)/40)^0.5 ≥ 1.0', [de, b], e, T_EXT, `48/b used: ${bFactor.toFixed(4)}`)],
        findings,
      };
    }
    case 'keyed':
      return { kind: 'lever-rule', steps: [], findings: [] };
  }
}
