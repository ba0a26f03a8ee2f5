/**
 * The results stored with every saved deck version, computed by the shared solver. A deck
 * the solver cannot compute is refused (400 naming the field) before anything is written.
 */
import { DeckInputError, type Deck } from '../../../shared/deck/schema.js';
import { deckGeometry } from '../../../shared/deck/geometry.js';
import { derivedSection } from '../../../shared/deck/section.js';
import { designLanes } from '../../../shared/lrfd/lanes.js';
import { SOLVER_VERSION } from '../../../shared/version.js';
import { ApiError } from '../../middleware/errors.js';

export interface StoredResult {
  method: string;
  solverVersion: string;
  data: unknown;
}

export function computeStoredResults(deck: Deck): StoredResult[] {
  try {
    const geometry = deckGeometry(deck);
    const lanes = designLanes(geometry.roadwayWidth);
    const section = derivedSection(deck);
    return [{ method: 'derived', solverVersion: SOLVER_VERSION, data: { geometry, section, lanes: { count: lanes.count, width: lanes.width } } }];
  } catch (e) {
    if (e instanceof DeckInputError) {
      const details = e.issues.map((i) => ({ path: ['body', 'deck', ...i.path].join('.'), message: i.message }));
      throw ApiError.badRequest(details.map((d) => `${d.path}: ${d.message}`).join('; '), details);
    }
    throw e;
  }
}
