/**
 * Code methods against the grillage: per girder, effect, span and lane case, the empirical
 * formula, lever rule and rigid-section values of the code engine (shared/lrfd/factors.ts)
 * beside the refined factor (refinedFactors.ts), with their ratios.
 *
 * Units: factors in lanes (dimensionless); ratios dimensionless. Girders are 1-based.
 *
 * Matching rule: the code gives interior rows for every interior girder and exterior rows
 * for the exterior girder they name (girder 1, or Nb when the deck is not symmetric; on a
 * symmetric deck girder Nb takes girder 1's rows). Rows are matched on effect, location key
 * ("span1", …, or "support2" for negative moment and reactions) and lane case ('one' / 'multiple'). The code value is the one the engine
 * adopted for that lane case (its own rules: formula, lever rule, rigid-section check,
 * policies). Findings of the rows used, and the refined run's findings for the effect, are
 * passed through unchanged.
 */
import type { Finding } from '../lrfd/findings.js';
import { RESULT_CAUTION, type CodeFactorResult, type FactorEffect, type FactorMethod, type FactorRow, type GirderKind } from '../lrfd/factors.js';
import type { RefinedFinding, RefinedResult } from './refinedFactors.js';
import { placeWords } from '../lrfd/words.js';

export interface ComparisonRow {
  girderNumber: number;
  girderKind: GirderKind;
  effect: FactorEffect;
  /** Location key and words, e.g. "span1", "span 1". */
  locationKey: string;
  location: string;
  lanes: 'one' | 'multiple';
  formula?: number;
  leverRule?: number;
  rigidSection?: number;
  grillage?: number;
  /** The code engine's adopted value for this lane case, and the method that gave it. */
  code?: number;
  codeMethod?: FactorMethod;
  /** Loaded lanes of the grillage's governing placement. */
  grillageLoadedLanes?: number;
  ratios: {
    /** grillage ÷ formula. */
    toFormula?: number;
    /** grillage ÷ the code's adopted value. */
    toCode?: number;
    toLeverRule?: number;
    toRigidSection?: number;
  };
  findings: (Finding | RefinedFinding)[];
}

export interface FactorComparison {
  deckName: string;
  rows: ComparisonRow[];
  caution: string;
}

const COMPARED: FactorEffect[] = ['moment', 'shear', 'negative-moment', 'reaction', 'fatigue-moment', 'fatigue-shear'];

function codeRowsFor(code: CodeFactorResult, girderNumber: number, kind: GirderKind, Nb: number): FactorRow[] {
  const own = code.factors.filter((r) => r.girderKind === kind && (kind === 'interior' || r.girderNumber === girderNumber));
  if (own.length || kind === 'interior') return own;
  // exterior girder the code did not name: the mirror of girder 1 on a symmetric deck
  if (code.derived.symmetric) return code.factors.filter((r) => r.girderKind === 'exterior' && (r.girderNumber === 1 || r.girderNumber === undefined || r.girderNumber === Nb + 1 - girderNumber));
  return [];
}

const ratio = (a: number | undefined, b: number | undefined) => (a !== undefined && b !== undefined && b !== 0 ? a / b : undefined);

/**
 * The code's adopted value among rows of one lane case (the value `selectGoverning` adopted;
 * the largest when the rows hold several), or undefined when none is adopted. The comparison
 * of methods, on screen and in the package, reads it here.
 */
export function adoptedValue(rows: readonly FactorRow[]): number | undefined {
  const adopted = rows.filter((r) => r.adopted);
  return adopted.length ? Math.max(...adopted.map((r) => r.value)) : undefined;
}

/** Which rows a comparison line holds: one girder kind, effect, place and lane case. */
export interface KindCase {
  kind: GirderKind;
  effect: FactorEffect;
  lanes: 'one' | 'multiple';
  locationKey: string;
}

/**
 * The grillage row of a girder kind, effect, place and lane case: the largest of the girders
 * of that kind (the comparison by girder kind, in the workspace and in the package), or
 * undefined when the refined result has none.
 */
export function grillageRowOfKind(rows: readonly FactorRow[], c: KindCase): FactorRow | undefined {
  const own = rows.filter((r) => r.method === 'grillage' && r.girderKind === c.kind && r.effect === c.effect && r.lanes === c.lanes && r.location.key === c.locationKey);
  return own.length ? own.reduce((a, b) => (b.value > a.value ? b : a)) : undefined;
}

/** Compare the code's factors with the refined ones, per girder (1-based), effect, span and lane case. */
export function compareFactors(code: CodeFactorResult, refined: RefinedResult): FactorComparison {
  const Nb = refined.girderCount;
  const rows: ComparisonRow[] = [];
  for (let n = 1; n <= Nb; n++) {
    const kind: GirderKind = n === 1 || n === Nb ? 'exterior' : 'interior';
    const codeRows = codeRowsFor(code, n, kind, Nb);
    const grillageRows = refined.rows.filter((r) => r.girderNumber === n);
    const keys = new Map<string, { effect: FactorEffect; locationKey: string; location: string; lanes: 'one' | 'multiple' }>();
    for (const r of [...grillageRows, ...codeRows]) {
      if (!COMPARED.includes(r.effect)) continue;
      const k = `${r.effect}|${r.location.key}|${r.lanes}`;
      if (!keys.has(k)) keys.set(k, { effect: r.effect, locationKey: r.location.key, location: placeWords(r.location.description), lanes: r.lanes });
    }
    for (const key of keys.values()) {
      const match = (r: FactorRow) => r.effect === key.effect && r.location.key === key.locationKey && r.lanes === key.lanes;
      const c = codeRows.filter(match);
      const g = grillageRows.find(match);
      const byMethod = (m: FactorMethod) => {
        const list = c.filter((r) => r.method === m);
        return list.length ? Math.max(...list.map((r) => r.value)) : undefined;
      };
      const adopted = c.filter((r) => r.adopted);
      const codeValue = adoptedValue(c);
      const codeMethod = adopted.length ? adopted.reduce((a, b) => (b.value > a.value ? b : a)).method : undefined;
      const row: ComparisonRow = {
        girderNumber: n,
        girderKind: kind,
        effect: key.effect,
        locationKey: key.locationKey,
        location: key.location,
        lanes: key.lanes,
        ratios: {},
        findings: [],
      };
      const formula = byMethod('formula');
      const leverRule = byMethod('lever-rule');
      const rigidSection = byMethod('rigid-section');
      if (formula !== undefined) row.formula = formula;
      if (leverRule !== undefined) row.leverRule = leverRule;
      if (rigidSection !== undefined) row.rigidSection = rigidSection;
      if (codeValue !== undefined) row.code = codeValue;
      if (codeMethod !== undefined) row.codeMethod = codeMethod;
      if (g) {
        row.grillage = g.value;
        if (g.loadedLanes !== undefined) row.grillageLoadedLanes = g.loadedLanes;
      }
      const r = {
        toFormula: ratio(row.grillage, formula),
        toCode: ratio(row.grillage, codeValue),
        toLeverRule: ratio(row.grillage, leverRule),
        toRigidSection: ratio(row.grillage, rigidSection),
      };
      for (const [k, v] of Object.entries(r)) if (v !== undefined) (row.ratios as Record<string, number>)[k] = v;
      const seen = new Set<string>();
      for (const f of [...c.flatMap((x) => x.findings), ...refined.findings.filter((f) => 'effect' in f && f.effect === key.effect)]) {
        const id = `${f.code}|${f.message}`;
        if (seen.has(id)) continue;
        seen.add(id);
        row.findings.push(f as Finding | RefinedFinding);
      }
      rows.push(row);
    }
  }
  return { deckName: refined.deckName, rows, caution: RESULT_CAUTION };
}
