/**
 * Differences between the inputs of two saved versions: every deck field, with its unit kind
 * so it can be shown in the reader's units (their factors: shared/versionDiff).
 */
import { deckFieldKind } from '@shared/deck/units';
import type { QuantityKind } from '@shared/units';

export interface InputChange {
  /** 'girders.spacing', 'spans.1.length' … */
  key: string;
  path: (string | number)[];
  kind: QuantityKind;
  before: unknown;
  after: unknown;
}

/** Every leaf of a deck: key → { path, value }. Arrays are indexed, objects by key. */
export function flattenDeck(value: unknown, path: (string | number)[] = [], out = new Map<string, { path: (string | number)[]; value: unknown }>()) {
  if (Array.isArray(value)) {
    if (value.length === 0) out.set(path.join('.'), { path, value: [] });
    value.forEach((v, i) => flattenDeck(v, [...path, i], out));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) flattenDeck(v, [...path, k], out);
  } else if (value !== undefined) {
    out.set(path.join('.'), { path, value });
  }
  return out;
}

function same(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' && typeof b === 'number') {
    return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
  }
  return JSON.stringify(a) === JSON.stringify(b);
}

/** Fields that differ between two decks, in the order of the newer deck's fields. */
export function diffDecks(before: unknown, after: unknown): InputChange[] {
  const a = flattenDeck(before);
  const b = flattenDeck(after);
  const keys = [...b.keys(), ...[...a.keys()].filter((k) => !b.has(k))];
  const out: InputChange[] = [];
  for (const key of keys) {
    const x = a.get(key);
    const y = b.get(key);
    if (x && y && same(x.value, y.value)) continue;
    const path = (y ?? x)!.path;
    out.push({ key, path, kind: deckFieldKind(path) ?? 'none', before: x?.value, after: y?.value });
  }
  return out;
}
