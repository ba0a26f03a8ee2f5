/** Display helpers for the review and training screens: factors and forces in the project's units. */
import { toDisplay, unitSymbol, type QuantityKind, type UnitSystem } from '@shared/units';
import { zeroIfNegligible } from '@shared/trace';

export function factorText(v: number): string {
  return Number.isFinite(v) ? v.toFixed(4) : '—';
}

/** An internal (SI) value shown in the project's unit system with its symbol. */
export function quantityText(value: number, kind: QuantityKind, units: UnitSystem, decimals?: number): string {
  const d = decimals ?? (kind === 'moment' || kind === 'force' ? 1 : kind === 'none' ? 4 : 3);
  // Round-off residue that rounds to zero at d decimals prints 0, never −0.000.
  const shown = zeroIfNegligible(toDisplay(value, kind, units), 0, d);
  const sym = unitSymbol(kind, units);
  const text = Math.abs(shown) >= 10000 ? shown.toLocaleString('en-US', { maximumFractionDigits: 0 }) : shown.toFixed(d);
  return sym ? (sym === '°' ? `${text}°` : `${text} ${sym}`) : text;
}

export const EFFECT_LABELS: Record<string, string> = {
  moment: 'moment',
  'negative-moment': 'negative moment',
  shear: 'shear',
  reaction: 'reaction',
  'fatigue-moment': 'fatigue moment',
  'fatigue-shear': 'fatigue shear',
  deflection: 'deflection',
};

export const METHOD_LABELS: Record<string, string> = {
  formula: 'empirical formula',
  'lever-rule': 'lever rule',
  'rigid-section': 'rigid section',
  'equal-share': 'equal share',
  'interior-minimum': 'not less than interior',
  grillage: 'grillage',
  governing: 'governing value',
};
