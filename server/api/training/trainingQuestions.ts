/**
 * The product's answer to a training question, and the grading of a trainee's answer.
 *
 * - 'factor': the row of the code-method result (shared/lrfd computeCodeFactors) asked for,
 *   with its trace and article; graded by relative difference |v − v*| / |v*| ≤ tolerance.
 * - 'truck-position': the governing placement on the girder's lever-rule or rigid-section
 *   transverse line (shared/placement governingTransversePlacement, exact on a piecewise-linear
 *   line; AASHTO LRFD Art. 3.6.1.3.1 wheel limits, Table 3.6.1.1.2-1 multiple presence). The
 *   trainee's placement is checked against the rules and evaluated on the same line; it
 *   passes when its factor is within the tolerance of the governing factor (several
 *   placements can govern equally, e.g. by symmetry, so the placement itself is not compared).
 *
 * Units: placements in m (internal), factors dimensionless.
 */
import type { Deck } from '../../../shared/deck/schema.js';
import { deckGeometry } from '../../../shared/deck/geometry.js';
import { governingChoice, type Candidate, type CodeFactorResult, type FactorRow } from '../../../shared/lrfd/index.js';
import type { TraceStep } from '../../../shared/trace.js';
import { checkPlacement, evaluateTransverse, governingTransversePlacement, leverRuleLine, placementRulesForDeck, rigidSectionLine, wheelLines, type Placement } from '../../../shared/placement/index.js';
import { ApiError } from '../../middleware/errors.js';
import { lengthInText } from '../../../shared/quantities/inText.js';
import { factorArticle } from '../reviews/versionResults.js';
import { EFFECT_LABELS, factorText } from '../../../shared/lrfd/words.js';
import type { FactorParams, PlacementInput, SubmissionBody, TruckPositionParams } from './trainingModel.js';

export interface ExpectedAnswer {
  /** The question in words. */
  question: string;
  value: number;
  article: string;
  trace: TraceStep[];
  /** Governing-value questions: every candidate and what became of it (shared/lrfd/choice.ts). */
  candidates?: Candidate[];
  /** Code row id (factor questions). */
  rowId?: string;
  method?: string;
  lanes?: string;
  loadedLanes?: number;
  location?: string;
  /** Truck-position questions: the governing placement, its wheel lines (m) and the roadway. */
  placement?: Placement;
  wheelLines?: [number, number][];
  roadway?: { curbLeft: number; curbRight: number; laneWidth: number; laneCount: number; girderOffsets: number[] };
}

const METHOD_WORDS: Record<string, string> = {
  governing: 'governing',
  formula: 'empirical-formula',
  'lever-rule': 'lever-rule',
  'rigid-section': 'rigid-section',
  'equal-share': 'equal-share',
};

export function factorQuestion(p: FactorParams, locationText: string): string {
  const lanes = p.lanes === 'one' ? 'one loaded lane' : p.lanes === 'multiple' ? 'two or more loaded lanes' : 'the governing lane case';
  const what = p.method === 'governing' ? `the governing ${EFFECT_LABELS[p.effect]} factor` : `the ${METHOD_WORDS[p.method]} ${EFFECT_LABELS[p.effect]} factor`;
  return `${what} of the ${p.girder} girder for ${lanes} (${locationText})`;
}

const paramsError = (message: string) => ApiError.badRequest(`params: ${message}`, [{ path: 'body.params', message }]);

function pickRow(code: CodeFactorResult, p: FactorParams): FactorRow | undefined {
  const ofEffect = code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect);
  const key = p.location ?? ofEffect[0]?.location.key;
  const rows = ofEffect.filter((r) => r.location.key === key);
  const inCase = p.lanes === 'governing' ? rows : rows.filter((r) => r.lanes === p.lanes);
  if (p.method === 'governing') return p.lanes === 'governing' ? rows.find((r) => r.governing) : inCase.find((r) => r.adopted);
  const byMethod = inCase.filter((r) => r.method === p.method);
  return byMethod.length ? byMethod.reduce((a, b) => (b.value > a.value ? b : a)) : undefined;
}

export function expectedFactor(code: CodeFactorResult, p: FactorParams): ExpectedAnswer {
  const row = pickRow(code, p);
  if (!row) {
    const locations = [...new Set(code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect).map((r) => r.location.key))];
    if (locations.length === 0) throw paramsError(`this deck version has no ${EFFECT_LABELS[p.effect]} factor for the ${p.girder} girder`);
    if (p.location && !locations.includes(p.location)) throw paramsError(`no ${EFFECT_LABELS[p.effect]} factor at ${p.location}: choose one of ${locations.join(', ')}`);
    throw paramsError(`this deck version has no ${factorQuestion(p, p.location ?? locations[0])}: the code does not use that method for that case here`);
  }
  // A governing value is the pick among candidates: show them all and the rule that picked it.
  const choice = p.method === 'governing' ? governingChoice(code.factors, { girder: p.girder, effect: p.effect, locationKey: row.location.key }, p.lanes) : null;
  return {
    question: factorQuestion(p, row.location.description),
    value: row.value,
    article: factorArticle(row),
    trace: choice && choice.candidates.length > 1 ? [...row.trace, choice.step] : row.trace,
    ...(choice && choice.candidates.length > 1 ? { candidates: choice.candidates } : {}),
    rowId: row.id,
    method: row.method,
    lanes: row.lanes,
    ...(row.loadedLanes !== undefined ? { loadedLanes: row.loadedLanes } : {}),
    location: row.location.description,
  };
}

function lineFor(deck: Deck, p: TruckPositionParams) {
  const g = deckGeometry(deck);
  if (p.girder > g.girderCount) {
    throw ApiError.badRequest(`params.girder: the deck has ${g.girderCount} girders`, [{ path: 'body.params.girder', message: `the deck has ${g.girderCount} girders (1 to ${g.girderCount})` }]);
  }
  const rules = placementRulesForDeck(deck);
  const left = Math.min(g.curbLeft, g.deckLeft);
  const right = Math.max(g.curbRight, g.deckRight);
  const line = p.line === 'lever-rule' ? leverRuleLine(g.offsets, p.girder - 1, left, right) : rigidSectionLine(g.offsets, p.girder - 1, left, right);
  return { g, rules, line };
}

/** A length in a trace label, shown in the reader's units (shared/quantities/inText.ts). */
const len = lengthInText;

export function expectedTruckPosition(deck: Deck, p: TruckPositionParams): ExpectedAnswer {
  const { g, rules, line } = lineFor(deck, p);
  const counts = p.laneCounts?.filter((k) => k <= rules.laneCount);
  if (p.laneCounts && (!counts || counts.length === 0)) {
    throw ApiError.badRequest(`params.laneCounts: the roadway holds ${rules.laneCount} design lane(s)`, [{ path: 'body.params.laneCounts', message: `the roadway holds ${rules.laneCount} design lane(s)` }]);
  }
  const best = governingTransversePlacement(line, rules, counts ? { laneCounts: counts } : {});
  const wl = best.placement.lanes.map((l) => wheelLines(rules, l));
  const what = p.line === 'lever-rule' ? 'lever rule' : 'rigid-section method';
  const trace: TraceStep[] = best.effect.lanes.map((l, i) => ({
    label: `Lane ${i + 1}: edges ${len(l.left)} to ${len(l.right)} from girder 1, wheel lines at ${len(l.wheelLines[0])} and ${len(l.wheelLines[1])}`,
    formula: '½ (r(y₁) + r(y₂)), r the reaction of the girder per unit load at y',
    inputs: [
      { symbol: 'y₁', description: 'left wheel line', value: l.wheelLines[0], kind: 'length' as const },
      { symbol: 'y₂', description: 'right wheel line', value: l.wheelLines[1], kind: 'length' as const },
    ],
    value: l.vehicleValue,
    kind: 'none' as const,
    article: 'AASHTO LRFD Art. 3.6.1.3.1 (wheels 2 ft from the lane edge), Art. 4.6.2.2.1',
  }));
  trace.push({
    label: `Factor with ${best.loadedLanes} loaded lane${best.loadedLanes === 1 ? '' : 's'}`,
    formula: 'g = m · Σ lane shares',
    inputs: [{ symbol: 'm', description: 'multiple presence factor', value: best.multiplePresence, kind: 'none' }],
    value: best.value,
    kind: 'none',
    article: 'AASHTO LRFD Table 3.6.1.1.2-1',
  });
  return {
    question: `the governing position of the design lanes and wheel lines for girder ${p.girder} by the ${what}${counts ? ` (${counts.join(' or ')} loaded lane${counts.length === 1 && counts[0] === 1 ? '' : 's'})` : ''}, and the factor it gives`,
    value: best.value,
    article: 'AASHTO LRFD Art. 3.6.1.3.1, Art. 4.6.2.2.1, Table 3.6.1.1.2-1',
    trace,
    loadedLanes: best.loadedLanes,
    placement: best.placement,
    wheelLines: wl,
    roadway: { curbLeft: rules.curbLeft, curbRight: rules.curbRight, laneWidth: rules.laneWidth, laneCount: rules.laneCount, girderOffsets: g.offsets },
  };
}

export interface Check {
  name: 'value' | 'placement';
  label: string;
  expected: number;
  submitted: number;
  /** |submitted − expected| / |expected|, percent. */
  differencePercent: number;
  passed: boolean;
}

export interface Grading {
  passed: boolean;
  tolerancePercent: number;
  checks: Check[];
  /** Rules the trainee's placement breaks (truck-position questions). */
  placementViolations: { path: string; message: string }[];
  /** For each step of the product's trace, the trainee step with the same value (within tolerance), or null; `steps.length` stands for the trainee's final value. */
  stepMatches: { traceIndex: number; label: string; productValue: number; traineeStep: number | null }[];
  summary: string;
}

function relDiff(submitted: number, expected: number): number {
  const scale = Math.max(Math.abs(expected), 1e-12);
  return (Math.abs(submitted - expected) / scale) * 100;
}

function check(name: Check['name'], label: string, expected: number, submitted: number, tol: number): Check {
  const d = relDiff(submitted, expected);
  return { name, label, expected, submitted, differencePercent: d, passed: d <= tol + 1e-9 };
}

/** Grade a submission; `kind` and `params` are those of the assignment. */
export function grade(deck: Deck, kind: string, params: unknown, expected: ExpectedAnswer, body: SubmissionBody, tolerancePercent: number): Grading {
  const checks: Check[] = [check('value', 'Your factor', expected.value, body.value, tolerancePercent)];
  const violations: Grading['placementViolations'] = [];
  if (kind === 'truck-position') {
    if (!body.placement) throw ApiError.badRequest('placement: this exercise asks for the truck position: give the placement', [{ path: 'body.placement', message: 'this exercise asks for the truck position: give the placement' }]);
    const { rules, line } = lineFor(deck, params as TruckPositionParams);
    const placement = body.placement as PlacementInput as Placement;
    for (const v of checkPlacement(placement, rules)) violations.push({ path: ['placement', ...v.path].join('.'), message: v.message });
    if (violations.length === 0) {
      const effect = evaluateTransverse(line, placement, rules, { check: false });
      checks.push(check('placement', 'Factor your placement produces', expected.value, effect.value, tolerancePercent));
    }
  }
  // The trainee's final value stands as one more step (index steps.length) for the last trace step.
  const last = expected.trace.length - 1;
  const stepMatches = expected.trace.map((s, i) => {
    const j = body.steps.findIndex((t) => t.value !== undefined && relDiff(t.value, s.value) <= tolerancePercent + 1e-9);
    const byValue = i === last && relDiff(body.value, s.value) <= tolerancePercent + 1e-9;
    return { traceIndex: i, label: s.label, productValue: s.value, traineeStep: j >= 0 ? j : byValue ? body.steps.length : null };
  });
  const passed = violations.length === 0 && checks.every((c) => c.passed);
  const first = checks[0];
  const parts = [`Your value ${factorText(first.submitted)} against the product's ${factorText(first.expected)}: ${first.differencePercent.toFixed(2)} % apart (tolerance ${tolerancePercent} %).`];
  if (violations.length) parts.push(`Your placement breaks ${violations.length} rule${violations.length === 1 ? '' : 's'}: ${violations[0].message}.`);
  const pc = checks.find((c) => c.name === 'placement');
  if (pc) parts.push(`Your placement gives ${factorText(pc.submitted)} (${pc.differencePercent.toFixed(2)} % from the governing ${factorText(pc.expected)}).`);
  const unmatched = stepMatches.filter((m) => m.traceIndex < expected.trace.length && m.traineeStep === null);
  if (body.steps.length && unmatched.length) parts.push(`First step without a matching value: “${unmatched[0].label}”.`);
  return { passed, tolerancePercent, checks, placementViolations: violations, stepMatches, summary: parts.join(' ') };
}
