/**
 * The code-method engine: every live-load distribution factor of a deck by the AASHTO LRFD
 * approximate methods, with the case that governs each girder and effect.
 *
 *   computeCodeFactors(deck) → { derived, factors (flat rows), governing, findings, trace }
 *
 * Methods: the empirical formulas of Art. 4.6.2.2.2 (moment) and 4.6.2.2.3 (shear), the
 * lever rule (Art. 4.6.2.2.1), the rigid-section check (Art. 4.6.2.2.2d), skew corrections
 * (Art. 4.6.2.2.2e, 4.6.2.2.3c), multiple presence (Table 3.6.1.1.2-1), fatigue (one lane,
 * multiple presence removed, Art. 3.6.1.1.2 and 3.6.1.4.3b), deflection (m·NL/Nb,
 * Art. 2.5.2.6.2), span lengths per effect (Table C4.6.2.2.1-1), and the owner policies of
 * the deck's `policy` (each off by default).
 *
 * Units: internal SI (m, m⁴, Pa, degrees) in, lane fractions (dimensionless) out. Girders
 * are numbered 1..Nb from the left; offsets from girder 1, positive to the right.
 *
 * Rule for unequal girder spacing (common practice, no source): an interior girder's S is
 * the average of its two adjacent spacings; the interior formulas use the largest such S
 * (the girder it belongs to is named in a finding); the exterior girder's g_interior uses
 * the S of the interior girder next to it; the lever rule and the rigid-section check use
 * the actual offsets.
 *
 * The row builder (`buildFactorRow`) and the selection of governing values
 * (`selectGoverning`) are exported so that other methods (e.g. a grillage analysis, method
 * "grillage") can add rows and be compared on the same footing.
 */
import { deckGeometry, type DeckGeometry } from '../deck/geometry.js';
import { assertDeck, DeckInputError, type Deck } from '../deck/schema.js';
import { derivedSection, type DerivedSection } from '../deck/section.js';
import type { TraceStep } from '../trace.js';
import { toUs } from '../units.js';
import { lengthInText } from '../quantities/inText.js';
import { citeArticle, designValuesOf, designValuesStep, formulaLength, type DesignValues } from '../loads/designValues.js';
import { parameter, type Finding } from './findings.js';
import type { FormulaContext, Lanes, TableOutcome } from './formula.js';
import { designLanes, multiplePresenceFactor } from './lanes.js';
import { leverRule, type LeverRuleResult, type LeverRuleWorksheet } from './leverRule.js';
import { deParameter, exteriorMoment, interiorMoment } from './moment.js';
import { rigidSection, type RigidSectionResult, type RigidSectionWorksheet } from './rigidSection.js';
import { closeOnGoverningCase } from './choice.js';
import { exteriorShear, interiorShear } from './shear.js';
import { momentSkewFactor, shearSkewFactor, type SkewFactor, type SkewInputs } from './skew.js';
import { effectLocations, type EffectLocation } from './spanLengths.js';
import { formulaFamily, rigidSectionScope, SD_CONSTANT_K, type FormulaFamily, type RigidSectionScope } from './sectionTypes.js';

export type GirderKind = 'interior' | 'exterior';
export type FactorEffect = 'moment' | 'negative-moment' | 'shear' | 'reaction' | 'fatigue-moment' | 'fatigue-shear' | 'deflection';
export type FactorMethod = 'formula' | 'lever-rule' | 'rigid-section' | 'equal-share' | 'interior-minimum' | 'grillage';

/** Where a factor applies. */
export interface FactorLocation {
  /** 0-based span (moment, shear and their fatigue rows). */
  span?: number;
  /** 0-based support line (negative moment, reactions). */
  support?: number;
  /** L used in the equations, m (absent for the whole-deck deflection factor). */
  spanLength?: number;
  /** Plain words, e.g. "span 1". */
  description: string;
  /** Stable key, e.g. "span1", "support2", "deck". */
  key: string;
}

export interface FactorRow {
  /** Unique within a result, e.g. "exterior/moment/span1/multiple/formula/g1". */
  id: string;
  /** 'interior' or 'exterior', or a girder number (1-based) where the method gives one. */
  girder: GirderKind | number;
  girderKind: GirderKind;
  /** The girder the value was computed for, 1-based, where the method names one. */
  girderNumber?: number;
  effect: FactorEffect;
  lanes: Lanes;
  /** Number of loaded lanes that produced the value (lever rule, rigid section, equal share). */
  loadedLanes?: number;
  method: FactorMethod;
  /** Final lane fraction, skew correction included. */
  value: number;
  /** Lane fraction before the skew correction. */
  baseValue: number;
  /** Skew multiplier applied (1 when none). */
  skewFactor: number;
  /** Multiple presence factor contained in `value` for one loaded lane (for fatigue). */
  oneLaneMultiplePresence?: number;
  /** 'lesser-of': this row and the others so marked in its lane case are compared by their least (Nb = 3). */
  combine?: 'lesser-of';
  location: FactorLocation;
  /** The value adopted for this girder, effect, location and lane case. */
  adopted: boolean;
  /** The value that governs this girder, effect and location. */
  governing: boolean;
  findings: Finding[];
  trace: TraceStep[];
  /**
   * Refined rows: how far any legal placement could exceed the value, in lanes and % of it,
   * and whether that meets the bound target (shared/placement/search.ts BOUND_TARGET_*).
   */
  bound?: { lanes: number; percent: number; meetsTarget: boolean };
  /** Refined moment rows: the value at twice the mesh density, its relative change, and whether that is within 1 %. */
  convergence?: { segmentsPerSpan: number; value: number; change: number; within: boolean };
  /** Refined rows: the load that governs the row's lane case ("design truck", "HL-93 tandem + lane", …). */
  vehicle?: string;
  leverRule?: LeverRuleWorksheet;
  rigidSection?: RigidSectionWorksheet;
}

export interface GoverningFactor {
  girder: GirderKind;
  girderNumber?: number;
  effect: FactorEffect;
  location: FactorLocation;
  value: number;
  lanes: Lanes;
  loadedLanes?: number;
  method: FactorMethod;
  /** id of the row that produced it. */
  rowId: string;
  /** Which case produced it, in words. */
  reason: string;
}

export interface DerivedValues {
  family: FormulaFamily;
  girderCount: number;
  /** Girder offsets from girder 1, m. */
  offsets: number[];
  /** Spacings between adjacent girders, m. */
  spacings: number[];
  uniformSpacing: boolean;
  /** S used by the interior formulas, m (absent with fewer than 3 girders). */
  interiorSpacing?: number;
  /** Girder (1-based) whose average adjacent spacing is `interiorSpacing`. */
  interiorSpacingGirder?: number;
  deckWidth: number;
  roadwayWidth: number;
  curbLeft: number;
  curbRight: number;
  designLanes: number;
  designLaneWidth: number;
  deLeft: number;
  deRight: number;
  deckModulus: number;
  girderModulus: number;
  modularRatio: number;
  eg?: number;
  Kg?: number;
  spans: number[];
  skews: number[];
  continuous: boolean;
  symmetric: boolean;
}

export interface CodeFactorResult {
  deckName: string;
  sectionType: Deck['sectionType'];
  derived: DerivedValues;
  factors: FactorRow[];
  governing: GoverningFactor[];
  /** All findings of all rows and of the deck, each once. */
  findings: Finding[];
  /** Steps of the derived values (n, eg, Kg, NL, de, W). */
  trace: TraceStep[];
  caution: string;
}

export const RESULT_CAUTION =
  'Distribution factors are aids to the judgement of a licensed engineer; local codes, owner policies and licensed practice govern.';

const FATIGUE_ARTICLE = 'AASHTO LRFD Art. 3.6.1.1.2 and 3.6.1.4.3b';

/** Fields for a new row; flags and the final value are filled in by `buildFactorRow`. */
export interface FactorRowInit {
  girderKind: GirderKind;
  girderNumber?: number;
  /** Show the girder number in `girder` instead of the kind. */
  numbered?: boolean;
  effect: FactorEffect;
  lanes: Lanes;
  loadedLanes?: number;
  method: FactorMethod;
  baseValue: number;
  skew?: SkewFactor;
  oneLaneMultiplePresence?: number;
  combine?: 'lesser-of';
  location: FactorLocation;
  findings?: Finding[];
  trace?: TraceStep[];
  leverRule?: LeverRuleWorksheet;
  rigidSection?: RigidSectionWorksheet;
}

/** Build one factor row: value = baseValue × skew factor, with the trace closed by the product. */
export function buildFactorRow(init: FactorRowInit): FactorRow {
  const skewFactor = init.skew?.factor ?? 1;
  const value = init.baseValue * skewFactor;
  const trace = (init.trace ?? []).slice();
  const findings = init.skew && init.skew.findings.length > 0 ? (init.findings ?? []).concat(init.skew.findings) : (init.findings ?? []).slice();
  if (init.skew && init.skew.steps.length > 0) {
    trace.push(...init.skew.steps.map((st) => ({ ...st, part: 'skew' as const })));
    trace.push({
      label: 'Distribution factor with the skew correction',
      formula: 'g = g₀ · skew factor',
      inputs: [
        { symbol: 'g₀', description: 'factor before skew', value: init.baseValue, kind: 'none' },
        { symbol: 'k_skew', description: 'skew factor', value: skewFactor, kind: 'none' },
      ],
      value,
      kind: 'none',
      article: init.skew.steps[init.skew.steps.length - 1].article,
      part: 'skew',
    });
  }
  const idGirder = init.girderNumber !== undefined && init.girderKind === 'exterior' ? `/g${init.girderNumber}` : '';
  const row: FactorRow = {
    id: `${init.girderKind}/${init.effect}/${init.location.key}/${init.lanes}/${init.method}${idGirder}`,
    girder: init.numbered && init.girderNumber !== undefined ? init.girderNumber : init.girderKind,
    girderKind: init.girderKind,
    effect: init.effect,
    lanes: init.lanes,
    method: init.method,
    value,
    baseValue: init.baseValue,
    skewFactor,
    location: init.location,
    adopted: false,
    governing: false,
    findings,
    trace,
  };
  if (init.girderNumber !== undefined) row.girderNumber = init.girderNumber;
  if (init.loadedLanes !== undefined) row.loadedLanes = init.loadedLanes;
  if (init.oneLaneMultiplePresence !== undefined) row.oneLaneMultiplePresence = init.oneLaneMultiplePresence;
  if (init.combine) row.combine = init.combine;
  if (init.leverRule) row.leverRule = init.leverRule;
  if (init.rigidSection) row.rigidSection = init.rigidSection;
  return row;
}

const METHOD_WORDS: Record<FactorMethod, string> = {
  formula: 'empirical formula',
  'lever-rule': 'lever rule',
  'rigid-section': 'rigid-section check',
  'equal-share': 'equal share m·NL/Nb',
  'interior-minimum': 'interior girder value (exterior not less than interior)',
  grillage: 'grillage analysis',
};

function reasonOf(r: FactorRow): string {
  const lanes = r.lanes === 'one' ? 'one loaded lane' : r.loadedLanes ? `${r.loadedLanes} loaded lanes` : 'two or more loaded lanes';
  const girder = r.girderNumber !== undefined ? `, girder ${r.girderNumber}` : '';
  return `${METHOD_WORDS[r.method]}, ${lanes}${girder}`;
}

function groupKey(r: FactorRow): string {
  return `${r.girderKind}|${r.effect}|${r.location.key}`;
}

/**
 * Mark the adopted value of each lane case and the governing value of each girder kind,
 * effect and location, in place; returns the governing list. Within a lane case, rows
 * marked `combine: 'lesser-of'` count by their least value; the adopted value is the
 * largest of that and the other rows (Art. 4.6.2.2.2d: the exterior girder is not taken
 * below the rigid-section value). The governing value is the largest adopted value.
 */
export function selectGoverning(rows: FactorRow[]): GoverningFactor[] {
  const groups = new Map<string, FactorRow[]>();
  for (const r of rows) {
    r.adopted = false;
    r.governing = false;
    const k = groupKey(r);
    const g = groups.get(k);
    if (g) g.push(r);
    else groups.set(k, [r]);
  }
  const out: GoverningFactor[] = [];
  for (const group of groups.values()) {
    const adopted: FactorRow[] = [];
    for (const lanes of ['one', 'multiple'] as const) {
      const inCase = group.filter((r) => r.lanes === lanes);
      if (inCase.length === 0) continue;
      const lesser = inCase.filter((r) => r.combine === 'lesser-of');
      const others = inCase.filter((r) => r.combine !== 'lesser-of');
      const candidates = [...others];
      if (lesser.length > 0) candidates.push(lesser.reduce((a, b) => (b.value < a.value ? b : a)));
      const best = candidates.reduce((a, b) => (b.value > a.value + 1e-12 ? b : a));
      best.adopted = true;
      adopted.push(best);
    }
    const gov = adopted.reduce((a, b) => (b.value > a.value + 1e-12 ? b : a));
    gov.governing = true;
    const g: GoverningFactor = {
      girder: gov.girderKind,
      effect: gov.effect,
      location: gov.location,
      value: gov.value,
      lanes: gov.lanes,
      method: gov.method,
      rowId: gov.id,
      reason: reasonOf(gov),
    };
    if (gov.girderNumber !== undefined) g.girderNumber = gov.girderNumber;
    if (gov.loadedLanes !== undefined) g.loadedLanes = gov.loadedLanes;
    out.push(g);
  }
  return out;
}

// ---------------------------------------------------------------------------------------

interface Engine {
  deck: Deck;
  geom: DeckGeometry;
  section: DerivedSection;
  family: FormulaFamily;
  lanes: { count: number; width: number; trace: TraceStep };
  /** The deck's design values (lanes, wheels; shared/loads/designValues.ts). */
  values: DesignValues;
  Nb: number;
  interiorS?: { S: number; girder: number };
  symmetric: boolean;
  /** Whether the rigid-section check applies, and why (Art. 4.6.2.2.2d). */
  rigid: RigidSectionScope;
  leverCache: Map<string, LeverRuleResult>;
  rigidCache: Map<string, RigidSectionResult>;
}

function near(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

/** Average of the two spacings adjacent to interior girder i (0-based). */
function averageSpacing(spacings: number[], i: number): number {
  return (spacings[i - 1] + spacings[i]) / 2;
}

function checkRequired(deck: Deck, family: FormulaFamily, section: DerivedSection): void {
  const s = deck.section;
  if (family === 'beam-slab' && section.Kg === undefined) {
    const missing = s.area === undefined ? 'area' : s.inertia === undefined ? 'inertia' : 'centroidFromTop';
    throw new DeckInputError(['section', missing], `section type ${deck.sectionType} needs A, I and the centroid depth (or eg) to compute Kg = n(I + A·eg²)`);
  }
  if (family === 'keyed' && s.beamShape === undefined) {
    throw new DeckInputError(['section', 'beamShape'], `section type ${deck.sectionType} connected only by shear keys needs the beam shape, which sets K of the S/D method (Table 4.6.2.2.2b-1)`);
  }
  if (family === 'multicell' && s.depth === undefined) {
    throw new DeckInputError(['section', 'depth'], 'section type d needs the web depth d for the shear formulas of Table 4.6.2.2.3a-1');
  }
  const skewed = deck.supports.some((sp) => sp.skew !== 0);
  if ((deck.sectionType === 'f' || deck.sectionType === 'g') && skewed && s.depth === undefined) {
    throw new DeckInputError(['section', 'depth'], `a skewed deck of section type ${deck.sectionType} needs the beam depth d for the shear correction of Table 4.6.2.2.3c-1`);
  }
  if (deck.supports.length !== deck.spans.length + 1) {
    throw new DeckInputError(['supports'], `a deck of ${deck.spans.length} span(s) needs ${deck.spans.length + 1} support lines, not ${deck.supports.length}`);
  }
}

function isSymmetric(geom: DeckGeometry, deck: Deck): boolean {
  const s = geom.spacings;
  for (let i = 0; i < s.length; i++) if (!near(s[i], s[s.length - 1 - i])) return false;
  return near(geom.deLeft, geom.deRight) && near(deck.overhangLeft, deck.overhangRight);
}

function makeEngine(deck: Deck): Engine {
  const family = formulaFamily(deck);
  const geom = deckGeometry(deck);
  const section = derivedSection(deck);
  checkRequired(deck, family, section);
  const values = designValuesOf(deck);
  let lanes: Engine['lanes'];
  try {
    lanes = designLanes(geom.roadwayWidth, values);
  } catch (e) {
    if (e instanceof DeckInputError) {
      const rule = values.laneRule;
      throw new DeckInputError(
        ['barrierRight', 'width'],
        `the clear roadway between the barrier faces is ${(geom.roadwayWidth / rule.unitMetres).toFixed(2)} ${rule.unitSymbol}, narrower than one ${values.printed.laneWidth} design lane (${citeArticle(values, 'Art. 3.6.1.1.1')})`,
      );
    }
    throw e;
  }
  const Nb = geom.girderCount;
  let interiorS: Engine['interiorS'];
  for (let i = 1; i < Nb - 1; i++) {
    const S = averageSpacing(geom.spacings, i);
    if (!interiorS || S > interiorS.S + 1e-12) interiorS = { S, girder: i };
  }
  return {
    deck,
    geom,
    section,
    family,
    lanes,
    values,
    Nb,
    interiorS,
    symmetric: isSymmetric(geom, deck),
    rigid: rigidSectionScope(deck),
    leverCache: new Map(),
    rigidCache: new Map(),
  };
}

function formulaContext(en: Engine, S: number, L: number): FormulaContext {
  const s = en.deck.section;
  const ctx: FormulaContext = {
    family: en.family,
    sectionType: en.deck.sectionType,
    S: parameter('S', 'girder spacing', S, 'length'),
    L: parameter('L', 'span length for this effect', L, 'length'),
    Nb: en.Nb,
    NL: en.lanes.count,
    ts: parameter('ts', 'structural slab thickness', en.deck.slab.thickness, 'dimension'),
  };
  if (en.section.Kg !== undefined) ctx.Kg = parameter('Kg', 'longitudinal stiffness parameter', en.section.Kg, 'inertia');
  if (s.depth !== undefined) ctx.d = parameter('d', 'girder depth', s.depth, 'dimension');
  if (s.width !== undefined) ctx.b = parameter('b', 'beam width', s.width, 'dimension');
  if (s.inertia !== undefined) ctx.I = parameter('I', 'girder moment of inertia', s.inertia, 'inertia');
  if (s.torsion !== undefined) ctx.J = parameter('J', 'torsional inertia', s.torsion, 'inertia');
  if (s.cells !== undefined) ctx.Nc = s.cells;
  ctx.W = parameter('W', 'edge-to-edge width of the bridge', en.geom.deckRight - en.geom.deckLeft, 'length');
  if (s.beamShape !== undefined) ctx.K = SD_CONSTANT_K[s.beamShape];
  return ctx;
}

function skewInputs(en: Engine, ctx: FormulaContext): SkewInputs {
  const inp: SkewInputs = {
    sectionType: en.deck.sectionType,
    actsAsUnit: en.deck.section.actsAsUnit ?? en.family !== 'keyed',
    S: ctx.S,
    L: ctx.L,
    ts: ctx.ts,
    Nb: en.Nb,
  };
  if (ctx.Kg) inp.Kg = ctx.Kg;
  if (ctx.d) inp.d = ctx.d;
  if (ctx.b) inp.b = ctx.b;
  if (ctx.Nc !== undefined) inp.Nc = ctx.Nc;
  return inp;
}

const LEVER_POLICY_ARTICLE = 'owner policy (lever rule without the one-lane multiple presence factor 1.2 of Table 3.6.1.1.2-1)';

/** Lever rule for a girder (0-based) and lane case, cached. */
function lever(en: Engine, girder: number, lanes: Lanes): LeverRuleResult {
  const key = `${girder}|${lanes}`;
  const hit = en.leverCache.get(key);
  if (hit) return hit;
  const counts = lanes === 'one' ? [1] : Array.from({ length: en.lanes.count - 1 }, (_, i) => i + 2);
  const oneLaneFactor = en.deck.policy.leverRuleWithoutMultiplePresence ? 1.0 : 1.2;
  const r = leverRule(en.geom.offsets, girder, en.geom.curbLeft, en.geom.curbRight, en.lanes.width, en.lanes.count, { loadedLanes: counts, oneLaneFactor, values: en.values });
  en.leverCache.set(key, r);
  return r;
}

/** Lever rule over all interior girders; the largest, with the girder it belongs to. */
function interiorLever(en: Engine, lanes: Lanes): { result: LeverRuleResult; girder: number } {
  let best: { result: LeverRuleResult; girder: number } | undefined;
  const last = en.symmetric ? Math.ceil((en.Nb - 1) / 2) : en.Nb - 2;
  for (let i = 1; i <= Math.min(last, en.Nb - 2); i++) {
    const r = lever(en, i, lanes);
    if (!best || r.value > best.result.value + 1e-12) best = { result: r, girder: i };
  }
  if (!best) throw new TypeError('no interior girder');
  return best;
}

function rigidFor(en: Engine, side: 'left' | 'right'): RigidSectionResult {
  const hit = en.rigidCache.get(side);
  if (hit) return hit;
  const r = rigidSection(en.geom.offsets, side, en.geom.curbLeft, en.geom.curbRight, en.lanes.width, en.lanes.count, en.values);
  en.rigidCache.set(side, r);
  return r;
}

function leverFindings(en: Engine, lanes: Lanes): Finding[] {
  if (lanes === 'one' && en.deck.policy.leverRuleWithoutMultiplePresence) {
    return [{ code: 'policy', message: 'owner policy: lever rule for one lane with m = 1.0 instead of 1.2', article: LEVER_POLICY_ARTICLE }];
  }
  return [];
}

type Effect = EffectLocation['effect'];
const isMomentLike = (e: Effect) => e === 'moment' || e === 'negative-moment';

function locationOf(loc: EffectLocation): FactorLocation {
  const out: FactorLocation = { spanLength: loc.length, description: loc.description, key: loc.key };
  if (loc.span !== undefined) out.span = loc.span;
  if (loc.support !== undefined) out.support = loc.support;
  return out;
}

/** Skew factor for a location (moment reduction or shear correction). */
function skewFor(en: Engine, loc: EffectLocation, ctx: FormulaContext): SkewFactor {
  const skews = en.deck.supports.map((s) => s.skew);
  const inp = skewInputs(en, ctx);
  if (loc.effect === 'moment') return momentSkewFactor(inp, [skews[loc.span!], skews[loc.span! + 1]]);
  if (loc.effect === 'negative-moment') {
    const j = loc.support!;
    const a = momentSkewFactor(inp, [skews[j - 1], skews[j]]);
    const b = momentSkewFactor(inp, [skews[j], skews[j + 1]]);
    return a.factor >= b.factor ? a : b;
  }
  if (loc.effect === 'shear') return shearSkewFactor(inp, Math.max(Math.abs(skews[loc.span!]), Math.abs(skews[loc.span! + 1])));
  return shearSkewFactor(inp, Math.abs(skews[loc.support!]));
}

function interiorOutcome(ctx: FormulaContext, effect: Effect, lanes: Lanes): TableOutcome {
  return isMomentLike(effect) ? interiorMoment(ctx, lanes) : interiorShear(ctx, lanes);
}

/** The adopted interior lane fraction (before skew) for a context, effect and lane case: value and the steps. */
function interiorValue(en: Engine, ctx: FormulaContext, effect: Effect, lanes: Lanes): { value: number; steps: TraceStep[]; findings: Finding[] } {
  const o = interiorOutcome(ctx, effect, lanes);
  if (o.kind === 'formula') return { value: o.value, steps: o.steps, findings: o.findings };
  const lv = interiorLever(en, lanes);
  if (o.kind === 'lever-rule') return { value: lv.result.value, steps: lv.result.trace, findings: [...o.findings, ...leverFindings(en, lanes)] };
  if (o.kind === 'lesser-of-formula-and-lever-rule') {
    const value = Math.min(o.value, lv.result.value);
    return { value, steps: [...o.steps, ...lv.result.trace], findings: o.findings };
  }
  throw new TypeError('unexpected interior outcome');
}

function effectOfLocation(e: Effect): FactorEffect {
  return e;
}

function locationInits(en: Engine, loc: EffectLocation): FactorRowInit[] {
  const inits: FactorRowInit[] = [];
  const laneCases: Lanes[] = en.lanes.count >= 2 ? ['one', 'multiple'] : ['one'];
  const location = locationOf(loc);
  const effect = effectOfLocation(loc.effect);
  const momentLike = isMomentLike(loc.effect);

  // Interior girders.
  if (en.Nb >= 3 && en.interiorS) {
    const ctx = formulaContext(en, en.interiorS.S, loc.length);
    const skew = skewFor(en, loc, ctx);
    const spacingFindings: Finding[] = [];
    if (!en.geom.spacings.every((s) => near(s, en.geom.spacings[0]))) {
      spacingFindings.push({
        code: 'assumption',
        message: `girder spacings vary (${en.geom.spacings.map((s) => toUs.ft(s).toFixed(2)).join(', ')} ft): interior formulas use S = ${toUs.ft(en.interiorS.S).toFixed(2)} ft, the largest average of the two spacings beside an interior girder (girder ${en.interiorS.girder + 1}) (common practice, no source)`,
        article: 'common practice, no source',
      });
    }
    if (en.family === 'keyed') {
      const theta = Math.max(...en.deck.supports.map((s) => Math.abs(s.skew)));
      if (theta > 45) {
        spacingFindings.push({ code: 'out-of-range', message: `θ = ${theta.toFixed(1)}° exceeds 45.0° by ${(theta - 45).toFixed(1)}°: S/D method used outside its range (engineering judgement)`, article: 'AASHTO LRFD Table 4.6.2.2.2b-1', parameter: 'θ', value: theta, limit: 45, bound: 'max', excess: theta - 45, unit: '°' });
      }
    }
    for (const lanes of laneCases) {
      const o = interiorOutcome(ctx, loc.effect, lanes);
      const common = { girderKind: 'interior' as const, effect, lanes, location, skew };
      const mOne = lanes === 'one' ? 1.2 : undefined;
      if (o.kind === 'formula' || o.kind === 'lesser-of-formula-and-lever-rule') {
        const init: FactorRowInit = {
          ...common,
          method: 'formula',
          baseValue: o.value,
          findings: [...spacingFindings, ...o.findings],
          trace: [...o.steps],
        };
        if (mOne !== undefined) init.oneLaneMultiplePresence = mOne;
        if (o.kind === 'lesser-of-formula-and-lever-rule') init.combine = 'lesser-of';
        inits.push(init);
      }
      if (o.kind === 'lever-rule' || o.kind === 'lesser-of-formula-and-lever-rule') {
        const lv = interiorLever(en, lanes);
        const init: FactorRowInit = {
          ...common,
          girderNumber: lv.girder + 1,
          method: 'lever-rule',
          loadedLanes: lv.result.loadedLanes,
          baseValue: lv.result.value,
          findings: [...(o.kind === 'lever-rule' ? [...spacingFindings, ...o.findings] : []), ...leverFindings(en, lanes)],
          trace: [...lv.result.trace],
          leverRule: lv.result.worksheet,
        };
        if (lanes === 'one') init.oneLaneMultiplePresence = en.deck.policy.leverRuleWithoutMultiplePresence ? 1.0 : 1.2;
        if (o.kind === 'lesser-of-formula-and-lever-rule') init.combine = 'lesser-of';
        inits.push(init);
      }
    }
  }

  // Exterior girders.
  const sides: ('left' | 'right')[] = en.symmetric ? ['left'] : ['left', 'right'];
  for (const side of sides) {
    const g = side === 'left' ? 0 : en.Nb - 1;
    const neighbour = side === 'left' ? 1 : en.Nb - 2;
    const exteriorS = side === 'left' ? en.geom.spacings[0] : en.geom.spacings[en.geom.spacings.length - 1];
    const adjacentS = en.Nb >= 3 ? averageSpacing(en.geom.spacings, neighbour) : exteriorS;
    const de = side === 'left' ? en.geom.deLeft : en.geom.deRight;
    const overhang = side === 'left' ? en.deck.overhangLeft : en.deck.overhangRight;
    const ctx = formulaContext(en, adjacentS, loc.length);
    const skew = skewFor(en, loc, ctx);
    const deP = deParameter(de);
    const exteriorSP = parameter('S_ext', 'spacing between the exterior girder and the next', exteriorS, 'length');
    const sideFindings: Finding[] = [];
    const numbered = !en.symmetric;
    for (const lanes of laneCases) {
      const o: TableOutcome = momentLike
        ? exteriorMoment(ctx, lanes, deP, { exteriorS: exteriorSP, We: parameter('We', 'half the web spacing plus the total overhang', exteriorS / 2 + overhang, 'length') })
        : exteriorShear(ctx, lanes, deP, { exteriorS: exteriorSP });
      const common = { girderKind: 'exterior' as const, girderNumber: g + 1, numbered, effect, lanes, location, skew };
      const leverRow = (extraFindings: Finding[], combine?: 'lesser-of') => {
        const lv = lever(en, g, lanes);
        const init: FactorRowInit = {
          ...common,
          method: 'lever-rule',
          loadedLanes: lv.loadedLanes,
          baseValue: lv.value,
          findings: [...sideFindings, ...extraFindings, ...leverFindings(en, lanes)],
          trace: [...lv.trace],
          leverRule: lv.worksheet,
        };
        if (lanes === 'one') init.oneLaneMultiplePresence = en.deck.policy.leverRuleWithoutMultiplePresence ? 1.0 : 1.2;
        if (combine) init.combine = combine;
        inits.push(init);
      };
      if (o.kind === 'lever-rule') {
        leverRow(o.findings);
      } else if (o.kind === 'formula') {
        const init: FactorRowInit = { ...common, method: 'formula', baseValue: o.value, findings: [...sideFindings, ...o.findings], trace: [...o.steps] };
        if (lanes === 'one') init.oneLaneMultiplePresence = 1.2;
        inits.push(init);
      } else if (o.kind === 'e-times-interior') {
        if (en.Nb < 3) {
          leverRow([
            ...o.findings,
            { code: 'fallback', message: `Nb = ${en.Nb}: there is no interior girder for g = e·g_interior: lever rule used`, article: 'AASHTO LRFD Art. 4.6.2.2.1', parameter: 'Nb', value: en.Nb, limit: 3, bound: 'min', excess: 3 - en.Nb, unit: '' },
          ]);
          continue;
        }
        const gi = interiorValue(en, ctx, loc.effect, lanes);
        const base = o.e * gi.value * o.extra;
        const product: TraceStep = {
          label: `Exterior girder ${g + 1}, ${momentLike ? 'moment' : 'shear'}, ${lanes === 'one' ? 'one design lane' : 'two or more design lanes'}`,
          formula: o.extra !== 1 ? 'g = e · g_interior · (48/b)' : 'g = e · g_interior',
          inputs: [
            { symbol: 'e', description: 'correction factor', value: o.e, kind: 'none' },
            { symbol: 'g_interior', description: `interior girder factor with S = ${lengthInText(adjacentS)}`, value: gi.value, kind: 'none' },
            ...(o.extra !== 1 ? [{ symbol: '48/b', description: 'width factor', value: o.extra, kind: 'none' as const }] : []),
          ],
          value: base,
          kind: 'none',
          article: momentLike ? 'AASHTO LRFD Table 4.6.2.2.2d-1' : 'AASHTO LRFD Table 4.6.2.2.3b-1',
        };
        const init: FactorRowInit = {
          ...common,
          method: 'formula',
          baseValue: base,
          findings: [...sideFindings, ...o.findings, ...gi.findings.filter((f) => f.code !== 'assumption')],
          trace: [...o.steps, ...gi.steps, product],
        };
        if (lanes === 'one') init.oneLaneMultiplePresence = 1.2;
        if (o.lesserWithLeverRule) init.combine = 'lesser-of';
        inits.push(init);
        if (o.lesserWithLeverRule) leverRow([], 'lesser-of');
      }
      if (en.rigid.applies) {
        const rs = rigidFor(en, side);
        const cs = lanes === 'one' ? rs.one : rs.multiple;
        if (cs) {
          const init: FactorRowInit = {
            ...common,
            method: 'rigid-section',
            loadedLanes: cs.loadedLanes,
            baseValue: cs.value,
            findings: rigidScopeFindings(en.rigid, en.deck.sectionType),
            trace: closeOnGoverningCase(
              rs.trace.filter((_, i) => (lanes === 'one' ? i === 0 : i > 0)),
              rs.worksheet.cases.filter((_, i) => (lanes === 'one' ? i === 0 : i > 0)),
              cs,
              'Rigid-section check',
              citeArticle(en.values, 'AASHTO LRFD Art. 4.6.2.2.2d'),
            ).map((st) => withScopeNote(momentLike ? st : { ...st, article: `${st.article}; applied to shear by Art. 4.6.2.2.3b` }, en.rigid)),
            rigidSection: rs.worksheet,
          };
          if (lanes === 'one') init.oneLaneMultiplePresence = 1.2;
          inits.push(init);
        }
      }
    }
  }

  // Owner policy: no factor below m·NL/Nb.
  if (en.deck.policy.floorAtEqualShare) {
    const eq = equalShare(en);
    const kinds: GirderKind[] = en.Nb >= 3 ? ['interior', 'exterior'] : ['exterior'];
    for (const girderKind of kinds) {
      inits.push({
          girderKind,
          effect,
          lanes: eq.lanes,
          loadedLanes: en.lanes.count,
          method: 'equal-share',
          baseValue: eq.value,
          location,
          findings: [{ code: 'policy', message: `owner policy: no factor below m·NL/Nb = ${eq.value.toFixed(3)}`, article: 'owner policy (floor at the equal share of all loaded lanes)' }],
          trace: [eq.step],
        });
    }
  }
  return inits;
}

/** A rigid-section step with the reason the check applies appended to its note. */
function withScopeNote(st: TraceStep, scope: RigidSectionScope): TraceStep {
  return { ...st, note: st.note ? `${st.note}; ${scope.reason}` : scope.reason };
}

/** A rigid-section row applied by owner policy says so among its findings. */
function rigidScopeFindings(scope: RigidSectionScope, sectionType: Deck['sectionType']): Finding[] {
  if (scope.basis !== 'owner-policy') return [];
  return [{ code: 'policy', message: `owner policy: rigid-section check on section type ${sectionType}, which is not one of types a, e, k`, article: scope.article }];
}

/** The step of the derived trace that records whether the rigid-section check applies, and why. */
function rigidScopeStep(scope: RigidSectionScope, deck: Deck): TraceStep {
  return {
    label: `Rigid-section check for the exterior girders: ${scope.applies ? 'applies' : 'does not apply'}`,
    formula: 'applies to section types a, e, k with diaphragms or cross-frames; to other types by owner policy',
    inputs: [],
    value: scope.applies ? 1 : 0,
    kind: 'none',
    article: scope.article,
    note: `section type ${deck.sectionType}, ${deck.diaphragms.type === 'none' ? 'no diaphragms' : deck.diaphragms.type.replace(/-/g, ' ')}: ${scope.reason}`,
  };
}

/** Skew angles a location's correction reads (for sharing rows between equal locations). */
function skewKey(en: Engine, loc: EffectLocation): string {
  const t = en.deck.supports.map((x) => x.skew);
  if (loc.effect === 'moment') return `M|${t[loc.span!]},${t[loc.span! + 1]}`;
  if (loc.effect === 'negative-moment') {
    const j = loc.support!;
    // Equal adjacent skews reduce to the positive-moment case of one span.
    if (t[j - 1] === t[j] && t[j] === t[j + 1]) return `M|${t[j]},${t[j]}`;
    return `N|${t[j - 1]},${t[j]},${t[j + 1]}`;
  }
  if (loc.effect === 'shear') return `V|${Math.max(Math.abs(t[loc.span!]), Math.abs(t[loc.span! + 1]))}`;
  return `V|${Math.abs(t[loc.support!])}`;
}

/** Rows of one location; locations with the same L, skews and kind of effect share their computation. */
function buildLocationRows(en: Engine, loc: EffectLocation, rows: FactorRow[], cache: Map<string, FactorRowInit[]>): void {
  const key = `${loc.length}|${skewKey(en, loc)}`;
  let inits = cache.get(key);
  if (!inits) {
    inits = locationInits(en, loc);
    cache.set(key, inits);
  }
  const location = locationOf(loc);
  for (const init of inits) rows.push(buildFactorRow({ ...init, effect: loc.effect, location, trace: [{ ...loc.trace, part: 'span-length' }, ...(init.trace ?? [])] }));
}


function equalShare(en: Engine): { value: number; lanes: Lanes; step: TraceStep } {
  const NL = en.lanes.count;
  const m = multiplePresenceFactor(NL);
  const value = (m * NL) / en.Nb;
  return {
    value,
    lanes: NL >= 2 ? 'multiple' : 'one',
    step: {
      label: 'All design lanes loaded, all girders sharing equally',
      formula: 'g = m · NL / Nb',
      inputs: [
        { symbol: 'm', description: 'multiple presence factor for NL lanes', value: m, kind: 'none' },
        { symbol: 'NL', description: 'number of design lanes', value: NL, kind: 'none' },
        { symbol: 'Nb', description: 'number of girders', value: en.Nb, kind: 'none' },
      ],
      value,
      kind: 'none',
      article: 'AASHTO LRFD Art. 2.5.2.6.2 and Table 3.6.1.1.2-1',
    },
  };
}

function derivedTrace(en: Engine): TraceStep[] {
  const steps: TraceStep[] = [];
  const { section, deck, geom } = en;
  steps.push({
    label: 'Modular ratio',
    formula: deck.materials.modularRatio !== undefined ? 'n (entered)' : 'n = E_B / E_D',
    inputs: [
      { symbol: 'E_B', description: 'girder modulus', value: section.girderModulus, kind: 'stress' },
      { symbol: 'E_D', description: 'deck modulus', value: section.deckModulus, kind: 'stress' },
    ],
    value: section.modularRatio,
    kind: 'none',
    article: 'AASHTO LRFD Eq. 4.6.2.2.1-2; Art. 5.4.2.4',
  });
  if (section.eg !== undefined) {
    steps.push({
      label: 'Distance between the centres of gravity of girder and deck',
      formula: deck.section.eg !== undefined ? 'eg (entered)' : 'eg = y_top + haunch + ts/2',
      inputs: [
        ...(deck.section.centroidFromTop !== undefined && deck.section.eg === undefined
          ? [{ symbol: 'y_top', description: 'girder centroid below its top', value: deck.section.centroidFromTop, kind: 'dimension' as const, formulaValue: toUs.in(deck.section.centroidFromTop), formulaUnit: 'in' }]
          : []),
        { symbol: 'haunch', description: 'haunch', value: deck.slab.haunch, kind: 'dimension', formulaValue: toUs.in(deck.slab.haunch), formulaUnit: 'in' },
        { symbol: 'ts', description: 'structural slab thickness', value: deck.slab.thickness, kind: 'dimension', formulaValue: toUs.in(deck.slab.thickness), formulaUnit: 'in' },
      ],
      value: section.eg,
      kind: 'dimension',
      article: 'AASHTO LRFD Art. 4.6.2.2.1 (notation eg)',
    });
  }
  if (section.Kg !== undefined) {
    steps.push({
      label: 'Longitudinal stiffness parameter',
      formula: 'Kg = n · (I + A · eg²)',
      inputs: [
        { symbol: 'n', description: 'modular ratio', value: section.modularRatio, kind: 'none' },
        { symbol: 'I', description: 'girder moment of inertia', value: deck.section.inertia!, kind: 'inertia', formulaValue: toUs.in4(deck.section.inertia!), formulaUnit: 'in⁴' },
        { symbol: 'A', description: 'girder area', value: deck.section.area!, kind: 'area', formulaValue: toUs.in2(deck.section.area!), formulaUnit: 'in²' },
        { symbol: 'eg', description: 'girder to deck centre of gravity', value: section.eg!, kind: 'dimension', formulaValue: toUs.in(section.eg!), formulaUnit: 'in' },
      ],
      value: section.Kg,
      kind: 'inertia',
      article: 'AASHTO LRFD Eq. 4.6.2.2.1-1',
    });
  }
  steps.push({
    label: 'Clear roadway width',
    formula: 'w = distance between the inside faces of the barriers',
    inputs: [
      { symbol: 'x_L', description: 'left barrier face from girder 1', value: geom.curbLeft, kind: 'length', ...formulaLength(en.values, geom.curbLeft) },
      { symbol: 'x_R', description: 'right barrier face from girder 1', value: geom.curbRight, kind: 'length', ...formulaLength(en.values, geom.curbRight) },
    ],
    value: geom.roadwayWidth,
    kind: 'length',
    article: citeArticle(en.values, 'AASHTO LRFD Art. 3.6.1.1.1'),
  });
  // the SI edition's values are named where they enter; a US customary deck's trace is as it was
  if (en.values.name !== 'us-customary') steps.push(designValuesStep(en.values));
  steps.push(en.lanes.trace);
  for (const [side, de, oh, bw] of [
    ['left', geom.deLeft, deck.overhangLeft, deck.barrierLeft.width],
    ['right', geom.deRight, deck.overhangRight, deck.barrierRight.width],
  ] as const) {
    steps.push({
      label: `de, ${side} exterior girder`,
      formula: 'de = overhang − barrier width (positive when the curb face is outboard of the girder)',
      inputs: [
        { symbol: 'overhang', description: `${side} overhang`, value: oh, kind: 'length', formulaValue: toUs.ft(oh), formulaUnit: 'ft' },
        { symbol: 'b_barrier', description: `${side} barrier width`, value: bw, kind: 'length', formulaValue: toUs.ft(bw), formulaUnit: 'ft' },
      ],
      value: de,
      kind: 'length',
      article: 'AASHTO LRFD Art. 4.6.2.2.1 (notation de)',
    });
  }
  steps.push(rigidScopeStep(en.rigid, deck));
  return steps;
}

/** Add fatigue, deflection and policy rows to rows already marked by `selectGoverning`. */
function addDerivedRows(en: Engine, rows: FactorRow[]): FactorRow[] {
  const extra: FactorRow[] = [];
  // Fatigue: one loaded lane, multiple presence removed.
  for (const r of rows) {
    if (!(r.adopted && r.lanes === 'one' && (r.effect === 'moment' || r.effect === 'negative-moment' || r.effect === 'shear'))) continue;
    const m = r.oneLaneMultiplePresence ?? 1.2;
    const effect: FactorEffect = r.effect === 'shear' ? 'fatigue-shear' : 'fatigue-moment';
    const step: TraceStep = {
      label: `Fatigue, ${r.girderKind} girder: one lane, multiple presence removed`,
      formula: m === 1 ? 'g_fatigue = g_one lane (no multiple presence was applied)' : 'g_fatigue = g_one lane / 1.20',
      inputs: [
        { symbol: 'g_one lane', description: `adopted one-lane factor (${METHOD_WORDS[r.method]})`, value: r.value, kind: 'none' },
        { symbol: 'm', description: 'multiple presence contained', value: m, kind: 'none' },
      ],
      value: r.value / m,
      kind: 'none',
      article: FATIGUE_ARTICLE,
    };
    const sdNote: Finding[] =
      en.family === 'keyed' && r.method === 'formula'
        ? [{ code: 'assumption', message: 'the S/D factor applies regardless of the number of loaded lanes; for fatigue it is divided by 1.2 like the other single-lane factors (Art. 3.6.1.1.2)', article: FATIGUE_ARTICLE }]
        : [];
    const init: FactorRowInit = {
      girderKind: r.girderKind,
      effect,
      lanes: 'one',
      method: r.method,
      baseValue: r.value / m,
      location: r.location,
      findings: sdNote.length ? r.findings.concat(sdNote) : r.findings,
      trace: [...r.trace, step],
      oneLaneMultiplePresence: 1,
    };
    if (r.girderNumber !== undefined) init.girderNumber = r.girderNumber;
    if (typeof r.girder === 'number') init.numbered = true;
    if (r.loadedLanes !== undefined) init.loadedLanes = r.loadedLanes;
    if (r.leverRule) init.leverRule = r.leverRule;
    if (r.rigidSection) init.rigidSection = r.rigidSection;
    extra.push(buildFactorRow(init));
  }
  // Deflection: all lanes loaded, all girders deflecting equally.
  const eq = equalShare(en);
  const deckLoc: FactorLocation = { description: 'whole deck', key: 'deck' };
  for (const girderKind of (en.Nb >= 3 ? ['interior', 'exterior'] : ['exterior']) as GirderKind[]) {
    extra.push(
      buildFactorRow({
        girderKind,
        effect: 'deflection',
        lanes: eq.lanes,
        loadedLanes: en.lanes.count,
        method: 'equal-share',
        baseValue: eq.value,
        location: deckLoc,
        trace: [eq.step],
      }),
    );
  }
  return extra;
}

/** Owner policy Art. 2.5.2.7.1: the exterior girder is given no less than the interior girder. */
function applyExteriorNotLessThanInterior(rows: FactorRow[], governing: GoverningFactor[]): FactorRow[] {
  const extra: FactorRow[] = [];
  for (const ext of governing) {
    if (ext.girder !== 'exterior' || ext.effect === 'deflection') continue;
    const int = governing.find((g) => g.girder === 'interior' && g.effect === ext.effect && g.location.key === ext.location.key);
    if (!int || !(int.value > ext.value + 1e-12)) continue;
    const src = rows.find((r) => r.id === int.rowId);
    extra.push(
      buildFactorRow({
        girderKind: 'exterior',
        effect: ext.effect,
        lanes: int.lanes,
        method: 'interior-minimum',
        baseValue: int.value,
        location: ext.location,
        findings: [
          {
            code: 'policy',
            message: `owner policy: the exterior girder carries no less than an interior girder (${int.value.toFixed(3)} > ${ext.value.toFixed(3)})`,
            article: 'AASHTO LRFD Art. 2.5.2.7.1',
          },
        ],
        trace: [
          {
            label: 'Exterior girder not less than interior girder',
            formula: 'g_exterior = max(g_exterior, g_interior)',
            inputs: [
              { symbol: 'g_exterior', description: ext.reason, value: ext.value, kind: 'none' },
              { symbol: 'g_interior', description: src ? reasonOf(src) : 'interior girder', value: int.value, kind: 'none' },
            ],
            value: int.value,
            kind: 'none',
            article: 'AASHTO LRFD Art. 2.5.2.7.1',
          },
        ],
      }),
    );
  }
  return extra;
}

function uniqueFindings(rows: FactorRow[], extra: Finding[]): Finding[] {
  const seen = new Set<string>();
  const out: Finding[] = [];
  for (const f of [...extra, ...rows.flatMap((r) => r.findings)]) {
    const k = `${f.code}|${f.message}`;
    if (seen.has(k)) continue;
    seen.add(k);
    out.push(f);
  }
  return out;
}

/**
 * Every code-method distribution factor of a validated deck.
 * @param deck a deck in internal units (from `assertDeck` / `parseDeck`).
 * @throws DeckInputError naming the field when the deck cannot be computed (no room for a
 *   design lane, a property the section type needs is missing, …).
 */
export function computeCodeFactors(deck: Deck): CodeFactorResult {
  const en = makeEngine(deck);
  const rows: FactorRow[] = [];
  const locations = effectLocations(deck);
  const cache = new Map<string, FactorRowInit[]>();
  for (const loc of locations) buildLocationRows(en, loc, rows, cache);
  selectGoverning(rows);
  rows.push(...addDerivedRows(en, rows));
  let governing = selectGoverning(rows);
  if (deck.policy.exteriorNotLessThanInterior) {
    const extra = applyExteriorNotLessThanInterior(rows, governing);
    if (extra.length > 0) {
      rows.push(...extra);
      governing = selectGoverning(rows);
    }
  }
  const deckFindings: Finding[] = locations.flatMap((l) => l.findings);
  if (en.symmetric) {
    deckFindings.push({ code: 'assumption', message: 'the cross-section is symmetric: the right exterior girder takes the values of the left one', article: 'statics (mirror symmetry)' });
  }
  if (en.family === 'multicell' && deck.section.cells !== undefined && deck.section.cells + 1 !== en.Nb) {
    deckFindings.push({ code: 'assumption', message: `type d: ${en.Nb} webs entered with Nc = ${deck.section.cells} cells (a box of Nc cells has Nc + 1 webs); both are used as entered`, article: 'AASHTO LRFD Table 4.6.2.2.1-1' });
  }
  for (const g of governing) {
    if (g.value <= 1e-12) {
      deckFindings.push({
        code: 'no-share',
        message: `${g.girder} girder, ${g.effect} (${g.location.description}): the ${g.reason} gives this girder no load — check it with a refined analysis or an owner policy (e.g. exterior not less than interior) before designing`,
        article: 'AASHTO LRFD Art. 4.6.2.2.1 and 4.6.3 (engineering judgement)',
      });
    }
  }
  if (en.rigid.basis === 'type-not-covered') {
    deckFindings.push({ code: 'not-applicable', message: `rigid-section check ${en.rigid.reason}`, article: en.rigid.article });
  }
  if (en.lanes.count === 1) {
    deckFindings.push({ code: 'not-applicable', message: 'the roadway holds one design lane: the formulas for two or more lanes do not apply', article: 'AASHTO LRFD Art. 3.6.1.1.1' });
  }
  const { geom, section } = en;
  const derived: DerivedValues = {
    family: en.family,
    girderCount: en.Nb,
    offsets: geom.offsets,
    spacings: geom.spacings,
    uniformSpacing: geom.spacings.every((s) => near(s, geom.spacings[0])),
    deckWidth: geom.deckRight - geom.deckLeft,
    roadwayWidth: geom.roadwayWidth,
    curbLeft: geom.curbLeft,
    curbRight: geom.curbRight,
    designLanes: en.lanes.count,
    designLaneWidth: en.lanes.width,
    deLeft: geom.deLeft,
    deRight: geom.deRight,
    deckModulus: section.deckModulus,
    girderModulus: section.girderModulus,
    modularRatio: section.modularRatio,
    spans: deck.spans.map((s) => s.length),
    skews: deck.supports.map((s) => s.skew),
    continuous: deck.continuous,
    symmetric: en.symmetric,
  };
  if (en.interiorS) {
    derived.interiorSpacing = en.interiorS.S;
    derived.interiorSpacingGirder = en.interiorS.girder + 1;
  }
  if (section.eg !== undefined) derived.eg = section.eg;
  if (section.Kg !== undefined) derived.Kg = section.Kg;
  return {
    deckName: deck.name,
    sectionType: deck.sectionType,
    derived,
    factors: rows,
    governing,
    findings: uniqueFindings(rows, deckFindings),
    trace: derivedTrace(en),
    caution: RESULT_CAUTION,
  };
}

/** Validate unknown input (internal units) and compute; throws DeckInputError naming the field. */
export function computeCodeFactorsFromInput(input: unknown): CodeFactorResult {
  return computeCodeFactors(assertDeck(input));
}

/** The governing factor of a girder kind, effect and location key (e.g. "span1"). */
export function governingFactor(result: CodeFactorResult, girder: GirderKind, effect: FactorEffect, locationKey?: string): GoverningFactor | undefined {
  return result.governing.find((g) => g.girder === girder && g.effect === effect && (locationKey === undefined || g.location.key === locationKey));
}


