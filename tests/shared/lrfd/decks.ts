/**
 * Test decks written in US customary display units (ft, in, in², in⁴, ksi) and converted
 * with the same edge conversion the CLI uses. `usDeck` starts from a plain type-a deck and
 * applies overrides; every numeric input a test relies on is stated in the test itself.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { assertDeck, deckFromDisplay, type CodeFactorResult, type Deck, type FactorRow } from '../../../shared/index.js';
import { BASE_US } from '../traceFixtures.js';

export type DeckOverrides = Record<string, unknown>;

export { BASE_US };

/** A validated deck in internal units from US display values. */
export function usDeck(over: DeckOverrides = {}): Deck {
  return assertDeck(deckFromDisplay({ ...BASE_US, ...over }, 'US'));
}

/** The deck of a file in public/examples (wrapped form { units, deck }). */
export function exampleDeck(file: string): Deck {
  const path = fileURLToPath(new URL(`../../../public/examples/${file}`, import.meta.url));
  const f = JSON.parse(readFileSync(path, 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
  return assertDeck(deckFromDisplay(f.deck, f.units));
}

/** The factor row of a girder kind, effect, lane case and method at a location key (default span 1). */
export function pickRow(r: CodeFactorResult, girder: 'interior' | 'exterior', effect: FactorRow['effect'], lanes: 'one' | 'multiple', method: FactorRow['method'], key = 'span1'): FactorRow {
  const found = r.factors.find((x) => x.girderKind === girder && x.effect === effect && x.lanes === lanes && x.method === method && x.location.key === key);
  if (!found) throw new Error(`missing row ${girder}/${effect}/${lanes}/${method}/${key}: ${r.factors.map((x) => x.id).join(', ')}`);
  return found;
}
