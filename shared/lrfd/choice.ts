/**
 * Why one code value governs: the candidates of a girder kind, effect and location (each
 * method's row, per lane case) and the rule that picks one — the same rule `selectGoverning`
 * applies (shared/lrfd/factors.ts), written out as a trace step a checker or a trainee can
 * follow:
 *  - within a lane case the largest candidate is adopted; rows marked `lesser-of` (three
 *    girders: the formula and the lever rule, Table 4.6.2.2.2b-1 / 4.6.2.2.2d-1) count by
 *    their least; the rigid-section value is a floor for the exterior girder
 *    (Art. 4.6.2.2.2d);
 *  - across lane cases the larger adopted value governs (Art. 3.6.1.1.2: the case with one
 *    loaded lane and the case with several are both checked).
 * Values are lane fractions (dimensionless); nothing here computes a factor.
 */
import type { TraceInput, TraceStep } from '../trace.js';
import type { FactorEffect, FactorMethod, FactorRow, GirderKind } from './factors.js';
import type { Lanes } from './formula.js';
import { METHOD_LABELS } from './words.js';

/** One candidate value and what became of it. */
export interface Candidate {
  rowId: string;
  method: FactorMethod;
  lanes: Lanes;
  loadedLanes?: number;
  girderNumber?: number;
  value: number;
  /** "rigid-section check, 2 loaded lanes" */
  words: string;
  /** 'governs': the value; 'adopted': its lane case's value, not the larger; 'not adopted': another candidate of its case won. */
  outcome: 'governs' | 'adopted' | 'not adopted';
}

export interface GoverningChoice {
  candidates: Candidate[];
  /** The choice as a trace step: every candidate as an input, the rule as the formula. */
  step: TraceStep;
}

/** The app's words for each method (shared/lrfd/words.ts). */
const METHOD_WORDS = METHOD_LABELS;

const SYMBOL: Record<FactorMethod, string> = {
  formula: 'formula',
  'lever-rule': 'lever rule',
  'rigid-section': 'rigid section',
  'equal-share': 'equal share',
  'interior-minimum': 'interior',
  grillage: 'grillage',
};

function laneWords(r: FactorRow): string {
  if (r.lanes === 'one') return 'one loaded lane';
  return r.loadedLanes ? `${r.loadedLanes} loaded lanes` : 'two or more loaded lanes';
}

function candidateOf(r: FactorRow): Candidate {
  const girder = r.girderNumber !== undefined ? `, girder ${r.girderNumber}` : '';
  const c: Candidate = { rowId: r.id, method: r.method, lanes: r.lanes, value: r.value, words: `${METHOD_WORDS[r.method]}, ${laneWords(r)}${girder}`, outcome: r.governing ? 'governs' : r.adopted ? 'adopted' : 'not adopted' };
  if (r.loadedLanes !== undefined) c.loadedLanes = r.loadedLanes;
  if (r.girderNumber !== undefined) c.girderNumber = r.girderNumber;
  return c;
}

function inputOf(r: FactorRow, bothCases: boolean): TraceInput {
  const lanes = r.lanes === 'one' ? '1 lane' : r.loadedLanes ? `${r.loadedLanes} lanes` : '2+ lanes';
  return { symbol: bothCases ? `g(${SYMBOL[r.method]}, ${lanes})` : `g(${SYMBOL[r.method]})`, description: candidateOf(r).words, value: r.value, kind: 'none' };
}

/** The rule that picked the adopted row of one lane case, in words, with its article. */
function caseRule(inCase: FactorRow[]): { text: string; article: string } {
  const adopted = inCase.find((r) => r.adopted);
  const lesser = inCase.filter((r) => r.combine === 'lesser-of');
  if (!adopted || inCase.length === 1) return { text: `the ${adopted ? METHOD_WORDS[adopted.method] : 'only'} value is the only candidate`, article: '' };
  const name = METHOD_WORDS[adopted.method];
  if (lesser.length > 1) {
    const pair = lesser.map((r) => METHOD_WORDS[r.method]).join(' and the ');
    return { text: `with three girders the lesser of the ${pair} counts; the ${name} value is adopted`, article: 'AASHTO LRFD Table 4.6.2.2.2b-1, Table 4.6.2.2.2d-1' };
  }
  if (adopted.method === 'rigid-section') return { text: 'the exterior girder is not taken below the rigid-section value, which is the larger', article: 'AASHTO LRFD Art. 4.6.2.2.2d' };
  if (adopted.method === 'interior-minimum') return { text: 'the exterior girder is not taken below the interior girder (owner policy)', article: '' };
  if (inCase.some((r) => r.method === 'rigid-section')) return { text: `the ${name} value is adopted: it is above the rigid-section floor`, article: 'AASHTO LRFD Art. 4.6.2.2.2d' };
  return { text: `the ${name} value is adopted: the largest candidate`, article: '' };
}

/**
 * The candidates and the rule for one girder kind, effect and location; `lanes` 'governing'
 * takes both lane cases, 'one' or 'multiple' only that case. The rows must have been through
 * `selectGoverning` (their `adopted` and `governing` marks are read, never recomputed).
 * Returns null when the scope has no rows.
 */
export function governingChoice(rows: FactorRow[], scope: { girder: GirderKind; effect: FactorEffect; locationKey: string }, lanes: Lanes | 'governing'): GoverningChoice | null {
  const inScope = rows.filter((r) => r.girderKind === scope.girder && r.effect === scope.effect && r.location.key === scope.locationKey && (lanes === 'governing' || r.lanes === lanes));
  if (inScope.length === 0) return null;
  const cases = (['one', 'multiple'] as const).map((l) => inScope.filter((r) => r.lanes === l)).filter((c) => c.length > 0);
  const chosen = lanes === 'governing' ? inScope.find((r) => r.governing) : inScope.find((r) => r.adopted);
  if (!chosen) return null;
  const bothCases = cases.length > 1;
  const rules = cases.map((c) => ({ lanes: c[0].lanes, ...caseRule(c) }));
  const why = rules.map((r) => (bothCases ? `${r.lanes === 'one' ? 'one loaded lane' : 'two or more loaded lanes'}: ${r.text}` : r.text));
  if (bothCases) why.push('the larger of the two lane cases governs');
  const articles = [...new Set(rules.map((r) => r.article).filter(Boolean))];
  if (bothCases) articles.push('AASHTO LRFD Art. 3.6.1.1.2');
  return {
    candidates: inScope.map(candidateOf),
    step: {
      label: `The value that governs, of ${inScope.length} candidates: the ${candidateOf(chosen).words}`,
      formula: why.join('; '),
      inputs: inScope.map((r) => inputOf(r, bothCases)),
      value: chosen.value,
      kind: 'none',
      article: articles.join('; ') || 'AASHTO LRFD Art. 4.6.2.2',
    },
  };
}

/**
 * The steps of a method worked for several numbers of loaded lanes (lever rule, rigid section),
 * closed by the case that gives the value, so that the trace ends on the value it explains:
 * the largest case (Art. 3.6.1.1.2: every number of loaded lanes is checked). Nothing is added
 * when the last step is already that case.
 */
export function closeOnGoverningCase(steps: TraceStep[], cases: readonly { loadedLanes: number; value: number }[], chosen: { loadedLanes: number; value: number }, method: string, article: string): TraceStep[] {
  const last = steps[steps.length - 1];
  if (cases.length < 2 || (last && last.value === chosen.value)) return steps;
  return [
    ...steps,
    {
      label: `${method}: the largest of the ${cases.length} cases, ${chosen.loadedLanes} loaded lane${chosen.loadedLanes === 1 ? '' : 's'}`,
      formula: 'g = max over the numbers of loaded lanes NL of g(NL)',
      inputs: [
        { symbol: 'NL', description: 'loaded lanes of the largest case', value: chosen.loadedLanes, kind: 'none' },
        ...cases.map((c) => ({ symbol: `g(${c.loadedLanes})`, description: `${c.loadedLanes} loaded lane${c.loadedLanes === 1 ? '' : 's'}`, value: c.value, kind: 'none' as const })),
      ],
      value: chosen.value,
      kind: 'none',
      article: `${article}; Art. 3.6.1.1.2 (every number of loaded lanes)`,
    },
  ];
}
