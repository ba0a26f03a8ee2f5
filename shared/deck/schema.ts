/**
 * The deck model: one zod schema used by the API, the client forms and the command-line
 * tool. A `DeckInput` is stored in internal units (SI base units, angles in degrees; see
 * `shared/units.ts`). Deck files and forms in US customary units are converted at the
 * edge with `convertDeckUnits` (see `deck/units.ts`).
 *
 * Coordinates and sign conventions
 * - Girders are numbered 1..Nb from the left (looking up-station). Transverse offsets are
 *   measured from girder 1's centreline, positive to the right.
 * - Each overhang runs from the exterior girder's centreline to the deck edge (≥ 0).
 * - Each barrier (or curb) has a width from the deck edge to its inside (traffic) face.
 *   de = overhang − barrier width: positive when the curb face is outboard of the
 *   exterior girder, negative when inboard (AASHTO LRFD Art. 4.6.2.2.1, definition of de).
 * - Skew θ at a support line is the angle between the support line and the normal to the
 *   girders, in degrees; its sign gives the direction (positive: the support line is
 *   rotated counter-clockwise in plan). The code's corrections use |θ|.
 * - Section types a…k are those of AASHTO LRFD Table 4.6.2.2.1-1.
 */
import { z } from 'zod';

export const SECTION_TYPES = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h', 'i', 'j', 'k'] as const;
export type SectionType = (typeof SECTION_TYPES)[number];

/** Plain descriptions of Table 4.6.2.2.1-1's common deck superstructures. */
export const SECTION_TYPE_DESCRIPTIONS: Record<SectionType, string> = {
  a: 'Steel beams with a cast-in-place or precast concrete slab',
  b: 'Closed steel or precast concrete boxes with a cast-in-place slab',
  c: 'Open steel or precast concrete boxes with a cast-in-place or precast slab',
  d: 'Cast-in-place concrete multicell box',
  e: 'Cast-in-place concrete tee beams',
  f: 'Precast solid, voided or cellular boxes with shear keys and a cast-in-place overlay',
  g: 'Precast solid, voided or cellular boxes with shear keys, with or without transverse post-tensioning',
  h: 'Precast concrete channels with shear keys and a cast-in-place overlay',
  i: 'Precast concrete double tees with shear keys, with or without transverse post-tensioning',
  j: 'Precast concrete tees with shear keys, with or without transverse post-tensioning',
  k: 'Precast concrete I or bulb-tee beams with a cast-in-place or precast slab',
};

const positive = (what: string) =>
  z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`).gt(0, `${what} must be greater than 0`);
const nonNegative = (what: string) =>
  z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`).min(0, `${what} must be 0 or more`);

export const girderLayoutSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('uniform'),
    /** Number of girders (or webs, for type d), Nb. */
    count: z.number().int('girder count must be a whole number').min(2, 'a deck needs at least 2 girders').max(40, 'at most 40 girders'),
    /** Centre-to-centre spacing S, m. */
    spacing: positive('girder spacing'),
  }),
  z.strictObject({
    kind: z.literal('offsets'),
    /** Girder centreline offsets, m, measured from any reference, strictly increasing left to right. */
    offsets: z
      .array(z.number().finite('each girder offset must be finite'))
      .min(2, 'a deck needs at least 2 girders')
      .max(40, 'at most 40 girders'),
  }),
]);

export const barrierSchema = z.strictObject({
  /** Width from the deck edge to the barrier's or curb's inside face, m. */
  width: nonNegative('barrier width'),
  /** Barrier height above the slab, m (drawing only). */
  height: nonNegative('barrier height').default(0.8128),
});

export const slabSchema = z.strictObject({
  /** Structural slab thickness ts, m. */
  thickness: positive('slab thickness'),
  /** Haunch (build-up) between girder top and slab soffit, m; counts in eg, not in ts. */
  haunch: nonNegative('haunch').default(0),
  /** Integral wearing surface not counted in ts, m (drawing and dead load only). */
  wearingSurface: nonNegative('wearing surface').default(0),
});

/**
 * Girder section properties (non-composite girder alone). Which ones are required depends
 * on the section type; see `REQUIRED_SECTION_PROPERTIES`.
 */
export const sectionSchema = z.strictObject({
  /** A, area of the girder, m². */
  area: positive('girder area A').optional(),
  /** I, moment of inertia of the girder about its own centroid, m⁴. */
  inertia: positive('girder moment of inertia I').optional(),
  /** Distance from the top of the girder to its centroid, m (gives eg with ts and haunch). */
  centroidFromTop: positive('girder centroid depth').optional(),
  /** eg entered directly: distance between the girder's and the deck's centres of gravity, m. */
  eg: positive('eg').optional(),
  /** J, St Venant torsional inertia, m⁴ (types f, g; and the grillage). */
  torsion: positive('torsional inertia J').optional(),
  /** d, depth of the girder (types b, c, and d's web depth), m. */
  depth: positive('girder depth d').optional(),
  /** b, width of a precast beam (types f, g, h, i, j), m. */
  width: positive('beam width b').optional(),
  /** Nc, number of cells of a multicell box (type d). */
  cells: z.number().int('number of cells must be a whole number').min(1, 'number of cells must be at least 1').optional(),
  /** Type h, i, j (and f, g) beam shape, for the constant K of Art. 4.6.2.2.2b. */
  beamShape: z.enum(['solid-rectangular', 'voided-rectangular', 'box', 'channel', 'tee', 'double-tee']).optional(),
  /**
   * Types f, g, h, i, j: whether the beams are connected enough to act as a unit
   * (transverse post-tensioning or a structural overlay), as opposed to only enough to
   * prevent relative vertical displacement at the interface.
   */
  actsAsUnit: z.boolean().optional(),
});

export const materialSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('modulus'),
    /** Modulus of elasticity E, Pa. */
    modulus: positive('modulus of elasticity'),
  }),
  z.strictObject({
    kind: z.literal('concrete'),
    /** Specified compressive strength f'c, Pa. */
    fc: positive("f'c"),
    /** Unit weight wc, N/m³ (Art. 5.4.2.4 uses it in kcf). */
    unitWeight: positive('concrete unit weight').default(150 * 4448.2216152605 / 0.3048 ** 3 / 1000),
    /** Correction factor for source of aggregate K1 (Art. 5.4.2.4). */
    K1: positive('K1').default(1),
    /**
     * Which modulus equation of Art. 5.4.2.4: 'current' Ec = 120,000·K1·wc^2.0·f'c^0.33
     * (8th edition and later), or 'pre-2015' Ec = 33,000·K1·wc^1.5·√f'c (earlier editions).
     */
    modulusEquation: z.enum(['current', 'pre-2015']).default('current'),
  }),
]);

export const spanSchema = z.strictObject({
  /** Span length along the girders, support centreline to support centreline, m. */
  length: positive('span length'),
});

export const supportSchema = z.strictObject({
  /** Skew θ of this support line, degrees (see the sign convention at the top). */
  skew: z
    .number({ error: 'skew must be a number' })
    .finite('skew must be finite')
    .gt(-90, 'skew must be greater than −90°')
    .lt(90, 'skew must be less than 90°'),
});

export const diaphragmSchema = z.strictObject({
  /** What connects the girders transversely. */
  type: z.enum(['none', 'concrete-diaphragms', 'steel-cross-frames']),
  /** Diaphragms or cross-frames at the support lines. */
  atSupports: z.boolean().default(true),
  /** Number of equally spaced intermediate diaphragm lines in each span. */
  intermediatePerSpan: z.number().int('intermediate diaphragm count must be a whole number').min(0).max(20).default(0),
  /** Effective moment of inertia of one diaphragm or cross-frame for the grillage, m⁴. */
  inertia: positive('diaphragm moment of inertia').optional(),
  /** Modulus of elasticity of the diaphragm, Pa (defaults to the girder's). */
  modulus: positive('diaphragm modulus').optional(),
});

export const policySchema = z.strictObject({
  /** Art. 2.5.2.7.1: the exterior girder carries no less than an interior girder. */
  exteriorNotLessThanInterior: z.boolean().default(false),
  /** Owner policy: lever rule for one lane with m = 1.0 instead of 1.2. */
  leverRuleWithoutMultiplePresence: z.boolean().default(false),
  /** Owner policy: every factor is at least m·NL/Nb (all lanes loaded, girders share equally). */
  floorAtEqualShare: z.boolean().default(false),
});

export const loadModifierSchema = z.strictObject({
  /** ηD, ductility (Art. 1.3.3). */
  ductility: positive('ηD').default(1),
  /** ηR, redundancy (Art. 1.3.4). */
  redundancy: positive('ηR').default(1),
  /** ηI, operational importance (Art. 1.3.5). */
  importance: positive('ηI').default(1),
});

/** Sections that take their properties into the empirical formulas, per type. */
export const REQUIRED_SECTION_PROPERTIES: Record<SectionType, (keyof z.infer<typeof sectionSchema>)[]> = {
  a: ['area', 'inertia'],
  b: ['depth'],
  c: ['depth'],
  d: ['cells'],
  e: ['area', 'inertia'],
  f: ['inertia', 'torsion', 'width'],
  g: ['inertia', 'torsion', 'width'],
  h: ['width'],
  i: ['area', 'inertia', 'width'],
  j: ['area', 'inertia', 'width'],
  k: ['area', 'inertia'],
};

export const deckSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'deck name is required').max(200, 'deck name is at most 200 characters'),
    sectionType: z.enum(SECTION_TYPES, { error: 'section type must be one of a, b, c, d, e, f, g, h, i, j, k' }),
    girders: girderLayoutSchema,
    /** Overhangs from exterior girder centreline to deck edge, m. */
    overhangLeft: nonNegative('left overhang'),
    overhangRight: nonNegative('right overhang'),
    barrierLeft: barrierSchema,
    barrierRight: barrierSchema,
    slab: slabSchema,
    section: sectionSchema,
    materials: z.strictObject({
      deck: materialSchema,
      girder: materialSchema,
      /** Modular ratio n = E_girder / E_deck entered directly (overrides the moduli). */
      modularRatio: positive('modular ratio n').optional(),
    }),
    spans: z.array(spanSchema).min(1, 'a deck needs at least one span').max(12, 'at most 12 spans'),
    /** true: girders continuous over the interior supports; false: simple spans. */
    continuous: z.boolean().default(false),
    /** One entry per support line (spans + 1), from the first abutment. */
    supports: z.array(supportSchema).min(2, 'a deck needs at least two support lines'),
    diaphragms: diaphragmSchema,
    policy: policySchema.default({ exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false }),
    loadModifiers: loadModifierSchema.default({ ductility: 1, redundancy: 1, importance: 1 }),
  })
  .superRefine((deck, ctx) => {
    if (deck.girders.kind === 'offsets') {
      const o = deck.girders.offsets;
      for (let i = 1; i < o.length; i++) {
        if (!(o[i] > o[i - 1])) {
          ctx.addIssue({
            code: 'custom',
            path: ['girders', 'offsets', i],
            message: `girder ${i + 1} must lie to the right of girder ${i} (offsets must increase; overlapping or coincident girders are not allowed)`,
          });
        }
      }
    }
    if (deck.supports.length !== deck.spans.length + 1) {
      ctx.addIssue({
        code: 'custom',
        path: ['supports'],
        message: `a deck of ${deck.spans.length} span(s) needs ${deck.spans.length + 1} support lines, not ${deck.supports.length}`,
      });
    }
    for (const prop of REQUIRED_SECTION_PROPERTIES[deck.sectionType]) {
      if (deck.section[prop] === undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['section', prop],
          message: `section type ${deck.sectionType} needs ${SECTION_PROPERTY_LABELS[prop]}`,
        });
      }
    }
    const hasEg = deck.section.eg !== undefined || deck.section.centroidFromTop !== undefined;
    if (['a', 'e', 'i', 'j', 'k'].includes(deck.sectionType) && !hasEg) {
      ctx.addIssue({
        code: 'custom',
        path: ['section', 'centroidFromTop'],
        message: `section type ${deck.sectionType} needs the girder centroid depth (or eg) to compute Kg`,
      });
    }
  });

export const SECTION_PROPERTY_LABELS: Record<keyof z.infer<typeof sectionSchema>, string> = {
  area: 'the girder area A',
  inertia: 'the girder moment of inertia I',
  centroidFromTop: 'the girder centroid depth from its top',
  eg: 'eg',
  torsion: 'the torsional inertia J',
  depth: 'the girder depth d',
  width: 'the beam width b',
  cells: 'the number of cells Nc',
  beamShape: 'the beam shape',
  actsAsUnit: 'whether the beams act as a unit',
};

/** A deck as stored and computed: defaults applied, internal units. */
export type Deck = z.output<typeof deckSchema>;
/** A deck as written in a file or form before defaults are applied (internal units). */
export type DeckInput = z.input<typeof deckSchema>;
export type GirderLayout = z.output<typeof girderLayoutSchema>;
export type Material = z.output<typeof materialSchema>;
export type SectionProperties = z.output<typeof sectionSchema>;
export type Policy = z.output<typeof policySchema>;

/** One problem with a deck, field path and rule in plain words. */
export interface DeckIssue {
  path: (string | number)[];
  message: string;
}

/** A typed error for a deck the engine cannot compute; `issues` name each field and rule. */
export class DeckInputError extends Error {
  readonly issues: DeckIssue[];
  constructor(path: (string | number)[] | DeckIssue[], message?: string) {
    const issues: DeckIssue[] =
      message === undefined ? (path as DeckIssue[]) : [{ path: path as (string | number)[], message }];
    super(issues.map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message)).join('; '));
    this.name = 'DeckInputError';
    this.issues = issues;
  }
  /** Path of the first offending field. */
  get path(): (string | number)[] {
    return this.issues[0]?.path ?? [];
  }
}

/** Validate unknown input; returns the deck or the list of issues (never throws). */
export function parseDeck(input: unknown): { ok: true; deck: Deck } | { ok: false; issues: DeckIssue[] } {
  const r = deckSchema.safeParse(input);
  if (r.success) return { ok: true, deck: r.data };
  return {
    ok: false,
    issues: r.error.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: i.message })),
  };
}

/** Validate or throw a `DeckInputError` naming the first offending field. */
export function assertDeck(input: unknown): Deck {
  const r = parseDeck(input);
  if (r.ok) return r.deck;
  throw new DeckInputError(r.issues);
}
