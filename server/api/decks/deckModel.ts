/** Request schemas for decks and their versions. The deck itself is validated by the shared
 *  deck schema, so the API, the forms and the command-line tool apply the same rules. */
import { z } from 'zod';
import { deckSchema } from '../../../shared/deck/schema.js';
import { personText } from '../../../shared/text.js';
import { idText } from '../../middleware/validate.js';
import { placementsSchema } from './placementsModel.js';

const message = personText('message', 500, { multiline: true, min: 1, minMessage: 'a save message is required' });

/** Saved lane and wheel placements (placementsModel.ts): bounded in depth, lengths and size. */
const placements = placementsSchema.optional();

export const deckCreateBody = z.strictObject({
  deck: deckSchema,
  message,
  placements,
});

export const versionCreateBody = z.strictObject({
  deck: deckSchema,
  message,
  basedOnVersionId: z.number().int().positive().optional(),
  placements,
});

export const versionParams = z.object({
  deckId: idText('deckId'),
  number: idText('version number'),
});

/** `?include=results` adds the stored results' data (every factor row with its trace) to a version. */
export const versionQuery = z.strictObject({
  include: z.enum(['results'], { error: 'include must be "results"' }).optional(),
});
