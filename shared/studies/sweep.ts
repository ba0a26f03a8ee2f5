/**
 * Parameter studies: a sweep of one or two deck parameters over a range or a list, the points
 * it makes, and each point's deck (pure: deck → deck).
 *
 * Units: internal SI, as the deck (shared/units.ts): lengths in m (span, spacing, overhang),
 * slab thickness in m, girder moment of inertia I in m⁴, skew in degrees. A range runs from
 * `from` to `to` (inclusive, within a round-off of 1e-9 of the step) by a positive `step`;
 * a list is taken in its order. With two parameters the points form a grid, the first
 * parameter varying slowest.
 *
 * Kg is swept through the girder's own moment of inertia I (Kg = n·(I + A·eg²), AASHTO LRFD
 * Eq. 4.6.2.2.1-1); the deck's other properties stay as saved.
 */
import { z } from 'zod';
import type { DeckInput } from '../deck/schema.js';
import type { QuantityKind } from '../units.js';
import { formatBound } from '../deck/limits.js';

export const STUDY_PARAMETERS = ['skew', 'girderSpacing', 'spanLength', 'firstSpanLength', 'overhang', 'slabThickness', 'girderInertia'] as const;
export type StudyParameter = (typeof STUDY_PARAMETERS)[number];

/** Plain words and the kind of quantity of each parameter (for the display units). */
export const STUDY_PARAMETER_INFO: Record<StudyParameter, { label: string; kind: QuantityKind }> = {
  skew: { label: 'skew of every support line', kind: 'angle' },
  girderSpacing: { label: 'girder spacing (girder count held)', kind: 'length' },
  spanLength: { label: 'span length (every span in proportion to span 1)', kind: 'length' },
  firstSpanLength: { label: 'length of span 1 only', kind: 'length' },
  overhang: { label: 'overhang (both sides)', kind: 'length' },
  slabThickness: { label: 'slab thickness ts', kind: 'dimension' },
  girderInertia: { label: 'girder moment of inertia I (moves Kg)', kind: 'inertia' },
};

/** The most points one study may have (the firm's limit). */
export const STUDY_POINT_LIMIT = 2000;

/** How the grillage is run over the points. */
export const STUDY_GRILLAGE = ['none', 'all', 'outside-range'] as const;
export type StudyGrillage = (typeof STUDY_GRILLAGE)[number];

const finite = (what: string) => z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`);

const valuesSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('range'), from: finite('from'), to: finite('to'), step: finite('step').gt(0, 'the step must be greater than 0') }),
    z.strictObject({
      kind: z.literal('list'),
      values: z.array(finite('each listed value'), { error: 'values must be a list of numbers' }).min(1, 'the list needs at least one value').max(STUDY_POINT_LIMIT, `at most ${STUDY_POINT_LIMIT} listed values`),
    }),
  ],
  { error: "values must be { kind: 'range', from, to, step } or { kind: 'list', values }" },
);

export const studyAxisSchema = z.strictObject(
  {
    parameter: z.enum(STUDY_PARAMETERS, { error: `parameter must be one of ${STUDY_PARAMETERS.join(', ')}` }),
    values: valuesSchema,
  },
  { error: 'each axis must be an object with a parameter and its values' },
);

export const sweepSchema = z.strictObject({
  axes: z.array(studyAxisSchema, { error: 'axes must be a list of one or two swept parameters' }).min(1, 'a study sweeps one or two parameters').max(2, 'a study sweeps at most two parameters'),
  grillage: z.enum(STUDY_GRILLAGE, { error: "grillage must be 'none', 'all' or 'outside-range'" }).default('none'),
}, { error: 'sweep must be an object with its axes and its grillage choice' }).superRefine((s, ctx) => {
  if (s.axes.length === 2 && s.axes[0].parameter === s.axes[1].parameter) {
    ctx.addIssue({ code: 'custom', path: ['axes', 1, 'parameter'], message: 'the two swept parameters must differ' });
  }
});

export type StudyAxis = z.output<typeof studyAxisSchema>;
export type Sweep = z.output<typeof sweepSchema>;
export type SweepInput = z.input<typeof sweepSchema>;

/** A sweep that makes no points or too many; `path` names the field, `message` what to change. */
export class SweepError extends Error {
  constructor(readonly path: (string | number)[], message: string) {
    super(message);
    this.name = 'SweepError';
  }
}

/** The values of one axis, in order. */
export function axisValues(axis: StudyAxis): number[] {
  const v = axis.values;
  if (v.kind === 'list') return v.values.slice();
  if (v.to < v.from) return [];
  const n = Math.floor((v.to - v.from) / v.step + 1e-9) + 1;
  if (n > STUDY_POINT_LIMIT * STUDY_POINT_LIMIT) return new Array<number>(STUDY_POINT_LIMIT + 1).fill(v.from);
  return Array.from({ length: n }, (_, i) => v.from + i * v.step);
}

/** One point of a study: its index and its value of each swept parameter (internal units). */
export interface StudyPoint {
  index: number;
  values: number[];
}

/** A step that gives at most `limit` points over [from, to], rounded up to 1, 2 or 5 × 10ⁿ. */
function coarserStep(from: number, to: number, limit: number): number {
  const raw = (to - from) / Math.max(1, limit - 1);
  const decade = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (m * decade >= raw * (1 - 1e-12)) return m * decade;
  return 10 * decade;
}

/** A step in words, in both unit systems (the solver does not know its reader's units). */
function stepText(step: number, parameter: StudyParameter): string {
  const kind = STUDY_PARAMETER_INFO[parameter].kind;
  if (kind === 'angle') return `${Number(step.toPrecision(4))}°`;
  return formatBound(step, kind === 'length' || kind === 'dimension' || kind === 'inertia' ? kind : 'none');
}

function tooMany(sweep: Sweep, counts: number[], limit: number): SweepError {
  const total = counts.reduce((a, b) => a * b, 1);
  const perAxis = sweep.axes.length === 1 ? limit : Math.floor(Math.sqrt(limit));
  const hints = sweep.axes.map((axis, i) => {
    const v = axis.values;
    if (counts[i] <= perAxis) return null;
    return v.kind === 'range' ? `a step of ${stepText(coarserStep(v.from, v.to, perAxis), axis.parameter)} for parameter ${i + 1}` : `at most ${perAxis} listed values for parameter ${i + 1}`;
  }).filter((h): h is string => h !== null);
  const i = counts.findIndex((c) => c > perAxis);
  return new SweepError(['axes', Math.max(0, i), 'values'], `the study has ${total.toLocaleString('en-US')} points, more than this firm's limit of ${limit.toLocaleString('en-US')}: try ${hints.join(' and ') || 'fewer values'} `);
}

/** Every point of a sweep, or a SweepError for none or more than `limit`. */
export function studyPoints(sweep: Sweep, limit = STUDY_POINT_LIMIT): StudyPoint[] {
  const lists = sweep.axes.map(axisValues);
  lists.forEach((l, i) => {
    if (l.length === 0) throw new SweepError(['axes', i, 'values'], `parameter ${i + 1} (${STUDY_PARAMETER_INFO[sweep.axes[i].parameter].label}) has no points: its range ends before it starts (to is less than from)`);
  });
  const counts = lists.map((l) => l.length);
  if (counts.reduce((a, b) => a * b, 1) > limit) throw tooMany(sweep, counts, limit);
  if (lists.length === 1) return lists[0].map((v, index) => ({ index, values: [v] }));
  const out: StudyPoint[] = [];
  for (const a of lists[0]) for (const b of lists[1]) out.push({ index: out.length, values: [a, b] });
  return out;
}

/** Set one parameter on a deck (in place on a copy the caller owns). */
function setParameter(deck: DeckInput, parameter: StudyParameter, value: number): void {
  switch (parameter) {
    case 'skew':
      deck.supports = deck.supports.map((s) => ({ ...s, skew: value }));
      return;
    case 'girderSpacing':
      if (deck.girders.kind !== 'uniform') throw new SweepError(['axes'], 'a sweep of girder spacing needs a deck with equally spaced girders (count and spacing), not girder offsets');
      deck.girders = { ...deck.girders, spacing: value };
      return;
    case 'spanLength': {
      const first = deck.spans[0].length;
      deck.spans = deck.spans.map((s) => ({ ...s, length: (s.length / first) * value }));
      return;
    }
    case 'firstSpanLength':
      deck.spans = deck.spans.map((s, i) => (i === 0 ? { ...s, length: value } : s));
      return;
    case 'overhang':
      deck.overhangLeft = value;
      deck.overhangRight = value;
      return;
    case 'slabThickness':
      deck.slab = { ...deck.slab, thickness: value };
      return;
    case 'girderInertia':
      deck.section = { ...deck.section, inertia: value };
      return;
  }
}

/** The deck of one point: the saved deck with each swept parameter set (the input is not changed). */
export function deckAtPoint(deck: DeckInput, sweep: Sweep, values: readonly number[]): DeckInput {
  const copy = structuredClone(deck);
  sweep.axes.forEach((axis, i) => setParameter(copy, axis.parameter, values[i]));
  return copy;
}

/** Validate a sweep; returns it (defaults applied) or the issues with their paths (never throws). */
export function parseSweep(input: unknown): { ok: true; sweep: Sweep } | { ok: false; issues: { path: (string | number)[]; message: string }[] } {
  const r = sweepSchema.safeParse(input);
  if (r.success) return { ok: true, sweep: r.data };
  return { ok: false, issues: r.error.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: i.message })) };
}
