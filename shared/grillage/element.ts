/**
 * The plane-grid (grillage) element: a straight prismatic member in the horizontal x–y plane
 * with bending out of the plane and St Venant torsion, three degrees of freedom per node.
 *
 * Units: lengths m, EI and GJ N·m², forces N, moments N·m; stiffness entries N/m, N, N·m.
 *
 * Sign conventions (one right-handed frame for the whole grillage):
 * - x along the girders (up-station), y transverse positive to the right, z DOWN. Since
 *   x × y = z, the frame (x, y, z-down) is right-handed.
 * - Node degrees of freedom, in this order: w (displacement along +z, i.e. positive DOWN),
 *   θx (rotation about +x), θy (rotation about +y), right-hand rule. Consequently, along a
 *   member lying on +x, θy = −dw/dx; along a member lying on +y, θx = +dw/dy.
 * - Forces conjugate to the DOFs: a vertical force positive down, moments about +x and +y.
 * - A member from node i to node j has local axes ξ (i → j), η = z × ξ rotated so that
 *   ξ × η = z, and local rotations θξ = c·θx + s·θy (twist), θη = −s·θx + c·θy, where
 *   (c, s) are the direction cosines of ξ. Along ξ, θη = −dw/dξ.
 * - Sagging bending moment (tension at the bottom) is positive: M = −EI·d²w/dξ² (w down).
 *   From the forces the nodes exert on a member, f = k·u − f_eq (f_eq: equivalent nodal
 *   loads of loads applied on the member): M_sag(i) = −f[θη_i], M_sag(j) = +f[θη_j].
 * - Shear V at a cut: the upward resultant of the forces on the part on the lower-ξ side.
 *   V just after node i = −f[w_i]; V just before node j = +f[w_j].
 *
 * Source: the grid element is the standard Euler–Bernoulli beam element (cubic Hermite
 * shape functions) plus a linear torsion element; e.g. W. Weaver & J. Gere, Matrix Analysis
 * of Framed Structures, grid members (from memory). Point loads on a member are carried to
 * its nodes by the same Hermite functions (consistent, statically equivalent nodal loads),
 * which for a prismatic member equal the fixed-end reactions reversed: nodal displacements
 * are exact and member end forces are exact once f_eq is subtracted.
 */

/** DOFs per node, in the order w, θx, θy (global DOF of node k, component c: 3k + c). */
export const DOF_PER_NODE = 3;

/**
 * Local 6×6 stiffness of a grid member in local DOFs (w_i, θξ_i, θη_i, w_j, θξ_j, θη_j),
 * row-major. EI, GJ in N·m², L in m.
 */
export function localGridStiffness(EI: number, GJ: number, L: number, out: Float64Array = new Float64Array(36)): Float64Array {
  const a = (12 * EI) / (L * L * L);
  const b = (6 * EI) / (L * L);
  const c = (4 * EI) / L;
  const d = (2 * EI) / L;
  const t = GJ / L;
  out.fill(0);
  // rows: w_i, θξ_i, θη_i, w_j, θξ_j, θη_j (θη = −dw/dξ flips the signs of the b terms)
  out[0] = a; out[2] = -b; out[3] = -a; out[5] = -b;
  out[7] = t; out[10] = -t;
  out[12] = -b; out[14] = c; out[15] = b; out[17] = d;
  out[18] = -a; out[20] = b; out[21] = a; out[23] = b;
  out[25] = -t; out[28] = t;
  out[30] = -b; out[32] = d; out[33] = b; out[35] = c;
  return out;
}

/**
 * Global 6×6 stiffness of a grid member from node i at (xi, yi) to node j at (xj, yj), in
 * global DOFs (w_i, θx_i, θy_i, w_j, θx_j, θy_j), row-major: K = Tᵀ·k·T with
 * T = diag(R, R), R = [[1, 0, 0], [0, c, s], [0, −s, c]].
 * EI, GJ in N·m²; dx = xj − xi, dy = yj − yi in m (length must be > 0; checked by callers).
 */
export function gridMemberStiffness(EI: number, GJ: number, dx: number, dy: number, out: Float64Array = new Float64Array(36)): Float64Array {
  const L = Math.hypot(dx, dy);
  const c = dx / L;
  const s = dy / L;
  const k = localGridStiffness(EI, GJ, L, scratchLocal);
  // T is block diagonal with R on each node; compute K = Tᵀ k T without forming T.
  // local index p -> (node, comp); global q likewise. T[p][q] nonzero only for same node.
  const R = scratchR;
  R[0] = 1; R[1] = 0; R[2] = 0;
  R[3] = 0; R[4] = c; R[5] = s;
  R[6] = 0; R[7] = -s; R[8] = c;
  // tmp = k T  (6×6)
  const tmp = scratchTmp;
  for (let p = 0; p < 6; p++) {
    for (let q = 0; q < 6; q++) {
      const nq = q < 3 ? 0 : 3;
      const cq = q - nq;
      let sum = 0;
      for (let r = 0; r < 3; r++) sum += k[p * 6 + nq + r] * R[r * 3 + cq];
      tmp[p * 6 + q] = sum;
    }
  }
  for (let p = 0; p < 6; p++) {
    const np = p < 3 ? 0 : 3;
    const cp = p - np;
    for (let q = 0; q < 6; q++) {
      let sum = 0;
      for (let r = 0; r < 3; r++) sum += R[r * 3 + cp] * tmp[(np + r) * 6 + q];
      out[p * 6 + q] = sum;
    }
  }
  return out;
}

const scratchLocal = new Float64Array(36);
const scratchTmp = new Float64Array(36);
const scratchR = new Float64Array(9);

/**
 * Statically equivalent (consistent) nodal loads of a point action on a longitudinal member
 * lying along +x, of length L m, at fraction xi ∈ [0, 1] from its node i:
 * a downward force P (N), a couple Mx about +x and a couple My about +y (N·m).
 * Writes the 6 global nodal loads (w_i, θx_i, θy_i, w_j, θx_j, θy_j) into `out`.
 *
 * Force: virtual work P·w(ξ) with w = N1 w_i + N2 w'_i + N3 w_j + N4 w'_j and w' = −θy.
 * Couple My: work My·θy(ξ) = −My·w'(ξ). Couple Mx: linear twist, work Mx·θx(ξ).
 */
export function consistentLoads(L: number, xi: number, P: number, Mx: number, My: number, out: Float64Array, offset = 0): void {
  const x2 = xi * xi;
  const x3 = x2 * xi;
  const N1 = 1 - 3 * x2 + 2 * x3;
  const N2 = L * (xi - 2 * x2 + x3);
  const N3 = 3 * x2 - 2 * x3;
  const N4 = L * (x3 - x2);
  // derivatives d/dx = (1/L) d/dξ
  const D1 = (-6 * xi + 6 * x2) / L;
  const D2 = 1 - 4 * xi + 3 * x2;
  const D3 = (6 * xi - 6 * x2) / L;
  const D4 = 3 * x2 - 2 * xi;
  out[offset] = P * N1 - My * D1;
  out[offset + 1] = Mx * (1 - xi);
  out[offset + 2] = -P * N2 + My * D2;
  out[offset + 3] = P * N3 - My * D3;
  out[offset + 4] = Mx * xi;
  out[offset + 5] = -P * N4 + My * D4;
}

/**
 * Sagging moment, N·m, at fraction xi0 of a member of length L m taken as simply supported
 * at its two ends, due to a downward force P (N) and a couple My about +y (N·m) at fraction
 * xi. Added to the linear interpolation of the member's end moments it gives the exact
 * moment inside a loaded prismatic member (statics of the member).
 *
 * A couple about +y on a member along +x lowers the sagging moment by My across it
 * (derived from the equivalent pair: down force at a, up force at a + δ, F·δ = My).
 * A load exactly at xi0 is taken as lying just beyond it (right-continuous in the load).
 */
export function simpleSpanMoment(L: number, xi0: number, xi: number, P: number, My: number): number {
  if (xi0 <= xi) return P * L * xi0 * (1 - xi) + My * xi0;
  return P * L * xi * (1 - xi0) - My * (1 - xi0);
}
