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
    // the caution is the shell's, once per screen and always in view (App.vue), not the panel's
    expect(w.text()).not.toContain('licensed');
  });
});

describe('the ratio table marks a bound that misses the target', () => {
  it('shows each row\'s stated bound and its governing load; a miss reads "above target"', () => {
    const summary = {
      caution: 'c',
      solverVersion: 'test',
      source: 'computed',
      deckName: 'd',
      girderCount: 4,
      rangeFindings: [],
      otherFindings: [],
      skew: { supports: [0, 0], largest: 0, words: 'square', effects: [] },
      governing: [],
      refined: {
        available: true,
        note: '',
        source: 'grillage',
        loads: 'design truck alone (strength); fatigue truck, one lane, no m (fatigue)',
        ratios: [
          { girder: 1, girderKind: 'exterior', effect: 'moment', locationKey: 'span1', location: 'span 1 (0.5 of the span)', refined: 0.7, code: 0.8, ratio: 0.875, vehicle: 'design truck', bound: { lanes: 0.002, percent: 0.29, meetsTarget: true } },
          { girder: 1, girderKind: 'exterior', effect: 'shear', locationKey: 'span1', location: 'span 1 (support 1, right side)', refined: 0.8, code: 0.9, ratio: 0.889, vehicle: 'HL-93 truck + lane', bound: { lanes: 0.3947, percent: 48.79, meetsTarget: false } },
        ],
        momentReductions: [],
        largestReduction: null,
      },
      indicators: [],
    } as unknown as RefinedSummary;
    const w = mount(RefinedSummaryPanel, { props: { summary, units: 'US' } });
    const rows = w.findAll('[data-test="ratios"] tbody tr').filter((r) => r.findAll('td').length > 1);
    expect(rows).toHaveLength(2);
    expect(rows[0].text()).toContain('0.0020 lanes, 0.3 %');
    expect(rows[0].text()).not.toContain('above target');
    expect(rows[1].text()).toContain('0.3947 lanes, 48.8 % ± above target');
    expect(rows[1].text()).toContain('HL-93 truck + lane');
    expect(w.get('[data-test="refined-loads"]').text()).toContain('design truck alone');
    w.unmount();
  });
});
