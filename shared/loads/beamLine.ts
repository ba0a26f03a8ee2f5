/**
 * HL-93 beam-line (one design lane) live-load effects: moment and shear envelopes at the
 * tenth points of every span, and support reactions, for simple and continuous beams.
 * These per-lane effects are what the live-load distribution factors multiply.
 *
 * Units (internal SI, shared/units.ts): positions m; moments N·m; shears and reactions N.
 * Sign conventions as in influenceLine.ts: sagging moment positive; shear = resultant of
 * the upward forces on the part left of the section; reactions upward positive.
 *
 * AASHTO LRFD Bridge Design Specifications (these provisions have kept this form across the
 * editions; from memory, check the edition a project is designed to):
 * - Art. 3.6.1.2.2 design truck (rear spacing 14–30 ft chosen for the extreme);
 *   Art. 3.6.1.2.3 design tandem; Art. 3.6.1.2.4 design lane load 0.64 klf.
 * - Art. 3.6.1.3.1: the extreme of (design tandem + lane) and (design truck + lane); for
 *   negative moment between the points of contraflexure under a uniform load on all spans,
 *   and for reactions at interior piers, also 90 % of two design trucks (14 ft rear
 *   spacings, at least 50 ft between the lead axle of one and the rear axle of the other)
 *   combined with 90 % of the lane load. Axles that do not contribute are neglected; the
 *   lane load is placed on the portions of the influence line that add to the effect.
 * - Table 3.6.2.1-1 dynamic load allowance IM: 33 % (all other limit states), 15 % (fatigue
 *   and fracture), 75 % (deck joints); not applied to the lane load (Art. 3.6.2.1).
 * - Art. 3.6.1.4.1 fatigue truck: one design truck with a constant 30 ft rear spacing, no
 *   lane load, IM 15 %.
 * Not included: the dual design tandem of commentary C3.6.1.3.1 (an owner's option).
 *
 * The vehicles, the lane load and the two-truck spacings are the deck's design values
 * (`options.values`, shared/loads/designValues.ts): the US customary ones above by default, or
 * the SI edition's (AASHTO LRFD (SI), same articles: 35/145/145 kN at 4.3 m then 4.3–9.0 m,
 * 2 × 110 kN at 1.2 m, 9.3 N/mm, fatigue rear spacing 9.0 m, two trucks 4.3 m rear spacings at
 * least 15 m apart). The allowances IM and the 90 % reduction are the same in both.
 */
import { DeckInputError } from '../deck/schema.js';
import type { TraceInput, TraceStep } from '../trace.js';
import { lengthInText as len, quantityInText as q } from '../quantities/inText.js';
import { fromUs } from '../units.js';
import { BeamAnalysis, validateBeam, type BeamInfluenceLine, type BeamModel, type BeamResponse } from './influenceLine.js';
import { maxVehicleEffect, uniformLoadEffect, type AxlePlacement, type VehicleEffect } from './movingLoad.js';
import type { Vehicle } from './vehicles.js';
import { citeArticle, designValuesStep, truckWords, US_CUSTOMARY_VALUES, type DesignValues } from './designValues.js';

/** Dynamic load allowance, all limit states except fatigue, components other than deck joints (Table 3.6.2.1-1). */
export const IM_STRENGTH_SERVICE = 0.33;
/** Dynamic load allowance, fatigue and fracture limit state (Table 3.6.2.1-1). */
export const IM_FATIGUE = 0.15;
/** Dynamic load allowance for deck joints, all limit states (Table 3.6.2.1-1). */
export const IM_DECK_JOINTS = 0.75;
/** Reduction on two design trucks and the lane load for negative moment and interior reactions (Art. 3.6.1.3.1). */
export const TWO_TRUCK_REDUCTION = 0.9;
/** Least distance from the lead axle of one truck to the rear axle of the other, 50 ft (Art. 3.6.1.3.1; US customary values), m. */
export const TWO_TRUCK_MIN_HEADWAY = US_CUSTOMARY_VALUES.twoTrucks.minHeadway;
/** Rear-axle spacing of each of the two trucks, 14 ft (Art. 3.6.1.3.1; US customary values), m. */
export const TWO_TRUCK_REAR_SPACING = US_CUSTOMARY_VALUES.twoTrucks.rearSpacing;

export type LoadingName = 'design truck' | 'design tandem' | 'two design trucks' | 'fatigue truck';

/**
 * Two design trucks with 14 ft rear spacings (SI edition 4.3 m), one behind the other; the
 * headway (rear axle of the first to the lead axle of the second) varies from 50 ft (SI
 * edition 15 m) to `maxHeadway` m (Art. 3.6.1.3.1). A headway as long as the beam lets the
 * second truck leave it. `values`: the deck's design values (default the US customary ones).
 */
export function twoDesignTrucks(maxHeadway: number, values: DesignValues = US_CUSTOMARY_VALUES): Vehicle {
  if (!Number.isFinite(maxHeadway) || maxHeadway <= 0) {
    throw new DeckInputError(['maxHeadway'], 'the largest headway must be a finite number of metres greater than 0');
  }
  const truck = values.truck;
  const { rearSpacing, minHeadway } = values.twoTrucks;
  const t = truck.axles;
  const rear = t[1].position + rearSpacing;
  const first = [t[0].position, t[1].position, rear];
  const lead2 = rear + minHeadway;
  const second = first.map((p) => lead2 + p);
  const weights = t.map((a) => a.weight);
  return {
    name: 'two design trucks',
    axles: [...first, ...second].map((position, i) => ({ weight: weights[i % 3], position })),
    gauge: truck.gauge,
    variableSpacing: { axleIndex: 3, min: minHeadway, max: Math.max(minHeadway, maxHeadway) },
  };
}

/** Where the governing vehicle stands. */
export interface VehiclePosition {
  vehicle: LoadingName;
  /** Front axle position, m from support 0. */
  frontAxleAt: number;
  /** +1 travelling towards +x, −1 towards −x. */
  direction: 1 | -1;
  /** Design truck: the rear-axle spacing used, m. Two trucks: the headway used, m. */
  axleSpacing?: number;
  axles: AxlePlacement[];
}

/** One extreme (maximum or minimum) of the per-lane LL+IM effect at a point. */
export interface LiveLoadExtreme {
  /** LL+IM for one design lane: N·m (moment) or N (shear, reaction). */
  value: number;
  /** The loading that governs; 'none' when no loading gives an effect of this sense. */
  governing: LoadingName | 'none';
  /** Placement of the governing vehicle (absent for 'none'). */
  position?: VehiclePosition;
  /** Static effect of the governing vehicle(s), before IM and any reduction. */
  vehicleEffect: number;
  /** Effect of the design lane load on the same portions, before any reduction (0 for fatigue). */
  laneEffect: number;
  /** Dynamic load allowance applied to the vehicle part. */
  impact: number;
  /** 1.0, or 0.90 for two design trucks. */
  reduction: number;
  /** LL+IM of every loading considered. */
  candidates: { loading: LoadingName; value: number }[];
  trace: TraceStep[];
}

export interface Envelope {
  max: LiveLoadExtreme;
  min: LiveLoadExtreme;
}

export interface EnvelopePoint {
  /** 0-based span index. */
  span: number;
  /** Fraction of the span, 0..1 (tenth points by default). */
  fraction: number;
  /** Position, m from support 0. */
  x: number;
  /** Moment under a uniform load on all spans is negative here (between points of contraflexure). */
  negativeMomentRegion: boolean;
  moment: Envelope;
  /** Which side of x the shear is taken on (just right of x, except at a span's end). */
  shearSide: 'left' | 'right';
  shear: Envelope;
  /** Fatigue truck with IM 15 % (absent when fatigue is turned off). */
  fatigueMoment?: Envelope;
  fatigueShear?: Envelope;
}

export interface ReactionEnvelope {
  support: number;
  x: number;
  /** Interior support (pier): two design trucks considered for the maximum. */
  interior: boolean;
  reaction: Envelope;
}

export interface BeamLineEffects {
  beam: BeamModel;
  points: EnvelopePoint[];
  reactions: ReactionEnvelope[];
  /** Points of contraflexure under a uniform load on all spans, m from support 0. */
  contraflexurePoints: number[];
  /** Loads and allowances used. */
  trace: TraceStep[];
}

export interface BeamLineOptions {
  /** Stations per span for the analysis; a multiple of the fractions' denominator (default 10). */
  pointsPerSpan?: number;
  /** Fractions of each span at which to report (default the tenth points 0, 0.1, …, 1). */
  fractions?: number[];
  /** Compute the fatigue-truck envelopes (default true). */
  fatigue?: boolean;
  /** The deck's design values: vehicles, lane load, two-truck spacings (default the US customary ones). */
  values?: DesignValues;
}

const TENTHS = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1];

type EffectKind = 'moment' | 'force';

/** A length in a trace sentence, shown in the reader's units (shared/quantities/inText.ts). */
const fmtLength = len;

function describe(label: string, sense: 'positive' | 'negative'): string {
  return `${label}, ${sense === 'positive' ? 'maximum' : 'minimum'}`;
}

function positionOf(name: LoadingName, e: VehicleEffect): VehiclePosition {
  const p: VehiclePosition = { vehicle: name, frontAxleAt: e.frontAxleAt, direction: e.direction, axles: e.axles };
  if (e.axleSpacing !== undefined) p.axleSpacing = e.axleSpacing;
  return p;
}

function vehicleStep(name: LoadingName, e: VehicleEffect, kind: EffectKind, where: string, article: string): TraceStep {
  const counted = e.axles.filter((a) => a.counted);
  const inputs: TraceInput[] = counted.map((a, i) => ({
    symbol: `P${i + 1}·y${i + 1}`,
    description: `axle of ${q(a.weight, 'force')} at x = ${fmtLength(a.position)}, ordinate ${a.ordinate.toFixed(6)}`,
    value: a.weight * a.ordinate,
    kind,
  }));
  const spacing =
    e.axleSpacing === undefined
      ? ''
      : name === 'two design trucks'
        ? `, headway ${fmtLength(e.axleSpacing)}`
        : `, rear spacing ${fmtLength(e.axleSpacing)}`;
  return {
    label: `${name[0].toUpperCase()}${name.slice(1)}, ${where}`,
    formula: `Σ Pᵢ·yᵢ over the axles that add to the effect${spacing}; front axle at x = ${fmtLength(e.frontAxleAt)}, travelling ${e.direction > 0 ? 'towards +x' : 'towards −x'}`,
    inputs,
    value: e.value,
    kind,
    article,
    note: counted.length < e.axles.length ? `${e.axles.length - counted.length} axle(s) neglected (off the beam or adverse), Art. 3.6.1.3.1` : undefined,
  };
}

function laneStep(lane: number, kind: EffectKind, where: string, values: DesignValues): TraceStep {
  const us = values.name === 'us-customary';
  return {
    label: `Design lane load, ${where}`,
    formula: `w·∫y dx over the portions of the influence line of this sign, w = ${us ? '0.64 klf' : q(values.laneLoad, 'lineLoad')}`,
    inputs: [{ symbol: 'w', description: 'design lane load', value: values.laneLoad, kind: 'lineLoad', ...(us ? { formulaValue: 0.64, formulaUnit: 'klf' } : {}) }],
    value: lane,
    kind,
    article: citeArticle(values, 'Art. 3.6.1.2.4, 3.6.1.3.1'),
  };
}

interface Computation {
  name: LoadingName;
  effect: VehicleEffect;
  lane: number;
  impact: number;
  reduction: number;
  total: number;
}

function pickExtreme(cands: Computation[], sense: 'positive' | 'negative'): Computation | undefined {
  let best: Computation | undefined;
  for (const c of cands) {
    if (sense === 'positive' ? c.total <= 0 : c.total >= 0) continue;
    if (!best || (sense === 'positive' ? c.total > best.total : c.total < best.total)) best = c;
  }
  return best;
}

function extremeOf(cands: Computation[], sense: 'positive' | 'negative', kind: EffectKind, where: string, steps: TraceStep[]): LiveLoadExtreme {
  const g = pickExtreme(cands, sense);
  const trace = [...steps];
  const candidates = cands.map((c) => ({ loading: c.name, value: c.total }));
  const value = g ? g.total : 0;
  trace.push({
    label: `LL+IM per lane, ${where}`,
    formula:
      cands.length === 1 && cands[0].name === 'fatigue truck'
        ? '(1 + IM)·(fatigue truck)'
        : `${sense === 'positive' ? 'largest' : 'most negative'} of ${cands.map((c) => (c.reduction !== 1 ? `${c.reduction.toFixed(2)}·[(1 + IM)·(${c.name}) + lane]` : `(1 + IM)·(${c.name}) + lane`)).join(', ')}`,
    inputs: cands.map((c) => ({ symbol: c.name, description: `LL+IM with ${c.name}`, value: c.total, kind })),
    value,
    kind,
    article: cands.some((c) => c.name === 'fatigue truck') ? 'Art. 3.6.1.4.1, Table 3.6.2.1-1' : 'Art. 3.6.1.3.1, Table 3.6.2.1-1',
    note: g ? `${g.name} governs` : `no loading produces a ${sense} effect here`,
  });
  if (!g) {
    return { value: 0, governing: 'none', vehicleEffect: 0, laneEffect: 0, impact: cands[0]?.impact ?? 0, reduction: 1, candidates, trace };
  }
  return {
    value,
    governing: g.name,
    position: positionOf(g.name, g.effect),
    vehicleEffect: g.effect.value,
    laneEffect: g.lane,
    impact: g.impact,
    reduction: g.reduction,
    candidates,
    trace,
  };
}

interface Loadings {
  values: DesignValues;
  twoTrucks?: Vehicle;
  /** Senses for which two design trucks apply. */
  twoTruckSenses: ('positive' | 'negative')[];
}

/** HL-93 envelope (max and min) of one influence line, per lane. */
function hl93Envelope(line: BeamInfluenceLine, kind: EffectKind, where: string, loadings: Loadings): Envelope {
  const make = (sense: 'positive' | 'negative'): LiveLoadExtreme => {
    const w = describe(where, sense);
    const values = loadings.values;
    const truck = maxVehicleEffect(line, values.truck, sense);
    const tandem = maxVehicleEffect(line, values.tandem, sense);
    const lane = uniformLoadEffect(line, values.laneLoad, sense);
    const im = IM_STRENGTH_SERVICE;
    const cands: Computation[] = [
      { name: 'design truck', effect: truck, lane, impact: im, reduction: 1, total: (1 + im) * truck.value + lane },
      { name: 'design tandem', effect: tandem, lane, impact: im, reduction: 1, total: (1 + im) * tandem.value + lane },
    ];
    const steps: TraceStep[] = [
      vehicleStep('design truck', truck, kind, w, citeArticle(values, 'Art. 3.6.1.2.2, 3.6.1.3.1')),
      vehicleStep('design tandem', tandem, kind, w, citeArticle(values, 'Art. 3.6.1.2.3, 3.6.1.3.1')),
      laneStep(lane, kind, w, values),
    ];
    if (loadings.twoTrucks && loadings.twoTruckSenses.includes(sense)) {
      const two = maxVehicleEffect(line, loadings.twoTrucks, sense);
      const r = TWO_TRUCK_REDUCTION;
      cands.push({ name: 'two design trucks', effect: two, lane, impact: im, reduction: r, total: r * ((1 + im) * two.value + lane) });
      steps.push(vehicleStep('two design trucks', two, kind, w, citeArticle(values, 'Art. 3.6.1.3.1')));
    }
    steps.push({
      label: 'Dynamic load allowance',
      formula: 'IM on the design truck and tandem, not on the lane load',
      inputs: [],
      value: im,
      kind: 'none',
      article: 'Art. 3.6.2.1, Table 3.6.2.1-1',
    });
    return extremeOf(cands, sense, kind, w, steps);
  };
  return { max: make('positive'), min: make('negative') };
}

/** Fatigue-truck envelope (IM 15 %, no lane load), per lane. */
function fatigueEnvelope(line: BeamInfluenceLine, kind: EffectKind, where: string, values: DesignValues): Envelope {
  const make = (sense: 'positive' | 'negative'): LiveLoadExtreme => {
    const w = `${describe(where, sense)} (fatigue)`;
    const e = maxVehicleEffect(line, values.fatigueTruck, sense);
    const im = IM_FATIGUE;
    const cands: Computation[] = [{ name: 'fatigue truck', effect: e, lane: 0, impact: im, reduction: 1, total: (1 + im) * e.value }];
    const steps: TraceStep[] = [
      vehicleStep('fatigue truck', e, kind, w, citeArticle(values, 'Art. 3.6.1.4.1')),
      { label: 'Dynamic load allowance, fatigue', formula: 'IM = 15 % for the fatigue and fracture limit state', inputs: [], value: im, kind: 'none', article: 'Table 3.6.2.1-1' },
    ];
    return extremeOf(cands, sense, kind, w, steps);
  };
  return { max: make('positive'), min: make('negative') };
}

function validateFractions(fr: unknown): number[] {
  if (fr === undefined) return TENTHS;
  if (!Array.isArray(fr) || fr.length === 0) throw new DeckInputError(['fractions'], 'give at least one fraction of the span (0 to 1)');
  fr.forEach((f, i) => {
    if (typeof f !== 'number' || !Number.isFinite(f) || f < 0 || f > 1) {
      throw new DeckInputError(['fractions', i], `a fraction of the span must be a number from 0 to 1 (got ${String(f)})`);
    }
  });
  return [...fr].sort((a, b) => a - b);
}

/** Support moments and contraflexure points for a unit uniform load on all spans. */
function uniformLoadMoments(analysis: BeamAnalysis): { supportMoments: number[]; contraflexure: number[]; momentAt: (span: number, t: number) => number } {
  const b = analysis.beam;
  const L = b.length;
  const supportMoments = b.supports.map((x, s) =>
    b.continuous && s > 0 && s < b.spans.length ? analysis.influenceLine({ kind: 'moment', x }).integral(0, L) : 0,
  );
  const momentAt = (span: number, t: number): number => {
    const Ls = b.spans[span];
    return supportMoments[span] * (1 - t) + supportMoments[span + 1] * t + 0.5 * Ls * Ls * t * (1 - t);
  };
  const contraflexure: number[] = [];
  b.spans.forEach((Ls, i) => {
    // M(t) = −(L²/2)t² + (L²/2 + M₁ − M₀)t + M₀ = 0 on (0, 1).
    const A = -0.5 * Ls * Ls;
    const B = 0.5 * Ls * Ls + supportMoments[i + 1] - supportMoments[i];
    const C = supportMoments[i];
    const disc = B * B - 4 * A * C;
    if (disc < 0) return;
    const sq = Math.sqrt(disc);
    for (const t of [(-B + sq) / (2 * A), (-B - sq) / (2 * A)].sort((p, q) => p - q)) {
      if (t > 1e-9 && t < 1 - 1e-9) contraflexure.push(b.supports[i] + t * Ls);
    }
  });
  return { supportMoments, contraflexure, momentAt };
}

/** The loads and allowances of a beam line (trace), with the source of the design values. */
function beamLineLoadsTrace(values: DesignValues, fatigue: boolean): TraceStep[] {
  const { truck, tandem } = values;
  const us = values.name === 'us-customary';
  const fatigueRear = us ? fromUs.ft(30) : values.fatigueTruck.axles[2].position - values.fatigueTruck.axles[1].position;
  const trace: TraceStep[] = [
    {
      label: 'Design truck',
      formula: us
        ? `${truck.axles.map((a) => q(a.weight, 'force')).join(', ')} axles; ${len(fromUs.ft(14))}, then ${len(fromUs.ft(14))} to ${len(fromUs.ft(30))} (chosen for the extreme)`
        : `${truckWords(values)} (chosen for the extreme)`,
      inputs: truck.axles.map((a, i) => ({ symbol: `P${i + 1}`, value: a.weight, kind: 'force' as const })),
      value: truck.axles.reduce((t, a) => t + a.weight, 0),
      kind: 'force',
      article: citeArticle(values, 'Art. 3.6.1.2.2'),
    },
    {
      label: 'Design tandem',
      formula: `2 × ${q(tandem.axles[0].weight, 'force')} at ${len(tandem.axles[1].position)}`,
      inputs: tandem.axles.map((a, i) => ({ symbol: `P${i + 1}`, value: a.weight, kind: 'force' as const })),
      value: tandem.axles.reduce((t, a) => t + a.weight, 0),
      kind: 'force',
      article: citeArticle(values, 'Art. 3.6.1.2.3'),
    },
    { label: 'Design lane load', formula: `w = ${q(values.laneLoad, 'lineLoad')} over ${len(values.laneLoadWidth)}`, inputs: [], value: values.laneLoad, kind: 'lineLoad', article: citeArticle(values, 'Art. 3.6.1.2.4') },
    { label: 'Dynamic load allowance', formula: 'IM = 33 % (truck and tandem only)', inputs: [], value: IM_STRENGTH_SERVICE, kind: 'none', article: 'Table 3.6.2.1-1' },
  ];
  // the SI edition's values are named where they enter; a US customary beam line's trace is as it was
  if (!us) trace.unshift(designValuesStep(values));
  if (fatigue) {
    trace.push({ label: 'Fatigue truck', formula: `design truck with a constant ${len(fatigueRear)} rear spacing; IM = 15 %`, inputs: [], value: IM_FATIGUE, kind: 'none', article: citeArticle(values, 'Art. 3.6.1.4.1, Table 3.6.2.1-1') });
  }
  return trace;
}

/**
 * HL-93 per-lane live-load envelopes of a beam line.
 * @param beam spans (m), continuity, optional EI per span (N·m²)
 * @param options.fractions fractions of each span to report (default tenth points)
 * @param options.pointsPerSpan analysis stations per span (default: 10, or enough to hold every fraction)
 * @param options.fatigue also compute the fatigue-truck envelopes (default true)
 * @returns moments in N·m, shears and reactions in N, per design lane, with traces
 */
export function hl93BeamLineEffects(beam: BeamModel, options: BeamLineOptions = {}): BeamLineEffects {
  const fractions = validateFractions(options.fractions);
  const fatigue = options.fatigue ?? true;
  if (typeof fatigue !== 'boolean') throw new DeckInputError(['fatigue'], 'fatigue must be true or false');
  const values = options.values ?? US_CUSTOMARY_VALUES;
  // Stations at every reported fraction (extra stations are added where a fraction is not one).
  const checked = validateBeam(beam);
  const extra: number[] = [];
  checked.spans.forEach((L, s) => {
    for (const f of fractions) extra.push(checked.supports[s] + f * L);
  });
  const analysis = new BeamAnalysis(beam, { pointsPerSpan: options.pointsPerSpan ?? 10 }, extra);
  const nb = analysis.beam;
  const uniform = uniformLoadMoments(analysis);
  const loadings: Loadings = {
    values,
    twoTrucks: nb.spans.length > 1 ? twoDesignTrucks(nb.length, values) : undefined,
    twoTruckSenses: [],
  };
  const points: EnvelopePoint[] = [];
  nb.spans.forEach((L, s) => {
    for (const f of fractions) {
      const x = nb.supports[s] + f * L;
      const where = `${f.toFixed(2)} L of span ${s + 1} (x = ${fmtLength(x)})`;
      const mLine = analysis.influenceLine({ kind: 'moment', x });
      const negative = nb.continuous && uniform.momentAt(s, f) < 0;
      const mom = hl93Envelope(mLine, 'moment', `moment at ${where}`, { values, twoTrucks: loadings.twoTrucks, twoTruckSenses: negative ? ['negative'] : [] });
      const side: 'left' | 'right' = f >= 1 ? 'left' : 'right';
      const vResp: BeamResponse = { kind: 'shear', x, side };
      const vLine = analysis.influenceLine(vResp);
      const shear = hl93Envelope(vLine, 'force', `shear just ${side} of ${where}`, { values, twoTruckSenses: [] });
      const point: EnvelopePoint = { span: s, fraction: f, x, negativeMomentRegion: negative, moment: mom, shearSide: side, shear };
      if (fatigue) {
        point.fatigueMoment = fatigueEnvelope(mLine, 'moment', `moment at ${where}`, values);
        point.fatigueShear = fatigueEnvelope(vLine, 'force', `shear just ${side} of ${where}`, values);
      }
      points.push(point);
    }
  });
  const reactions: ReactionEnvelope[] = nb.supports.map((x, support) => {
    const interior = support > 0 && support < nb.spans.length;
    const line = analysis.influenceLine({ kind: 'reaction', support });
    const env = hl93Envelope(line, 'force', `reaction at support ${support}`, {
      values,
      twoTrucks: interior ? loadings.twoTrucks : undefined,
      twoTruckSenses: interior ? ['positive'] : [],
    });
    return { support, x, interior, reaction: env };
  });
  const trace = beamLineLoadsTrace(values, fatigue);
  if (nb.continuous && nb.spans.length > 1) {
    trace.push({
      label: 'Points of contraflexure under a uniform load on all spans',
      formula: 'M(x) = 0 with every span loaded; two design trucks apply to negative moment between them and to interior reactions',
      inputs: uniform.contraflexure.map((x, i) => ({ symbol: `x${i + 1}`, value: x, kind: 'length' as const })),
      value: uniform.contraflexure.length,
      kind: 'none',
      article: 'Art. 3.6.1.3.1',
    });
  }
  return {
    beam: { spans: [...nb.spans], continuous: nb.continuous, ...(beam.flexuralRigidity ? { flexuralRigidity: [...beam.flexuralRigidity] } : {}) },
    points,
    reactions,
    contraflexurePoints: uniform.contraflexure,
    trace,
  };
}
