/**
 * Girder live-load effects: distribution factor × beam-line (one design lane) effect.
 *
 * Units: moments N·m, shears and reactions N (internal SI, shared/units.ts); distribution
 * factors are dimensionless lanes per girder and already include the multiple presence
 * factor where the code's method does (AASHTO LRFD Art. 4.6.2.2.1; fatigue factors have it
 * removed, Art. 3.6.1.1.2 and 3.6.1.4.3b).
 *
 * Girder LL+IM = g × (LL+IM per lane), Art. 4.6.2.2 (approximate methods of analysis for
 * beam-slab bridges): the per-lane envelope from beamLine.ts multiplied by the factor for
 * the same force effect and place. The code's commentary table on continuous spans says
 * which span length each factor uses (positive moment, negative moment near an interior
 * support, shear, reactions); pass per-span values or a function to apply it.
 */
import { DeckInputError } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import type { BeamLineEffects, Envelope, LiveLoadExtreme } from './beamLine.js';

export type GirderEffectName = 'positive-moment' | 'negative-moment' | 'shear' | 'reaction' | 'fatigue-moment' | 'fatigue-shear';

/** Where a factor is asked for. */
export interface GirderFactorLocation {
  effect: GirderEffectName;
  /** 0-based span (moment and shear points). */
  span?: number;
  /** Fraction of the span, 0..1. */
  fraction?: number;
  /** Position, m from support 0. */
  x?: number;
  /** 0-based support (reactions). */
  support?: number;
}

/** One factor everywhere, one per span (per support for reactions), or a function of the place. */
export type FactorInput = number | readonly number[] | ((location: GirderFactorLocation) => number);

export interface GirderDistributionFactors {
  /** Positive moment; also negative moment when `negativeMoment` is absent. */
  moment: FactorInput;
  /** Negative moment (used for the minimum moment everywhere). */
  negativeMoment?: FactorInput;
  shear: FactorInput;
  /** Reactions; one value, or one per support. Without it no girder reactions are given. */
  reaction?: FactorInput;
  /** Fatigue moment (one lane, multiple presence removed). Without it no fatigue moments are given. */
  fatigueMoment?: FactorInput;
  /** Fatigue shear. Without it no fatigue shears are given. */
  fatigueShear?: FactorInput;
}

export interface GirderExtreme {
  /** Girder LL+IM, N·m or N. */
  value: number;
  /** Distribution factor used. */
  factor: number;
  /** Beam-line (per-lane) LL+IM it multiplies. */
  beamLine: number;
  governing: LiveLoadExtreme['governing'];
  trace: TraceStep[];
}

export interface GirderEnvelope {
  max: GirderExtreme;
  min: GirderExtreme;
}

export interface GirderPoint {
  span: number;
  fraction: number;
  x: number;
  moment: GirderEnvelope;
  shear: GirderEnvelope;
  fatigueMoment?: GirderEnvelope;
  fatigueShear?: GirderEnvelope;
}

export interface GirderReaction {
  support: number;
  x: number;
  reaction: GirderEnvelope;
}

export interface GirderLiveLoadEffects {
  points: GirderPoint[];
  /** Present when a reaction factor was given. */
  reactions?: GirderReaction[];
}

const FIELD: Record<GirderEffectName, keyof GirderDistributionFactors> = {
  'positive-moment': 'moment',
  'negative-moment': 'negativeMoment',
  shear: 'shear',
  reaction: 'reaction',
  'fatigue-moment': 'fatigueMoment',
  'fatigue-shear': 'fatigueShear',
};

function resolver(field: keyof GirderDistributionFactors, input: FactorInput, count: number, per: 'span' | 'support') {
  if (typeof input === 'number') {
    if (!Number.isFinite(input) || input < 0) throw new DeckInputError(['factors', field], `the ${field} distribution factor must be a finite number, 0 or more (got ${input})`);
    return () => input;
  }
  if (Array.isArray(input)) {
    if (input.length !== count) {
      throw new DeckInputError(['factors', field], `give one ${field} distribution factor per ${per} (${count}), or a single value (got ${input.length})`);
    }
    input.forEach((v, i) => {
      if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
        throw new DeckInputError(['factors', field, i], `the ${field} distribution factor for ${per} ${i + 1} must be a finite number, 0 or more (got ${String(v)})`);
      }
    });
    return (loc: GirderFactorLocation) => input[per === 'span' ? loc.span! : loc.support!];
  }
  if (typeof input === 'function') {
    return (loc: GirderFactorLocation) => {
      const v = input(loc);
      if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) {
        throw new DeckInputError(['factors', field], `the ${field} distribution factor given for ${JSON.stringify(loc)} must be a finite number, 0 or more (got ${String(v)})`);
      }
      return v;
    };
  }
  throw new DeckInputError(['factors', field], `the ${field} distribution factor must be a number, a list or a function`);
}

function scale(e: LiveLoadExtreme, g: number, what: string, kind: 'moment' | 'force', effect: GirderEffectName): GirderExtreme {
  const value = g * e.value;
  const step: TraceStep = {
    label: `Girder LL+IM, ${what}`,
    formula: 'g × (LL+IM per lane)',
    inputs: [
      { symbol: 'g', description: `distribution factor (${effect})`, value: g, kind: 'none' },
      { symbol: 'LL+IM', description: 'per design lane', value: e.value, kind },
    ],
    value,
    kind,
    article: effect.startsWith('fatigue') ? 'Art. 4.6.2.2, 3.6.1.4.3b' : 'Art. 4.6.2.2',
  };
  return { value, factor: g, beamLine: e.value, governing: e.governing, trace: [...e.trace, step] };
}

/**
 * Girder LL+IM envelopes from the beam-line envelopes and the distribution factors.
 * @param beamLine per-lane envelopes from `hl93BeamLineEffects`
 * @param factors distribution factors per force effect (dimensionless)
 * @returns moments N·m, shears and reactions N, per girder, with traces
 */
export function girderLiveLoadEffects(beamLine: BeamLineEffects, factors: GirderDistributionFactors): GirderLiveLoadEffects {
  if (!factors || typeof factors !== 'object') throw new DeckInputError(['factors'], 'distribution factors are required (moment and shear at least)');
  if (factors.moment === undefined) throw new DeckInputError(['factors', 'moment'], 'the moment distribution factor is required');
  if (factors.shear === undefined) throw new DeckInputError(['factors', 'shear'], 'the shear distribution factor is required');
  const nSpans = beamLine.beam.spans.length;
  const get = (effect: GirderEffectName, fallback?: FactorInput) => {
    const field = FIELD[effect];
    const input = (factors[field] as FactorInput | undefined) ?? fallback;
    if (input === undefined) return undefined;
    return resolver(factors[field] !== undefined ? field : 'moment', input, effect === 'reaction' ? nSpans + 1 : nSpans, effect === 'reaction' ? 'support' : 'span');
  };
  const pos = get('positive-moment')!;
  const neg = get('negative-moment', factors.moment)!;
  const shear = get('shear')!;
  const fm = get('fatigue-moment');
  const fv = get('fatigue-shear');
  const reaction = get('reaction');
  const points: GirderPoint[] = beamLine.points.map((p) => {
    const at = (effect: GirderEffectName): GirderFactorLocation => ({ effect, span: p.span, fraction: p.fraction, x: p.x });
    const where = `${p.fraction.toFixed(2)} L of span ${p.span + 1}`;
    const env = (e: Envelope, gMax: number, gMin: number, what: string, kind: 'moment' | 'force', effMax: GirderEffectName, effMin: GirderEffectName): GirderEnvelope => ({
      max: scale(e.max, gMax, `${what} at ${where}, maximum`, kind, effMax),
      min: scale(e.min, gMin, `${what} at ${where}, minimum`, kind, effMin),
    });
    const gv = shear(at('shear'));
    const out: GirderPoint = {
      span: p.span,
      fraction: p.fraction,
      x: p.x,
      moment: env(p.moment, pos(at('positive-moment')), neg(at('negative-moment')), 'moment', 'moment', 'positive-moment', 'negative-moment'),
      shear: env(p.shear, gv, gv, `shear just ${p.shearSide} of the point`, 'force', 'shear', 'shear'),
    };
    if (fm && p.fatigueMoment) {
      const g = fm(at('fatigue-moment'));
      out.fatigueMoment = env(p.fatigueMoment, g, g, 'fatigue moment', 'moment', 'fatigue-moment', 'fatigue-moment');
    }
    if (fv && p.fatigueShear) {
      const g = fv(at('fatigue-shear'));
      out.fatigueShear = env(p.fatigueShear, g, g, 'fatigue shear', 'force', 'fatigue-shear', 'fatigue-shear');
    }
    return out;
  });
  const result: GirderLiveLoadEffects = { points };
  if (reaction) {
    result.reactions = beamLine.reactions.map((r) => {
      const g = reaction({ effect: 'reaction', support: r.support, x: r.x });
      return {
        support: r.support,
        x: r.x,
        reaction: {
          max: scale(r.reaction.max, g, `reaction at support ${r.support}, maximum`, 'force', 'reaction'),
          min: scale(r.reaction.min, g, `reaction at support ${r.support}, minimum`, 'force', 'reaction'),
        },
      };
    });
  }
  return result;
}
