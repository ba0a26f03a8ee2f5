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
import { formatBound, PHYSICAL_LIMITS, type PhysicalRange } from './limits.js';
import { personText } from '../text.js';

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

const number = (what: string) => z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`);

/**
 * A quantity within its physical range (`deck/limits.ts`), both ends inclusive; a quantity
 * whose minimum is above zero reads "greater than 0" for zero or less (one message
 * per value). Messages give the bound in SI and US customary units.
 */
const ranged = (what: string, range: PhysicalRange) => {
  const base = number(what);
  const low =
    range.min > 0
      ? base
          .gt(0, `${what} must be greater than 0`)
          .refine((v) => v <= 0 || v >= range.min, `${what} must be at least ${formatBound(range.min, range.kind)}`)
      : base.min(range.min, range.min === 0 ? `${what} must be 0 or more` : `${what} must be at least ${formatBound(range.min, range.kind)}`);
  return low.refine((v) => v <= range.max, `${what} must be at most ${formatBound(range.max, range.kind)}`);
};
const L = PHYSICAL_LIMITS;

export const girderLayoutSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('uniform'),
    /** Number of girders (or webs, for type d), Nb. */
    count: number('girder count').int('girder count must be a whole number').min(2, 'a deck needs at least 2 girders').max(40, 'at most 40 girders'),
    /** Centre-to-centre spacing S, m. */
    spacing: ranged('girder spacing', L.girderSpacing),
  }),
  z.strictObject({
    kind: z.literal('offsets'),
    /** Girder centreline offsets, m, measured from any reference, strictly increasing left to right. */
    offsets: z
      .array(ranged('each girder offset', L.girderOffset))
      .min(2, 'a deck needs at least 2 girders')
      .max(40, 'at most 40 girders'),
  }),
]);

export const barrierSchema = z.strictObject({
  /** Width from the deck edge to the barrier's or curb's inside face, m. */
  width: ranged('barrier width', L.barrierWidth),
  /** Barrier height above the slab, m (drawing only). */
  height: ranged('barrier height', L.barrierHeight).default(0.8128),
});

export const slabSchema = z.strictObject({
  /** Structural slab thickness ts, m. */
  thickness: ranged('slab thickness', L.slabThickness),
  /** Haunch (build-up) between girder top and slab soffit, m; counts in eg, not in ts. */
  haunch: ranged('haunch', L.haunch).default(0),
  /** Integral wearing surface not counted in ts, m (drawing and dead load only). */
  wearingSurface: ranged('wearing surface', L.wearingSurface).default(0),
});

/**
 * Girder section properties (non-composite girder alone). Which ones are required depends
 * on the section type; see `REQUIRED_SECTION_PROPERTIES`.
 */
export const sectionSchema = z.strictObject({
  /** A, area of the girder, m². */
  area: ranged('girder area A', L.girderArea).optional(),
  /** I, moment of inertia of the girder about its own centroid, m⁴. */
  inertia: ranged('girder moment of inertia I', L.girderInertia).optional(),
  /** Distance from the top of the girder to its centroid, m (gives eg with ts and haunch). */
  centroidFromTop: ranged('girder centroid depth', L.sectionDimension).optional(),
  /** eg entered directly: distance between the girder's and the deck's centres of gravity, m. */
  eg: ranged('eg', L.sectionDimension).optional(),
  /** J, St Venant torsional inertia, m⁴ (types f, g; and the grillage). */
  torsion: ranged('torsional inertia J', L.torsion).optional(),
  /** d, depth of the girder (types b, c, and d's web depth), m. */
  depth: ranged('girder depth d', L.sectionDimension).optional(),
  /** b, width of a precast beam (types f, g, h, i, j), m. */
  width: ranged('beam width b', L.sectionDimension).optional(),
  /** Nc, number of cells of a multicell box (type d). */
  cells: number('number of cells').int('number of cells must be a whole number').min(1, 'number of cells must be at least 1').max(L.cells.max, `number of cells must be at most ${L.cells.max}`).optional(),
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
    modulus: ranged('modulus of elasticity', L.modulus),
  }),
  z.strictObject({
    kind: z.literal('concrete'),
    /** Specified compressive strength f'c, Pa. */
    fc: ranged("f'c", L.concreteStrength),
    /** Unit weight wc, N/m³ (Art. 5.4.2.4 uses it in kcf). */
    unitWeight: ranged('concrete unit weight', L.concreteUnitWeight).default(150 * 4448.2216152605 / 0.3048 ** 3 / 1000),
    /** Correction factor for source of aggregate K1 (Art. 5.4.2.4). */
    K1: ranged('K1', L.K1).default(1),
    /**
     * Which modulus equation of Art. 5.4.2.4: 'current' Ec = 120,000·K1·wc^2.0·f'c^0.33
     * (8th edition and later), or 'pre-2015' Ec = 33,000·K1·wc^1.5·√f'c (earlier editions).
     */
    modulusEquation: z.enum(['current', 'pre-2015']).default('current'),
  }),
]);

export const spanSchema = z.strictObject({
  /** Span length along the girders, support centreline to support centreline, m. */
  length: ranged('span length', L.spanLength),
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
  intermediatePerSpan: number('intermediate diaphragm count').int('intermediate diaphragm count must be a whole number').min(0, 'intermediate diaphragm count must be 0 or more').max(20, 'intermediate diaphragm count must be at most 20').default(0),
  /** Effective moment of inertia of one diaphragm or cross-frame for the grillage, m⁴. */
  inertia: ranged('diaphragm moment of inertia', L.diaphragmInertia).optional(),
  /** Modulus of elasticity of the diaphragm, Pa (defaults to the girder's). */
  modulus: ranged('diaphragm modulus', L.modulus).optional(),
  /** Concrete diaphragms: web width b_w, m (with depth: the default stiffness, grillage/diaphragmStiffness.ts). */
  width: ranged('diaphragm width', L.diaphragmDimension).optional(),
  /** Concrete diaphragms: depth below the slab soffit, m. */
  depth: ranged('diaphragm depth', L.diaphragmDimension).optional(),
  /** Steel cross-frames: top chord area, m². */
  topChordArea: ranged('cross-frame top chord area', L.crossFrameArea).optional(),
  /** Steel cross-frames: bottom chord area, m². */
  bottomChordArea: ranged('cross-frame bottom chord area', L.crossFrameArea).optional(),
  /** Steel cross-frames: area of one diagonal (X-frame, two per bay), m². */
  diagonalArea: ranged('cross-frame diagonal area', L.crossFrameArea).optional(),
  /** Steel cross-frames: depth between chord centroids, m. */
  frameDepth: ranged('cross-frame depth', L.crossFrameDepth).optional(),
  /** The grillage models the diaphragms (default true); false leaves them out (slab strips only). */
  includeInGrillage: z.boolean().default(true),
});

/** The loads a refined (grillage) run may use (deck field `refinedLoading`). */
export const REFINED_LOADINGS = ['design-truck', 'hl93'] as const;
export type RefinedLoading = (typeof REFINED_LOADINGS)[number];

/**
 * Which edition's design values a deck's live loads and lanes use (deck field `designValues`;
 * shared/loads/designValues.ts): 'us-customary', the US customary edition's (12 ft lanes,
 * 8/32/32 kip truck, …; the default, so a stored deck without the field keeps them), or
 * 'si-edition', the SI edition's own (3.6 m lanes, 35/145/145 kN truck, …). A deck created in
 * an SI project starts with 'si-edition'.
 */
export const DESIGN_VALUE_SETS = ['us-customary', 'si-edition'] as const;
export type DesignValuesName = (typeof DESIGN_VALUE_SETS)[number];

export const policySchema = z.strictObject({
  /** Art. 2.5.2.7.1: the exterior girder carries no less than an interior girder. */
  exteriorNotLessThanInterior: z.boolean().default(false),
  /** Owner policy: lever rule for one lane with m = 1.0 instead of 1.2. */
  leverRuleWithoutMultiplePresence: z.boolean().default(false),
  /** Owner policy: every factor is at least m·NL/Nb (all lanes loaded, girders share equally). */
  floorAtEqualShare: z.boolean().default(false),
  /** Owner policy: the rigid-section check (Art. 4.6.2.2.2d) on every section type with
   *  diaphragms or cross-frames, not only types a, e, k. */
  rigidSectionAnyType: z.boolean().default(false),
});

export const loadModifierSchema = z.strictObject({
  /** ηD, ductility (Art. 1.3.3). */
  ductility: ranged('ηD', L.loadModifier).default(1),
  /** ηR, redundancy (Art. 1.3.4). */
  redundancy: ranged('ηR', L.loadModifier).default(1),
  /** ηI, operational importance (Art. 1.3.5). */
  importance: ranged('ηI', L.loadModifier).default(1),
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
    name: personText('deck name', 200, { min: 1, minMessage: 'deck name is required' }),
    sectionType: z.enum(SECTION_TYPES, { error: (issue) => (issue.input === undefined ? 'choose the cross-section type (a to k)' : 'section type must be one of a, b, c, d, e, f, g, h, i, j, k') }),
    girders: girderLayoutSchema,
    /** Overhangs from exterior girder centreline to deck edge, m. */
    overhangLeft: ranged('left overhang', L.overhang),
    overhangRight: ranged('right overhang', L.overhang),
    barrierLeft: barrierSchema,
    barrierRight: barrierSchema,
    slab: slabSchema,
    section: sectionSchema,
    materials: z.strictObject({
      deck: materialSchema,
      girder: materialSchema,
      /** Modular ratio n = E_girder / E_deck entered directly (overrides the moduli). */
      modularRatio: ranged('modular ratio n', L.modularRatio).optional(),
    }),
    spans: z.array(spanSchema).min(1, 'a deck needs at least one span').max(12, 'at most 12 spans'),
    /** true: girders continuous over the interior supports; false: simple spans. */
    continuous: z.boolean().default(false),
    /** One entry per support line (spans + 1), from the first abutment. */
    supports: z.array(supportSchema).min(2, 'a deck needs at least two support lines'),
    diaphragms: diaphragmSchema,
    /**
     * The loads of the refined (grillage) factors: 'design-truck' (default), the design truck
     * alone; 'hl93', the design truck or the design tandem, each with 33 % dynamic load
     * allowance and the design lane load in every loaded lane (shared/grillage/refinedFactors.ts).
     */
    refinedLoading: z.enum(REFINED_LOADINGS, { error: "refined loading must be 'design-truck' or 'hl93'" }).default('design-truck'),
    /** The design values of the live loads and lanes (DESIGN_VALUE_SETS above). */
    designValues: z.enum(DESIGN_VALUE_SETS, { error: "design values must be 'us-customary' or 'si-edition'" }).default('us-customary'),
    policy: policySchema.default({ exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: false }),
    loadModifiers: loadModifierSchema.default({ ductility: 1, redundancy: 1, importance: 1 }),
  })
  .superRefine((deck, ctx) => {
    if (deck.girders.kind === 'offsets') {
      const o = deck.girders.offsets;
      for (let i = 1; i < o.length; i++) {
        const gap = o[i] - o[i - 1];
        if (!(gap > 0)) {
          ctx.addIssue({
            code: 'custom',
            path: ['girders', 'offsets', i],
            message: `girder ${i + 1} must lie to the right of girder ${i} (offsets must increase; overlapping or coincident girders are not allowed)`,
          });
        } else if (gap < L.girderSpacing.min || gap > L.girderSpacing.max) {
          ctx.addIssue({
            code: 'custom',
            path: ['girders', 'offsets', i],
            message: `the spacing from girder ${i} to girder ${i + 1} must be from ${formatBound(L.girderSpacing.min, 'length')} to ${formatBound(L.girderSpacing.max, 'length')}`,
          });
        }
      }
    }
    const spread =
      deck.girders.kind === 'uniform'
        ? (deck.girders.count - 1) * deck.girders.spacing
        : deck.girders.offsets[deck.girders.offsets.length - 1] - deck.girders.offsets[0];
    const width = spread + deck.overhangLeft + deck.overhangRight;
    const partsInRange = Math.max(deck.overhangLeft, deck.overhangRight) <= L.overhang.max && spread <= L.girderSpacing.max * 40;
    if (partsInRange && width > L.deckWidth.max) {
      ctx.addIssue({
        code: 'custom',
        path: ['girders'],
        message: `the deck is ${formatBound(width, 'length')} wide (girders plus overhangs): at most ${formatBound(L.deckWidth.max, 'length')} is accepted`,
      });
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
