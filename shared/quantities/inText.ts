/**
 * Lengths inside the solver's sentences (findings, trace labels), shown in the reader's unit
 * system. The solver works in SI and does not know who will read it, so a length in a
 * sentence is written as a token holding metres — `lengthInText(73.65)` → "{{len:73.65}}" —
 * and every place that shows the sentence (workspace, review, package, CSV, command line)
 * passes it through `showLengths(text, units)`: "241.63 ft" in a US customary project,
 * "73.650 m" in an SI one. Precision as an engineer writes lengths: ft to 2 decimals, m to 3.
 * Other quantities (the axle loads and spacings in a formula, say) are tokens too —
 * `quantityInText(142.3e3, 'force')` → "{{q:force:142300}}" → "32.0 kip" or "142.3 kN".
 * Text without tokens (older stored results, code findings) is returned unchanged.
 * Units: a length token's number is metres; a quantity token's is its internal SI value.
 */
import { toDisplay, toUs, unitSymbol, type QuantityKind, type UnitSystem } from '../units.js';

const TOKEN = /\{\{len:(-?[0-9.eE+-]+)\}\}/g;
const QUANTITY = /\{\{q:([a-zA-Z]+):(-?[0-9.eE+-]+)\}\}/g;

/** Decimals of a quantity inside a sentence, per unit system (as an engineer writes them). */
const DECIMALS: Record<UnitSystem, Partial<Record<QuantityKind, number>>> = {
  US: { length: 2, dimension: 2, force: 1, moment: 1, lineLoad: 3, stress: 2, area: 1, inertia: 0, lengthSquared: 1, unitWeight: 3 },
  SI: { length: 3, dimension: 0, force: 1, moment: 1, lineLoad: 2, stress: 1, area: 0, inertia: 0, lengthSquared: 2, unitWeight: 1 },
};

/** A length (m) inside a sentence, to be shown in the reader's units. */
export function lengthInText(metres: number): string {
  return `{{len:${metres}}}`;
}

/** Any quantity (internal SI value) inside a sentence or a formula, to be shown in the reader's units. */
export function quantityInText(value: number, kind: QuantityKind): string {
  return kind === 'length' ? lengthInText(value) : `{{q:${kind}:${value}}}`;
}

function quantityText(value: number, kind: QuantityKind, units: UnitSystem): string {
  const shown = toDisplay(value, kind, units);
  const decimals = DECIMALS[units][kind] ?? 3;
  const number = Math.abs(shown) >= 1000 ? shown.toLocaleString('en-US', { maximumFractionDigits: decimals, minimumFractionDigits: decimals }) : shown.toFixed(decimals);
  return `${number} ${unitSymbol(kind, units)}`.trim();
}

/** The sentence with every length and quantity token shown in `units` (lengths: ft to 2 decimals, m to 3). */
export function showLengths(text: string, units: UnitSystem): string {
  if (!text.includes('{{')) return text;
  return text
    .replace(TOKEN, (_, v: string) => {
      const m = Number(v);
      if (!Number.isFinite(m)) return v;
      return units === 'US' ? `${toUs.ft(m).toFixed(2)} ft` : `${m.toFixed(3)} m`;
    })
    .replace(QUANTITY, (all, kind: string, v: string) => {
      const x = Number(v);
      if (!Number.isFinite(x) || !(kind in DECIMALS.US)) return all;
      return quantityText(x, kind as QuantityKind, units);
    });
}
