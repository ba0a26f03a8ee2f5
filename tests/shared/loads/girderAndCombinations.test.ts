/**
 * Girder LL+IM (distribution factor × beam-line effect, AASHTO LRFD Art. 4.6.2.2) and the
 * load combinations of Table 3.4.1-1 / Table 3.4.1-2 with the load modifier of
 * Art. 1.3.2.1 (Eq. 1.3.2.1-2 and 1.3.2.1-3).
 *
 * Load factors checked (7th edition, 2014, and later): Strength I γDC 1.25/0.90,
 * γDW 1.50/0.65, γLL 1.75; Service I 1.00; Service II γLL 1.30; Fatigue I 1.75; Fatigue II
 * 0.80. Earlier editions (from memory): Fatigue I 1.50, Fatigue II 0.75. The factored sums
 * below are hand computations written out beside each check.
 */
import { describe, expect, it } from 'vitest';
import {
  DeckInputError,
  combineEffects,
  fromUs,
  girderLimitState,
  girderLiveLoadEffects,
  hl93BeamLineEffects,
  limitStateFactors,
  loadModifier,
  toUs,
} from '../../../shared/index.js';

const ft = fromUs.ft;

describe('girder LL+IM = g × beam-line effect (Art. 4.6.2.2)', () => {
  const beamLine = hl93BeamLineEffects({ spans: [ft(80), ft(100)], continuous: true });

  it('multiplies each effect by its factor; negative moment and fatigue use their own factors', () => {
    const g = girderLiveLoadEffects(beamLine, { moment: 0.62, negativeMoment: 0.71, shear: 0.8, reaction: 0.9, fatigueMoment: 0.41, fatigueShear: 0.55 });
    beamLine.points.forEach((p, i) => {
      const q = g.points[i];
      expect(q.moment.max.value).toBe(0.62 * p.moment.max.value);
      expect(q.moment.min.value).toBe(0.71 * p.moment.min.value);
      expect(q.shear.max.value).toBe(0.8 * p.shear.max.value);
      expect(q.shear.min.value).toBe(0.8 * p.shear.min.value);
      expect(q.fatigueMoment!.max.value).toBe(0.41 * p.fatigueMoment!.max.value);
      expect(q.fatigueShear!.min.value).toBe(0.55 * p.fatigueShear!.min.value);
      expect(q.moment.max.factor).toBe(0.62);
      expect(q.moment.max.beamLine).toBe(p.moment.max.value);
      expect(q.moment.max.trace.at(-1)!.article).toContain('4.6.2.2');
    });
    g.reactions!.forEach((r, i) => expect(r.reaction.max.value).toBe(0.9 * beamLine.reactions[i].reaction.max.value));
  });

  it('takes one factor per span, or a function of the place; without a reaction or fatigue factor those effects are left out', () => {
    const g = girderLiveLoadEffects(beamLine, { moment: [0.6, 0.7], shear: (loc) => (loc.span === 0 ? 0.75 : 0.85) });
    for (const [i, p] of beamLine.points.entries()) {
      expect(g.points[i].moment.max.value).toBe((p.span === 0 ? 0.6 : 0.7) * p.moment.max.value);
      expect(g.points[i].moment.min.value).toBe((p.span === 0 ? 0.6 : 0.7) * p.moment.min.value);
      expect(g.points[i].shear.max.value).toBe((p.span === 0 ? 0.75 : 0.85) * p.shear.max.value);
      expect(g.points[i].fatigueMoment).toBeUndefined();
    }
    expect(g.reactions).toBeUndefined();
  });

  it('rejects negative, non-finite or wrongly sized factors, naming the field', () => {
    const path = (fn: () => unknown) => {
      try {
        fn();
      } catch (e) {
        expect(e).toBeInstanceOf(DeckInputError);
        return (e as DeckInputError).path;
      }
      throw new Error('expected an error');
    };
    expect(path(() => girderLiveLoadEffects(beamLine, { moment: -0.1, shear: 1 }))).toEqual(['factors', 'moment']);
    expect(path(() => girderLiveLoadEffects(beamLine, { moment: [0.5], shear: 1 }))).toEqual(['factors', 'moment']);
    expect(path(() => girderLiveLoadEffects(beamLine, { moment: [0.5, Number.NaN], shear: 1 }))).toEqual(['factors', 'moment', 1]);
    expect(path(() => girderLiveLoadEffects(beamLine, { moment: 0.5, shear: () => Number.POSITIVE_INFINITY }))).toEqual(['factors', 'shear']);
    expect(path(() => girderLiveLoadEffects(beamLine, { moment: 0.5, shear: 0.5, reaction: [1, 1] }))).toEqual(['factors', 'reaction']);
  });
});

describe('load factors (Table 3.4.1-1, 3.4.1-2)', () => {
  it('2014 and later editions', () => {
    expect(limitStateFactors('Strength I')).toMatchObject({ liveLoad: 1.75, DC: { max: 1.25, min: 0.9 }, DW: { max: 1.5, min: 0.65 }, usesLoadModifier: true });
    expect(limitStateFactors('Service I')).toMatchObject({ liveLoad: 1.0, DC: { max: 1, min: 1 }, DW: { max: 1, min: 1 } });
    expect(limitStateFactors('Service II').liveLoad).toBe(1.3);
    expect(limitStateFactors('Fatigue I').liveLoad).toBe(1.75);
    expect(limitStateFactors('Fatigue II').liveLoad).toBe(0.8);
    expect(limitStateFactors('Fatigue I').DC).toBeUndefined();
  });

  it('earlier editions: Fatigue I 1.50, Fatigue II 0.75 (from memory)', () => {
    expect(limitStateFactors('Fatigue I', 'before-2014').liveLoad).toBe(1.5);
    expect(limitStateFactors('Fatigue II', 'before-2014').liveLoad).toBe(0.75);
    expect(limitStateFactors('Strength I', 'before-2014').liveLoad).toBe(1.75);
  });
});

describe('load modifier (Art. 1.3.2.1, 1.3.3–1.3.5)', () => {
  it('η = ηD·ηR·ηI for strength, 1/η for minimum factors; 1.00 for other limit states', () => {
    const m = loadModifier('Strength I', { ductility: 1.05, redundancy: 1.0, importance: 1.05 });
    expect(m.eta).toBeRelativelyClose(1.1025, 1e-12);
    expect(m.etaForMinimum).toBeRelativelyClose(1 / 1.1025, 1e-12);
    expect(loadModifier('Service I', { ductility: 1.05 }).eta).toBe(1);
    expect(loadModifier('Strength I').eta).toBe(1);
  });

  it('η not less than 0.95 (Eq. 1.3.2.1-2) and 1/η not more than 1.0 (Eq. 1.3.2.1-3)', () => {
    const m = loadModifier('Strength I', { ductility: 0.95, redundancy: 0.95, importance: 0.95 });
    expect(m.eta).toBe(0.95);
    expect(m.etaForMinimum).toBe(1);
  });

  it('rejects η below 0.95 or not finite, naming the field', () => {
    try {
      loadModifier('Strength I', { redundancy: 0.9 });
      throw new Error('expected an error');
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).path).toEqual(['loadModifiers', 'redundancy']);
    }
    expect(() => loadModifier('Strength I', { importance: Number.NaN })).toThrow(DeckInputError);
    expect(() => loadModifier('Strength V' as 'Strength I')).toThrow(/limit state/);
  });
});

describe('factored combinations (hand computations)', () => {
  const input = { liveLoad: { max: 300, min: -50 }, DC: 100, DW: 20 };

  it('Strength I: max 1.25·100 + 1.50·20 + 1.75·300 = 680; min 0.90·100 + 0.65·20 + 1.75·(−50) = 15.5', () => {
    const c = combineEffects('Strength I', input);
    expect(c.max).toBeRelativelyClose(680, 1e-12);
    expect(c.min).toBeRelativelyClose(15.5, 1e-12);
    expect(c.trace.some((s) => s.article.includes('Table 3.4.1-1'))).toBe(true);
  });

  it('Strength I with η = 1.1025: max 1.1025·680 = 749.7; min (90 + 13)/1.1025 − 1.1025·87.5', () => {
    const c = combineEffects('Strength I', input, { modifiers: { ductility: 1.05, importance: 1.05 } });
    expect(c.max).toBeRelativelyClose(1.1025 * 680, 1e-12);
    expect(c.min).toBeRelativelyClose(103 / 1.1025 - 1.1025 * 87.5, 1e-12);
  });

  it('a hogging permanent effect takes the larger factor for the minimum: DC = −200 gives min 1.25·(−200) + …', () => {
    const c = combineEffects('Strength I', { liveLoad: { max: 40, min: -300 }, DC: -200, DW: -30 });
    expect(c.min).toBeRelativelyClose(1.25 * -200 + 1.5 * -30 + 1.75 * -300, 1e-12);
    expect(c.max).toBeRelativelyClose(0.9 * -200 + 0.65 * -30 + 1.75 * 40, 1e-12);
  });

  it('Service I and II: 1.00·DC + 1.00·DW + γLL·LL with γLL 1.00 and 1.30; η does not apply', () => {
    expect(combineEffects('Service I', input, { modifiers: { ductility: 1.05 } }).max).toBeRelativelyClose(100 + 20 + 300, 1e-12);
    expect(combineEffects('Service II', input).max).toBeRelativelyClose(100 + 20 + 1.3 * 300, 1e-12);
    expect(combineEffects('Service II', input).min).toBeRelativelyClose(100 + 20 + 1.3 * -50, 1e-12);
  });

  it('Fatigue I and II: γLL × live-load range, 1.75·350 and 0.80·350 (0.75·350 before 2014); DC and DW not used', () => {
    const f1 = combineEffects('Fatigue I', input);
    expect(f1.range).toBeRelativelyClose(1.75 * 350, 1e-12);
    expect(f1.max).toBeRelativelyClose(1.75 * 300, 1e-12);
    expect(combineEffects('Fatigue II', input).range).toBeRelativelyClose(0.8 * 350, 1e-12);
    expect(combineEffects('Fatigue II', input, { edition: 'before-2014' }).range).toBeRelativelyClose(0.75 * 350, 1e-12);
    expect(f1.trace.at(-1)!.note).toMatch(/permanent loads do not enter/);
  });

  it('rejects a live-load maximum below its minimum, non-finite effects and an unknown edition', () => {
    expect(() => combineEffects('Strength I', { liveLoad: { max: -1, min: 1 } })).toThrow(DeckInputError);
    expect(() => combineEffects('Strength I', { liveLoad: { max: 1, min: 0 }, DC: Number.NaN })).toThrow(DeckInputError);
    expect(() => combineEffects('Strength I', { liveLoad: { max: 1, min: 0 } }, { edition: '1998' as 'before-2014' })).toThrow(/edition/);
  });
});

describe('a girder through the limit states', () => {
  it('Strength I at midspan of a 110 ft simple span: 1.75·g·[1.33·1700 + 968] kip·ft; fatigue needs the fatigue factors', () => {
    const L = 110;
    const beamLine = hl93BeamLineEffects({ spans: [ft(L)], continuous: false });
    const g = 0.796;
    const girder = girderLiveLoadEffects(beamLine, { moment: g, shear: 0.973 });
    const s1 = girderLimitState(girder, 'Strength I');
    expect(toUs.kipFt(s1[5].moment.max)).toBeRelativelyClose(1.75 * g * (1.33 * (18 * L - 280) + 0.08 * L * L), 1e-9);
    const withDead = girderLimitState(girder, 'Strength I', { permanent: () => ({ moment: { DC: fromUs.kipFt(2000), DW: fromUs.kipFt(300) } }) });
    expect(toUs.kipFt(withDead[5].moment.max)).toBeRelativelyClose(1.25 * 2000 + 1.5 * 300 + 1.75 * g * (1.33 * (18 * L - 280) + 0.08 * L * L), 1e-9);
    expect(() => girderLimitState(girder, 'Fatigue I')).toThrow(/fatigue distribution factors/);
    const fat = girderLimitState(girderLiveLoadEffects(beamLine, { moment: g, shear: 0.973, fatigueMoment: 0.45, fatigueShear: 0.5 }), 'Fatigue I');
    // Simple span: minimum fatigue moment 0, so the range is the maximum: 1.75·0.45·1.15·(18L − 536).
    expect(toUs.kipFt(fat[5].moment.range!)).toBeRelativelyClose(1.75 * 0.45 * 1.15 * (18 * L - 536), 1e-9);
  });
});
