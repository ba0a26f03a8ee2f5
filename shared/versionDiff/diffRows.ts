/**
 * The rows of one version's factors as a comparison lists them, each keyed by what it is —
 * girder, effect, place and lane case (and, for a code row, its method) — so two versions are
 * compared like with like, and labelled in the words of the rest of the app
 * (shared/lrfd/words.ts). Three sections:
 *  - governing: the code's governing value of each girder kind, effect and place, and the
 *    governing grillage value of each girder, effect and place (the largest of its lane cases;
 *    a span's shear is the larger of its two ends);
 *  - code: every code-method row;
 *  - grillage: every grillage row (one girder, effect, place and lane case).
 * Units: factors dimensionless (lanes per girder).
 */
import { EFFECT_LABELS, LANE_LABELS, METHOD_LABELS, placeWords } from '../lrfd/words.js';
import type { ComparedCodeRow, ComparedPlace, VersionFactors } from './versionFactors.js';

export type DiffSection = 'governing' | 'code' | 'grillage';

/** What a row is, in words. */
export interface RowLabels {
  girder: string;
  effect: string;
  location: string;
  lanes: string;
  method: string;
}

export interface KeyedValue {
  key: string;
  section: DiffSection;
  /** Sorts the rows: section, girder, effect, place, lane case, method. */
  order: number[];
  labels: RowLabels;
  value: number;
  /** Which case gave a governing value ("lever rule, one lane"), in words. */
  note?: string;
}

const SECTIONS: DiffSection[] = ['governing', 'code', 'grillage'];
const EFFECTS = ['moment', 'shear', 'negative-moment', 'reaction', 'fatigue-moment', 'fatigue-shear', 'deflection'];
const METHODS = ['governing', 'formula', 'lever-rule', 'rigid-section', 'equal-share', 'interior-minimum', 'grillage'];

const indexOf = (list: string[], id: string) => (list.includes(id) ? list.indexOf(id) : list.length);

/** "span 2" → 2, "support 3" → 103, the whole deck last. */
function placeOrder(key: string): number {
  const m = /^(span|support)(\d+)$/.exec(key);
  if (!m) return 1000;
  return (m[1] === 'span' ? 0 : 100) + Number(m[2]);
}

/** A place in words; a span's shear applies at either end, and its grillage value is the larger of the two. */
export function placeLabel(effect: string, location: ComparedPlace): string {
  const words = placeWords(location.description);
  const shear = effect === 'shear' || effect === 'fatigue-shear';
  return shear && location.key.startsWith('span') ? `${words}, both ends` : words;
}

function codeGirderLabel(r: Pick<ComparedCodeRow, 'girderKind' | 'girderNumber'>): string {
  return r.girderNumber === undefined ? `${r.girderKind} girders` : `${r.girderKind} girder G${r.girderNumber}`;
}

function codeGirderOrder(r: Pick<ComparedCodeRow, 'girderKind' | 'girderNumber'>): number {
  return (r.girderKind === 'interior' ? 0 : 1000) + (r.girderNumber ?? 0);
}

interface RowOf {
  section: DiffSection;
  girder: { id: string; order: number; label: string };
  effect: string;
  location: ComparedPlace;
  lanes: { id: string; order: number; label: string };
  method: { id: string; label: string };
  value: number;
  note?: string;
}

function keyed(r: RowOf): KeyedValue {
  return {
    key: [r.section, r.girder.id, r.effect, r.location.key, r.lanes.id, r.method.id].join('|'),
    section: r.section,
    order: [SECTIONS.indexOf(r.section), r.girder.order, indexOf(EFFECTS, r.effect), placeOrder(r.location.key), r.lanes.order, indexOf(METHODS, r.method.id)],
    labels: { girder: r.girder.label, effect: EFFECT_LABELS[r.effect] ?? r.effect, location: placeLabel(r.effect, r.location), lanes: r.lanes.label, method: r.method.label },
    value: r.value,
    ...(r.note ? { note: r.note } : {}),
  };
}

const GOVERNING_CASE = { id: 'governing', order: 2, label: 'the larger lane case' };
const laneCase = (lanes: string) => ({ id: lanes, order: lanes === 'one' ? 0 : 1, label: LANE_LABELS[lanes] ?? lanes });
const codeGirder = (r: Pick<ComparedCodeRow, 'girderKind' | 'girderNumber'>) => ({ id: `${r.girderKind}${r.girderNumber ?? ''}`, order: codeGirderOrder(r), label: codeGirderLabel(r) });
const grillageGirder = (n: number, kind: string) => ({ id: `G${n}`, order: n, label: `G${n} (${kind})` });

function codeRows(f: VersionFactors): KeyedValue[] {
  const governing = f.code.governing.map((g) =>
    keyed({ section: 'governing', girder: codeGirder(g), effect: g.effect, location: g.location, lanes: GOVERNING_CASE, method: { id: 'code', label: 'code, governing value' }, value: g.value, note: `${METHOD_LABELS[g.method] ?? g.method}, ${LANE_LABELS[g.lanes] ?? g.lanes}` }),
  );
  const rows = f.code.rows.map((r) => keyed({ section: 'code', girder: codeGirder(r), effect: r.effect, location: r.location, lanes: laneCase(r.lanes), method: { id: r.method, label: METHOD_LABELS[r.method] ?? r.method }, value: r.value }));
  return [...governing, ...rows];
}

function grillageRows(f: VersionFactors): KeyedValue[] {
  if (!f.refined.available) return [];
  const kindOf = new Map(f.refined.rows.map((r) => [r.girderNumber, r.girderKind]));
  const governing = f.refined.governing.map((g) =>
    keyed({
      section: 'governing',
      girder: grillageGirder(g.girder, kindOf.get(g.girder) ?? 'girder'),
      effect: g.effect,
      location: { key: g.locationKey, description: g.location },
      lanes: GOVERNING_CASE,
      method: { id: 'grillage', label: 'grillage, governing value' },
      value: g.value,
      note: [LANE_LABELS[g.lanes] ?? g.lanes, g.vehicle].filter(Boolean).join(', '),
    }),
  );
  const rows = f.refined.rows.map((r) => keyed({ section: 'grillage', girder: grillageGirder(r.girderNumber, r.girderKind), effect: r.effect, location: r.location, lanes: laneCase(r.lanes), method: { id: 'grillage', label: METHOD_LABELS.grillage }, value: r.value }));
  return [...governing, ...rows];
}

/** Every row of a version's factors, by key (a repeated key is told apart by its order of appearance). */
export function versionRows(f: VersionFactors): Map<string, KeyedValue> {
  const out = new Map<string, KeyedValue>();
  for (const r of [...codeRows(f), ...grillageRows(f)]) {
    let key = r.key;
    for (let n = 2; out.has(key); n++) key = `${r.key}#${n}`;
    out.set(key, { ...r, key });
  }
  return out;
}

/** Whether a row comes from the grillage (its side may lack a grillage result). */
export function isGrillageKey(key: string): boolean {
  return key.startsWith('grillage|') || /^governing\|G\d+\|/.test(key);
}

export function compareOrder(a: number[], b: number[]): number {
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const d = (a[i] ?? 0) - (b[i] ?? 0);
    if (d !== 0) return d;
  }
  return 0;
}
