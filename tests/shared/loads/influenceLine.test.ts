/**
 * Influence lines by the stiffness method, checked against closed forms and identities.
 *
 * Sources
 * - Simple span (statics, hand derivation): for a unit load at ξ on a span L,
 *   R0 = 1 − ξ/L, RL = ξ/L; M(x) = ξ(L − x)/L for ξ ≤ x and x(L − ξ)/L for ξ ≥ x;
 *   V(x) = −ξ/L for ξ < x and 1 − ξ/L for ξ > x.
 * - Two continuous spans: Clapeyron's three-moment equation (any structural analysis text,
 *   e.g. Timoshenko & Young, Theory of Structures, the three-moment equation), hand
 *   derivation written out below each test.
 * - Three equal continuous spans under a uniform load on all spans: support moments
 *   −0.100·wL² (beam tables of continuous beams, e.g. the AISC Manual's "continuous beam —
 *   three equal spans — all spans loaded"; from memory) and points of contraflexure at
 *   0.8 L in the end spans, (1 ± √0.2)/2·L in the middle span (hand derivation from those
 *   support moments).
 * - Identities (common practice, no source): ΣR = 1 for a unit load; the shear line jumps
 *   by +1 at its section; moment = Σ reactions × lever arms − load × lever arm (statics);
 *   mirror symmetry of a symmetric beam; Maxwell–Betti reciprocity (the support-moment line
 *   is the same function whatever the mesh).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BeamAnalysis, DeckInputError, influenceLine, type BeamModel } from '../../../shared/index.js';

const RTOL = 1e-9;

/** |a − b| ≤ rtol·scale, for ordinates that may be zero. */
function close(a: number, b: number, scale: number, rtol = RTOL): void {
  expect(Math.abs(a - b)).toBeLessThanOrEqual(rtol * scale);
}

describe('simple span: closed-form influence lines (hand derivation)', () => {
  const L = 33.5;
  const beam: BeamModel = { spans: [L], continuous: false };
  const xs = [0.1, 0.37, 0.5, 0.83].map((f) => f * L);
  const loads = [0, 0.05, 0.2, 0.41, 0.5, 0.66, 0.9, 1].map((f) => f * L);

  it('moment: ξ(L − x)/L left of x, x(L − ξ)/L right of x', () => {
    for (const x of xs) {
      const il = influenceLine(beam, { kind: 'moment', x });
      for (const xi of loads) {
        const exact = xi <= x ? (xi * (L - x)) / L : (x * (L - xi)) / L;
        close(il.at(xi), exact, L);
      }
    }
  });

  it('shear: −ξ/L left of x, 1 − ξ/L right of x; a load at x counts on the side asked for', () => {
    for (const x of xs) {
      const right = influenceLine(beam, { kind: 'shear', x, side: 'right' });
      const left = influenceLine(beam, { kind: 'shear', x, side: 'left' });
      for (const xi of loads) {
        if (xi === x) continue;
        const exact = xi < x ? -xi / L : 1 - xi / L;
        close(right.at(xi), exact, 1);
        close(left.at(xi), exact, 1);
      }
      // Load exactly at x: in the left part for "just right of x", in the right part for "just left".
      close(right.at(x), -x / L, 1);
      close(left.at(x), 1 - x / L, 1);
    }
  });

  it('reactions: 1 − ξ/L and ξ/L', () => {
    const r0 = influenceLine(beam, { kind: 'reaction', support: 0 });
    const r1 = influenceLine(beam, { kind: 'reaction', support: 1 });
    for (const xi of loads) {
      close(r0.at(xi), 1 - xi / L, 1);
      close(r1.at(xi), xi / L, 1);
    }
  });

  it('ordinates between stations are exact (cubic Hermite, not linear): one element per span still gives the closed form', () => {
    // A coarse mesh with the section as the only interior node reproduces the linear
    // moment line exactly, and a continuous beam's curved line matches a fine mesh.
    const il = influenceLine(beam, { kind: 'moment', x: 0.37 * L }, { pointsPerSpan: 1 });
    for (const xi of loads) close(il.at(xi), xi <= 0.37 * L ? (xi * (L - 0.37 * L)) / L : (0.37 * L * (L - xi)) / L, L);
    const two: BeamModel = { spans: [20, 27], continuous: true };
    const coarse = influenceLine(two, { kind: 'moment', x: 20 }, { pointsPerSpan: 1 });
    const fine = influenceLine(two, { kind: 'moment', x: 20 }, { pointsPerSpan: 40 });
    for (const xi of [1.3, 7.77, 13.1, 19.9, 23.4, 33.3, 46]) close(coarse.at(xi), fine.at(xi), 20);
  });
});

describe('two continuous spans: three-moment equation (hand derivation)', () => {
  it('equal spans: M_B = −(L/4)·ξ(1 − ξ²), R_A = 1 − ξ − ξ(1 − ξ²)/4, R_B = (3ξ − ξ³)/2, R_C = −ξ(1 − ξ²)/4', () => {
    // Three-moment equation with M_A = M_C = 0 and a unit load at a = ξL in span AB:
    //   2·M_B·(L + L) = −P·a·(L² − a²)/L  ⇒  M_B = −P·L·ξ(1 − ξ²)/4.
    // Statics of span BC: R_C·L = M_B (hogging M_B pulls C down); of span AB:
    //   R_A = (1 − ξ) + M_B/L; R_B = 1 − R_A − R_C.
    const L = 42.7;
    const a = new BeamAnalysis({ spans: [L, L], continuous: true }, { pointsPerSpan: 10 });
    const mB = a.influenceLine({ kind: 'moment', x: L });
    const rA = a.influenceLine({ kind: 'reaction', support: 0 });
    const rB = a.influenceLine({ kind: 'reaction', support: 1 });
    const rC = a.influenceLine({ kind: 'reaction', support: 2 });
    for (const xi of [0.05, 0.2, 1 / Math.sqrt(3), 0.63, 0.9]) {
      const g = xi * (1 - xi * xi);
      close(mB.at(xi * L), (-L / 4) * g, L);
      close(rA.at(xi * L), 1 - xi - g / 4, 1);
      close(rB.at(xi * L), (3 * xi - xi ** 3) / 2, 1);
      close(rC.at(xi * L), -g / 4, 1);
      // Symmetry: a load at the mirror point in span BC gives the same M_B and R_B.
      close(mB.at(2 * L - xi * L), (-L / 4) * g, L);
      close(rB.at(2 * L - xi * L), (3 * xi - xi ** 3) / 2, 1);
    }
  });

  it('moment at a point of span 1: simple-span moment + M_B·x/L', () => {
    const L = 30;
    const x = 0.4 * L;
    const il = influenceLine({ spans: [L, L], continuous: true }, { kind: 'moment', x });
    for (const xi of [0.1, 0.4, 0.7, 1.3, 1.8].map((f) => f * L)) {
      const simple = xi <= L ? (xi <= x ? (xi * (L - x)) / L : (x * (L - xi)) / L) : 0;
      const u = xi <= L ? xi / L : (2 * L - xi) / L;
      const mB = (-L / 4) * u * (1 - u * u);
      close(il.at(xi), simple + (mB * x) / L, L);
    }
  });

  it('unequal spans and rigidities: M_B = −P·a(L1² − a²) / [2·L1·I1·(L1/I1 + L2/I2)]', () => {
    // Three-moment equation with I per span:
    //   2·M_B·(L1/I1 + L2/I2) = −6·A1·ā1/(L1·I1) − 6·A2·b̄2/(L2·I2),
    // where for a unit load at a from A in span 1, 6·A1·ā1/L1 = a(L1² − a²)/L1 … and for a
    // load at b from C in span 2, 6·A2·b̄2/L2 = b(L2² − b²)/L2.
    const L1 = 25;
    const L2 = 36;
    const I1 = 2.0e9;
    const I2 = 3.5e9;
    const beam: BeamModel = { spans: [L1, L2], continuous: true, flexuralRigidity: [I1, I2] };
    const il = influenceLine(beam, { kind: 'moment', x: L1 });
    const denom = 2 * (L1 / I1 + L2 / I2);
    for (const a of [3, 11, 17.5, 24]) close(il.at(a), -(a * (L1 * L1 - a * a)) / (L1 * I1) / denom, L1);
    for (const b of [2, 9, 20, 33]) close(il.at(L1 + L2 - b), -(b * (L2 * L2 - b * b)) / (L2 * I2) / denom, L1);
  });
});

describe('three equal continuous spans under a uniform load on all spans (beam tables)', () => {
  it('support moments −0.100·wL²', () => {
    const L = 18;
    const a = new BeamAnalysis({ spans: [L, L, L], continuous: true });
    for (const x of [L, 2 * L]) {
      const il = a.influenceLine({ kind: 'moment', x });
      expect(il.integral(0, 3 * L)).toBeRelativelyClose(-0.1 * L * L, RTOL);
    }
  });
});

describe('identities', () => {
  const beams: BeamModel[] = [
    { spans: [21], continuous: false },
    { spans: [20, 31, 24], continuous: true },
    { spans: [20, 31, 24], continuous: false },
    { spans: [12, 40, 40, 12], continuous: true, flexuralRigidity: [1, 3, 3, 1] },
  ];

  it('Σ reactions = 1 for a unit load anywhere; zero off the beam', () => {
    for (const beam of beams) {
      const a = new BeamAnalysis(beam, { pointsPerSpan: 7 });
      const total = beam.spans.reduce((s, v) => s + v, 0);
      const lines = beam.spans.map((_, i) => a.influenceLine({ kind: 'reaction', support: i })).concat(a.influenceLine({ kind: 'reaction', support: beam.spans.length }));
      for (let k = 0; k <= 50; k++) {
        const xi = (k / 50) * total;
        close(lines.reduce((s, l) => s + l.at(xi), 0), 1, 1);
      }
      for (const l of lines) expect(l.at(total + 1)).toBe(0);
    }
  });

  it('statics: M(x) = Σ R_i·(x − x_i) over supports left of x − (x − ξ) for a load left of x', () => {
    for (const beam of beams) {
      const a = new BeamAnalysis(beam, { pointsPerSpan: 6 });
      const sup = [0];
      for (const L of beam.spans) sup.push(sup[sup.length - 1] + L);
      const total = sup[sup.length - 1];
      const reactions = sup.map((_, i) => a.influenceLine({ kind: 'reaction', support: i }));
      for (const x of [0.31 * total, 0.5 * total, 0.77 * total]) {
        const m = a.influenceLine({ kind: 'moment', x });
        const v = a.influenceLine({ kind: 'shear', x, side: 'right' });
        for (const xi of [0.07, 0.29, 0.45, 0.61, 0.93].map((f) => f * total)) {
          let moment = 0;
          let shear = 0;
          sup.forEach((s, i) => {
            // "Just right of x" includes a support standing at x.
            if (s <= x) {
              moment += reactions[i].at(xi) * (x - s);
              shear += reactions[i].at(xi);
            }
          });
          if (xi <= x) {
            moment -= x - xi;
            shear -= 1;
          }
          close(m.at(xi), moment, total);
          close(v.at(xi), shear, 1);
        }
      }
    }
  });

  it('the shear line jumps by +1 at its section (both sides), and left/right differ only there inside a span', () => {
    const a = new BeamAnalysis({ spans: [20, 31, 24], continuous: true });
    for (const x of [7.3, 20 + 12.1, 60]) {
      for (const side of ['left', 'right'] as const) {
        const v = a.influenceLine({ kind: 'shear', x, side });
        close(v.limit(x, 1) - v.limit(x, -1), 1, 1);
      }
      const l = a.influenceLine({ kind: 'shear', x, side: 'left' });
      const r = a.influenceLine({ kind: 'shear', x, side: 'right' });
      for (const xi of [3, 15, 33, 50, 70]) close(l.at(xi), r.at(xi), 1);
    }
  });

  it('at an interior support, shear right − shear left = the reaction line (load not at the support)', () => {
    const a = new BeamAnalysis({ spans: [20, 31, 24], continuous: true });
    const x = 20;
    const l = a.influenceLine({ kind: 'shear', x, side: 'left' });
    const r = a.influenceLine({ kind: 'shear', x, side: 'right' });
    const R = a.influenceLine({ kind: 'reaction', support: 1 });
    for (const xi of [4, 13, 27, 44, 66]) close(r.at(xi) - l.at(xi), R.at(xi), 1);
  });

  it('mirror symmetry of a symmetric beam', () => {
    const beam: BeamModel = { spans: [20, 31, 20], continuous: true };
    const total = 71;
    const m1 = influenceLine(beam, { kind: 'moment', x: 8 });
    const m2 = influenceLine(beam, { kind: 'moment', x: total - 8 });
    const r1 = influenceLine(beam, { kind: 'reaction', support: 1 });
    const r2 = influenceLine(beam, { kind: 'reaction', support: 2 });
    const v1 = influenceLine(beam, { kind: 'shear', x: 8, side: 'right' });
    const v2 = influenceLine(beam, { kind: 'shear', x: total - 8, side: 'left' });
    for (const xi of [1, 6.5, 19, 30, 44, 60, 70]) {
      close(m1.at(xi), m2.at(total - xi), total);
      close(r1.at(xi), r2.at(total - xi), 1);
      if (Math.abs(xi - 8) > 1e-9) close(v1.at(xi), -v2.at(total - xi), 1);
    }
  });

  it('the ordinates do not depend on the mesh (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 3, max: 80, noNaN: true }), { minLength: 1, maxLength: 4 }),
        fc.boolean(),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.integer({ min: 1, max: 12 }),
        (spans, continuous, fx, fxi, n) => {
          const beam: BeamModel = { spans, continuous };
          const total = spans.reduce((s, v) => s + v, 0);
          const x = fx * total;
          const xi = fxi * total;
          const a = influenceLine(beam, { kind: 'moment', x }, { pointsPerSpan: n });
          const b = influenceLine(beam, { kind: 'moment', x }, { pointsPerSpan: 25 });
          const va = a.at(xi);
          expect(Number.isFinite(va)).toBe(true);
          close(va, b.at(xi), total, 1e-8);
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('bad input: typed errors naming the parameter', () => {
  const expectError = (fn: () => unknown, path: (string | number)[]) => {
    try {
      fn();
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).path).toEqual(path);
      return;
    }
    throw new Error('expected a DeckInputError');
  };

  it('rejects no spans, zero, negative and non-finite spans', () => {
    expectError(() => influenceLine({ spans: [], continuous: true }, { kind: 'moment', x: 0 }), ['spans']);
    expectError(() => influenceLine({ spans: [10, 0], continuous: true }, { kind: 'moment', x: 1 }), ['spans', 1]);
    expectError(() => influenceLine({ spans: [-5], continuous: false }, { kind: 'moment', x: 1 }), ['spans', 0]);
    expectError(() => influenceLine({ spans: [Number.NaN], continuous: false }, { kind: 'moment', x: 1 }), ['spans', 0]);
    expectError(() => influenceLine({ spans: [10], continuous: false, flexuralRigidity: [1, 2] }, { kind: 'moment', x: 1 }), ['flexuralRigidity']);
    expectError(() => influenceLine({ spans: [10, 10], continuous: true, flexuralRigidity: [1, -2] }, { kind: 'moment', x: 1 }), ['flexuralRigidity', 1]);
  });

  it('rejects a station outside the beam, a bad support index, a bad side and a bad mesh', () => {
    const beam: BeamModel = { spans: [10, 12], continuous: true };
    expectError(() => influenceLine(beam, { kind: 'moment', x: 22.5 }), ['x']);
    expectError(() => influenceLine(beam, { kind: 'shear', x: -0.1, side: 'left' }), ['x']);
    expectError(() => influenceLine(beam, { kind: 'reaction', support: 3 }), ['support']);
    expectError(() => influenceLine(beam, { kind: 'shear', x: 3, side: 'middle' as 'left' }), ['side']);
    expectError(() => influenceLine(beam, { kind: 'moment', x: 3 }, { pointsPerSpan: 0 }), ['pointsPerSpan']);
    expectError(() => influenceLine(beam, { kind: 'moment', x: 3 }, { pointsPerSpan: 2.5 }), ['pointsPerSpan']);
  });
});
