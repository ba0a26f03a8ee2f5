/** Request schemas for review rounds. Strings are trimmed; unknown fields are refused. */
import { z } from 'zod';
import { personText } from '../../../shared/text.js';
import { pageFields } from '../pagination.js';
import { REVIEW_STATES } from '../../db/schema.js';
import { idText } from '../../middleware/validate.js';

/** Effects and methods a comment may be anchored to (the factor table's own names). */
export const ANCHOR_EFFECTS = ['moment', 'negative-moment', 'shear', 'reaction', 'fatigue-moment', 'fatigue-shear', 'deflection'] as const;
export const ANCHOR_METHODS = ['formula', 'lever-rule', 'rigid-section', 'equal-share', 'interior-minimum', 'grillage', 'governing'] as const;

const id = (what: string) => z.number({ error: `${what} must be a number` }).int(`${what} must be a whole number`).positive(`${what} must be a positive id`);
/** Text a person types (shared/text.ts): NFC, no control or bidirectional-override characters; fields over 200 characters may hold lines. */
const text = (what: string, max: number) => personText(what, max, { multiline: max > 200 });

export const anchorSchema = z
  .strictObject({
    /** Girder number, 1 = left exterior girder. */
    girder: z.number({ error: 'anchor.girder must be a number' }).int('anchor.girder must be a whole number').min(1, 'anchor.girder must be 1 or more').max(40, 'anchor.girder must be at most 40').optional(),
    effect: z.enum(ANCHOR_EFFECTS, { error: `anchor.effect must be one of ${ANCHOR_EFFECTS.join(', ')}` }).optional(),
    method: z.enum(ANCHOR_METHODS, { error: `anchor.method must be one of ${ANCHOR_METHODS.join(', ')}` }).optional(),
    lanes: z.enum(['one', 'multiple'], { error: 'anchor.lanes must be "one" or "multiple"' }).optional(),
  })
  .refine((a) => Object.values(a).some((v) => v !== undefined), { message: 'an anchor names at least one of girder, effect, method, lanes (leave it out for a comment on the whole deck)' });

export type CommentAnchor = z.infer<typeof anchorSchema>;

export const submitBody = z.strictObject({
  versionId: id('versionId'),
  reviewerId: id('reviewerId'),
  note: text('note', 2000).default(''),
});

export const commentBody = z.strictObject({
  body: text('comment', 5000).min(1, 'the comment is empty'),
  anchor: anchorSchema.optional(),
  parentId: id('parentId').optional(),
});

export const decisionBody = z
  .strictObject({
    outcome: z.enum(['approve', 'send-back'], { error: 'outcome must be "approve" or "send-back"' }),
    note: text('note', 5000).default(''),
  })
  .superRefine((b, ctx) => {
    if (b.outcome === 'send-back' && b.note.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['note'], message: 'say why the version is sent back' });
    }
  });

export const refinedBody = z.strictObject({
  justified: z.boolean({ error: 'justified must be true (a refined analysis is justified) or false' }),
  reason: text('reason', 2000).min(1, 'give the reason for the decision'),
});

export const listQuery = z.strictObject({
  /** 'assigned': rounds I review; 'submitted': rounds I submitted; 'all': the firm's. */
  view: z.enum(['assigned', 'submitted', 'all'], { error: 'view must be assigned, submitted or all' }).default('all'),
  state: z.enum(REVIEW_STATES, { error: `state must be one of ${REVIEW_STATES.join(', ')}` }).optional(),
  deckId: idText('deckId').optional(),
  ...pageFields,
});

export const statusQuery = z.strictObject({
  deckId: idText('deckId'),
  ...pageFields,
});

export type SubmitBody = z.infer<typeof submitBody>;
export type CommentBody = z.infer<typeof commentBody>;
export type DecisionBody = z.infer<typeof decisionBody>;
export type RefinedBody = z.infer<typeof refinedBody>;
export type ListQuery = z.infer<typeof listQuery>;
