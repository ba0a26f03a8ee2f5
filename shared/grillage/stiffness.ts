/**
 * Member properties of the grillage from the deck. Units in: the deck (internal SI).
 * Units out: E, G Pa; I, J m⁴; EI, GJ N·m²; widths m.
 *
 * Longitudinal (girder) members, one per girder line:
 * - Bending: composite transformed section with the tributary slab width as flange
 *   (interior: half the spacing each side; exterior: half the spacing plus the overhang),
 *   `compositeInertia` of deck/section.ts, in girder material; E_girder taken as n·E_deck so
 *   that the modular ratio n governs the relative stiffness (Art. 4.6.2.2.1, Eq. 4.6.2.2.1-2;
 *   tributary flange width after Art. 4.6.2.6.1). When the girder area or centroid is missing
 *   but I is given, I is used alone (a finding says so).
 * - Torsion: G_girder·J_girder + G_deck·b·ts³/6 (the slab's share of the tributary width b,
 *   grillage analogy). J_girder is `section.torsion` when given; otherwise it is taken as 0
 *   (neglected, a stated estimate with a finding: small for open steel and concrete I-sections,
 *   not for boxes).
 * Transverse slab-strip members, per strip of width b: I = b·ts³/12, J = b·ts³/6 in deck
 * concrete (E. C. Hambly, Bridge Deck Behaviour, grillage analogy for slabs; from memory).
 * Shear moduli G = E / (2(1 + ν)): ν = 0.2 for concrete (AASHTO LRFD Art. 5.4.2.5), 0.3 for
 * steel (common practice, no source); a girder of modulus ≥ 100 GPa is taken as steel.
 * Diaphragms and cross-frames (deck.diaphragms): a member of EI from `diaphragmStiffness.ts`
 * (the given I, or a concrete T-section or steel cross-frame equivalent beam from the
 * deck's geometry), per girder bay, added to the slab strip at each diaphragm line; no
 * torsional stiffness. Missing geometry is a DeckInputError naming the field;
 * `diaphragms.includeInGrillage: false` leaves them out (slab strips alone), with a finding.
 */
import { deckGeometry } from '../deck/geometry.js';
import { compositeInertia, derivedSection, eccentricityEg } from '../deck/section.js';
import { DeckInputError, type Deck } from '../deck/schema.js';
import { lengthInText } from '../quantities/inText.js';
import type { TraceStep } from '../trace.js';
import type { GrillageFinding } from './quality.js';
import { checkDiaphragmInput, diaphragmModulus, diaphragmStiffness } from './diaphragmStiffness.js';

export const POISSON_CONCRETE = 0.2;
export const POISSON_STEEL = 0.3;
/** Girders of at least this modulus are taken as steel for ν, Pa. */
export const STEEL_MODULUS_THRESHOLD = 100e9;

export interface StiffnessOptions {
  /** Multiplies the bending stiffness of transverse slab strips and diaphragms (default 1). */
  transverseStiffnessFactor: number;
  /** Multiplies every St Venant torsional stiffness, longitudinal and transverse (default 1; 0 = no torsion). */
  torsionFactor: number;
  /** Girder torsion constant J, m⁴, overriding section.torsion. */
  girderTorsion?: number;
  /** Poisson's ratio of the girder material (default by material, see above). */
  girderPoisson?: number;
}

export interface DeckStiffness {
  /** Deck concrete modulus, Pa. */
  Ed: number;
  Gd: number;
  /** Girder modulus used (n·Ed), Pa. */
  Eg: number;
  Gg: number;
  n: number;
  nuGirder: number;
  ts: number;
  /** Girder J used, m⁴ (0 when neglected). */
  Jgirder: number;
  /** EI, GJ of a girder line of tributary slab width b (m), N·m². */
  girder(b: number): { EI: number; GJ: number; Ic: number };
  /** EI, GJ of a transverse slab strip of width b (m), N·m². */
  slabStrip(b: number): { EI: number; GJ: number };
  /** The diaphragms are members of the grillage. */
  diaphragmsModelled: boolean;
  /** EI added by one diaphragm member across a girder bay of spacing S (m), N·m² (0 when not modelled). */
  diaphragmEI(S: number): number;
  findings: GrillageFinding[];
  trace: TraceStep[];
}

export function deckStiffness(deck: Deck, opt: StiffnessOptions, tributary: { interior?: number; exterior: number }): DeckStiffness {
  const ds = derivedSection(deck);
  const Ed = ds.deckModulus;
  const n = ds.modularRatio;
  const Eg = n * Ed;
  const nuGirder =
    opt.girderPoisson ?? (deck.materials.girder.kind === 'concrete' || ds.girderModulus < STEEL_MODULUS_THRESHOLD ? POISSON_CONCRETE : POISSON_STEEL);
  const Gd = (Ed / (2 * (1 + POISSON_CONCRETE))) * opt.torsionFactor;
  const Gg = (Eg / (2 * (1 + nuGirder))) * opt.torsionFactor;
  const ts = deck.slab.thickness;
  const findings: GrillageFinding[] = [];
  const trace: TraceStep[] = [];

  const { area, inertia } = deck.section;
  const eg = eccentricityEg(deck);
  const canComposite = area !== undefined && inertia !== undefined && eg !== undefined;
  if (inertia === undefined) {
    throw new DeckInputError(['section', 'inertia'], 'the grillage needs the girder moment of inertia I');
  }
  if (!canComposite) {
    findings.push({
      code: 'composite-section-unavailable',
      severity: 'warning',
      message: 'girder area or centroid depth not given: the girder moment of inertia I is used alone for the longitudinal members (no composite slab flange)',
    });
  }
  const Ic = (b: number) => (canComposite ? compositeInertia(deck, b) : inertia);

  const Jgirder = opt.girderTorsion ?? deck.section.torsion ?? 0;
  if (opt.girderTorsion === undefined && deck.section.torsion === undefined) {
    const closed = ['b', 'c', 'd', 'f', 'g'].includes(deck.sectionType);
    findings.push({
      code: 'girder-torsion-estimated',
      severity: closed ? 'warning' : 'info',
      message: closed
        ? `section type ${deck.sectionType} is a closed or box section but no torsional inertia J is given: the girder's own torsion is neglected (J = 0), only the slab's share counts; enter J for a meaningful result`
        : "no girder torsional inertia J given: the girder's own St Venant torsion is neglected (J = 0, small for open I-sections); the slab's share counts",
    });
  }

  const diaphragms = deck.diaphragms;
  const diaphragmsModelled = diaphragms.type !== 'none' && diaphragms.includeInGrillage !== false;
  checkDiaphragmInput(deck);
  const Ediaph = diaphragmModulus(deck, Eg);
  const diaphragmEI = (S: number) => (diaphragmsModelled ? diaphragmStiffness(deck, S, Ediaph, Ed).EI * opt.transverseStiffnessFactor : 0);
  if (diaphragms.type !== 'none' && !diaphragmsModelled) {
    findings.push({
      code: 'diaphragms-left-out',
      severity: 'info',
      message: `the ${diaphragms.type === 'concrete-diaphragms' ? 'concrete diaphragms' : 'steel cross-frames'} are left out of the grillage by the deck's setting: the slab strips alone connect the girders at their lines`,
    });
  }
  const girder = (b: number) => {
    const I = Ic(b);
    return { EI: Eg * I, GJ: Gg * Jgirder + Gd * ((b * ts ** 3) / 6), Ic: I };
  };
  const slabStrip = (b: number) => ({
    EI: (Ed * b * ts ** 3 * opt.transverseStiffnessFactor) / 12,
    GJ: (Gd * b * ts ** 3) / 6,
  });

  trace.push({
    label: 'Deck concrete modulus and shear modulus',
    formula: 'G = E / (2·(1 + ν)), ν = 0.2',
    inputs: [{ symbol: 'Ed', description: 'deck concrete modulus', value: Ed, kind: 'stress' }],
    value: Ed / (2 * (1 + POISSON_CONCRETE)),
    kind: 'stress',
    article: 'AASHTO LRFD Art. 5.4.2.4 (E), Art. 5.4.2.5 (ν)',
  });
  trace.push({
    label: 'Girder modulus in the grillage',
    formula: 'Eg = n·Ed',
    inputs: [
      { symbol: 'n', description: 'modular ratio', value: n, kind: 'none' },
      { symbol: 'Ed', description: 'deck concrete modulus', value: Ed, kind: 'stress' },
    ],
    value: Eg,
    kind: 'stress',
    article: 'AASHTO LRFD Eq. 4.6.2.2.1-2',
    note: `girder shear modulus with ν = ${nuGirder}`,
  });
  const bInt = tributary.interior;
  if (bInt !== undefined) {
    trace.push({
      label: 'Composite inertia of an interior girder line',
      formula: canComposite ? 'Ic = I + b·ts³/(12n) + A·(b·ts/n)/(A + b·ts/n)·eg²' : 'Ic = I (girder alone)',
      inputs: [
        { symbol: 'b', description: 'tributary slab width', value: bInt, kind: 'length' },
        { symbol: 'ts', description: 'slab thickness', value: ts, kind: 'dimension' },
        { symbol: 'I', description: 'girder moment of inertia', value: inertia, kind: 'inertia' },
      ],
      value: Ic(bInt),
      kind: 'inertia',
      article: 'AASHTO LRFD Art. 4.6.2.6.1 (tributary flange width); transformed section',
    });
  }
  trace.push({
    label: 'Composite inertia of an exterior girder line',
    formula: canComposite ? 'Ic = I + b·ts³/(12n) + A·(b·ts/n)/(A + b·ts/n)·eg²' : 'Ic = I (girder alone)',
    inputs: [
      { symbol: 'b', description: 'tributary slab width (half spacing + overhang)', value: tributary.exterior, kind: 'length' },
      { symbol: 'ts', description: 'slab thickness', value: ts, kind: 'dimension' },
    ],
    value: Ic(tributary.exterior),
    kind: 'inertia',
    article: 'AASHTO LRFD Art. 4.6.2.6.1 (tributary flange width); transformed section',
  });
  trace.push({
    label: 'Torsion constant of a girder line (girder + slab share)',
    formula: 'GJ = Gg·Jg + Gd·b·ts³/6',
    inputs: [
      { symbol: 'Jg', description: 'girder torsional inertia', value: Jgirder, kind: 'inertia' },
      { symbol: 'b', description: 'tributary slab width', value: bInt ?? tributary.exterior, kind: 'length' },
      { symbol: 'ts', description: 'slab thickness', value: ts, kind: 'dimension' },
    ],
    value: ((bInt ?? tributary.exterior) * ts ** 3) / 6,
    kind: 'inertia',
    article: 'grillage analogy (slab share J = b·ts³/6)',
    note: opt.torsionFactor === 1 ? undefined : `all torsion multiplied by ${opt.torsionFactor}`,
  });
  trace.push({
    label: 'Transverse slab strip per metre of strip width',
    formula: 'I = b·ts³/12, J = b·ts³/6 (b = 1 m)',
    inputs: [{ symbol: 'ts', description: 'slab thickness', value: ts, kind: 'dimension' }],
    value: ts ** 3 / 12,
    kind: 'inertia',
    article: 'grillage analogy for slabs',
    note: opt.transverseStiffnessFactor === 1 ? undefined : `bending stiffness multiplied by ${opt.transverseStiffnessFactor}`,
  });
  if (diaphragmsModelled) trace.push(...diaphragmTrace(deck, deckGeometry(deck).spacings, Ediaph, Ed, opt.transverseStiffnessFactor));
  return { Ed, Gd, Eg, Gg, n, nuGirder, ts, Jgirder, girder, slabStrip, diaphragmsModelled, diaphragmEI, findings, trace };
}

/** One trace step per distinct girder-bay spacing: which stiffness each diaphragm member has. */
function diaphragmTrace(deck: Deck, bays: number[], E: number, Ed: number, factor: number): TraceStep[] {
  const distinct = [...new Set(bays.map((b) => Number(b.toPrecision(9))))];
  const what = deck.diaphragms.type === 'concrete-diaphragms' ? 'concrete diaphragm' : 'steel cross-frame';
  return distinct.map((S) => {
    const p = diaphragmStiffness(deck, S, E, Ed);
    const inputs: TraceStep['inputs'] = [
      { symbol: 'S', description: 'girder spacing of the bay', value: S, kind: 'length' },
      { symbol: 'E', description: `${what} modulus`, value: E, kind: 'stress' },
    ];
    let formula = 'EI = E·I (given moment of inertia)';
    let article = 'deck.diaphragms.inertia';
    if (p.source === 'concrete-t-section') {
      const d = deck.diaphragms;
      inputs.push(
        { symbol: 'bw', description: 'diaphragm width', value: d.width!, kind: 'dimension' },
        { symbol: 'd', description: 'diaphragm depth below the slab', value: d.depth!, kind: 'dimension' },
        { symbol: 'ts', description: 'slab thickness', value: deck.slab.thickness, kind: 'dimension' },
        { symbol: 'be', description: 'effective slab width, min(S/4, 12·ts + bw)', value: p.effectiveWidth!, kind: 'dimension' },
      );
      formula = 'EI = E·I_T − E_deck·be·ts³/12 (T-section of web bw × d and slab flange be; slab strip already modelled)';
      article = 'AASHTO LRFD Art. 4.6.2.6.1, effective flange width rule of editions before 2008 (from memory), span S';
    } else if (p.source === 'steel-cross-frame') {
      const d = deck.diaphragms;
      inputs.push(
        { symbol: 'At', description: 'top chord area', value: d.topChordArea!, kind: 'area' },
        { symbol: 'Ab', description: 'bottom chord area', value: d.bottomChordArea!, kind: 'area' },
        { symbol: 'Ad', description: 'area of one diagonal (X-frame)', value: d.diagonalArea!, kind: 'area' },
        { symbol: 'h', description: 'frame depth between chords', value: d.frameDepth!, kind: 'dimension' },
        { symbol: 'Ieq', description: 'chords by the parallel-axis rule, At·Ab/(At+Ab)·h²', value: p.Ieq!, kind: 'inertia' },
        { symbol: 'φ', description: 'shear flexibility of the diagonals, 12·E·Ieq/(GAs·S²), GAs = 2·E·Ad·sin²α·cosα', value: p.phi!, kind: 'none' },
      );
      formula = 'EI = E·Ieq/(1 + φ) (equivalent beam of an X cross-frame)';
      article = 'equivalent beam of a truss cross-frame (common practice, from memory)';
    }
    return {
      label: `Diaphragm member (${what}, bay of ${lengthInText(S)})`,
      formula,
      inputs,
      value: p.I,
      kind: 'inertia' as const,
      article,
      note: factor === 1 ? 'no torsional stiffness; added to the slab strip at each diaphragm line' : `bending stiffness multiplied by ${factor}`,
    };
  });
}
