/**
 * Showing internal values in the user's unit system. The deck and every result are held in
 * internal SI units (shared/units.ts); this composable converts only what is shown and what
 * the user types — never what is stored.
 *
 * `formatInput` writes a value for an input box (plain digits, no grouping, enough
 * significant digits that re-reading it reproduces what was typed in the same system);
 * `format` writes a value for reading (grouped, a sensible number of decimals per kind).
 */
import { computed, type Ref } from 'vue';
import { fromDisplay, toDisplay, unitSymbol, type QuantityKind, type UnitSystem } from '@shared/units';
import { zeroIfNegligible } from '@shared/trace';
import { factorText } from '@shared/lrfd/words';

/** Significant digits kept in input boxes. */
const INPUT_SIGNIFICANT_DIGITS = 7;

/** An internal value → the text of an input box in `system` ('' for a missing value). */
export function formatInput(value: number | undefined | null, kind: QuantityKind, system: UnitSystem): string {
  if (value === undefined || value === null || Number.isNaN(value)) return '';
  if (!Number.isFinite(value)) return String(value);
  const shown = toDisplay(value, kind, system);
  if (shown === 0) return '0';
  const rounded = Number(shown.toPrecision(INPUT_SIGNIFICANT_DIGITS));
  const abs = Math.abs(rounded);
  if (abs >= 1e15 || abs < 1e-6) return rounded.toExponential().replace('e+', 'e');
  return String(rounded);
}

/**
 * Decimals an engineer writes a typed value to, per unit system and kind (ft to 3, in to 2,
 * kip-ft to 1; m to 3, mm to 1): an input box shows a value so while it is not being edited.
 */
const SHOWN_INPUT_DECIMALS: Record<UnitSystem, Partial<Record<QuantityKind, number>>> = {
  US: { length: 3, dimension: 2, area: 2, lengthSquared: 2, inertia: 1, stress: 2, unitWeight: 4, force: 2, moment: 1, lineLoad: 4, angle: 2, none: 4 },
  SI: { length: 3, dimension: 1, area: 0, lengthSquared: 3, inertia: 0, stress: 1, unitWeight: 2, force: 2, moment: 1, lineLoad: 3, angle: 2, none: 4 },
};

/**
 * An internal value → the text an input box shows while it is not being edited: at the
 * decimals an engineer writes (SHOWN_INPUT_DECIMALS), trailing zeros dropped. The stored value
 * is never rounded; `formatInput` gives its every digit (shown while editing). `rounded` says
 * whether the two differ.
 */
export function formatInputShown(value: number | undefined | null, kind: QuantityKind, system: UnitSystem): { text: string; rounded: boolean } {
  const full = formatInput(value, kind, system);
  if (value === undefined || value === null || !Number.isFinite(value)) return { text: full, rounded: false };
  const d = SHOWN_INPUT_DECIMALS[system][kind] ?? 4;
  const shown = toDisplay(value, kind, system);
  const abs = Math.abs(shown);
  // tiny values keep their significant digits rather than read 0
  if (abs !== 0 && abs < 10 ** -d) return { text: full, rounded: false };
  const text = String(Number(shown.toFixed(d)));
  return { text, rounded: Number(text) !== Number(full) };
}

/**
 * The text of an input box in `system` → an internal value. Empty text gives undefined;
 * text that is not a number gives NaN (the schema then names the field and the rule).
 * Accepts a decimal comma, spaces and thin spaces as digit groups, and a leading "+".
 */
export function parseInput(text: string, kind: QuantityKind, system: UnitSystem): number | undefined {
  const t = text.trim().replace(/[\s\u2009\u202f_]/g, '').replace(/^\+/, '').replace(/^−/, '-');
  if (t === '') return undefined;
  const normalised = /^-?\d+,\d+$/.test(t) ? t.replace(',', '.') : t;
  if (!/^-?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(normalised)) return Number.NaN;
  return fromDisplay(Number(normalised), kind, system);
}

/** Decimals for reading, per kind and system (values shown in display units). */
const READ_DECIMALS: Record<UnitSystem, Partial<Record<QuantityKind, number>>> = {
  US: { length: 2, dimension: 2, area: 1, lengthSquared: 1, inertia: 0, stress: 0, unitWeight: 3, force: 1, moment: 1, lineLoad: 3, angle: 1, none: 3 },
  SI: { length: 3, dimension: 1, area: 0, lengthSquared: 3, inertia: 0, stress: 0, unitWeight: 1, force: 1, moment: 1, lineLoad: 2, angle: 1, none: 3 },
};

/** An internal value as text for reading, with its unit symbol unless `withUnit` is false. */
/**
 * A number as an engineer writes it, never with an exponent: grouped thousands
 * ("24,000,000,000" mm⁴), `decimals` places, and a value too small for them given three
 * significant digits ("0.000400"); below 1e-9 of the unit it is round-off and reads 0.
 */
export function plainNumber(value: number, decimals: number): string {
  const abs = Math.abs(value);
  const tiny = abs !== 0 && abs < 10 ** -decimals;
  const places = !tiny ? decimals : abs < 1e-9 ? decimals : Math.min(12, Math.ceil(-Math.log10(abs)) + 2);
  const shown = tiny && abs < 1e-9 ? 0 : value;
  return shown.toLocaleString('en-US', { minimumFractionDigits: places, maximumFractionDigits: places });
}

export function formatValue(
  value: number | undefined | null,
  kind: QuantityKind,
  system: UnitSystem,
  options: { decimals?: number; withUnit?: boolean; zeroBelowPrecision?: boolean } = {},
): string {
  if (value === undefined || value === null || !Number.isFinite(value)) return '—';
  const decimals = options.decimals ?? READ_DECIMALS[system][kind] ?? 3;
  const raw = toDisplay(value, kind, system);
  // In traces, a value that rounds to zero at the decimals shown reads 0, not 3.6e-16.
  const shown = options.zeroBelowPrecision ? zeroIfNegligible(raw, 0, decimals) : raw;
  const text = plainNumber(shown, decimals);
  const symbol = unitSymbol(kind, system);
  if (options.withUnit === false || !symbol) return text;
  return kind === 'angle' ? `${text}°` : `${text} ${symbol}`;
}

/**
 * A distribution factor (lanes per girder) as text: the one rule of the review, the version
 * comparison and the package (`factorText`, shared/lrfd/words.ts: 4 decimals), so a value on
 * screen reads as it is printed everywhere else.
 */
export function formatFactor(value: number | undefined | null): string {
  if (value === undefined || value === null) return '—';
  return factorText(value);
}

/** Helpers bound to a reactive unit system. */
export function useUnits(system: Ref<UnitSystem>) {
  return {
    system,
    symbol: (kind: QuantityKind) => unitSymbol(kind, system.value),
    show: (value: number, kind: QuantityKind) => toDisplay(value, kind, system.value),
    internal: (value: number, kind: QuantityKind) => fromDisplay(value, kind, system.value),
    format: (value: number | undefined | null, kind: QuantityKind, options?: { decimals?: number; withUnit?: boolean }) =>
      formatValue(value, kind, system.value, options),
    formatInput: (value: number | undefined | null, kind: QuantityKind) => formatInput(value, kind, system.value),
    parseInput: (text: string, kind: QuantityKind) => parseInput(text, kind, system.value),
    label: computed(() => (system.value === 'US' ? 'US customary' : 'SI')),
  };
}
