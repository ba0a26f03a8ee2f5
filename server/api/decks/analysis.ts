/**
 * The results stored with every saved deck version, computed by the shared solver:
 * method 'code' — every code-method distribution factor with its trace and findings
 * (shared/lrfd computeCodeFactors). A deck the solver cannot compute is refused (400 naming
 * the field) before anything is written.
 */
import { DeckInputError, type Deck } from '../../../shared/deck/schema.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { SOLVER_VERSION } from '../../../shared/version.js';
import { ApiError } from '../../middleware/errors.js';

export interface StoredResult {
  method: string;
  solverVersion: string;
  data: unknown;
}

/** Turns the solver's typed deck error into a 400 whose details point into the request body. */
export function deckErrorToApi(e: DeckInputError): ApiError {
  const details = e.issues.map((i) => ({ path: ['body', 'deck', ...i.path].join('.'), message: i.message }));
  return ApiError.badRequest(details.map((d) => `${d.path}: ${d.message}`).join('; '), details);
}

export function computeStoredResults(deck: Deck): StoredResult[] {
  try {
    return [{ method: 'code', solverVersion: SOLVER_VERSION, data: computeCodeFactors(deck) }];
  } catch (e) {
    if (e instanceof DeckInputError) throw deckErrorToApi(e);
    throw e;
  }
}
