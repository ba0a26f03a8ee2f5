/**
 * Bending stiffness of one diaphragm or cross-frame member of the grillage, per girder bay.
 *
 * Units: internal SI (m, m², m⁴, Pa; EI in N·m²). A member spans one girder bay of clear
 * centre-to-centre spacing S (m). No torsional stiffness is given to diaphragms (J = 0,
 * common practice for cross-frames and a stated simplification for concrete diaphragms).
 *
 * Which stiffness (first that applies):
 * 1. `diaphragms.inertia` given: EI = E·I (E = `diaphragms.modulus`, else as below).
 * 2. Concrete diaphragm from its width b_w and depth d below the slab soffit, acting with the
 *    slab as a T-section: flange of effective width b_e = min(S/4, 12·ts + b_w), the rule for
 *    the effective flange width of AASHTO LRFD Art. 4.6.2.6.1 in editions before 2008 (least
 *    of a quarter of the span, 12 slab thicknesses plus the web, the beam spacing; from
 *    memory), applied to the diaphragm as a beam of span S. The slab flange is transformed to
 *    diaphragm concrete by E_deck / E_diaphragm. The grillage already carries the slab over
 *    the strip at the diaphragm line, so the member adds EI = E_dia·I_T − E_deck·b_e·ts³/12
 *    (the slab's own bending over b_e is not counted twice).
 * 3. Steel X cross-frame as an equivalent beam (truss-to-beam equivalence, common practice,
 *    from memory): chords of areas A_t, A_b at a distance h apart give, by the parallel-axis
 *    rule about their common centroid, I_eq = A_t·A_b/(A_t + A_b)·h². The two diagonals of
 *    area A_d each (one in tension, one in compression) at angle α = atan(h/S) to the chords
 *    give the panel's shear stiffness GA_s = 2·E·A_d·sin²α·cosα (a diagonal of length
 *    S/cosα carrying V/(2 sinα)). Shear flexibility enters through φ = 12·E·I_eq/(GA_s·S²)
 *    and EI_eff = E·I_eq/(1 + φ): an Euler beam of EI_eff has the same sway stiffness
 *    12·EI/(S³(1 + φ)) as a Timoshenko beam of the frame, which is the mode in which
 *    differentially deflecting girders load a cross-frame.
 * Moduli: a steel cross-frame without `diaphragms.modulus` is steel, Es = 29,000 ksi
 * (AASHTO LRFD Art. 6.4.1); a concrete diaphragm without it takes the girder modulus n·E_deck.
 * Every EI is multiplied by the grillage's transverseStiffnessFactor.
 */
import { DeckInputError, type Deck } from '../deck/schema.js';
import { PA_PER_KSI } from '../units.js';

export const STEEL_CROSS_FRAME_MODULUS = 29000 * PA_PER_KSI;

export interface DiaphragmStiffnessParts {
  /** How the stiffness was found. */
  source: 'given-inertia' | 'concrete-t-section' | 'steel-cross-frame';
  /** Modulus used, Pa. */
  E: number;
  /** Effective moment of inertia added by the member (EI_eff / E), m⁴. */
  I: number;
  /** EI added to the slab strip at the line, N·m² (before the transverse factor). */
  EI: number;
  /** Concrete: effective slab width b_e, m. Steel: I_eq, m⁴, and φ. */
  effectiveWidth?: number;
  Ieq?: number;
  phi?: number;
}

/** Missing geometry of a diaphragm that has no given inertia: a DeckInputError naming the first missing field. */
export function checkDiaphragmInput(deck: Deck): void {
  const d = deck.diaphragms;
  if (d.type === 'none' || d.inertia !== undefined || d.includeInGrillage === false) return;
  const need: (keyof typeof d)[] =
    d.type === 'concrete-diaphragms' ? ['width', 'depth'] : ['topChordArea', 'bottomChordArea', 'diagonalArea', 'frameDepth'];
  const what = d.type === 'concrete-diaphragms' ? 'concrete diaphragms' : 'steel cross-frames';
  for (const field of need) {
    const v = d[field];
    if (typeof v !== 'number' || !(v > 0)) {
      throw new DeckInputError(
        ['diaphragms', field],
        `${what} in the grillage need a moment of inertia or ${need.join(', ')}: ${field} is ${v === undefined ? 'missing' : `${String(v)}, not greater than 0`}`,
      );
    }
  }
}

/** The modulus of the diaphragms, Pa (see the module comment). */
export function diaphragmModulus(deck: Deck, girderModulus: number): number {
  const d = deck.diaphragms;
  if (d.modulus !== undefined) return d.modulus;
  return d.type === 'steel-cross-frames' ? STEEL_CROSS_FRAME_MODULUS : girderModulus;
}

/** Stiffness of the member across one bay of spacing S (m); inputs checked by checkDiaphragmInput. */
export function diaphragmStiffness(deck: Deck, S: number, E: number, deckModulus: number): DiaphragmStiffnessParts {
  const d = deck.diaphragms;
  if (d.inertia !== undefined) return { source: 'given-inertia', E, I: d.inertia, EI: E * d.inertia };
  if (d.type === 'concrete-diaphragms') {
    const bw = d.width!;
    const dw = d.depth!;
    const ts = deck.slab.thickness;
    const be = Math.min(S / 4, 12 * ts + bw);
    const bf = be * (deckModulus / E); // flange transformed to diaphragm concrete
    const Af = bf * ts;
    const Aw = bw * dw;
    const yf = ts / 2; // from the top of the slab
    const yw = ts + dw / 2;
    const yBar = (Af * yf + Aw * yw) / (Af + Aw);
    const IT = (bf * ts ** 3) / 12 + Af * (yf - yBar) ** 2 + (bw * dw ** 3) / 12 + Aw * (yw - yBar) ** 2;
    const EI = E * IT - deckModulus * ((be * ts ** 3) / 12);
    return { source: 'concrete-t-section', E, I: EI / E, EI, effectiveWidth: be };
  }
  const At = d.topChordArea!;
  const Ab = d.bottomChordArea!;
  const Ad = d.diagonalArea!;
  const h = d.frameDepth!;
  const Ieq = ((At * Ab) / (At + Ab)) * h ** 2;
  const alpha = Math.atan2(h, S);
  const GAs = 2 * E * Ad * Math.sin(alpha) ** 2 * Math.cos(alpha);
  const phi = (12 * E * Ieq) / (GAs * S ** 2);
  const I = Ieq / (1 + phi);
  return { source: 'steel-cross-frame', E, I, EI: E * I, Ieq, phi };
}
