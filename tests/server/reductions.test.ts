/**
 * The review's reduction table and its largest claimable reduction are one answer: the
 * largest claimable reduction is the largest reduction among the rows marked claimable, on
 * every example deck (simple and continuous), and each kind and span has exactly one claimable
 * row, its design girder (the largest refined moment of the kind there; girders of one kind
 * designed alike for a span is common practice, no source).
 *
 * The moment identity checked: girder LL+IM moment = g × per-lane LL+IM moment
 * (AASHTO LRFD Art. 4.6.2.2), so reduction = (g_code − g_refined) × M_lane and the percentage
 * is (g_code − g_refined) / g_code.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { assertDeck } from '../../shared/deck/schema.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { computeCodeFactors } from '../../shared/lrfd/index.js';
import { computeRefinedFactors } from '../../shared/grillage/refinedFactors.js';
import { governingPerGirder, largestClaimableReduction, momentReductionTable, type MomentReduction } from '../../shared/review/reductions.js';
import { perLaneMaxMoment } from '../../server/reports/envelopes.js';

const dir = fileURLToPath(new URL('../../public/examples/', import.meta.url));
const readDeck = (name: string) => {
  const f = JSON.parse(readFileSync(join(dir, name), 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
  return assertDeck(deckFromDisplay(f.deck, f.units));
};
// Every example deck the grillage can model (a girder moment of inertia given; mesh.test.ts
// checks that the others are refused with a message naming the field).
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.deck.json'))
  .filter((f) => readDeck(f).section.inertia !== undefined);

describe('the reduction table and its largest claimable reduction', () => {
  it('covers simple and continuous example decks', () => {
    const decks = files.map(readDeck);
    expect(decks.some((d) => d.continuous && d.spans.length > 1)).toBe(true);
    expect(decks.some((d) => d.spans.length === 1)).toBe(true);
  });

  for (const file of files) {
    it(file, { timeout: 60_000 }, () => {
      const deck = readDeck(file);
      const code = computeCodeFactors(deck);
      const refined = governingPerGirder(computeRefinedFactors(deck, { effects: ['moment'] }).rows);
      const table = momentReductionTable(code, refined, (span) => perLaneMaxMoment(deck, span));
      expect(table.length).toBe(code.derived.girderCount * deck.spans.length);

      const groups = new Map<string, MomentReduction[]>();
      for (const r of table) {
        expect(r.reduction).toBeRelativelyClose((r.code - r.refined) * r.perLaneMoment, 1e-12);
        expect(r.reductionPercent).toBeRelativelyClose(((r.code - r.refined) / r.code) * 100, 1e-12);
        const key = `${r.girderKind}|${r.locationKey}`;
        groups.set(key, [...(groups.get(key) ?? []), r]);
      }
      for (const rows of groups.values()) {
        const claimable = rows.filter((r) => r.claimable);
        expect(claimable).toHaveLength(1);
        const top = Math.max(...rows.map((r) => r.refinedMoment));
        expect(claimable[0].refinedMoment).toBe(top);
        for (const r of rows) expect(r.designGirder).toBe(claimable[0].girder);
      }
      const largest = largestClaimableReduction(table);
      const best = Math.max(...table.filter((r) => r.claimable).map((r) => r.reductionPercent));
      expect(largest).not.toBeNull();
      expect(largest?.claimable).toBe(true);
      expect(largest?.reductionPercent).toBe(best);
      expect(table).toContain(largest);
    });
  }

  it('claims nothing from an empty table', () => {
    expect(largestClaimableReduction([])).toBeNull();
  });
});
