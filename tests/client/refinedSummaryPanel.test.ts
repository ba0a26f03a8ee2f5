// @vitest-environment happy-dom
/**
 * The review's refined-analysis panel shows the reduction table with each row's claim, and its
 * "largest claimable reduction" line is the largest of the rows it marks "Yes" (one answer from
 * shared/review/reductions.ts, here on a three-span continuous example deck).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import RefinedSummaryPanel from '@/components/review/RefinedSummaryPanel.vue';
import type { RefinedSummary } from '@/api/reviews';
import { assertDeck } from '../../shared/deck/schema';
import { deckFromDisplay } from '../../shared/deck/units';
import { computeCodeFactors } from '../../shared/lrfd/index';
import { computeRefinedFactors } from '../../shared/grillage/refinedFactors';
import { governingPerGirder, largestClaimableReduction, momentReductionTable } from '../../shared/review/reductions';

describe('the refined-analysis panel', () => {
  it('marks the claimable rows and names the largest of them', { timeout: 60_000 }, () => {
    const file = JSON.parse(readFileSync('public/examples/larchmont-mill-creek.deck.json', 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
    const deck = assertDeck(deckFromDisplay(file.deck, file.units));
    const code = computeCodeFactors(deck);
    const refined = governingPerGirder(computeRefinedFactors(deck, { effects: ['moment'], checkConvergence: true }).rows);
    // Any per-lane moment will do for the panel's agreement with the table (the server uses the
    // HL-93 beam-line envelope); one that differs per span keeps the spans apart.
    const table = momentReductionTable(code, refined, (span) => 1e6 * (span + 1));
    const largest = largestClaimableReduction(table);
    expect(largest).not.toBeNull();
    const summary: RefinedSummary = {
      caution: code.caution,
      solverVersion: 'test',
      source: 'computed',
      deckName: deck.name,
      girderCount: code.derived.girderCount,
      rangeFindings: [],
      otherFindings: [],
      skew: { supports: code.derived.skews, largest: 0, words: 'square', effects: [] },
      governing: [],
      refined: { available: true, note: '', source: 'grillage', ratios: [], momentReductions: table, largestReduction: largest },
      indicators: [],
    } as unknown as RefinedSummary;
    const w = mount(RefinedSummaryPanel, { props: { summary, units: 'US' } });
    const rows = w.findAll('[data-test="reductions"] tbody tr').filter((r) => r.findAll('td').length > 1);
    expect(rows).toHaveLength(table.length);
    const yes = rows.filter((r) => r.text().includes('Yes: design'));
    expect(yes).toHaveLength(table.filter((r) => r.claimable).length);
    expect(rows.filter((r) => r.text().includes('No: '))).toHaveLength(table.length - yes.length);
    const line = w.find('.ds-strong').text();
    expect(line).toContain(`${largest!.reductionPercent.toFixed(1)} % (girder ${largest!.girder}, ${largest!.location})`);
    expect(w.text()).toContain('licensed');
  });
});
