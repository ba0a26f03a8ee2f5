/**
 * Training exercises: what an instructor may ask about a deck version, and what a trainee
 * sends back. Two kinds of question:
 * - 'factor': one code-method distribution factor, named by girder (interior or exterior),
 *   effect, lane case, method, place and — on a skewed deck — with or before the skew
 *   correction, e.g. "the lever-rule shear factor of the exterior girder (girder 1) with one
 *   loaded lane, in span 1, before the skew correction";
 * - 'truck-position': the governing transverse position of the design lanes and wheel lines
 *   for one girder on its lever-rule or rigid-section line — the trainee gives the placement
 *   (lane edges and wheel offsets, m) and the factor it produces.
 * Placements use the shared placement model (shared/placement/rules.ts): lane left edge y
 * from girder 1 and the left wheel line's offset from that edge, both in m.
 */
import { z } from 'zod';
import { personText } from '../../../shared/text.js';

export const FACTOR_EFFECTS = ['moment', 'negative-moment', 'shear', 'reaction', 'fatigue-moment', 'fatigue-shear', 'deflection'] as const;
export const FACTOR_METHODS = ['governing', 'formula', 'lever-rule', 'rigid-section', 'equal-share'] as const;

/** Text a person types (shared/text.ts): NFC, no control or bidirectional-override characters; fields over 200 characters may hold lines. */
const text = (what: string, max: number) => personText(what, max, { multiline: max > 200 });
const id = (what: string) => z.number({ error: `${what} must be a number` }).int(`${what} must be a whole number`).positive(`${what} must be a positive id`);

export const factorParams = z.strictObject({
  girder: z.enum(['interior', 'exterior'], { error: 'girder must be "interior" or "exterior"' }),
  effect: z.enum(FACTOR_EFFECTS, { error: `effect must be one of ${FACTOR_EFFECTS.join(', ')}` }),
  /** 'governing': the larger of the lane cases. */
  lanes: z.enum(['one', 'multiple', 'governing'], { error: 'lanes must be "one", "multiple" or "governing"' }),
  /** 'governing': the value the code adopts for the lane case. */
  method: z.enum(FACTOR_METHODS, { error: `method must be one of ${FACTOR_METHODS.join(', ')}` }),
  /** Location key of the code result ("span1", "support2", "deck"); default the first for the effect. */
  location: z.string().trim().regex(/^(span|support)\d{1,2}$|^deck$/, 'location must be like "span1", "support2" or "deck"').optional(),
  /**
   * Where the place has a skew correction (Art. 4.6.2.2.2e, 4.6.2.2.3c): 'with' (default) asks
   * for the value with it, 'before' for the value before it; the question says which.
   */
  skew: z.enum(['with', 'before'], { error: 'skew must be "with" or "before"' }).optional(),
});

export const truckPositionParams = z.strictObject({
  /** Girder number, 1 = left exterior girder. */
  girder: z.number({ error: 'girder must be a number' }).int('girder must be a whole number').min(1, 'girder must be 1 or more').max(40, 'girder must be at most 40'),
  line: z.enum(['lever-rule', 'rigid-section'], { error: 'line must be "lever-rule" or "rigid-section"' }),
  /** Numbers of loaded lanes to consider (default every number the roadway allows). */
  laneCounts: z.array(z.number().int('each lane count must be a whole number').min(1, 'each lane count must be at least 1').max(8, 'each lane count must be at most 8')).min(1).max(8).optional(),
});

export const assignmentBody = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('factor'),
    versionId: id('versionId'),
    params: factorParams,
    title: text('title', 200).optional(),
    instructions: text('instructions', 5000).default(''),
    tolerancePercent: z.number({ error: 'tolerancePercent must be a number' }).finite().gt(0, 'tolerancePercent must be greater than 0').max(25, 'tolerancePercent must be at most 25'),
    dueAt: z.iso.datetime({ offset: true, error: 'dueAt must be a date and time such as 2026-12-20T17:00:00Z' }),
    traineeIds: z.array(id('each trainee id')).min(1, 'assign the exercise to at least one trainee').max(200),
  }),
  z.strictObject({
    kind: z.literal('truck-position'),
    versionId: id('versionId'),
    params: truckPositionParams,
    title: text('title', 200).optional(),
    instructions: text('instructions', 5000).default(''),
    tolerancePercent: z.number({ error: 'tolerancePercent must be a number' }).finite().gt(0, 'tolerancePercent must be greater than 0').max(25, 'tolerancePercent must be at most 25'),
    dueAt: z.iso.datetime({ offset: true, error: 'dueAt must be a date and time such as 2026-12-20T17:00:00Z' }),
    traineeIds: z.array(id('each trainee id')).min(1, 'assign the exercise to at least one trainee').max(200),
  }),
]);

export const assignmentUpdateBody = z
  .strictObject({
    dueAt: z.iso.datetime({ offset: true, error: 'dueAt must be a date and time such as 2026-12-20T17:00:00Z' }).optional(),
    instructions: text('instructions', 5000).optional(),
    addTraineeIds: z.array(id('each trainee id')).min(1).max(200).optional(),
    /** Opens the exercise to all: its answer and its version's results are shown to every trainee (cannot be undone). */
    openToAll: z.literal(true, { error: 'openToAll can only be true: an exercise opened to all stays open' }).optional(),
  })
  .refine((b) => Object.values(b).some((v) => v !== undefined), { message: 'nothing to change: send dueAt, instructions, addTraineeIds or openToAll' });

const finite = (what: string) => z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`);

export const placementSchema = z.strictObject({
  lanes: z
    .array(z.strictObject({ left: finite('lane left edge'), wheelOffset: finite('wheel offset') }))
    .min(1, 'a placement loads at least one lane')
    .max(8, 'at most 8 loaded lanes'),
});

export const stepSchema = z.strictObject({
  label: text('step label', 200).min(1, 'each step needs a label'),
  formula: text('step formula', 500).default(''),
  value: finite('step value').optional(),
  note: text('step note', 1000).default(''),
});

export const submissionBody = z.strictObject({
  /** The trainee's value of the factor asked for (lanes per girder). Beyond ±1000 it is a typing
   *  error (common practice, no source), and its difference from the answer would not be finite. */
  value: finite('value').min(-1000, 'value must be between -1000 and 1000 lanes per girder').max(1000, 'value must be between -1000 and 1000 lanes per girder'),
  steps: z.array(stepSchema).max(40, 'at most 40 steps').default([]),
  placement: placementSchema.optional(),
});

export type AssignmentBody = z.infer<typeof assignmentBody>;
export type AssignmentUpdate = z.infer<typeof assignmentUpdateBody>;
export type FactorParams = z.infer<typeof factorParams>;
export type TruckPositionParams = z.infer<typeof truckPositionParams>;
export type SubmissionBody = z.infer<typeof submissionBody>;
export type PlacementInput = z.infer<typeof placementSchema>;

/** Ready-made questions for the instructor's form. */
export const QUESTION_PRESETS = [
  {
    id: 'exterior-moment-multiple',
    title: 'The governing moment factor of the exterior girder for two or more lanes',
    kind: 'factor' as const,
    params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' } satisfies FactorParams,
  },
  {
    id: 'interior-moment-multiple',
    title: 'The moment factor of an interior girder for two or more lanes (empirical formula)',
    kind: 'factor' as const,
    params: { girder: 'interior', effect: 'moment', lanes: 'multiple', method: 'formula' } satisfies FactorParams,
  },
  {
    id: 'lever-rule-shear',
    title: 'The lever-rule factor for shear of the exterior girder, one lane, before the skew correction',
    kind: 'factor' as const,
    params: { girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule', skew: 'before' } satisfies FactorParams,
  },
  {
    id: 'lever-rule-shear-skewed',
    title: 'The lever-rule factor for shear of the exterior girder, one lane, skew correction included',
    kind: 'factor' as const,
    params: { girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule', skew: 'with' } satisfies FactorParams,
  },
  {
    id: 'exterior-shear-governing',
    title: 'The governing shear factor of the exterior girder (skew correction included)',
    kind: 'factor' as const,
    params: { girder: 'exterior', effect: 'shear', lanes: 'governing', method: 'governing' } satisfies FactorParams,
  },
  {
    id: 'fatigue-moment-interior',
    title: 'The fatigue moment factor of an interior girder (one lane, multiple presence removed)',
    kind: 'factor' as const,
    params: { girder: 'interior', effect: 'fatigue-moment', lanes: 'one', method: 'governing' } satisfies FactorParams,
  },
  {
    id: 'governing-truck-position',
    title: 'The governing truck position for the exterior girder (lever rule, one lane)',
    kind: 'truck-position' as const,
    params: { girder: 1, line: 'lever-rule', laneCounts: [1] } satisfies TruckPositionParams,
  },
  {
    id: 'rigid-section-position',
    title: 'The governing lane positions for the exterior girder by the rigid-section method',
    kind: 'truck-position' as const,
    params: { girder: 1, line: 'rigid-section' } satisfies TruckPositionParams,
  },
];
