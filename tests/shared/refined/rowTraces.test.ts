/**
 * Every row's trace agrees with its row, on every example deck (tests/fixtures/exampleDecks.ts),
 * code rows and grillage rows alike: the trace ends on the row's value; a grillage row's trace
 * computes the row's own lane count throughout (each girder-effect step has that k) and its
 * closing step states k, the multiple presence factor of k lanes (AASHTO LRFD Table
 * 3.6.1.1.2-1: 1.20, 1.00, 0.85, 0.65; none for fatigue, Art. 3.6.1.4.3b), the row's load and
 * its lane case, and its value is E_g / E_1 of the steps above it; its position along the
 * girder is the row's place (Σ of the girder's spans before it plus the fraction of its span,
 * or the support) and is written as a length token, so it prints in the reader's units. No text
 * of any trace holds a unit symbol outside a token (symbols: tests/fixtures/unitsInText.ts).
 * Identities of the product's own arithmetic, so exact equality; Table 3.6.1.1.2-1 quoted from
 * memory.
 */
import { describe, expect, it } from 'vitest';
import { assertDeck } from '../../../shared/deck/schema.js';
import { computeCodeFactors, type FactorRow } from '../../../shared/lrfd/factors.js';
import { computeRefinedFactors } from '../../../shared/grillage/refinedFactors.js';
import { LANE_LABELS } from '../../../shared/lrfd/words.js';
import { showLengths } from '../../../shared/quantities/inText.js';
import type { TraceStep } from '../../../shared/trace.js';
import { exampleDecks } from '../../fixtures/exampleDecks.js';
import { unitsReport } from '../../fixtures/unitsInText.js';

/** Table 3.6.1.1.2-1, multiple presence factor m by the number of loaded lanes. */
const M = (k: number) => (k === 1 ? 1.2 : k === 2 ? 1.0 : k === 3 ? 0.85 : 0.65);
const input = (s: TraceStep, symbol: string) => s.inputs.find((i) => i.symbol === symbol)?.value;
const TOKEN = /\{\{(?:len|q):[^}]*\}\}/g;
const LEN = /\{\{len:(-?[0-9.eE+-]+)\}\}/;

function textsOf(trace: TraceStep[]): string[] {
  return trace.flatMap((s) => [s.label, s.formula, s.note ?? '', ...s.inputs.map((i) => i.description ?? '')]);
}

/** Where a grillage row is read along its girder, m: from its place and the beam line's spans (L1…Ln of its steps). */
function beamPosition(row: FactorRow, spans: number[]): number | undefined {
  const before = (n: number) => spans.slice(0, n).reduce((a, b) => a + b, 0);
  const support = /^support(\d+)$/.exec(row.location.key);
  if (support) return row.effect === 'negative-moment' ? before(Number(support[1]) - 1) : undefined;
  const s = row.location.span!;
  const fraction = /\((\d\.\d) of the span\)/.exec(row.location.description);
  if (fraction) return before(s) + Number(fraction[1]) * spans[s];
  const end = /\(support (\d+), (left|right) side\)/.exec(row.location.description);
  return end ? before(Number(end[1]) - 1) : undefined;
}

describe.each(exampleDecks())('$name', ({ deck }) => {
  const d = assertDeck(deck);
  const code = computeCodeFactors(d);
  const refined = computeRefinedFactors(d);

  it('each code row’s trace ends on the row’s value and states the loaded lanes of its case', () => {
    expect(code.factors.length).toBeGreaterThan(0);
    for (const r of code.factors) {
      expect(r.trace.at(-1)!.value, r.id).toBe(r.value);
      if (r.loadedLanes === undefined) continue;
      // the value before the skew correction is a step's, and the trace names the row's lane count
      expect(r.trace.some((s) => s.value === r.baseValue), r.id).toBe(true);
      const stated = r.trace.some((s) => input(s, 'NL') === r.loadedLanes || input(s, 'k') === r.loadedLanes || s.label.includes(`${r.loadedLanes} loaded lane`));
      expect(stated, `${r.id}: ${r.trace.map((s) => s.label).join(' / ')}`).toBe(true);
    }
  });

  it('each grillage row’s trace computes its lane count and load, ends on its value and says so', () => {
    expect(refined.rows.length).toBeGreaterThan(0);
    for (const r of refined.rows) {
      const last = r.trace.at(-1)!;
      const k = r.loadedLanes!;
      const fatigue = r.effect.startsWith('fatigue');
      expect(last.value, r.id).toBe(r.value);
      expect(input(last, 'k'), r.id).toBe(k);
      expect(r.lanes === 'one' ? k === 1 : k >= 2, r.id).toBe(true);
      expect(input(last, 'm'), r.id).toBe(fatigue ? 1 : M(k));
      expect(last.label, r.id).toContain(LANE_LABELS[r.lanes]);
      expect(last.note, r.id).toMatch(new RegExp(`^${k} loaded lanes?, ${r.vehicle};`));
      // every girder-effect step is worked for the row's k; the closing E_g is the largest of them over E_1
      const girderSteps = r.trace.filter((s) => s.label.startsWith('Grillage:'));
      expect(girderSteps.length, r.id).toBeGreaterThan(0);
      for (const s of girderSteps) expect(input(s, 'k'), `${r.id}: ${s.label}`).toBe(k);
      const sgn = r.effect === 'negative-moment' ? -1 : 1;
      expect(input(last, 'E_g'), r.id).toBe(girderSteps.reduce((a, s) => (sgn * s.value > sgn * a ? s.value : a), girderSteps[0].value));
      expect(last.value).toBe(input(last, 'E_g')! / input(last, 'E_1')!);
    }
  });

  it('a grillage row’s trace reads its beam line at the row’s place, as a length in the reader’s units', () => {
    for (const r of refined.rows) {
      const beam = r.trace.find((s) => s.label.startsWith('Beam line:'))!;
      const spans = beam.inputs.filter((i) => /^L\d+$/.test(i.symbol)).map((i) => i.value);
      const expected = beamPosition(r, spans);
      const token = LEN.exec(beam.label);
      if (expected === undefined) {
        expect(beam.label, r.id).toMatch(/at support \d+$/);
        continue;
      }
      expect(token, `${r.id}: ${beam.label}`).not.toBeNull();
      expect(Number(token![1])).toBeRelativelyClose(expected, 1e-9);
      expect(showLengths(beam.label, 'US'), r.id).toMatch(/ at \d+\.\d{2} ft along the girder$/);
      expect(showLengths(beam.label, 'SI'), r.id).toMatch(/ at \d+\.\d{3} m along the girder$/);
    }
  });

  it('no trace text holds a unit symbol outside a length or quantity token', () => {
    const texts = [...code.factors, ...refined.rows].flatMap((r) => textsOf(r.trace)).map((t) => t.replace(TOKEN, 'TOKEN'));
    expect(texts.length).toBeGreaterThan(100);
    for (const units of ['US', 'SI'] as const) expect(unitsReport(texts.join('\n'), units).foreign).toEqual([]);
  });
});
