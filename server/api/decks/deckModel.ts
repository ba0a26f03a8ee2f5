/** Request schemas for decks and their versions. The deck itself is validated by the shared
 *  deck schema, so the API, the forms and the command-line tool apply the same rules. */
import { z } from 'zod';
import { deckSchema } from '../../../shared/deck/schema.js';
import { personText } from '../../../shared/text.js';
import { idText } from '../../middleware/validate.js';

const message = personText('message', 500, { multiline: true, min: 1, minMessage: 'a save message is required' });

/** Deepest nesting accepted in saved placements (the workspace writes about four levels). */
export const MAX_PLACEMENTS_DEPTH = 32;

/** Whether a JSON value nests at most `max` levels, checked without recursion (so that a
 *  10,000-deep value cannot overflow the stack here, nor later in JSON.stringify). */
function nestsAtMost(value: unknown, max: number): boolean {
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (v === null || typeof v !== 'object') continue;
    if (depth + 1 > max) return false;
    for (const child of Object.values(v)) stack.push([child, depth + 1]);
  }
  return true;
}

/** Saved lane and wheel placements: free-form JSON, bounded in size by the body limit and in depth. */
const placements = z
  .unknown()
  .refine((v) => nestsAtMost(v, MAX_PLACEMENTS_DEPTH), { message: `placements may nest at most ${MAX_PLACEMENTS_DEPTH} levels deep` })
  .optional();

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
