/**
 * Girder responses of the grillage: bending moments along the girders, shears at the
 * supports, bearing reactions; for load cases (direct solve) and as linear functionals for
 * influence surfaces (adjoint solve).
 *
 * Units: moments N·m, shears and reactions N, loads N; per unit load: m (moment) and
 * dimensionless (shear, reaction). Positions: x, y in m as mesh.ts.
 *
 * Sign conventions
 * - Girder moment: sagging positive (tension at the bottom). At a node it is the average of
 *   the end moments of the girder members meeting there (they differ by the torsion that
 *   transverse members bring in); between nodes, the member's end moments interpolated
 *   linearly plus the simple-span moment of the loads on that member (exact member statics).
 * - Girder shear at a support: V = upward resultant of the forces on the girder on the
 *   lower-x side of a cut just left or just right of the bearing; positive just right of the
 *   first support under downward load, negative just left of the last.
 * - Reaction: upward positive, at the bearing of a girder on a support line (for simple
 *   spans at an interior support: the two bearings of that girder, one per span end, together).
 * Loads: downward positive; a load exactly on a node belongs to the member starting there.
 */
import { lengthInText } from '../quantities/inText.js';
import type { AssembledGrid } from './assemble.js';
import { consistentLoads, simpleSpanMoment } from './element.js';
import { GrillageInputError } from './errors.js';
import type { LoadShare } from './loadTransfer.js';
import { supportX } from './mesh.js';
import type { GrillageModel } from './model.js';

/**
 * A girder response. Indices are 0-based: girder 0 is girder 1 (left), support 0 the first
 * support line. `fraction` is measured along the girder's own span, from its bearing on
 * support line `span` to its bearing on support line `span + 1` (on a skewed deck each
 * girder's midspan lies at a different x). `side` of a shear: just before ('left', lower x)
 * or just after ('right') the girder's bearing on support line `support`.
 */
export type GrillageResponse =
  | { kind: 'girder-moment'; girder: number /* 0-based */; span: number /* 0-based */; fraction: number /* 0..1 along the span */ }
  | { kind: 'girder-shear'; girder: number; support: number; side: 'left' | 'right' }
  | { kind: 'reaction'; girder: number; support: number };

/** A plain label, girders, spans and supports counted from 1. */
export function responseLabel(r: GrillageResponse): string {
  switch (r.kind) {
    case 'girder-moment':
      return `girder ${r.girder + 1} moment at ${r.fraction.toFixed(3)} of span ${r.span + 1}`;
    case 'girder-shear':
      return `girder ${r.girder + 1} shear just ${r.side} of support ${r.support + 1}`;
    case 'reaction':
      return `girder ${r.girder + 1} reaction at support ${r.support + 1}`;
  }
}

/**
 * A response as a linear functional of the free displacements u and of the loads on the few
 * girder members next to the response point:
 *   r = a·u + Σ_local c_seg·f_eq(seg) [+ simple-span moment term on `interior.seg`].
 */
export interface CompiledResponse {
  response: GrillageResponse;
  /** Coefficients on the free unknowns. */
  a: Float64Array;
  /** Coefficients on the consistent nodal loads (6 per segment) of member loads, by global segment. */
  local: { seg: number; coef: Float64Array }[];
  /** For a moment between nodes: the segment and position of the point. */
  interior?: { seg: number; xi0: number };
}

function intIn(v: number, lo: number, hi: number): boolean {
  return Number.isInteger(v) && v >= lo && v <= hi;
}

/** Checks a response request against the model; throws GrillageInputError naming the field. */
export function validateResponse(model: GrillageModel, r: GrillageResponse, index = 0): void {
  const path = (f: string) => ['responses', index, f];
  const Nb = model.girderCount;
  const N = model.spanCount;
  if (!r || typeof r !== 'object' || !['girder-moment', 'girder-shear', 'reaction'].includes((r as { kind: string }).kind)) {
    throw new GrillageInputError('invalid-response', path('kind'), "response kind must be 'girder-moment', 'girder-shear' or 'reaction'");
  }
  if (!intIn(r.girder, 0, Nb - 1)) throw new GrillageInputError('invalid-response', path('girder'), `girder must be a whole number from 0 to ${Nb - 1}, not ${r.girder}`);
  if (r.kind === 'girder-moment') {
    if (!intIn(r.span, 0, N - 1)) throw new GrillageInputError('invalid-response', path('span'), `span must be a whole number from 0 to ${N - 1}, not ${r.span}`);
    if (!(Number.isFinite(r.fraction) && r.fraction >= 0 && r.fraction <= 1)) {
      throw new GrillageInputError('invalid-response', path('fraction'), `fraction must be a number from 0 to 1, not ${r.fraction}`);
    }
  } else {
    if (!intIn(r.support, 0, N)) throw new GrillageInputError('invalid-response', path('support'), `support must be a whole number from 0 to ${N}, not ${r.support}`);
    if (r.kind === 'girder-shear') {
      if (r.side !== 'left' && r.side !== 'right') throw new GrillageInputError('invalid-response', path('side'), "side must be 'left' or 'right'");
      if (r.side === 'left' && r.support === 0) throw new GrillageInputError('invalid-response', path('side'), 'there is no girder just left of the first support (support 0)');
      if (r.side === 'right' && r.support === N) throw new GrillageInputError('invalid-response', path('side'), `there is no girder just right of the last support (support ${N})`);
    } else if (!model.mesh.bearings.some((b) => b.girder === r.girder && b.support === r.support)) {
      throw new GrillageInputError('invalid-response', path('support'), `girder ${r.girder + 1} has no bearing on support ${r.support + 1} (it was left out)`);
    }
  }
}

/** Where a girder response sits on its line: node position or segment and fraction. */
function girderPoint(model: GrillageModel, g: number, span: number, fraction: number): { line: number; pos: number; xi0: number } {
  const mesh = model.mesh;
  const l = mesh.girderLine[g];
  const line = mesh.lines[l];
  const y = line.y;
  const x0 = supportX(mesh, span, y);
  const x1 = supportX(mesh, span + 1, y);
  const x = x0 + fraction * (x1 - x0);
  const tol = 1e-9 * (x1 - x0);
  const first = line.spanFirst[span];
  const last = line.spanLast[span];
  for (let p = first; p <= last; p++) {
    if (Math.abs(line.xs[p] - x) <= tol) return { line: l, pos: p, xi0: 0 };
  }
  let p = first;
  while (p < last - 1 && x >= line.xs[p + 1]) p++;
  return { line: l, pos: p, xi0: (x - line.xs[p]) / (line.xs[p + 1] - line.xs[p]) };
}

/** Bearing node(s) of girder g on support s, each with the girder segments on its two sides. */
function bearingSides(model: GrillageModel, g: number, support: number): { node: number; left: number; right: number; restraint: number }[] {
  const mesh = model.mesh;
  const l = mesh.girderLine[g];
  const line = mesh.lines[l];
  const off = model.transfer.lineSegOffset[l];
  const out: { node: number; left: number; right: number; restraint: number }[] = [];
  mesh.bearings.forEach((b, k) => {
    if (b.girder !== g || b.support !== support) return;
    let pos = -1;
    for (let p = 0; p < line.nodes.length; p++) if (line.nodes[p] === b.node) pos = p;
    const left = pos > 0 && line.segMember[pos - 1] >= 0 ? off + pos - 1 : -1;
    const right = pos < line.segMember.length && line.segMember[pos] >= 0 ? off + pos : -1;
    out.push({ node: b.node, left, right, restraint: k });
  });
  return out;
}

function addMemberRow(grid: AssembledGrid, member: number, row: number, weight: number, a: Float64Array): void {
  const m = grid.definition.members[member];
  const K = grid.memberMatrices;
  const base = member * 36 + row * 6;
  for (let q = 0; q < 6; q++) {
    const node = q < 3 ? m.i : m.j;
    const f = grid.dofIndex[node * 3 + (q % 3)];
    if (f >= 0) a[f] += weight * K[base + q];
  }
}

/** Builds the linear functional of a response. */
export function compileResponse(model: GrillageModel, r: GrillageResponse): CompiledResponse {
  validateResponse(model, r);
  const grid = model.grid;
  const t = model.transfer;
  const a = new Float64Array(grid.n);
  const local: { seg: number; coef: Float64Array }[] = [];
  const addLocal = (seg: number, comp: number, v: number) => {
    let e = local.find((q) => q.seg === seg);
    if (!e) local.push((e = { seg, coef: new Float64Array(6) }));
    e.coef[comp] += v;
  };
  if (r.kind === 'girder-moment') {
    const pt = girderPoint(model, r.girder, r.span, r.fraction);
    const line = model.mesh.lines[pt.line];
    const off = t.lineSegOffset[pt.line];
    if (pt.xi0 === 0) {
      const left = pt.pos > 0 && line.segMember[pt.pos - 1] >= 0 ? pt.pos - 1 : -1;
      const right = pt.pos < line.segMember.length && line.segMember[pt.pos] >= 0 ? pt.pos : -1;
      const w = left >= 0 && right >= 0 ? 0.5 : 1;
      // M_sag(j) of the left member = +(K u − f_eq)[θy_j]; M_sag(i) of the right member = −(K u − f_eq)[θy_i]
      if (left >= 0) {
        addMemberRow(grid, line.segMember[left], 5, w, a);
        addLocal(off + left, 5, -w);
      }
      if (right >= 0) {
        addMemberRow(grid, line.segMember[right], 2, -w, a);
        addLocal(off + right, 2, w);
      }
      return { response: r, a, local };
    }
    const seg = pt.pos;
    const member = line.segMember[seg];
    addMemberRow(grid, member, 2, -(1 - pt.xi0), a);
    addLocal(off + seg, 2, 1 - pt.xi0);
    addMemberRow(grid, member, 5, pt.xi0, a);
    addLocal(off + seg, 5, -pt.xi0);
    return { response: r, a, local, interior: { seg: off + seg, xi0: pt.xi0 } };
  }
  if (r.kind === 'girder-shear') {
    // the girder segment just right of the support (start of the next span) or just left (end of the previous)
    const l = model.mesh.girderLine[r.girder];
    const line = model.mesh.lines[l];
    const seg = t.lineSegOffset[l] + (r.side === 'right' ? line.spanFirst[r.support] : line.spanLast[r.support - 1] - 1);
    const member = t.segMember[seg];
    if (r.side === 'right') {
      addMemberRow(grid, member, 0, -1, a); // V = −(K u − f_eq)[w_i]
      addLocal(seg, 0, 1);
    } else {
      addMemberRow(grid, member, 3, 1, a); // V = +(K u − f_eq)[w_j]
      addLocal(seg, 3, -1);
    }
    return { response: r, a, local };
  }
  // reaction: R_up = F_r − K_r·u over the girder's bearing node(s) on this support
  const { start, cols, vals } = grid.restrainedRows;
  for (const s of bearingSides(model, r.girder, r.support)) {
    for (let p = start[s.restraint]; p < start[s.restraint + 1]; p++) a[cols[p]] -= vals[p];
    if (s.left >= 0) addLocal(s.left, 3, 1);
    if (s.right >= 0) addLocal(s.right, 0, 1);
  }
  return { response: r, a, local };
}

/** A point load on the deck: downward force P (N) at plan point (x, y) m. */
export interface PointLoad {
  x: number;
  y: number;
  P: number;
}

/** Result of a direct solve for a set of point loads. */
export interface GrillageLoadResult {
  /** Global nodal displacements: w (m, down), θx, θy (rad), 3 per node. */
  displacements: Float64Array;
  /** The shares of every load on the girder and edge members. */
  shares: LoadShare[];
  /** Sum of the applied loads, N (down). */
  totalLoad: number;
  /** Sum of the bearing reactions, N (up). */
  totalReaction: number;
  /** girderMoments[g][span][k]: sagging moment at tenth point k (0..10) of the span, N·m. */
  girderMoments: number[][][];
  /** girderShears[g][support]: shear just left and right of the bearing, N (null where no girder). */
  girderShears: { left: number | null; right: number | null }[][];
  /** reactions[g][support]: upward reaction, N (null where the bearing was left out). */
  reactions: (number | null)[][];
  /** Any response, evaluated from the member end forces of this solution. */
  response(r: GrillageResponse): number;
}

/**
 * Direct solve: the loads go to the nodes by the statically equivalent transfer, K u = F is
 * solved with the banded factors, and the responses follow from member end forces
 * f = K_e·u_e − f_eq (loads on the member subtracted).
 */
export function analyseLoads(model: GrillageModel, loads: PointLoad[]): GrillageLoadResult {
  const grid = model.grid;
  const mesh = model.mesh;
  const t = model.transfer;
  const F = new Float64Array(mesh.nodes.length * 3);
  const shares: LoadShare[] = [];
  let totalLoad = 0;
  loads.forEach((ld, k) => {
    if (!(Number.isFinite(ld.x) && Number.isFinite(ld.y) && Number.isFinite(ld.P))) {
      throw new GrillageInputError('invalid-load', ['loads', k], `load ${k + 1}: x, y and P must be finite numbers`);
    }
    if (!t.onDeck(ld.x, ld.y)) {
      throw new GrillageInputError('invalid-load', ['loads', k], `load ${k + 1} at (x ${lengthInText(ld.x)}, y ${lengthInText(ld.y)}) is off the deck`);
    }
    totalLoad += ld.P;
    shares.push(...t.shares(ld.x, ld.y, ld.P));
  });
  // f_eq per segment
  const feq = new Map<number, Float64Array>();
  const byseg = new Map<number, LoadShare[]>();
  const tmp = new Float64Array(6);
  for (const s of shares) {
    consistentLoads(s.L, s.xi, s.P, s.Mx, s.My, tmp);
    let acc = feq.get(s.seg);
    if (!acc) feq.set(s.seg, (acc = new Float64Array(6)));
    for (let q = 0; q < 6; q++) acc[q] += tmp[q];
    if (!byseg.has(s.seg)) byseg.set(s.seg, []);
    byseg.get(s.seg)!.push(s);
    const m = mesh.members[s.member];
    for (let q = 0; q < 3; q++) {
      F[m.i * 3 + q] += tmp[q];
      F[m.j * 3 + q] += tmp[3 + q];
    }
  }
  const uf = grid.factor.solveInPlace(freeOf(grid, F));
  const u = new Float64Array(F.length);
  for (let gd = 0; gd < u.length; gd++) {
    const k = grid.dofIndex[gd];
    if (k >= 0) u[gd] = uf[k];
  }
  // restraint forces: K_r u − F_r (downward-positive force from the support); reaction up = F_r − K_r u
  const { start, cols, vals } = grid.restrainedRows;
  const reactionOf = new Float64Array(mesh.bearings.length);
  let totalReaction = 0;
  mesh.bearings.forEach((b, k) => {
    let s = 0;
    for (let p = start[k]; p < start[k + 1]; p++) s += vals[p] * uf[cols[p]];
    reactionOf[k] = F[b.node * 3] - s;
    totalReaction += reactionOf[k];
  });

  const endForces = (seg: number): Float64Array => {
    const member = t.segMember[seg];
    const m = mesh.members[member];
    const K = grid.memberMatrices;
    const ue = [u[m.i * 3], u[m.i * 3 + 1], u[m.i * 3 + 2], u[m.j * 3], u[m.j * 3 + 1], u[m.j * 3 + 2]];
    const f = new Float64Array(6);
    const fe = feq.get(seg);
    for (let p = 0; p < 6; p++) {
      let s = 0;
      for (let q = 0; q < 6; q++) s += K[member * 36 + p * 6 + q] * ue[q];
      f[p] = s - (fe ? fe[p] : 0);
    }
    return f;
  };

  const response = (r: GrillageResponse): number => {
    validateResponse(model, r);
    if (r.kind === 'reaction') {
      let s = 0;
      mesh.bearings.forEach((b, k) => {
        if (b.girder === r.girder && b.support === r.support) s += reactionOf[k];
      });
      return s;
    }
    const l = mesh.girderLine[r.girder];
    const line = mesh.lines[l];
    const off = t.lineSegOffset[l];
    if (r.kind === 'girder-shear') {
      if (r.side === 'right') return -endForces(off + line.spanFirst[r.support])[0];
      return endForces(off + line.spanLast[r.support - 1] - 1)[3];
    }
    const pt = girderPoint(model, r.girder, r.span, r.fraction);
    if (pt.xi0 === 0) {
      const vals: number[] = [];
      if (pt.pos > 0 && line.segMember[pt.pos - 1] >= 0) vals.push(endForces(off + pt.pos - 1)[5]);
      if (pt.pos < line.segMember.length && line.segMember[pt.pos] >= 0) vals.push(-endForces(off + pt.pos)[2]);
      return vals.reduce((p, q) => p + q, 0) / vals.length;
    }
    const seg = off + pt.pos;
    const f = endForces(seg);
    let M = (1 - pt.xi0) * -f[2] + pt.xi0 * f[5];
    for (const s of byseg.get(seg) ?? []) M += simpleSpanMoment(s.L, pt.xi0, s.xi, s.P, s.My);
    return M;
  };

  const Nb = model.girderCount;
  const N = model.spanCount;
  const girderMoments: number[][][] = [];
  const girderShears: { left: number | null; right: number | null }[][] = [];
  const reactions: (number | null)[][] = [];
  for (let g = 0; g < Nb; g++) {
    girderMoments.push(
      Array.from({ length: N }, (_, span) => Array.from({ length: 11 }, (_, k) => response({ kind: 'girder-moment', girder: g, span, fraction: k / 10 }))),
    );
    girderShears.push(
      Array.from({ length: N + 1 }, (_, s) => ({
        left: s > 0 ? response({ kind: 'girder-shear', girder: g, support: s, side: 'left' }) : null,
        right: s < N ? response({ kind: 'girder-shear', girder: g, support: s, side: 'right' }) : null,
      })),
    );
    reactions.push(
      Array.from({ length: N + 1 }, (_, s) =>
        mesh.bearings.some((b) => b.girder === g && b.support === s) ? response({ kind: 'reaction', girder: g, support: s }) : null,
      ),
    );
  }
  return { displacements: u, shares, totalLoad, totalReaction, girderMoments, girderShears, reactions, response };
}

function freeOf(grid: AssembledGrid, F: Float64Array): Float64Array {
  const f = new Float64Array(grid.n);
  for (let gd = 0; gd < F.length; gd++) {
    const k = grid.dofIndex[gd];
    if (k >= 0) f[k] += F[gd];
  }
  return f;
}
