/**
 * The factors of two saved versions side by side, row for row (shared/versionDiff/diffRows.ts:
 * one girder, effect, place and lane case per row). A row has not changed when both versions
 * write the same number (factorText, 4 decimals, as the review summary and the package print
 * it: a change below the last digit shown is none; common practice, no source). A row that
 * cannot be compared says why: the value is not in one version, or one version's grillage is
 * not there (still being computed, could not be built, …).
 * Units: factors dimensionless (lanes per girder); changes in lanes and in % of the earlier value.
 */
import { factorText } from '../lrfd/words.js';
import { compareOrder, isGrillageKey, versionRows, type DiffSection, type KeyedValue, type RowLabels } from './diffRows.js';
import { GRILLAGE_MISSING_WORDS, type VersionFactors } from './versionFactors.js';

export interface VersionSide {
  /** The version's number (v1, v2, …). */
  number: number;
  factors: VersionFactors;
}

/** One version's value in a row, or why it has none. */
export interface DiffCell {
  value?: number;
  /** The number as written, or the reason there is none. */
  text: string;
  /** Which case gave a governing value, in words. */
  note?: string;
  /** The full reason when there is no value. */
  why?: string;
}

/** same: equal as written; changed; added / removed: in one version only; not-compared: one version's grillage is not there. */
export type DiffState = 'same' | 'changed' | 'added' | 'removed' | 'not-compared';

export interface FactorDiffRow extends RowLabels {
  key: string;
  section: DiffSection;
  before: DiffCell;
  after: DiffCell;
  state: DiffState;
  /** "no change", "+0.0250 (+3.1 %)", "new in v3", "not compared: …". */
  change: string;
  /** after / before − 1, where both exist and before is not 0. */
  relative?: number;
}

export interface FactorDiff {
  rows: FactorDiffRow[];
  /** Rows per state. */
  counts: Record<DiffState, number>;
  /** How the code factors and the grillage of each version were obtained, in words. */
  sources: string[];
}

function valueCell(r: KeyedValue): DiffCell {
  return { value: r.value, text: factorText(r.value), ...(r.note ? { note: r.note } : {}) };
}

/** Why a side has no value in a row. */
function missingCell(side: VersionSide, key: string): DiffCell {
  const refined = side.factors.refined;
  if (isGrillageKey(key) && !refined.available) return { text: GRILLAGE_MISSING_WORDS[refined.missing], why: refined.note };
  return { text: `none in v${side.number}`, why: `version ${side.number} has no such value: its deck or the methods that apply to it differ` };
}

const MINUS = '\u2212';
function signed(v: number, digits: number): string {
  return `${v < 0 ? MINUS : '+'}${Math.abs(v).toFixed(digits)}`;
}

/** "+0.0250 (+3.1 %)": the change in lanes and in % of the earlier value. */
export function changeText(before: number, after: number): string {
  const d = after - before;
  if (before === 0) return signed(d, 4);
  const pct = (after / before - 1) * 100;
  return `${signed(d, 4)} (${signed(pct, Math.abs(pct) < 1 ? 2 : 1)} %)`;
}

function compareCells(a: VersionSide, b: VersionSide, key: string, x?: KeyedValue, y?: KeyedValue): Pick<FactorDiffRow, 'before' | 'after' | 'state' | 'change' | 'relative'> {
  const before = x ? valueCell(x) : missingCell(a, key);
  const after = y ? valueCell(y) : missingCell(b, key);
  if (x && y) {
    if (before.text === after.text) return { before, after, state: 'same', change: 'no change' };
    return { before, after, state: 'changed', change: changeText(x.value, y.value), ...(x.value !== 0 ? { relative: y.value / x.value - 1 } : {}) };
  }
  const grillageGone = isGrillageKey(key) && (!a.factors.refined.available || !b.factors.refined.available);
  if (grillageGone) {
    const side = !a.factors.refined.available ? a : b;
    return { before, after, state: 'not-compared', change: `not compared, v${side.number}: ${(x ? after : before).text}` };
  }
  return y ? { before, after, state: 'added', change: `new in v${b.number}` } : { before, after, state: 'removed', change: `not in v${b.number}` };
}

/** A row standing for every grillage row when neither version has a grillage result, so the reason is still shown. */
function noGrillageRow(a: VersionSide, b: VersionSide): FactorDiffRow {
  const before = missingCell(a, 'grillage|');
  const after = missingCell(b, 'grillage|');
  return { key: 'grillage|none', section: 'grillage', girder: 'every girder', effect: 'every effect', location: 'every place', lanes: 'each lane case', method: 'grillage', before, after, state: 'not-compared', change: 'not compared: neither version has grillage values' };
}

function sourceWords(side: VersionSide): string {
  const f = side.factors;
  const code = `code factors ${f.code.source === 'stored' ? 'stored with the version' : 'computed from its deck'} (solver ${f.code.solverVersion})`;
  const grillage = f.refined.available ? f.refined.source : GRILLAGE_MISSING_WORDS[f.refined.missing];
  return `v${side.number}: ${code}; ${grillage}`;
}

/** Every row of either version, in order, with each version's value and the change. */
export function diffVersionFactors(a: VersionSide, b: VersionSide): FactorDiff {
  const ra = versionRows(a.factors);
  const rb = versionRows(b.factors);
  const keys = [...new Set([...rb.keys(), ...ra.keys()])];
  const ordered = keys.map((key) => ({ key, x: ra.get(key), y: rb.get(key), row: (rb.get(key) ?? ra.get(key))! })).sort((p, q) => compareOrder(p.row.order, q.row.order));
  const out: FactorDiffRow[] = ordered.map(({ key, x, y, row }) => ({ key, section: row.section, ...row.labels, ...compareCells(a, b, key, x, y) }));
  if (!a.factors.refined.available && !b.factors.refined.available) out.push(noGrillageRow(a, b));
  const counts: Record<DiffState, number> = { same: 0, changed: 0, added: 0, removed: 0, 'not-compared': 0 };
  for (const r of out) counts[r.state]++;
  return { rows: out, counts, sources: [sourceWords(a), sourceWords(b)] };
}
