/**
 * The span length L to use in the distribution-factor equations for each force effect,
 * AASHTO LRFD Table C4.6.2.2.1-1:
 *   positive moment                        the span for which moment is computed
 *   negative moment near interior supports the average of the two adjacent spans
 *   shear                                  the span for which shear is computed
 *   exterior reaction                      the exterior span
 *   interior reaction of continuous spans  the average of the two adjacent spans
 * For simple spans sharing a support line (not continuous), the reaction at that line is
 * taken with the shorter adjacent span, which gives the larger factor where L enters
 * (common practice, no source).
 *
 * Units: lengths in m; skews in degrees as entered (the corrections use |θ|).
 */
import type { Deck } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { toUs } from '../units.js';
import type { Finding } from './findings.js';

export type LocatedEffect = 'moment' | 'negative-moment' | 'shear' | 'reaction';

export interface EffectLocation {
  effect: LocatedEffect;
  /** 0-based span (moment, shear). */
  span?: number;
  /** 0-based support line (negative moment, reaction). */
  support?: number;
  /** L for the equations, m. */
  length: number;
  /** Plain description, e.g. "span 1" or "support 2 (interior, continuous)". */
  description: string;
  /** Stable key, e.g. "span1" or "support2". */
  key: string;
  trace: TraceStep;
  findings: Finding[];
}

const ARTICLE = 'AASHTO LRFD Table C4.6.2.2.1-1';

function lengthStep(label: string, formula: string, inputs: number[], value: number): TraceStep {
  return {
    label,
    formula,
    inputs: inputs.map((v, i) => ({ symbol: `L${i + 1}`, description: 'span length', value: v, kind: 'length' as const, formulaValue: toUs.ft(v), formulaUnit: 'ft' })),
    value,
    kind: 'length',
    article: ARTICLE,
  };
}

/** Every place a factor is computed, with its L. */
export function effectLocations(deck: Pick<Deck, 'spans' | 'continuous'>): EffectLocation[] {
  const spans = deck.spans.map((s) => s.length);
  const n = spans.length;
  const out: EffectLocation[] = [];
  spans.forEach((L, i) => {
    out.push({
      effect: 'moment',
      span: i,
      length: L,
      description: `span ${i + 1}`,
      key: `span${i + 1}`,
      trace: lengthStep(`L for positive moment, span ${i + 1}`, 'L = length of the span', [L], L),
      findings: [],
    });
  });
  if (deck.continuous && n > 1) {
    for (let j = 1; j < n; j++) {
      const L = (spans[j - 1] + spans[j]) / 2;
      out.push({
        effect: 'negative-moment',
        support: j,
        length: L,
        description: `support ${j + 1} (interior, continuous)`,
        key: `support${j + 1}`,
        trace: lengthStep(`L for negative moment near support ${j + 1}`, 'L = average of the two adjacent spans', [spans[j - 1], spans[j]], L),
        findings: [],
      });
    }
  }
  spans.forEach((L, i) => {
    out.push({
      effect: 'shear',
      span: i,
      length: L,
      description: `span ${i + 1}`,
      key: `span${i + 1}`,
      trace: lengthStep(`L for shear, span ${i + 1}`, 'L = length of the span', [L], L),
      findings: [],
    });
  });
  for (let j = 0; j <= n; j++) {
    if (j === 0 || j === n) {
      const L = spans[j === 0 ? 0 : n - 1];
      out.push({
        effect: 'reaction',
        support: j,
        length: L,
        description: `support ${j + 1} (end support)`,
        key: `support${j + 1}`,
        trace: lengthStep(`L for the exterior reaction at support ${j + 1}`, 'L = length of the exterior span', [L], L),
        findings: [],
      });
    } else if (deck.continuous) {
      const L = (spans[j - 1] + spans[j]) / 2;
      out.push({
        effect: 'reaction',
        support: j,
        length: L,
        description: `support ${j + 1} (interior, continuous)`,
        key: `support${j + 1}`,
        trace: lengthStep(`L for the interior reaction at support ${j + 1}`, 'L = average of the two adjacent spans', [spans[j - 1], spans[j]], L),
        findings: [],
      });
    } else {
      const L = Math.min(spans[j - 1], spans[j]);
      out.push({
        effect: 'reaction',
        support: j,
        length: L,
        description: `support ${j + 1} (between simple spans)`,
        key: `support${j + 1}`,
        trace: lengthStep(`L for the reaction at support ${j + 1}`, 'L = the shorter adjacent simple span', [spans[j - 1], spans[j]], L),
        findings: [
          {
            code: 'assumption',
            message: `support ${j + 1} carries two simple spans: the reaction factor uses the shorter adjacent span (common practice, no source)`,
            article: 'common practice, no source',
          },
        ],
      });
    }
  }
  return out;
}
