/** Display helpers for the review and training screens: factors and forces in the project's units. */
import { toDisplay, unitSymbol, type QuantityKind, type UnitSystem } from '@shared/units';
import { zeroIfNegligible } from '@shared/trace';

// The factor's words and its 4-decimal text are shared with the package and the version comparison.
export { EFFECT_LABELS, METHOD_LABELS, boundText, factorText, ratioText } from '@shared/lrfd/words';

/** An internal (SI) value shown in the project's unit system with its symbol. */
export function quantityText(value: number, kind: QuantityKind, units: UnitSystem, decimals?: number): string {
  const d = decimals ?? (kind === 'moment' || kind === 'force' ? 1 : kind === 'none' ? 4 : 3);
  // Round-off residue that rounds to zero at d decimals prints 0, never −0.000.
  const shown = zeroIfNegligible(toDisplay(value, kind, units), 0, d);
  const sym = unitSymbol(kind, units);
  const text = Math.abs(shown) >= 10000 ? shown.toLocaleString('en-US', { maximumFractionDigits: 0 }) : shown.toFixed(d);
  return sym ? (sym === '°' ? `${text}°` : `${text} ${sym}`) : text;
}
