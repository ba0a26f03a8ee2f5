/**
 * Training questions ask what they grade: for every question an instructor can make on a
 * skewed deck, a right deck, a three-girder deck and an unsymmetric deck, the question names
 * the method, girder, effect, lane case, place and skew correction of the value it grades; the
 * expected answer is that value (the code row's value with the skew correction, its baseValue
 * before it); a trainee's literal answer passes; and the trace a trainee is compared with holds
 * only the steps of that quantity. Hand calculations with AASHTO LRFD articles check the values
 * of a few questions from the deck's inputs.
 */
import { describe, expect, it } from 'vitest';
import { assertDeck, type Deck } from '../../shared/deck/schema.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { computeCodeFactors, hasTraceParts, withTraceParts, type CodeFactorResult, type FactorRow } from '../../shared/lrfd/index.js';
import type { TraceStep } from '../../shared/trace.js';
import { EFFECT_LABELS } from '../../shared/lrfd/words.js';
import { deckGeometry } from '../../shared/deck/geometry.js';
import { expectedFactor, expectedTruckPosition, grade, type ExpectedAnswer } from '../../server/api/training/trainingQuestions.js';
import { FACTOR_EFFECTS, FACTOR_METHODS, type FactorParams } from '../../server/api/training/trainingModel.js';
import { ApiError } from '../../server/middleware/errors.js';
import { quarryCreekUs } from '../fixtures/decks.js';

type UsDeck = Record<string, unknown>;
const deckOf = (changes: UsDeck): Deck => assertDeck(deckFromDisplay({ ...structuredClone(quarryCreekUs), ...changes } as never, 'US'));

const DECKS: { name: string; deck: Deck; skewed: boolean }[] = [
  { name: 'six bulb-tees, 20° skew', deck: deckOf({}), skewed: true },
  { name: 'six bulb-tees, right deck', deck: deckOf({ supports: [{ skew: 0 }, { skew: 0 }] }), skewed: false },
  { name: 'three girders at 12 ft, 20° skew', deck: deckOf({ girders: { kind: 'uniform', count: 3, spacing: 12 } }), skewed: true },
  { name: 'unequal overhangs, 20° skew', deck: deckOf({ overhangRight: 2.5 }), skewed: true },
];

const TOLERANCE = 1; // %
const reads = (s: TraceStep) => s.inputs.some((i) => i.symbol === 'L' && i.kind === 'length');

/** Every question the form and the API allow, with the answer or the refusal. */
function everyQuestion(code: CodeFactorResult): { p: FactorParams; answer: ExpectedAnswer | null; refusal: string | null }[] {
  const out: { p: FactorParams; answer: ExpectedAnswer | null; refusal: string | null }[] = [];
  for (const girder of ['interior', 'exterior'] as const)
    for (const effect of FACTOR_EFFECTS)
      for (const lanes of ['one', 'multiple', 'governing'] as const)
        for (const method of FACTOR_METHODS)
          for (const skew of ['with', 'before'] as const) {
            const p: FactorParams = { girder, effect, lanes, method, skew };
            try {
              out.push({ p, answer: expectedFactor(code, p), refusal: null });
            } catch (e) {
              if (!(e instanceof ApiError)) throw e;
              out.push({ p, answer: null, refusal: e.message });
            }
          }
  return out;
}

/** The value a question names, from its definition: the largest of the method's values in the lane case(s) asked (with or before the skew correction), or the code's adopted / governing value. */
function namedValue(code: CodeFactorResult, p: FactorParams): { row: FactorRow; value: number } {
  const here = code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect);
  const place = here[0].location.key;
  const rows = here.filter((r) => r.location.key === place && (p.lanes === 'governing' || r.lanes === p.lanes));
  if (p.method === 'governing') {
    const row = rows.find((r) => (p.lanes === 'governing' ? r.governing : r.adopted))!;
    return { row, value: row.value };
  }
  const q = (r: FactorRow) => (p.skew === 'before' ? r.baseValue : r.value);
  const row = rows.filter((r) => r.method === p.method).reduce((a, b) => (q(b) > q(a) ? b : a));
  return { row, value: q(row) };
}

describe.each(DECKS)('every factor question on the deck "$name"', ({ deck, skewed }) => {
  const code = computeCodeFactors(deck);
  const questions = everyQuestion(code);
  const asked = questions.filter((q) => q.answer !== null);

  it('covers every method, both lane cases and both skew choices', () => {
    const methods = new Set(asked.map((q) => q.answer!.method));
    for (const m of ['formula', 'lever-rule', 'rigid-section', 'equal-share']) expect(methods, m).toContain(m);
    expect(new Set(asked.map((q) => q.answer!.lanes))).toEqual(new Set(['one', 'multiple']));
    expect(new Set(asked.map((q) => q.answer!.skew))).toEqual(skewed ? new Set(['none', 'with', 'before']) : new Set(['none']));
  });

  it('the expected answer is the value the question names: the row’s value with the skew correction, its baseValue before it', () => {
    for (const { p, answer } of asked) {
      const { row, value } = namedValue(code, p);
      expect(answer!.rowId, JSON.stringify(p)).toBe(row.id);
      expect(answer!.value, JSON.stringify(p)).toBe(value);
      if (answer!.skew === 'before') expect(answer!.value).toBe(row.baseValue);
      else expect(answer!.value).toBe(row.value);
    }
  });

  it('the question names the method, girder, effect, lane case, place and skew correction', () => {
    for (const { p, answer } of asked) {
      const q = answer!.question;
      const row = code.factors.find((r) => r.id === answer!.rowId)!;
      const label = JSON.stringify(p);
      expect(q, label).toContain(`${p.method === 'governing' ? 'governing' : p.method === 'formula' ? 'empirical-formula' : p.method} ${EFFECT_LABELS[p.effect]} factor`);
      expect(q, label).toContain(`the ${p.girder} girder`);
      if (p.method !== 'governing' && row.girderNumber !== undefined) expect(q, label).toContain(`(girder ${row.girderNumber})`);
      expect(q, label).toContain(row.location.description);
      if (row.method === 'equal-share') expect(q, label).toContain(`all ${code.derived.designLanes} design lanes loaded`);
      else if (row.effect.startsWith('fatigue')) expect(q, label).toContain('with one loaded lane, multiple presence removed');
      else if (p.lanes === 'one') expect(q, label).toContain('with one loaded lane,');
      else if (p.lanes === 'multiple') expect(q, label).toMatch(code.derived.designLanes === 2 && p.method !== 'formula' && p.method !== 'governing' ? /with two loaded lanes,/ : /with two or more loaded lanes/);
      // A skewed deck's question says whether the correction is in the value; a right deck's says nothing of it
      // (the deflection share m·NL/Nb of Art. 2.5.2.6.2 has no skew correction).
      const correction = skewed && row.effect !== 'deflection';
      if (!correction) expect(q, label).not.toMatch(/skew/);
      else expect(q.endsWith(p.skew === 'before' ? ', before the skew correction' : ', skew correction included'), `${label}: ${q}`).toBe(true);
    }
  });

  it('the trace holds only the steps of the quantity: no skew step before the correction, L only where a step reads it', () => {
    for (const { p, answer } of asked) {
      const row = code.factors.find((r) => r.id === answer!.rowId)!;
      const label = JSON.stringify(p);
      const own = answer!.candidates ? answer!.trace.slice(0, -1) : answer!.trace;
      // Every step is one of the row's, in the row's order; a governing value adds the choice of candidates last.
      const positions = own.map((s) => row.trace.findIndex((t) => t.label === s.label && t.value === s.value));
      expect(positions.every((i, k) => i >= 0 && (k === 0 || i > positions[k - 1])), label).toBe(true);
      if (answer!.candidates) expect(answer!.trace.at(-1)!.label, label).toMatch(/^The value that governs, of \d+ candidates/);
      if (answer!.skew === 'before') expect(own.some((s) => s.part === 'skew'), label).toBe(false);
      if (answer!.skew === 'with') expect(own.at(-1)!.value, label).toBe(row.value);
      const spanStep = own.find((s) => s.part === 'span-length');
      const readers = own.filter((s) => s.part !== 'span-length' && reads(s));
      expect(spanStep !== undefined, `${label}: L is shown exactly when a step reads it`).toBe(readers.length > 0);
      // Left out: only skew steps (before the correction) and an L that no kept step reads.
      for (const s of row.trace.filter((t) => !own.includes(t))) expect(s.part === 'skew' || s.part === 'span-length', `${label}: ${s.label}`).toBe(true);
      // The lever rule, the rigid-section check and the equal share do not read L (Art. 4.6.2.2.1, 4.6.2.2.2d, 2.5.2.6.2).
      if (['lever-rule', 'rigid-section', 'equal-share'].includes(row.method) && answer!.skew !== 'with') expect(spanStep, label).toBeUndefined();
    }
  });

  it('a literal answer passes, steps and all; a wrong step is named by a step of the quantity only', () => {
    for (const { p, answer } of asked) {
      const e = answer!;
      const label = JSON.stringify(p);
      // As a trainee writes it: 3 decimals for the answer, 4 significant digits for each step.
      const steps = e.trace.map((s) => ({ label: s.label, formula: '', note: '', value: Number(s.value.toPrecision(4)) }));
      const literal = grade(deck, 'factor', p, e, { value: Number(e.value.toFixed(3)), steps }, TOLERANCE);
      expect(literal.passed, label).toBe(true);
      expect(literal.stepMatches.every((m) => m.traineeStep !== null), label).toBe(true);
      expect(literal.summary, label).not.toMatch(/First step without/);

      const wrong = grade(deck, 'factor', p, e, { value: e.value * 1.5, steps: [{ label: 'a guess', formula: '', note: '', value: -7 }] }, TOLERANCE);
      expect(wrong.passed).toBe(false);
      expect(wrong.summary, label).toContain(`First step without a matching value: “${e.trace[0].label}”.`);
    }
  });

  it('refuses "before the skew correction" only where no such value exists, naming params.skew', () => {
    for (const { p, refusal } of questions.filter((q) => q.refusal !== null && q.p.skew === 'before')) {
      const with_ = questions.find((q) => JSON.stringify(q.p) === JSON.stringify({ ...p, skew: 'with' }))!;
      if (with_.refusal !== null) continue; // no such factor at all
      expect(p.method === 'governing' || p.effect.startsWith('fatigue'), JSON.stringify(p)).toBe(true);
      expect(refusal).toMatch(/^params\.skew: /);
    }
  });
});

describe('hand calculations of the values the questions name (fixture deck: six type-k bulb-tees at 9.6667 ft, L = 110 ft, 20° skew)', () => {
  const deck = DECKS[0].deck;
  const code = computeCodeFactors(deck);
  const u = quarryCreekUs;
  const S = u.girders.spacing;
  const ask = (p: FactorParams) => expectedFactor(code, p);
  // Kg = n (I + A eg²), AASHTO LRFD Eq. 4.6.2.2.1-1; n = √(f'c girder / f'c deck) for equal unit weights
  // (Art. 5.4.2.4, Ec = 33 000 K1 wc^1.5 √f'c); eg = centroid depth + ts/2 (no haunch).
  const n = Math.sqrt(u.materials.girder.fc / u.materials.deck.fc);
  const eg = u.section.centroidFromTop + u.slab.thickness / 2;
  const Kg = n * (u.section.inertia + u.section.area * eg * eg);
  const L = u.spans[0].length;
  const ts = u.slab.thickness;
  // Shear skew correction, Table 4.6.2.2.3c-1 (types a, e, k): 1.0 + 0.20 (12.0 L ts³ / Kg)^0.3 tan θ.
  const shearSkew = 1 + 0.2 * ((12 * L * ts ** 3) / Kg) ** 0.3 * Math.tan((20 * Math.PI) / 180);

  it('the lever-rule shear factor of the exterior girder, one lane: 0.828 before the skew correction, 0.828 × 1.052 with it', () => {
    // Lever rule, Art. 4.6.2.2.1: the slab hinged over girder 2. Wheel 2 ft from the barrier face
    // (Art. 3.6.1.3.1, the lane edge at the face); de = 3.5 − 1.5 = 2.0 ft, so the outer wheel is over
    // girder 1 (ordinate 1) and the inner wheel 6 ft further, (S − 6)/S. One lane, m = 1.20 (Table 3.6.1.1.2-1).
    const lever = 1.2 * 0.5 * (1 + (S - 6) / S);
    expect(lever).toBeRelativelyClose(0.8276, 1e-4);
    const before = ask({ girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule', skew: 'before' });
    expect(before.question).toBe('the lever-rule shear factor of the exterior girder (girder 1) with one loaded lane, in span 1, before the skew correction');
    expect(before.value).toBeRelativelyClose(lever, 1e-6);
    expect(before.trace.map((s) => s.label)).toEqual(['Lever rule, girder 1, 1 loaded lane']);
    // The trainee's literal answer, 0.828, passes at 1 %.
    expect(grade(deck, 'factor', {}, before, { value: 0.828, steps: [{ label: 'lever rule', formula: '', note: '', value: 0.828 }] }, 1).passed).toBe(true);

    const withSkew = ask({ girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule' });
    expect(withSkew.question).toBe('the lever-rule shear factor of the exterior girder (girder 1) with one loaded lane, in span 1, skew correction included');
    expect(shearSkew).toBeRelativelyClose(1.0516, 1e-4);
    expect(withSkew.value).toBeRelativelyClose(lever * shearSkew, 1e-6);
    // The correction reads L, so the trace shows where L comes from: L, lever rule, correction, product.
    expect(withSkew.trace.map((s) => s.part ?? 'method')).toEqual(['span-length', 'method', 'skew', 'skew']);
    expect(grade(deck, 'factor', {}, withSkew, { value: 0.828, steps: [] }, 1).passed).toBe(false);
    expect(grade(deck, 'factor', {}, withSkew, { value: 0.870, steps: [] }, 1).passed).toBe(true);
  });

  it('the rigid-section moment factor of the exterior girder, one lane', () => {
    // Rigid section, Eq. C4.6.2.2.2d-1: R = NL/Nb + X_ext Σe / Σx², times m = 1.20 for one lane.
    // Girders at ±0.5S, ±1.5S, ±2.5S from the centre: Σx² = 2 (0.25 + 2.25 + 6.25) S² = 17.5 S²; X_ext = 2.5 S.
    // The truck's resultant is 2 + 3 = 5 ft inside the barrier face, which is 2 ft outside girder 1:
    // e = 2.5 S − 3 ft.
    const X = 2.5 * S;
    const R = 1.2 * (1 / 6 + (X * (X - 3)) / (17.5 * S * S));
    const e = ask({ girder: 'exterior', effect: 'moment', lanes: 'one', method: 'rigid-section', skew: 'before' });
    expect(e.value).toBeRelativelyClose(R, 1e-6);
    expect(e.trace.every((s) => s.part === undefined)).toBe(true);
  });

  it('the interior moment and shear formulas for two or more lanes, with and before the skew correction', () => {
    // Table 4.6.2.2.2b-1 (types a, e, k), two or more lanes: 0.075 + (S/9.5)^0.6 (S/L)^0.2 (Kg/(12 L ts³))^0.1.
    const moment = 0.075 + (S / 9.5) ** 0.6 * (S / L) ** 0.2 * (Kg / (12 * L * ts ** 3)) ** 0.1;
    const m = { girder: 'interior', effect: 'moment', lanes: 'multiple', method: 'formula' } as const;
    // Table 4.6.2.2.2e-1: c1 = 0 for θ < 30°, so at 20° the moment is not reduced — both questions have one value.
    expect(ask({ ...m, skew: 'before' }).value).toBeRelativelyClose(moment, 1e-4);
    expect(ask({ ...m, skew: 'with' }).value).toBeRelativelyClose(moment, 1e-4);
    // The formula reads L: the trace starts with it whether or not the correction is in.
    expect(ask({ ...m, skew: 'before' }).trace[0].part).toBe('span-length');
    // Table 4.6.2.2.3a-1 (types a, e, k), two or more lanes: 0.2 + S/12 − (S/35)².
    const shear = 0.2 + S / 12 - (S / 35) ** 2;
    const v = { girder: 'interior', effect: 'shear', lanes: 'multiple', method: 'formula' } as const;
    const before = ask({ ...v, skew: 'before' });
    expect(before.value).toBeRelativelyClose(shear, 1e-6);
    // This formula has no L in it, and before the correction nothing else reads L.
    expect(before.trace.map((s) => s.label)).toEqual(['Interior girder, shear, two or more design lanes']);
    expect(ask({ ...v, skew: 'with' }).value).toBeRelativelyClose(shear * shearSkew, 1e-6);
  });

  it('three girders at 12 ft: the lever rule of the exterior girder with two loaded lanes', () => {
    // Two 12 ft lanes from the barrier face, 2 ft outside girder 1 (Art. 3.6.1.1.1, 3.6.1.3.1): lane 1's
    // wheels at 0 and 6 ft (ordinates 1 and 0.5), lane 2's first wheel at 12 ft, over girder 2 (ordinate 0).
    // R = (1 + 0.5 + 0) / 2, m = 1.00 for two lanes (Table 3.6.1.1.2-1).
    const three = DECKS[2].deck;
    const e = expectedFactor(computeCodeFactors(three), { girder: 'exterior', effect: 'shear', lanes: 'multiple', method: 'lever-rule', skew: 'before' });
    expect(e.question).toBe('the lever-rule shear factor of the exterior girder (girder 1) with two loaded lanes, in span 1, before the skew correction');
    expect(e.value).toBeRelativelyClose(0.75, 1e-9);
    expect(e.loadedLanes).toBe(2);
  });

  it('refuses a governing value or a fatigue factor before the skew correction, saying why', () => {
    expect(() => ask({ girder: 'exterior', effect: 'shear', lanes: 'governing', method: 'governing', skew: 'before' })).toThrow(/^params\.skew: a governing value is chosen among values with their skew corrections/);
    expect(() => ask({ girder: 'exterior', effect: 'fatigue-shear', lanes: 'one', method: 'lever-rule', skew: 'before' })).toThrow(/^params\.skew: the fatigue shear factor starts from the adopted one-lane factor with its skew correction/);
  });
});

describe('truck-position questions on every girder of every deck', () => {
  it.each(DECKS)('the deck "$name": the governing placement and its factor pass; the question names girder, line and lane counts', ({ deck }) => {
    const count = deckGeometry(deck).girderCount;
    for (let girder = 1; girder <= count; girder++)
      for (const line of ['lever-rule', 'rigid-section'] as const) {
        const p = { girder, line, laneCounts: [1] };
        const e = expectedTruckPosition(deck, p);
        expect(e.question).toContain(`for girder ${girder} by the ${line === 'lever-rule' ? 'lever rule' : 'rigid-section method'} (1 loaded lane)`);
        const g = grade(deck, 'truck-position', p, e, { value: Number(e.value.toFixed(3)), steps: [], placement: e.placement! }, TOLERANCE);
        expect(g.passed, `${line}, girder ${girder}`).toBe(true);
        expect(g.checks.map((c) => c.name)).toEqual(['value', 'placement']);
      }
  });
});

describe('results stored before the solver recorded the parts of a trace', () => {
  const strip = (r: CodeFactorResult): CodeFactorResult => ({ ...r, factors: r.factors.map((f) => ({ ...f, trace: f.trace.map(({ part: _part, ...s }) => s) })) });

  it('take the parts from a fresh computation where the rows agree, and keep a row that does not as stored', () => {
    const fresh = computeCodeFactors(DECKS[0].deck);
    const stored = strip(fresh);
    expect(hasTraceParts(stored)).toBe(false);
    expect(hasTraceParts(fresh)).toBe(true);
    expect(withTraceParts(stored, fresh)).toEqual(fresh);

    const changed = strip(fresh);
    changed.factors[0] = { ...changed.factors[0], trace: changed.factors[0].trace.map((s, i) => (i === 1 ? { ...s, value: s.value * 1.01 } : s)) };
    const mended = withTraceParts(changed, fresh);
    expect(mended.factors[0]).toEqual(changed.factors[0]);
    expect(mended.factors.slice(1)).toEqual(fresh.factors.slice(1));
  });
});
