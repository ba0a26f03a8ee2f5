/**
 * The lane and wheel placements saved with a deck version (the workspace's SavedPlacements,
 * src/stores/useDeckStore.ts, format 'deckshare-placements-1'): the vehicle, the loaded lanes
 * (shared/placement/rules.ts LanePlacement, m), the girder and effect studied, and the shares
 * and governing values per girder shown when it was saved. Everything else is refused, so a
 * stored version can always be read back: nesting is at most four levels, every list and
 * string is bounded, and the whole value is at most PLACEMENTS_MAX_BYTES of JSON.
 * Units: lengths in m; shares and governing values in lanes per girder.
 */
import { z } from 'zod';

export const PLACEMENTS_FORMAT = 'deckshare-placements-1';
/** A deck has at most 40 girders (shared/deck/schema.ts): per-girder lists are that long at most. */
export const MAX_GIRDERS = 40;
/** Design lanes are at least 12 ft wide (AASHTO LRFD Art. 3.6.1.1.1): 40 covers any deck here. */
export const MAX_LANES = 40;
/** Largest JSON of a placements value, bytes (the fullest valid value is about 11 KB). */
export const PLACEMENTS_MAX_BYTES = 16 * 1024;
/** Positions and lengths beyond 10 km are typing errors, not decks (common practice, no source). */
const MAX_LENGTH_M = 10_000;

const metres = (what: string) =>
  z
    .number({ error: `${what} must be a number (m)` })
    .finite(`${what} must be finite`)
    .min(-MAX_LENGTH_M, `${what} must be within ±${MAX_LENGTH_M} m`)
    .max(MAX_LENGTH_M, `${what} must be within ±${MAX_LENGTH_M} m`);

const share = z.number({ error: 'each value must be a number or null' }).finite('each value must be finite').min(-1000).max(1000).nullable();
const perGirder = (what: string) => z.array(share, { error: `${what} must be a list` }).max(MAX_GIRDERS, `${what} lists at most ${MAX_GIRDERS} girders`);
const perEffect = (what: string) =>
  z.strictObject({ moment: perGirder(`${what}.moment`).optional(), shear: perGirder(`${what}.shear`).optional() }, { error: `${what} must be an object with moment and/or shear lists` });

const lane = z.strictObject(
  {
    left: metres('lane left edge'),
    wheelOffset: metres('wheel offset'),
    frontAxleAt: metres('front axle position').optional(),
    direction: z.union([z.literal(1), z.literal(-1)], { error: 'direction must be 1 or -1' }).optional(),
    axleSpacing: z.number({ error: 'axle spacing must be a number (m)' }).finite().positive('axle spacing must be positive').max(100, 'axle spacing must be at most 100 m').optional(),
  },
  { error: 'each lane must be an object { left, wheelOffset, frontAxleAt?, direction?, axleSpacing? }' },
);

export const placementsSchema = z
  .strictObject(
    {
      format: z.literal(PLACEMENTS_FORMAT, { error: `format must be "${PLACEMENTS_FORMAT}"` }),
      vehicle: z.enum(['design truck', 'design tandem', 'fatigue truck'], { error: 'vehicle must be "design truck", "design tandem" or "fatigue truck"' }),
      lanes: z.array(lane, { error: 'lanes must be a list' }).max(MAX_LANES, `at most ${MAX_LANES} lanes`),
      studied: z.strictObject(
        {
          /** Index of the girder studied, 0 = girder 1. */
          girder: z.number({ error: 'studied.girder must be a number' }).int('studied.girder must be a whole number').min(0, 'studied.girder must be 0 or more').max(MAX_GIRDERS - 1, `studied.girder must be at most ${MAX_GIRDERS - 1}`),
          effect: z.enum(['moment', 'shear'], { error: 'studied.effect must be "moment" or "shear"' }),
        },
        { error: 'studied must be an object { girder, effect }' },
      ),
      shares: perEffect('shares').optional(),
      governing: perEffect('governing').optional(),
    },
    { error: `placements must be an object of format "${PLACEMENTS_FORMAT}"` },
  )
  .superRefine((p, ctx) => {
    const bytes = Buffer.byteLength(JSON.stringify(p), 'utf8');
    if (bytes > PLACEMENTS_MAX_BYTES) ctx.addIssue({ code: 'custom', message: `placements must be at most ${PLACEMENTS_MAX_BYTES} bytes of JSON (this is ${bytes})` });
  });

export type SavedPlacements = z.infer<typeof placementsSchema>;

/** Nesting depth of a JSON value, counted without recursion (a hostile value may be very deep). */
function depthOf(value: unknown): number {
  let deepest = 0;
  const stack: [unknown, number][] = [[value, 1]];
  while (stack.length) {
    const [v, d] = stack.pop()!;
    if (typeof v !== 'object' || v === null) continue;
    deepest = Math.max(deepest, d);
    for (const child of Object.values(v)) stack.push([child, d + 1]);
  }
  return deepest;
}

/** Older rows (saved before the format was enforced) are shown when at most this deep and large. */
const LEGACY_MAX_DEPTH = 16;
const LEGACY_MAX_BYTES = 64 * 1024;

/**
 * Stored placements for display: the value as saved when it follows the format; an older
 * free-form value when it is small and shallow; otherwise null (it is kept in the database,
 * but not sent: it could not be read back safely).
 */
export function readStoredPlacements(json: string | null): unknown {
  if (json === null || json.length > LEGACY_MAX_BYTES) return null;
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch {
    return null;
  }
  const r = placementsSchema.safeParse(value);
  if (r.success) return r.data;
  return depthOf(value) <= LEGACY_MAX_DEPTH ? value : null;
}
