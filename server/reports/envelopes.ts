/**
 * Girder HL-93 LL+IM envelopes of a deck version for the report and the CSV export: the
 * per-lane beam-line envelope (shared/loads, Art. 3.6.1.3.1, IM of Art. 3.6.2.1) times the
 * code's governing distribution factor of each girder kind, effect and place (Art. 4.6.2.2).
 *
 * Units: moments N·m, shears and reactions N; x in m from support 0; factors dimensionless.
 * Negative-moment factors apply near interior supports: at a point of span s the larger of
 * the negative-moment factors of its two end supports is used (common practice, no source);
 * a simple-span deck has none, and its minimum moments use the positive-moment factor.
 */
import type { Deck } from '../../shared/deck/schema.js';
import type { CodeFactorResult, FactorEffect, GirderKind } from '../../shared/lrfd/index.js';
import { designValuesOf, girderLiveLoadEffects, hl93BeamLineEffects, type BeamLineEffects, type GirderLiveLoadEffects } from '../../shared/loads/index.js';

const beamLineCache = new Map<string, BeamLineEffects>();

/** The per-lane HL-93 envelopes of the deck's beam line (cached by spans, continuity and design values). */
export function beamLineOf(deck: Pick<Deck, 'spans' | 'continuous'> & Partial<Pick<Deck, 'designValues'>>): BeamLineEffects {
  const spans = deck.spans.map((s) => s.length);
  const values = designValuesOf(deck);
  const key = `${deck.continuous}|${spans.join(',')}|${values.name}`;
  let bl = beamLineCache.get(key);
  if (!bl) {
    bl = hl93BeamLineEffects({ spans, continuous: deck.continuous }, { values });
    if (beamLineCache.size > 200) beamLineCache.clear();
    beamLineCache.set(key, bl);
  }
  return bl;
}

/** Largest per-lane LL+IM positive moment in span `span` (0-based), N·m. */
export function perLaneMaxMoment(deck: Pick<Deck, 'spans' | 'continuous'> & Partial<Pick<Deck, 'designValues'>>, span: number): number {
  const pts = beamLineOf(deck).points.filter((p) => p.span === span);
  return Math.max(...pts.map((p) => p.moment.max.value));
}

function factorAt(code: CodeFactorResult, girder: GirderKind, effect: FactorEffect, key: string): number | undefined {
  return code.governing.find((g) => g.girder === girder && g.effect === effect && g.location.key === key)?.value;
}

export interface GirderEnvelopes {
  girder: GirderKind;
  effects: GirderLiveLoadEffects;
}

/** Interior and exterior girder envelopes with the code's governing factors. */
export function girderEnvelopes(deck: Deck, code: CodeFactorResult): GirderEnvelopes[] {
  const bl = beamLineOf(deck);
  const nSpans = deck.spans.length;
  return (['interior', 'exterior'] as const)
    .filter((girder) => code.governing.some((g) => g.girder === girder))
    .map((girder) => {
      const perSpan = (effect: FactorEffect) => Array.from({ length: nSpans }, (_, s) => factorAt(code, girder, effect, `span${s + 1}`));
      const need = (values: (number | undefined)[], what: string) =>
        values.map((v, i) => {
          if (v === undefined) throw new Error(`the code result has no governing ${what} factor for the ${girder} girder in span ${i + 1}`);
          return v;
        });
      const moment = need(perSpan('moment'), 'moment');
      const shear = need(perSpan('shear'), 'shear');
      const negativeAt = (support: number) => factorAt(code, girder, 'negative-moment', `support${support + 1}`);
      const reactions = Array.from({ length: nSpans + 1 }, (_, j) => factorAt(code, girder, 'reaction', `support${j + 1}`));
      const fatigueMoment = perSpan('fatigue-moment');
      const fatigueShear = perSpan('fatigue-shear');
      const effects = girderLiveLoadEffects(bl, {
        moment,
        negativeMoment: (loc) => {
          const s = loc.span ?? 0;
          const candidates = [negativeAt(s), negativeAt(s + 1)].filter((v): v is number => v !== undefined);
          return candidates.length ? Math.max(...candidates) : moment[s];
        },
        shear,
        ...(reactions.every((v) => v !== undefined) ? { reaction: reactions as number[] } : {}),
        ...(fatigueMoment.every((v) => v !== undefined) ? { fatigueMoment: fatigueMoment as number[] } : {}),
        ...(fatigueShear.every((v) => v !== undefined) ? { fatigueShear: fatigueShear as number[] } : {}),
      });
      return { girder, effects };
    });
}
