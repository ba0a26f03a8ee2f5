/**
 * Lengths inside the solver's sentences (findings, trace labels), shown in the reader's unit
 * system. The solver works in SI and does not know who will read it, so a length in a
 * sentence is written as a token holding metres — `lengthInText(73.65)` → "{{len:73.65}}" —
 * and every place that shows the sentence (workspace, review, package, CSV, command line)
 * passes it through `showLengths(text, units)`: "241.63 ft" in a US customary project,
 * "73.650 m" in an SI one. Precision as an engineer writes lengths: ft to 2 decimals, m to 3.
 * Text without tokens (older stored results, code findings) is returned unchanged.
 * Units: the token's number is metres.
 */
import { toUs, type UnitSystem } from '../units.js';

const TOKEN = /\{\{len:(-?[0-9.eE+-]+)\}\}/g;

/** A length (m) inside a sentence, to be shown in the reader's units. */
export function lengthInText(metres: number): string {
  return `{{len:${metres}}}`;
}

/** The sentence with every length token shown in `units` (ft to 2 decimals, m to 3). */
export function showLengths(text: string, units: UnitSystem): string {
  if (!text.includes('{{len:')) return text;
  return text.replace(TOKEN, (_, v: string) => {
    const m = Number(v);
    if (!Number.isFinite(m)) return v;
    return units === 'US' ? `${toUs.ft(m).toFixed(2)} ft` : `${m.toFixed(3)} m`;
  });
}
