/**
 * Differences between two saved versions: of their inputs (every deck field, with its unit
 * kind so it can be shown in the reader's units) and of their factors (rows keyed by girder,
 * effect, lanes and method).
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

/** A factor row as the code-method engine reports it (the fields a diff needs). */
export interface FactorRowLike {
  girder: string | number;
  effect: string;
  lanes: string;
  method: string;
  value: number;
}

export interface FactorChange {
  key: string;
  girder: string | number;
  effect: string;
  lanes: string;
  method: string;
  before: number | undefined;
  after: number | undefined;
  /** after / before − 1 where both exist. */
  relative: number | undefined;
}

export function factorKey(r: Pick<FactorRowLike, 'girder' | 'effect' | 'lanes' | 'method'>): string {
  return `${r.girder}|${r.effect}|${r.lanes}|${r.method}`;
}

/** Factor rows whose value differs by more than `tolerance` (relative), or that exist on one side only. */
export function diffFactors(before: FactorRowLike[], after: FactorRowLike[], tolerance = 5e-4): FactorChange[] {
  const a = new Map(before.map((r) => [factorKey(r), r]));
  const b = new Map(after.map((r) => [factorKey(r), r]));
  const keys = [...b.keys(), ...[...a.keys()].filter((k) => !b.has(k))];
  const out: FactorChange[] = [];
  for (const key of keys) {
    const x = a.get(key);
    const y = b.get(key);
    const row = (y ?? x)!;
    const relative = x && y && x.value !== 0 ? y.value / x.value - 1 : undefined;
    if (x && y && Math.abs(y.value - x.value) <= tolerance * Math.max(Math.abs(x.value), Math.abs(y.value), 1e-12)) continue;
    out.push({
      key,
      girder: row.girder,
      effect: row.effect,
      lanes: row.lanes,
      method: row.method,
      before: x?.value,
      after: y?.value,
      relative,
    });
  }
  return out;
}
