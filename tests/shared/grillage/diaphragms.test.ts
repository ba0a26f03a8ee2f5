import { describe, expect, it } from 'vitest';
import { assertDeck, DeckInputError, type DeckInput } from '../../../shared/deck/schema.js';
import { analyseLoads, buildGrillage } from '../../../shared/grillage/index.js';
import { diaphragmStiffness, STEEL_CROSS_FRAME_MODULUS } from '../../../shared/grillage/diaphragmStiffness.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { fromUs } from '../../../shared/units.js';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { steelDeck } from './fixtures.js';

describe('diaphragm stiffness from the deck geometry (hand computations)', () => {
  it('steel X cross-frame: I_eq = At·Ab/(At+Ab)·h², shear flexibility φ from the diagonals', () => {
    // Equivalent beam of a truss cross-frame (common practice, from memory): chords by the
    // parallel-axis rule; X diagonals give GAs = 2·E·Ad·sin²α·cosα, φ = 12·E·Ieq/(GAs·S²).
    const deck = steelDeck({ diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 1, topChordArea: 3e-3, bottomChordArea: 2e-3, diagonalArea: 1.5e-3, frameDepth: 1.2 } });
    const S = 2.4;
    const E = STEEL_CROSS_FRAME_MODULUS;
    const p = diaphragmStiffness(deck, S, E, 25e9);
    // By hand: Ieq = 0.003·0.002/0.005·1.44 = 1.728e-3 m⁴; α = atan(0.5): sin² = 0.2, cos = 0.894427;
    // GAs = 2·E·0.0015·0.2·0.894427 = 5.366563e-4·E; φ = 12·1.728e-3/(5.366563e-4·5.76) = 6.708204
    expect(p.Ieq!).toBeRelativelyClose(1.728e-3, 1e-12);
    expect(p.phi!).toBeRelativelyClose(6.708204, 1e-6);
    expect(p.I).toBeRelativelyClose(1.728e-3 / 7.708204, 1e-6);
    expect(p.EI).toBeRelativelyClose((E * 1.728e-3) / 7.708204, 1e-6);
    expect(E).toBeRelativelyClose(fromUs.ksi(29000), 1e-12); // AASHTO LRFD Art. 6.4.1
  });

  it('concrete diaphragm: T-section with be = min(S/4, 12·ts + bw), less the slab strip already modelled', () => {
    // Effective flange rule of AASHTO LRFD Art. 4.6.2.6.1 before 2008 (from memory), span S.
    const base = steelDeck();
    const input = { ...base, slab: { ...base.slab, thickness: 0.2 }, diaphragms: { ...base.diaphragms, type: 'concrete-diaphragms' as const, width: 0.3, depth: 0.8 } };
    const deck = assertDeck(input as DeckInput);
    const E = 30e9;
    const p = diaphragmStiffness(deck, 3.2, E, 30e9);
    // By hand: be = min(0.8, 2.7) = 0.8 m. Flange 0.8×0.2 (A 0.16, y 0.1), web 0.3×0.8 (A 0.24, y 0.6):
    // ȳ = (0.016 + 0.144)/0.4 = 0.4; I_T = 0.8·0.008/12 + 0.16·0.09 + 0.3·0.512/12 + 0.24·0.04
    //    = 5.3333e-4 + 0.0144 + 0.0128 + 0.0096 = 0.0373333 m⁴; less be·ts³/12 = 5.3333e-4 → 0.0368 m⁴.
    expect(p.effectiveWidth!).toBeRelativelyClose(0.8, 1e-12);
    expect(p.I).toBeRelativelyClose(0.0368, 1e-9);
    expect(p.EI).toBeRelativelyClose(E * 0.0368, 1e-9);
  });
});

describe('bad diaphragm input', () => {
  it('a concrete diaphragm with neither geometry nor stiffness names the missing field', () => {
    try {
      buildGrillage(steelDeck({ diaphragms: { type: 'concrete-diaphragms', intermediatePerSpan: 1, width: 0.3 } }));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).issues[0].path).toEqual(['diaphragms', 'depth']);
      expect((e as DeckInputError).message).toMatch(/concrete diaphragms .*depth is missing/);
    }
  });

  it('a cross-frame with zero areas is refused by the deck schema, naming the field', () => {
    try {
      steelDeck({ diaphragms: { type: 'steel-cross-frames', topChordArea: 0, bottomChordArea: 2e-3, diagonalArea: 1e-3, frameDepth: 1 } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      const issue = (e as DeckInputError).issues[0];
      expect(issue.path).toEqual(['diaphragms', 'topChordArea']);
      expect(issue.message).toBe('cross-frame top chord area must be greater than 0');
    }
  });

  it('a cross-frame depth beyond the physical range states the bound in both units', () => {
    expect(() => steelDeck({ diaphragms: { type: 'steel-cross-frames', frameDepth: 9 } })).toThrow(/cross-frame depth must be at most 5000 mm \(196\.9 in\)/);
  });

  it('an old stored deck with diaphragms but no sizes parses, keeps its code factors, and the grillage names the missing field', () => {
    const file = JSON.parse(readFileSync(fileURLToPath(new URL('../../../public/examples/fhwa-psc-step-5-1.deck.json', import.meta.url)), 'utf8'));
    delete file.deck.diaphragms.width;
    delete file.deck.diaphragms.depth;
    const deck = assertDeck(deckFromDisplay(file.deck, file.units));
    expect(deck.diaphragms.includeInGrillage).toBe(true);
    const code = computeCodeFactors(deck);
    expect(code.factors.length).toBeGreaterThan(0);
    expect(() => buildGrillage(deck)).toThrow(/diaphragms\.width: concrete diaphragms in the grillage need a moment of inertia or width, depth/);
    const off = assertDeck(deckFromDisplay({ ...file.deck, diaphragms: { ...file.deck.diaphragms, includeInGrillage: false } }, file.units));
    expect(buildGrillage(off).findings.some((f) => f.code === 'diaphragms-left-out')).toBe(true);
  });

  it('an old deck without the new fields still parses (defaults: in the grillage, no geometry)', () => {
    const deck = steelDeck({ diaphragms: { type: 'none' } as DeckInput['diaphragms'] });
    expect(deck.diaphragms.includeInGrillage).toBe(true);
    expect(deck.diaphragms.width).toBeUndefined();
    expect(buildGrillage(deck).mesh.members.some((m) => m.kind === 'diaphragm')).toBe(false);
  });
});

describe('stiff diaphragms on a right simple span', () => {
  const frames = { type: 'steel-cross-frames' as const, intermediatePerSpan: 9, inertia: 1 };
  const spec = { girders: 5, spacingFt: 8, spansFt: [100] };
  const L = fromUs.ft(100);
  const S = fromUs.ft(8);
  const load = [{ x: L / 2, y: 0, P: 100e3 }]; // over the exterior girder at mid-span

  // The rigid-section model neglects torsion (the section rotates as a rigid body, loads shared
  // by bending alone), so both grillages are run without torsion for this comparison.
  /** Girder shares of the mid-span moment (station 5 of the tenth points). */
  const shares = (withFrames: boolean, switchedOff = false) => {
    const diaphragms = withFrames ? { ...frames, includeInGrillage: !switchedOff } : { type: 'none' as const };
    const model = buildGrillage(steelDeck({ ...spec, diaphragms }), { segmentsPerSpan: 20, torsionFactor: 0 });
    const res = analyseLoads(model, load);
    const m = res.girderMoments.map((g) => g[0][5]);
    const total = m.reduce((a, b) => a + b, 0);
    return { m, total, model };
  };

  it('girder moments across mid-span sum to the static moment PL/4 (equilibrium), with and without', () => {
    // Statics of a simple beam under a central point load: M = P·L/4.
    for (const w of [false, true]) expect(shares(w).total).toBeRelativelyClose((100e3 * L) / 4, 1e-9);
  });

  it('shares move toward the rigid-section values (commentary to AASHTO LRFD Art. 4.6.2.2.2d)', () => {
    // Rigid section: R_i = P/Nb + P·e·x_i/Σx², e and x_i from the girder group's centre.
    const x = [-2, -1, 0, 1, 2].map((k) => k * S);
    const sx2 = x.reduce((a, b) => a + b * b, 0);
    const rigid = x.map((xi) => 1 / 5 + (x[0] * xi) / sx2);
    const dist = (s: number[]) => Math.hypot(...s.map((v, i) => v - rigid[i]));
    const soft = shares(false);
    const stiff = shares(true);
    const softShares = soft.m.map((v) => v / soft.total);
    const stiffShares = stiff.m.map((v) => v / stiff.total);
    // Without diaphragms the loaded girder takes far more than the rigid share; with them every
    // share lies within 0.01 (of the load) of the rigid value and the gap shrinks tenfold.
    expect(softShares[0] - rigid[0]).toBeGreaterThan(0.05);
    expect(dist(stiffShares)).toBeLessThan(0.1 * dist(softShares));
    stiffShares.forEach((v, i) => expect(Math.abs(v - rigid[i])).toBeLessThan(0.01));
    // the deck's switch leaves them out: the same shares as no diaphragms at all
    shares(true, true).m.forEach((v, i) => expect(v).toBeRelativelyClose(soft.m[i], 1e-12));
    // the model summary names the members and their stiffness
    expect(stiff.model.trace.some((t) => t.label.startsWith('Diaphragm member (steel cross-frame'))).toBe(true);
    expect(stiff.model.mesh.members.filter((m) => m.kind === 'diaphragm')).toHaveLength(11 * 4);
  });
});
