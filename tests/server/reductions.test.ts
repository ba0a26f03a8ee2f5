/**
 * The review's reduction table and its largest claimable reduction are one answer: the
 * largest claimable reduction is the largest reduction among the rows marked claimable, on
 * every example deck (simple and continuous). Each kind and span has exactly one design girder
 * (the largest refined moment of the kind there; girders of one kind designed alike for a span
 * is common practice, no source), and only its row can be claimed, and only when the model
 * earns it: its stated bound meets the target, its factor changes by at most 1 % at twice the
 * mesh density (common practice, no source), and the grillage includes the deck's diaphragms
 * or cross-frames.
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
      const refined = governingPerGirder(computeRefinedFactors(deck, { effects: ['moment'], checkConvergence: true }).rows);
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
        const top = Math.max(...rows.map((r) => r.refinedMoment));
        const design = rows.filter((r) => r.designGirder === r.girder);
        expect(design).toHaveLength(1);
        expect(design[0].refinedMoment).toBe(top);
        for (const r of rows) {
          expect(r.designGirder).toBe(design[0].girder);
          if (r !== design[0]) expect(r.withheld).toEqual(['not-design-girder']);
        }
        const d = design[0];
        expect(d.bound).toBeDefined();
        expect(d.convergence).toBeDefined();
        expect(d.convergence!.segmentsPerSpan).toBe(2 * 40);
        expect(d.convergence!.change).toBeRelativelyClose(Math.abs(d.convergence!.value - d.refined) / d.refined, 1e-12);
        expect(d.claimable).toBe(d.bound!.meetsTarget && d.convergence!.within);
        const expected = [...(d.bound!.meetsTarget ? [] : ['bound-misses-target']), ...(d.convergence!.within ? [] : ['mesh-unconverged'])];
        expect(d.withheld).toEqual(expected);
        if (!d.bound!.meetsTarget) expect(d.claim).toMatch(/misses the target of 0\.005 lanes and 0\.5 %/);
        if (!d.convergence!.within) expect(d.claim).toMatch(/at twice the mesh density \(80 segments per span\) the factor changes by/);
      }
      const largest = largestClaimableReduction(table);
      const claimable = table.filter((r) => r.claimable);
      if (claimable.length === 0) expect(largest).toBeNull();
      else {
        expect(largest?.claimable).toBe(true);
        expect(largest?.reductionPercent).toBe(Math.max(...claimable.map((r) => r.reductionPercent)));
        expect(table).toContain(largest);
      }

      // A model without the deck's diaphragms claims nothing, and says so.
      const without = momentReductionTable(code, refined, (span) => perLaneMaxMoment(deck, span), { diaphragmsLeftOut: true });
      expect(without.some((r) => r.claimable)).toBe(false);
      expect(without.filter((r) => r.designGirder === r.girder).every((r) => r.withheld.includes('diaphragms-left-out') && /leaves out the deck’s diaphragms/.test(r.claim))).toBe(true);
      expect(largestClaimableReduction(without)).toBeNull();

      // A mesh with a panel more elongated than Art. 4.6.3.3.1 allows (5.0, quoted from memory) claims nothing, and says so.
      const elongated = momentReductionTable(code, refined, (span) => perLaneMaxMoment(deck, span), { diaphragmsLeftOut: false, panelAspect: { ratio: 6.25, limit: 5 } });
      expect(elongated.some((r) => r.claimable)).toBe(false);
      expect(elongated.filter((r) => r.designGirder === r.girder).every((r) => r.withheld.includes('mesh-aspect-ratio') && r.claim.includes('aspect ratio of 6.25, above 5 (AASHTO LRFD Art. 4.6.3.3.1)'))).toBe(true);

      // Rows stored before bounds and convergence were kept with them claim nothing until recomputed.
      const unbounded = momentReductionTable(code, refined.map(({ bound: _bound, convergence: _convergence, ...r }) => r), (span) => perLaneMaxMoment(deck, span));
      expect(unbounded.some((r) => r.claimable)).toBe(false);
      expect(unbounded.filter((r) => r.designGirder === r.girder).every((r) => r.withheld.includes('bound-unknown') && r.withheld.includes('convergence-unknown'))).toBe(true);
    });
  }

  it('some example deck has a claimable row, so the claim is not empty by construction', () => {
    const any = files.some((file) => {
      const deck = readDeck(file);
      const code = computeCodeFactors(deck);
      const refined = governingPerGirder(computeRefinedFactors(deck, { effects: ['moment'], checkConvergence: true }).rows);
      return momentReductionTable(code, refined, (span) => perLaneMaxMoment(deck, span)).some((r) => r.claimable);
    });
    expect(any).toBe(true);
  });

  it('claims nothing from an empty table', () => {
    expect(largestClaimableReduction([])).toBeNull();
  });
});
