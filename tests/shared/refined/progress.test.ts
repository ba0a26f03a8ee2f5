/** A refined run says where it is (what the server's job view shows while a worker runs it):
 *  the model first, then each factor of the search in order, then the convergence run; the
 *  search's count ends at the number of factors returned. Bookkeeping of the product itself
 *  (no engineering source). */
import { describe, expect, it } from 'vitest';
import { computeRefinedFactors, type RefinedProgress } from '../../../shared/grillage/refinedFactors.js';
import { steelDeck } from '../grillage/fixtures.js';

describe('refined run progress', () => {
  it('reports the model, every factor of the search in order, then the convergence run', () => {
    const seen: RefinedProgress[] = [];
    const result = computeRefinedFactors(steelDeck({ girders: 4, spacingFt: 8, spansFt: [80] }), { checkConvergence: true, onProgress: (p) => seen.push({ ...p }) });
    expect(seen[0]).toEqual({ phase: 'model', done: 0, total: 1 });
    const search = seen.filter((p) => p.phase === 'search');
    expect(search.map((p) => p.done)).toEqual(result.factors.map((_, k) => k));
    expect(search.every((p) => p.total === result.factors.length)).toBe(true);
    expect(seen[seen.length - 1]).toEqual({ phase: 'convergence', done: 0, total: 1 });
    // the convergence run (twice the density) reports nothing of its own
    expect(seen.filter((p) => p.phase === 'model')).toHaveLength(1);
  });
});
