/**
 * The product's answer to a training question, and the grading of a trainee's answer.
 *
 * - 'factor': the row of the code-method result (shared/lrfd computeCodeFactors) asked for,
 *   its value with or before the skew correction, the steps of that quantity only
 *   (shared/lrfd/quantity.ts) and its article; the question is worded from the same row, so a
 *   literal answer to it is the graded value; graded by relative difference
 *   |v − v*| / |v*| ≤ tolerance. A trainee's step matches a trace step of equal value.
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
import { canLeaveOutSkew, governingChoice, rowQuantity, rowSkew, type Candidate, type CodeFactorResult, type FactorRow } from '../../../shared/lrfd/index.js';
import { EFFECT_LABELS, METHOD_LABELS, factorText } from '../../../shared/lrfd/words.js';
import type { TraceStep } from '../../../shared/trace.js';
import { checkPlacement, evaluateTransverse, governingTransversePlacement, leverRuleLine, placementRulesForDeck, rigidSectionLine, wheelLines, type Placement } from '../../../shared/placement/index.js';
import { ApiError } from '../../middleware/errors.js';
import { lengthInText } from '../../../shared/quantities/inText.js';
import { factorArticle } from '../reviews/versionResults.js';
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
  /** Factor questions: whether the value has the skew correction in it ('none': there is none at this place). */
  skew?: SkewInQuestion;
  /** Truck-position questions: the governing placement, its wheel lines (m) and the roadway. */
  placement?: Placement;
  wheelLines?: [number, number][];
  roadway?: { curbLeft: number; curbRight: number; laneWidth: number; laneCount: number; girderOffsets: number[]; gauge?: number; wheelToLaneEdge?: number };
}

/** Where a factor's skew correction stands in the question: absent (no correction at this place), included, or left out. */
export type SkewInQuestion = 'none' | 'with' | 'before';

/** "lever-rule" from "lever rule": the method as an adjective in a question (words of shared/lrfd/words.ts). */
const methodAdjective = (method: string) => (METHOD_LABELS[method] ?? method).replace(/ /g, '-');

function girderWords(p: FactorParams, row: FactorRow | undefined): string {
  if (p.method !== 'governing' && row?.girderNumber !== undefined) return `the ${p.girder} girder (girder ${row.girderNumber})`;
  if (p.method === 'governing' && typeof row?.girder === 'number') return `the ${p.girder} girders (the larger of the two)`;
  return `the ${p.girder} girder`;
}

/**
 * The lane case the value stands for: one lane, two or more (the count that governs, for the
 * methods that try each count), the larger of the two, or all lanes. `cases`: the lane cases
 * in which the question's method has a value at that place (a "larger of the two" with one
 * case to pick from names that case).
 */
function laneWords(p: FactorParams, row: FactorRow | undefined, designLanes: number, cases: readonly string[]): string {
  if (row?.method === 'equal-share') return `all ${designLanes} design lanes loaded`;
  if (p.effect === 'fatigue-moment' || p.effect === 'fatigue-shear') return 'one loaded lane, multiple presence removed';
  const lanes = p.lanes === 'governing' && cases.length === 1 ? cases[0] : p.lanes;
  if (lanes === 'one') return p.lanes === 'governing' && designLanes < 2 ? 'one loaded lane (the roadway holds one design lane)' : 'one loaded lane';
  const countsTried = p.method === 'lever-rule' || p.method === 'rigid-section';
  if (lanes === 'multiple') {
    if (countsTried) return designLanes === 2 ? 'two loaded lanes' : 'two or more loaded lanes (the number of lanes that gives the largest factor)';
    return 'two or more loaded lanes';
  }
  return 'one loaded lane or two or more, whichever gives the larger factor';
}

function placeWords(location: FactorRow['location'] | undefined, key: string | undefined): string {
  if (!location) return `at ${key ?? 'the first place of the effect'}`;
  if (location.span !== undefined) return `in ${location.description}`;
  if (location.support !== undefined) return `at ${location.description}`;
  return `for the ${location.description}`;
}

const SKEW_WORDS: Record<SkewInQuestion, string> = { none: '', with: ', skew correction included', before: ', before the skew correction' };

/**
 * The question in words, naming all that is graded: method, girder, effect, lane case, place
 * and whether the skew correction is in the value, e.g. "the lever-rule shear factor of the
 * exterior girder (girder 1) with one loaded lane, in span 1, before the skew correction".
 */
export function factorQuestion(p: FactorParams, code: Pick<CodeFactorResult, 'derived' | 'factors'>, row: FactorRow | undefined, skew: SkewInQuestion, location = row?.location): string {
  const what = `the ${p.method === 'governing' ? 'governing' : methodAdjective(p.method)} ${EFFECT_LABELS[p.effect]} factor`;
  const cases = [...new Set(code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect && r.location.key === location?.key && (p.method === 'governing' || r.method === p.method)).map((r) => r.lanes))];
  return `${what} of ${girderWords(p, row)} with ${laneWords(p, row, code.derived.designLanes, cases)}, ${placeWords(location, p.location)}${SKEW_WORDS[skew]}`;
}

const paramsError = (message: string, field?: string) => ApiError.badRequest(`params${field ? `.${field}` : ''}: ${message}`, [{ path: `body.params${field ? `.${field}` : ''}`, message }]);

function pickRow(code: CodeFactorResult, p: FactorParams): FactorRow | undefined {
  const ofEffect = code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect);
  const key = p.location ?? ofEffect[0]?.location.key;
  const rows = ofEffect.filter((r) => r.location.key === key);
  const inCase = p.lanes === 'governing' ? rows : rows.filter((r) => r.lanes === p.lanes);
  if (p.method === 'governing') return p.lanes === 'governing' ? rows.find((r) => r.governing) : inCase.find((r) => r.adopted);
  const byMethod = inCase.filter((r) => r.method === p.method);
  // The largest of the method's values (exterior girders of an unsymmetric deck, lane cases), as asked: with or before the skew correction.
  const asked = (r: FactorRow) => (p.skew === 'before' ? r.baseValue : r.value);
  return byMethod.length ? byMethod.reduce((a, b) => (asked(b) > asked(a) ? b : a)) : undefined;
}

function missingRow(code: CodeFactorResult, p: FactorParams): ApiError {
  const locations = [...new Set(code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect).map((r) => r.location.key))];
  if (locations.length === 0) return paramsError(`this deck version has no ${EFFECT_LABELS[p.effect]} factor for the ${p.girder} girder`);
  if (p.location && !locations.includes(p.location)) return paramsError(`no ${EFFECT_LABELS[p.effect]} factor at ${p.location}: choose one of ${locations.join(', ')}`);
  const place = code.factors.find((r) => r.location.key === (p.location ?? locations[0]))?.location;
  return paramsError(`this deck version has no value for ${factorQuestion(p, code, undefined, 'none', place)}: the code does not use that method for that case here`);
}

/** Whether the question's value has the skew correction in it; refuses "before" where no such value exists. */
function skewInQuestion(p: FactorParams, row: FactorRow, scope: FactorRow[]): SkewInQuestion {
  const asked = p.skew ?? 'with';
  if (p.method === 'governing') {
    if (asked === 'before') throw paramsError('a governing value is chosen among values with their skew corrections: ask for it with the skew correction, or ask for one method’s factor before the correction', 'skew');
    return scope.some((r) => rowSkew(r) !== 'none') ? 'with' : 'none';
  }
  const where = rowSkew(row);
  if (where === 'none') return 'none';
  if (asked === 'before' && !canLeaveOutSkew(row)) {
    throw paramsError(`the ${EFFECT_LABELS[p.effect]} factor starts from the adopted one-lane factor with its skew correction: ask for it with the skew correction`, 'skew');
  }
  return asked;
}

/**
 * The product's answer to a factor question: the row asked for, its value with or before the
 * skew correction, and only the steps that value rests on (shared/lrfd/quantity.ts); a
 * governing value ends with the step that picks it among every candidate (shared/lrfd/choice.ts).
 */
export function expectedFactor(code: CodeFactorResult, p: FactorParams): ExpectedAnswer {
  const row = pickRow(code, p);
  if (!row) throw missingRow(code, p);
  const scope = code.factors.filter((r) => r.girderKind === p.girder && r.effect === p.effect && r.location.key === row.location.key);
  const skew = skewInQuestion(p, row, scope);
  const quantity = rowQuantity(row, skew === 'before' ? 'before' : 'with');
  // A governing value is the pick among candidates: show them all and the rule that picked it.
  const choice = p.method === 'governing' ? governingChoice(code.factors, { girder: p.girder, effect: p.effect, locationKey: row.location.key }, p.lanes) : null;
  const withChoice = choice !== null && choice.candidates.length > 1;
  return {
    question: factorQuestion(p, code, row, skew),
    value: quantity.value,
    article: factorArticle(row),
    trace: withChoice ? [...quantity.trace, choice.step] : quantity.trace,
    ...(withChoice ? { candidates: choice.candidates } : {}),
    rowId: row.id,
    method: row.method,
    lanes: row.lanes,
    ...(row.loadedLanes !== undefined ? { loadedLanes: row.loadedLanes } : {}),
    location: row.location.description,
    skew,
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
    roadway: { curbLeft: rules.curbLeft, curbRight: rules.curbRight, laneWidth: rules.laneWidth, laneCount: rules.laneCount, girderOffsets: g.offsets, gauge: rules.gauge, wheelToLaneEdge: rules.wheelToLaneEdge },
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
    // A step that computes the answer itself (the last, or one with the answer's value) is reached by the final value.
    const computesAnswer = i === last || relDiff(s.value, expected.value) <= 1e-9;
    const byValue = computesAnswer && relDiff(body.value, s.value) <= tolerancePercent + 1e-9;
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
