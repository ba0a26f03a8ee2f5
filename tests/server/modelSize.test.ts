/** The refined model-size count used before queueing (server/compute/modelSize.ts): it
 *  follows the mesher's node count (shared/grillage/mesh.ts, which it must not fall below,
 *  or the limit would let through decks larger than it states), and the default limit
 *  refuses the largest deck the schema accepts. Node counts: common practice, no source. */
import { availableParallelism } from 'node:os';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config/env.js';
import { modelSizeRefusal, refinedModelSize } from '../../server/compute/modelSize.js';
import { assertDeck, type Deck } from '../../shared/deck/schema.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { buildGrillage } from '../../shared/grillage/model.js';
import { REFINED_SEGMENTS_PER_SPAN } from '../../shared/grillage/refinedFactors.js';
import { quarryCreekUs } from '../fixtures/decks.js';

function deck(girders: number, spans: number, skews: number[], continuous: boolean, diaphragms = 1): Deck {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.girders = { kind: 'uniform', count: girders, spacing: 6 }; // ft: 40 girders stay within the 80 m deck width
  us.spans = Array.from({ length: spans }, (_, j) => ({ length: 90 + 10 * j }));
  us.supports = skews.map((skew) => ({ skew }));
  us.continuous = continuous;
  us.diaphragms = { type: 'concrete-diaphragms', atSupports: true, intermediatePerSpan: diaphragms, width: 10, depth: 48 };
  return assertDeck(deckFromDisplay(us as never, 'US'));
}

describe('refined model size', () => {
  const cases: [string, Deck][] = [
    ['right, one span', deck(5, 1, [0, 0], false)],
    ['20° skew, skew-parallel, two continuous spans', deck(6, 2, [20, 20, 20], true, 2)],
    ['30° skew, perpendicular, simple spans', deck(8, 2, [30, 30, 30], false)],
    ['fanned skews 45° to 10°', deck(7, 3, [45, 30, 10, 0], true, 0)],
    ['right, three simple spans', deck(4, 3, [0, 0, 0, 0], false, 3)],
  ];
  for (const [name, d] of cases) {
    it(`counts about the mesher's nodes: ${name}`, () => {
      const actual = buildGrillage(d, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN }).stats.nodes;
      const size = refinedModelSize(d);
      expect(size.nodes).toBeGreaterThanOrEqual(actual);
      // the estimate counts every station line and no merging of near nodes, so it never
      // undercounts; 10 % over is the margin the limit's documentation allows (server/compute/modelSize.ts)
      expect(size.nodes).toBeLessThanOrEqual(actual * 1.1);
      expect(size.nodeGirders).toBe(size.nodes * size.girders);
    });
  }

  it('the default limit refuses the largest schema-legal deck and takes 40 girders on one span', () => {
    const limit = loadConfig({}).refinedMaxNodeGirders;
    // schema bounds: 40 girders, 12 spans, 20 intermediate diaphragms per span; 30° skew
    const largest = refinedModelSize(deck(40, 12, Array(13).fill(30), true, 20));
    expect(modelSizeRefusal(largest, limit)).toMatch(/40 girders, 12 spans\) would have about [\d,]+ nodes × 40 girder lines/);
    expect(modelSizeRefusal(refinedModelSize(deck(40, 1, [30, 30], true, 0)), limit)).toBeNull();
    expect(modelSizeRefusal(refinedModelSize(deck(40, 2, [30, 30, 30], true, 0)), limit)).not.toBeNull();
    expect(modelSizeRefusal(refinedModelSize(deck(12, 12, Array(13).fill(30), true, 0)), limit)).toBeNull();
  });
});

describe('refined pool settings from the environment', () => {
  it('defaults to cores − 1 threads (at least 1) and a 60 s run', () => {
    const c = loadConfig({});
    expect(c.refinedThreads).toBe(Math.max(1, availableParallelism() - 1));
    expect(c.refinedJobMs).toBe(60_000);
    const set = loadConfig({ REFINED_THREADS: '3', REFINED_JOB_SECONDS: '2.5', REFINED_QUEUE: '0', REFINED_WORKER_MEMORY_MB: '256', REFINED_MAX_NODE_GIRDERS: '5000' });
    expect(set).toMatchObject({ refinedThreads: 3, refinedJobMs: 2500, refinedQueue: 0, refinedWorkerMemoryMb: 256, refinedMaxNodeGirders: 5000 });
  });

  it('refuses settings that could not work, naming the variable', () => {
    expect(() => loadConfig({ REFINED_THREADS: '0' })).toThrow(/REFINED_THREADS/);
    expect(() => loadConfig({ REFINED_THREADS: '1.5' })).toThrow(/REFINED_THREADS must be a whole number/);
    expect(() => loadConfig({ REFINED_JOB_SECONDS: '0' })).toThrow(/REFINED_JOB_SECONDS must be greater than 0/);
    expect(() => loadConfig({ REFINED_WORKER_MEMORY_MB: '16' })).toThrow(/REFINED_WORKER_MEMORY_MB/);
    expect(() => loadConfig({ REFINED_QUEUE: '-1' })).toThrow(/REFINED_QUEUE/);
  });
});
