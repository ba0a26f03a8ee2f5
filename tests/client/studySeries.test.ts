/** The study chart's data: range bands from the points' findings and one line per method present. */
import { describe, expect, it } from 'vitest';
import { bandsOf, chartData } from '@/components/study/studySeries';
import { deckAtPoint, parseSweep, studyPoints } from '@shared/studies/sweep';
import { computeCodePoint } from '@shared/studies/pointResult';
import { fromUs } from '@shared/units';
import type { StudyPointRow } from '@/api/studies';
import { deckTemplate } from '@/components/deck/deckTemplates';

/** The one-span bulb-tee starting deck (an invented example, like the demo's Quarry Creek deck). */
const quarryCreekDeck = () => deckTemplate('precast-one-span').build();

describe('study chart data', () => {
  it('flagged runs become bands reaching half way to their neighbours', () => {
    expect(bandsOf([1, 2, 3, 4, 5], [false, false, true, true, false])).toEqual([[2.5, 4.5]]);
    expect(bandsOf([1, 2, 3], [true, false, true])).toEqual([[1, 1.5], [2.5, 3]]);
    expect(bandsOf([1, 2, 3], [false, false, false])).toEqual([]);
  });

  it('a sweep of S across 16 ft draws the band from there on, in feet (AASHTO LRFD Table 4.6.2.2.2b-1: S ≤ 16.0 ft)', () => {
    const r = parseSweep({ axes: [{ parameter: 'girderSpacing', values: { kind: 'list', values: [14, 15, 16, 17, 18].map((v) => fromUs.ft(v)) } }] });
    if (!r.ok) throw new Error('sweep');
    const base = { ...quarryCreekDeck(), girders: { kind: 'uniform' as const, count: 4, spacing: 1 } };
    const points: StudyPointRow[] = studyPoints(r.sweep).map((p) => {
      const out = computeCodePoint(deckAtPoint(base, r.sweep, p.values));
      if (!out.ok) throw new Error(out.error);
      return { index: p.index, values: p.values, summary: out.summary, error: null, solverVersion: 'test' };
    });
    const d = chartData(points, 'interior/moment', 'length', 'US');
    expect(d.bands).toHaveLength(1);
    expect(d.bands[0][0]).toBeCloseTo(16.5, 9);
    expect(d.bands[0][1]).toBeCloseTo(18, 9);
    expect(d.fallbacks.map(([x]) => Math.round(x))).toEqual([17, 18]);
    expect(d.lines.map((l) => l.method)).toContain('lever-rule');
  });
});
