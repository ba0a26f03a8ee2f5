/**
 * Load combinations for girder design: Strength I, Service I, Service II, Fatigue I and
 * Fatigue II (AASHTO LRFD Table 3.4.1-1 and Table 3.4.1-2), with the load modifier η
 * (Art. 1.3.2.1).
 *
 * Units: effects are passed and returned in internal SI (N·m for moments, N for shears and
 * reactions); factors are dimensionless. LL means the girder LL+IM effect (the dynamic load
 * allowance is already in it): the HL-93 envelope for strength and service, the fatigue
 * truck envelope for fatigue.
 *
 * Load factors (Table 3.4.1-1, permanent loads Table 3.4.1-2):
 *   Strength I   γDC 1.25 / 0.90, γDW 1.50 / 0.65, γLL 1.75
 *   Service I    γDC 1.00, γDW 1.00, γLL 1.00
 *   Service II   γDC 1.00, γDW 1.00, γLL 1.30
 *   Fatigue I    γLL 1.75 (7th edition, 2014, and later); 1.50 in earlier editions
 *   Fatigue II   γLL 0.80 (7th edition, 2014, and later); 0.75 in earlier editions
 *   (the earlier-edition values are from memory). Permanent loads do not enter the
 *   fatigue combinations, which take the live-load range.
 *
 * Load modifier (Art. 1.3.2.1, 1.3.3–1.3.5): η = ηD·ηR·ηI ≥ 0.95 where the maximum load
 * factor applies, 1/(ηD·ηR·ηI) ≤ 1.0 where the minimum applies. ηD, ηR and ηI are 1.00
 * for every limit state other than strength (and extreme event), so η enters Strength I
 * only here. Each defaults to 1.00 and may be set (≥ 0.95, the code's lowest value).
 */
import { DeckInputError } from '../deck/schema.js';
import type { QuantityKind } from '../units.js';
import type { TraceStep } from '../trace.js';
import type { GirderLiveLoadEffects, GirderPoint } from './girderEffects.js';

export type LimitState = 'Strength I' | 'Service I' | 'Service II' | 'Fatigue I' | 'Fatigue II';
export const LIMIT_STATES: readonly LimitState[] = ['Strength I', 'Service I', 'Service II', 'Fatigue I', 'Fatigue II'];

/** '2014-and-later': 7th edition (2014) onwards; 'before-2014': earlier editions with Fatigue I and II. */
export type SpecificationEdition = '2014-and-later' | 'before-2014';
export const DEFAULT_EDITION: SpecificationEdition = '2014-and-later';

export interface PermanentLoadFactor {
  max: number;
  min: number;
}

export interface LimitStateFactors {
  limitState: LimitState;
  edition: SpecificationEdition;
  /** γLL, applied to LL+IM. */
  liveLoad: number;
  /** γp for components and attachments (absent for fatigue). */
  DC?: PermanentLoadFactor;
  /** γp for wearing surfaces and utilities (absent for fatigue). */
  DW?: PermanentLoadFactor;
  /** Fatigue limit states combine the live-load range. */
  fatigue: boolean;
  /** The load modifier η applies (strength limit states). */
  usesLoadModifier: boolean;
  trace: TraceStep[];
}

function checkLimitState(ls: unknown): LimitState {
  if (!LIMIT_STATES.includes(ls as LimitState)) {
    throw new DeckInputError(['limitState'], `limit state must be one of ${LIMIT_STATES.join(', ')} (got ${String(ls)})`);
  }
  return ls as LimitState;
}

function checkEdition(e: unknown): SpecificationEdition {
  if (e === undefined) return DEFAULT_EDITION;
  if (e !== '2014-and-later' && e !== 'before-2014') {
    throw new DeckInputError(['edition'], `edition must be '2014-and-later' or 'before-2014' (got ${String(e)})`);
  }
  return e;
}

/** Load factors of one limit state (Table 3.4.1-1, Table 3.4.1-2). */
export function limitStateFactors(limitState: LimitState, edition?: SpecificationEdition): LimitStateFactors {
  const ls = checkLimitState(limitState);
  const ed = checkEdition(edition);
  const later = ed === '2014-and-later';
  const editionText = later ? '7th edition (2014) and later' : 'editions before 2014';
  let f: Omit<LimitStateFactors, 'trace' | 'limitState' | 'edition'>;
  switch (ls) {
    case 'Strength I':
      f = { liveLoad: 1.75, DC: { max: 1.25, min: 0.9 }, DW: { max: 1.5, min: 0.65 }, fatigue: false, usesLoadModifier: true };
      break;
    case 'Service I':
      f = { liveLoad: 1.0, DC: { max: 1.0, min: 1.0 }, DW: { max: 1.0, min: 1.0 }, fatigue: false, usesLoadModifier: false };
      break;
    case 'Service II':
      f = { liveLoad: 1.3, DC: { max: 1.0, min: 1.0 }, DW: { max: 1.0, min: 1.0 }, fatigue: false, usesLoadModifier: false };
      break;
    case 'Fatigue I':
      f = { liveLoad: later ? 1.75 : 1.5, fatigue: true, usesLoadModifier: false };
      break;
    case 'Fatigue II':
      f = { liveLoad: later ? 0.8 : 0.75, fatigue: true, usesLoadModifier: false };
      break;
  }
  const trace: TraceStep[] = [
    {
      label: `${ls}: live-load factor γLL`,
      formula: 'γLL from Table 3.4.1-1',
      inputs: [],
      value: f.liveLoad,
      kind: 'none',
      article: 'Table 3.4.1-1',
      note: f.fatigue ? `${editionText}; applied to the LL+IM range of the fatigue truck` : undefined,
    },
  ];
  if (f.DC && f.DW) {
    trace.push({
      label: `${ls}: permanent-load factors γp`,
      formula: ls === 'Strength I' ? 'DC 1.25 (max) / 0.90 (min); DW 1.50 (max) / 0.65 (min)' : 'DC 1.00; DW 1.00',
      inputs: [],
      value: f.DC.max,
      kind: 'none',
      article: ls === 'Strength I' ? 'Table 3.4.1-2' : 'Table 3.4.1-1',
    });
  }
  return { limitState: ls, edition: ed, ...f, trace };
}

export interface LoadModifierInput {
  /** ηD, ductility (Art. 1.3.3), default 1.00. */
  ductility?: number;
  /** ηR, redundancy (Art. 1.3.4), default 1.00. */
  redundancy?: number;
  /** ηI, operational importance (Art. 1.3.5), default 1.00. */
  importance?: number;
}

export interface LoadModifier {
  /** η for loads whose maximum factor applies: ηD·ηR·ηI, not less than 0.95 (Eq. 1.3.2.1-2). */
  eta: number;
  /** η for loads whose minimum factor applies: 1/(ηD·ηR·ηI), not more than 1.0 (Eq. 1.3.2.1-3). */
  etaForMinimum: number;
  trace: TraceStep[];
}

/**
 * Load modifier for a limit state (Art. 1.3.2.1). For limit states other than strength,
 * ηD = ηR = ηI = 1.00 (Art. 1.3.3–1.3.5) whatever is set.
 */
export function loadModifier(limitState: LimitState, modifiers: LoadModifierInput = {}): LoadModifier {
  const ls = checkLimitState(limitState);
  const read = (name: keyof LoadModifierInput, symbol: string, article: string): number => {
    const v = modifiers[name];
    if (v === undefined) return 1;
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0.95) {
      throw new DeckInputError(['loadModifiers', name], `${symbol} must be a finite number not less than 0.95 (${article}); got ${String(v)}`);
    }
    return v;
  };
  const d = read('ductility', 'ηD', 'Art. 1.3.3');
  const r = read('redundancy', 'ηR', 'Art. 1.3.4');
  const i = read('importance', 'ηI', 'Art. 1.3.5');
  const strength = ls.startsWith('Strength');
  const product = strength ? d * r * i : 1;
  const eta = Math.max(product, 0.95);
  const etaForMinimum = Math.min(1 / product, 1);
  const trace: TraceStep[] = [
    {
      label: `${ls}: load modifier η`,
      formula: strength ? 'η = ηD·ηR·ηI ≥ 0.95 (maximum factors); 1/(ηD·ηR·ηI) ≤ 1.0 (minimum factors)' : 'ηD = ηR = ηI = 1.00 for limit states other than strength',
      inputs: strength
        ? [
            { symbol: 'ηD', description: 'ductility', value: d, kind: 'none' },
            { symbol: 'ηR', description: 'redundancy', value: r, kind: 'none' },
            { symbol: 'ηI', description: 'operational importance', value: i, kind: 'none' },
          ]
        : [],
      value: eta,
      kind: 'none',
      article: strength ? 'Art. 1.3.2.1, Eq. 1.3.2.1-2 and 1.3.2.1-3' : 'Art. 1.3.3, 1.3.4, 1.3.5',
      note: strength && product < 0.95 ? `ηD·ηR·ηI = ${product.toFixed(4)} is raised to 0.95` : undefined,
    },
  ];
  return { eta, etaForMinimum, trace };
}

export interface CombinationInput {
  /** Girder LL+IM extremes (HL-93 for strength and service, fatigue truck for fatigue), N·m or N. */
  liveLoad: { max: number; min: number };
  /** Unfactored effect of components and attachments, same unit (optional). */
  DC?: number;
  /** Unfactored effect of wearing surfaces and utilities, same unit (optional). */
  DW?: number;
}

export interface CombinationOptions {
  edition?: SpecificationEdition;
  modifiers?: LoadModifierInput;
  /** Quantity kind of the effect, for the trace ('moment' or 'force'); default 'moment'. */
  kind?: QuantityKind;
  /** What the effect is, for the trace labels, e.g. "moment at 0.40 L of span 1". */
  label?: string;
}

export interface CombinedEffect {
  limitState: LimitState;
  /** Factored maximum Σ ηᵢ·γᵢ·Qᵢ, N·m or N. */
  max: number;
  /** Factored minimum, N·m or N. */
  min: number;
  /** Fatigue: factored live-load range γLL·(max − min), N·m or N. */
  range?: number;
  trace: TraceStep[];
}

function finiteOrUndefined(v: unknown, field: string): number | undefined {
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new DeckInputError([field], `${field} effect must be a finite number (got ${String(v)})`);
  return v;
}

/**
 * Factored effects of one limit state, Σ ηᵢ·γᵢ·Qᵢ (Art. 1.3.2.1, Eq. 1.3.2.1-1, 3.4.1-1).
 * Each permanent load takes the factor (maximum or minimum) that makes the extreme more
 * extreme, with η or 1/η to match; the live load takes γLL with η.
 * @param input unfactored effects (N·m or N), LL already including IM and the distribution factor
 */
export function combineEffects(limitState: LimitState, input: CombinationInput, options: CombinationOptions = {}): CombinedEffect {
  const f = limitStateFactors(limitState, options.edition);
  const m = loadModifier(limitState, options.modifiers);
  if (!input || !input.liveLoad) throw new DeckInputError(['liveLoad'], 'the live-load effect (max and min) is required');
  const llMax = finiteOrUndefined(input.liveLoad.max, 'liveLoad.max');
  const llMin = finiteOrUndefined(input.liveLoad.min, 'liveLoad.min');
  if (llMax === undefined || llMin === undefined) throw new DeckInputError(['liveLoad'], 'the live-load effect needs both max and min');
  if (llMax < llMin) throw new DeckInputError(['liveLoad'], `the live-load maximum (${llMax}) is less than the minimum (${llMin})`);
  const dc = finiteOrUndefined(input.DC, 'DC');
  const dw = finiteOrUndefined(input.DW, 'DW');
  const kind = options.kind ?? 'moment';
  const what = options.label ? `, ${options.label}` : '';
  const trace: TraceStep[] = [...f.trace, ...m.trace];
  const gLL = f.liveLoad;
  if (f.fatigue) {
    const range = gLL * (llMax - llMin);
    trace.push({
      label: `${limitState}: factored live-load range${what}`,
      formula: 'γLL·[(LL+IM)max − (LL+IM)min]',
      inputs: [
        { symbol: 'γLL', value: gLL, kind: 'none' },
        { symbol: '(LL+IM)max', value: llMax, kind },
        { symbol: '(LL+IM)min', value: llMin, kind },
      ],
      value: range,
      kind,
      article: 'Table 3.4.1-1, Art. 3.6.1.4.1',
      note: dc !== undefined || dw !== undefined ? 'permanent loads do not enter the fatigue load combinations (Table 3.4.1-1): DC and DW not used' : undefined,
    });
    return { limitState, max: gLL * llMax, min: gLL * llMin, range, trace };
  }
  // Permanent load term for the maximum (sense +1) or the minimum (sense −1).
  const permanent = (q: number | undefined, factor: PermanentLoadFactor | undefined, sense: 1 | -1): { value: number; gamma: number; eta: number } => {
    if (q === undefined || !factor) return { value: 0, gamma: 0, eta: 1 };
    const useMax = sense * q >= 0; // the larger factor makes this extreme more extreme
    const gamma = useMax ? factor.max : factor.min;
    const eta = f.usesLoadModifier ? (useMax ? m.eta : m.etaForMinimum) : 1;
    return { value: eta * gamma * q, gamma, eta };
  };
  const etaLL = f.usesLoadModifier ? m.eta : 1;
  const build = (sense: 1 | -1) => {
    const ll = sense > 0 ? llMax : llMin;
    const pDC = permanent(dc, f.DC, sense);
    const pDW = permanent(dw, f.DW, sense);
    const value = pDC.value + pDW.value + etaLL * gLL * ll;
    const inputs = [
      { symbol: 'γLL', value: gLL, kind: 'none' as const },
      { symbol: 'LL+IM', value: ll, kind },
    ];
    if (dc !== undefined) inputs.push({ symbol: 'γDC', value: pDC.gamma, kind: 'none' }, { symbol: 'DC', value: dc, kind });
    if (dw !== undefined) inputs.push({ symbol: 'γDW', value: pDW.gamma, kind: 'none' }, { symbol: 'DW', value: dw, kind });
    if (f.usesLoadModifier) inputs.push({ symbol: 'η', value: etaLL, kind: 'none' });
    trace.push({
      label: `${limitState}: factored ${sense > 0 ? 'maximum' : 'minimum'}${what}`,
      formula: `${f.usesLoadModifier ? 'η·' : ''}γLL·(LL+IM)${dc !== undefined ? ' + ηᵢ·γDC·DC' : ''}${dw !== undefined ? ' + ηᵢ·γDW·DW' : ''}`,
      inputs,
      value,
      kind,
      article: 'Art. 1.3.2.1, Table 3.4.1-1, Table 3.4.1-2',
    });
    return value;
  };
  const max = build(1);
  const min = build(-1);
  return { limitState, max, min, trace };
}

/** Unfactored permanent effects at a girder point, N·m (moment) and N (shear). */
export interface PermanentEffects {
  moment?: { DC?: number; DW?: number };
  shear?: { DC?: number; DW?: number };
}

export interface GirderLimitStatePoint {
  span: number;
  fraction: number;
  x: number;
  moment: CombinedEffect;
  shear: CombinedEffect;
}

/**
 * One limit state at every point of a girder. Strength and service use the HL-93 girder
 * envelopes; fatigue uses the fatigue envelopes, which need the fatigue factors.
 * @param permanent unfactored DC and DW effects at a point (optional)
 */
export function girderLimitState(
  girder: GirderLiveLoadEffects,
  limitState: LimitState,
  options: Omit<CombinationOptions, 'kind' | 'label'> & { permanent?: (point: GirderPoint) => PermanentEffects } = {},
): GirderLimitStatePoint[] {
  const f = limitStateFactors(limitState, options.edition);
  return girder.points.map((p) => {
    const where = `${p.fraction.toFixed(2)} L of span ${p.span + 1}`;
    const mEnv = f.fatigue ? p.fatigueMoment : p.moment;
    const vEnv = f.fatigue ? p.fatigueShear : p.shear;
    if (!mEnv || !vEnv) {
      throw new DeckInputError(['factors', !mEnv ? 'fatigueMoment' : 'fatigueShear'], `${limitState} needs the girder fatigue effects: give the fatigue distribution factors`);
    }
    const perm = options.permanent ? options.permanent(p) : {};
    const common = { edition: options.edition, modifiers: options.modifiers };
    return {
      span: p.span,
      fraction: p.fraction,
      x: p.x,
      moment: combineEffects(limitState, { liveLoad: { max: mEnv.max.value, min: mEnv.min.value }, ...perm.moment }, { ...common, kind: 'moment', label: `moment at ${where}` }),
      shear: combineEffects(limitState, { liveLoad: { max: vEnv.max.value, min: vEnv.min.value }, ...perm.shear }, { ...common, kind: 'force', label: `shear at ${where}` }),
    };
  });
}
