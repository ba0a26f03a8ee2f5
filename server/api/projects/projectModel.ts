/** Request schemas for projects (bridges). Strings are trimmed; unknown fields are refused. */
import { z } from 'zod';
import { personText } from '../../../shared/text.js';

/** Text a person types (shared/text.ts): NFC, no control or bidirectional-override characters; fields over 200 characters may hold lines. */
const text = (what: string, max: number) => personText(what, max, { multiline: max > 200 });

export const projectCreateBody = z.strictObject({
  name: text('name', 200).min(1, 'name is required'),
  ownerAgency: text('owner agency', 200).default(''),
  location: text('location', 200).default(''),
  units: z.enum(['US', 'SI'], { error: 'units must be "US" (US customary) or "SI"' }),
  notes: text('notes', 5000).default(''),
});

export const projectUpdateBody = z
  .strictObject({
    name: text('name', 200).min(1, 'name is required').optional(),
    ownerAgency: text('owner agency', 200).optional(),
    location: text('location', 200).optional(),
    units: z.enum(['US', 'SI'], { error: 'units must be "US" (US customary) or "SI"' }).optional(),
    notes: text('notes', 5000).optional(),
    archived: z.boolean({ error: 'archived must be true or false' }).optional(),
  })
  .refine((b) => Object.keys(b).length > 0, { message: 'nothing to change: send at least one field' });

export const projectListQuery = z.strictObject({
  archived: z.enum(['include', 'only', 'exclude'], { error: 'archived must be include, only or exclude' }).default('exclude'),
});

export type ProjectCreate = z.infer<typeof projectCreateBody>;
export type ProjectUpdate = z.infer<typeof projectUpdateBody>;
