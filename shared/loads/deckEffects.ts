/**
 * Girder live-load effects of a deck: the HL-93 beam-line (one design lane) envelopes of the
 * deck's spans multiplied by the governing code-method distribution factors of each girder
 * kind, per force effect and place (AASHTO LRFD Art. 4.6.2.2; span lengths per effect from
 * the commentary table C4.6.2.2.1-1 are already inside the factors' locations).
 *
 * Units: moments N·m, shears and reactions N (internal SI). Sign conventions are those of
 * beamLine.ts: sagging moment positive; shear positive when the resultant of the upward
 * forces on the left part is upward; reactions upward positive.
 *
 * Which factor is used where:
 * - maximum (positive) moment at a point of span i: the governing 'moment' factor of span i;
 * - minimum (negative) moment: between points of contraflexure next to an interior support
 *   of a continuous deck, that support's 'negative-moment' factor; elsewhere span i's
 *   'moment' factor;
 * - shear: span i's 'shear' factor; reactions: the support's 'reaction' factor;
 * - fatigue: the 'fatigue-moment' and 'fatigue-shear' factors (multiple presence removed);
 *   negative fatigue moment near a pier uses that support's 'fatigue-moment' factor when
 *   the code result has one.
 */
import type { Deck } from '../deck/schema.js';
import { DeckInputError } from '../deck/schema.js';
import type { CodeFactorResult, FactorEffect, GirderKind, GoverningFactor } from '../lrfd/factors.js';
import { hl93BeamLineEffects, type BeamLineEffects } from './beamLine.js';
import { designValuesOf } from './designValues.js';
import { girderLiveLoadEffects, type GirderFactorLocation, type GirderLiveLoadEffects } from './girderEffects.js';

export interface DeckGirderEffects {
  beamLine: BeamLineEffects;
  /** Girder LL+IM per girder kind; a kind is absent when the deck has no such girder. */
  girders: Partial<Record<GirderKind, GirderLiveLoadEffects>>;
}

function pick(governing: GoverningFactor[], kind: GirderKind, effect: FactorEffect, match: (g: GoverningFactor) => boolean): GoverningFactor | undefined {
  return governing.find((g) => g.girder === kind && g.effect === effect && match(g));
}

/**
 * @param deck the deck (internal units) whose spans are loaded.
 * @param code the code-method result of the same deck (`computeCodeFactors(deck)`).
 */
export function deckGirderEffects(deck: Deck, code: CodeFactorResult, beamLine?: BeamLineEffects): DeckGirderEffects {
  const line = beamLine ?? hl93BeamLineEffects({ spans: deck.spans.map((s) => s.length), continuous: deck.continuous }, { values: designValuesOf(deck) });
  const supportX: number[] = [0];
  for (const s of deck.spans) supportX.push(supportX[supportX.length - 1] + s.length);
  const cf = line.contraflexurePoints;

  /** The interior support whose negative-moment region (between contraflexure points) holds x. */
  const pierOf = (x: number): number | undefined => {
    if (!deck.continuous) return undefined;
    for (let j = 1; j < supportX.length - 1; j++) {
      const left = Math.max(...cf.filter((c) => c < supportX[j]), supportX[j - 1]);
      const right = Math.min(...cf.filter((c) => c > supportX[j]), supportX[j + 1]);
      if (x >= left - 1e-9 && x <= right + 1e-9) return j;
    }
    return undefined;
  };

  const girders: DeckGirderEffects['girders'] = {};
  for (const kind of ['interior', 'exterior'] as const) {
    if (!code.governing.some((g) => g.girder === kind)) continue;
    const need = (effect: FactorEffect, match: (g: GoverningFactor) => boolean, where: string): number => {
      const g = pick(code.governing, kind, effect, match);
      if (!g) throw new DeckInputError(['factors'], `no governing ${effect} factor of the ${kind} girder at ${where}`);
      return g.value;
    };
    const bySpan = (effect: FactorEffect) => (loc: GirderFactorLocation) => need(effect, (g) => g.location.span === loc.span, `span ${(loc.span ?? 0) + 1}`);
    const nearPier = (effect: FactorEffect, fallback: FactorEffect) => (loc: GirderFactorLocation) => {
      const pier = loc.x === undefined ? undefined : pierOf(loc.x);
      const g = pier === undefined ? undefined : pick(code.governing, kind, effect, (f) => f.location.support === pier);
      return g ? g.value : bySpan(fallback)(loc);
    };
    girders[kind] = girderLiveLoadEffects(line, {
      moment: bySpan('moment'),
      negativeMoment: nearPier('negative-moment', 'moment'),
      shear: bySpan('shear'),
      reaction: (loc) => need('reaction', (g) => g.location.support === loc.support, `support ${(loc.support ?? 0) + 1}`),
      fatigueMoment: nearPier('fatigue-moment', 'fatigue-moment'),
      fatigueShear: bySpan('fatigue-shear'),
    });
  }
  return { beamLine: line, girders };
}
