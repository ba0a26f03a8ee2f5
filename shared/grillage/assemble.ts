/**
 * Assembly of a plane grid into symmetric banded storage, after a reverse Cuthill–McKee node
 * numbering, and its banded LDLᵀ factorisation. This layer knows nodes, members and
 * restraints only; the deck mesher (mesh.ts) produces them.
 *
 * Units: node coordinates m; member EI, GJ N·m²; nodal loads N (w) and N·m (θx, θy);
 * displacements m and rad. Sign conventions: see element.ts (z down, w positive down,
 * rotations by the right-hand rule about +x and +y).
 *
 * Unknowns: 3 per node (w, θx, θy) numbered node by node in RCM order, restrained DOFs
 * left out. For each restrained DOF the coupling row K[r, free] is kept, so that support
 * reactions are R = F_r − K[r, free]·u (and, with the adjoint, influence surfaces of them).
 */
import { lengthInText } from '../quantities/inText.js';
import { DOF_PER_NODE, gridMemberStiffness } from './element.js';
import { BandLDLT, SingularPivotError, SymmetricBandMatrix } from './bandSolver.js';
import { adjacencyFromEdges, nodeBandwidth, reverseCuthillMcKee } from './numbering.js';
import { GrillageInputError, GrillageMechanismError, type GridDirection, type MechanismLocation } from './errors.js';

export interface GridNode {
  /** Plan position, m. */
  x: number;
  y: number;
}

export interface GridMember {
  /** End node indices. */
  i: number;
  j: number;
  /** Flexural rigidity about the member's horizontal transverse axis, N·m² (> 0). */
  EI: number;
  /** St Venant torsional rigidity, N·m² (≥ 0). */
  GJ: number;
}

export interface GridRestraint {
  node: number;
  direction: GridDirection;
}

export interface GridDefinition {
  nodes: GridNode[];
  members: GridMember[];
  restraints: GridRestraint[];
  /** Plain description of node k for messages (defaults to its coordinates). */
  describeNode?: (node: number) => { where: string; girder?: number };
}

export interface AssembleOptions {
  /** Relative pivot tolerance for mechanism detection (default 1e-10). */
  pivotTolerance?: number;
  /** Skip the RCM renumbering (tests of its effect). */
  naturalOrder?: boolean;
}

export interface AssembledGrid {
  readonly definition: GridDefinition;
  readonly nodeCount: number;
  /** Number of free unknowns. */
  readonly n: number;
  /** dofIndex[3·node + c] = free unknown index, or −1 when restrained. */
  readonly dofIndex: Int32Array;
  /** For each restrained DOF (in `restraints` order): its global DOF 3·node + c. */
  readonly restrainedDofs: Int32Array;
  /** Coupling rows K[r, free] of each restrained DOF, compressed (start/cols/vals). */
  readonly restrainedRows: { start: Int32Array; cols: Int32Array; vals: Float64Array };
  /** Global 6×6 member matrices, member m at 36·m. */
  readonly memberMatrices: Float64Array;
  readonly K: SymmetricBandMatrix;
  readonly factor: BandLDLT;
  /** Node bandwidth after numbering, and the half-bandwidth in unknowns. */
  readonly nodeBandwidth: number;
  readonly halfBandwidth: number;
  /** RCM order: order[k] = node at position k. */
  readonly order: Int32Array;
}

const DIRS: GridDirection[] = ['w', 'rx', 'ry'];

function describe(def: GridDefinition, node: number): { where: string; girder?: number } {
  if (def.describeNode) return def.describeNode(node);
  const p = def.nodes[node];
  return { where: `node ${node} at (x ${lengthInText(p.x)}, y ${lengthInText(p.y)})` };
}

/** Validates the grid: finite coordinates, positive stiffness, members of non-zero length. */
export function validateGrid(def: GridDefinition): void {
  const nn = def.nodes.length;
  let scale = 0;
  def.nodes.forEach((p, k) => {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) {
      throw new GrillageInputError('degenerate-mesh', ['grid', 'nodes', k], `node ${k} has a coordinate that is not a finite number`);
    }
    scale = Math.max(scale, Math.abs(p.x), Math.abs(p.y));
  });
  const minLength = 1e-9 * Math.max(scale, 1);
  def.members.forEach((m, k) => {
    if (!Number.isInteger(m.i) || !Number.isInteger(m.j) || m.i < 0 || m.j < 0 || m.i >= nn || m.j >= nn) {
      throw new GrillageInputError('degenerate-mesh', ['grid', 'members', k], `member ${k} refers to a node that does not exist`);
    }
    if (!(Number.isFinite(m.EI) && m.EI > 0)) {
      throw new GrillageInputError('zero-stiffness', ['grid', 'members', k, 'EI'], `member ${k} (${describe(def, m.i).where} to ${describe(def, m.j).where}): flexural rigidity EI must be a finite number greater than 0, not ${m.EI}`);
    }
    if (!(Number.isFinite(m.GJ) && m.GJ >= 0)) {
      throw new GrillageInputError('zero-stiffness', ['grid', 'members', k, 'GJ'], `member ${k}: torsional rigidity GJ must be a finite number of 0 or more, not ${m.GJ}`);
    }
    const a = def.nodes[m.i];
    const b = def.nodes[m.j];
    if (!(Math.hypot(b.x - a.x, b.y - a.y) > minLength)) {
      throw new GrillageInputError('degenerate-mesh', ['grid', 'members', k], `member ${k} joins ${describe(def, m.i).where} to ${describe(def, m.j).where}, which coincide: a member needs a length greater than 0`);
    }
  });
  def.restraints.forEach((r, k) => {
    if (!Number.isInteger(r.node) || r.node < 0 || r.node >= nn || !DIRS.includes(r.direction)) {
      throw new GrillageInputError('degenerate-mesh', ['grid', 'restraints', k], `restraint ${k} refers to a node or direction that does not exist`);
    }
  });
}

/**
 * Numbers, assembles and factorises a grid. Throws `GrillageInputError` for bad members and
 * `GrillageMechanismError` when the restrained grid is a mechanism.
 */
export function assembleGrid(def: GridDefinition, options: AssembleOptions = {}): AssembledGrid {
  validateGrid(def);
  const nn = def.nodes.length;
  const nm = def.members.length;
  const ei = new Int32Array(nm);
  const ej = new Int32Array(nm);
  for (let k = 0; k < nm; k++) {
    ei[k] = def.members[k].i;
    ej[k] = def.members[k].j;
  }
  let order: Int32Array;
  let position: Int32Array;
  if (options.naturalOrder) {
    order = Int32Array.from({ length: nn }, (_, k) => k);
    position = order.slice();
  } else {
    ({ order, position } = reverseCuthillMcKee(adjacencyFromEdges(nn, ei, ej)));
  }

  const restrained = new Uint8Array(nn * DOF_PER_NODE);
  const restrainedDofs = new Int32Array(def.restraints.length);
  def.restraints.forEach((r, k) => {
    const g = r.node * DOF_PER_NODE + DIRS.indexOf(r.direction);
    restrained[g] = 1;
    restrainedDofs[k] = g;
  });
  const dofIndex = new Int32Array(nn * DOF_PER_NODE).fill(-1);
  let n = 0;
  for (let p = 0; p < nn; p++) {
    const node = order[p];
    for (let c = 0; c < DOF_PER_NODE; c++) {
      const g = node * DOF_PER_NODE + c;
      if (!restrained[g]) dofIndex[g] = n++;
    }
  }
  // half-bandwidth in free unknowns
  let hb = 0;
  for (let k = 0; k < nm; k++) {
    let lo = Infinity;
    let hi = -Infinity;
    for (const node of [ei[k], ej[k]]) {
      for (let c = 0; c < DOF_PER_NODE; c++) {
        const f = dofIndex[node * DOF_PER_NODE + c];
        if (f < 0) continue;
        if (f < lo) lo = f;
        if (f > hi) hi = f;
      }
    }
    if (hi > lo) hb = Math.max(hb, hi - lo);
  }
  // nodes not touched by any member still have their own diagonal only
  const K = new SymmetricBandMatrix(n, hb);
  const memberMatrices = new Float64Array(nm * 36);
  const gdof = new Int32Array(6);
  // restrained coupling rows, accumulated per restrained DOF in maps
  const restrainedSlot = new Int32Array(nn * DOF_PER_NODE).fill(-1);
  restrainedDofs.forEach((g, k) => (restrainedSlot[g] = k));
  const rowMaps: Map<number, number>[] = Array.from({ length: restrainedDofs.length }, () => new Map());
  const ke = new Float64Array(36);
  for (let k = 0; k < nm; k++) {
    const m = def.members[k];
    const a = def.nodes[m.i];
    const b = def.nodes[m.j];
    gridMemberStiffness(m.EI, m.GJ, b.x - a.x, b.y - a.y, ke);
    memberMatrices.set(ke, k * 36);
    for (let c = 0; c < 3; c++) {
      gdof[c] = m.i * DOF_PER_NODE + c;
      gdof[3 + c] = m.j * DOF_PER_NODE + c;
    }
    for (let p = 0; p < 6; p++) {
      const fp = dofIndex[gdof[p]];
      if (fp >= 0) {
        for (let q = 0; q <= 5; q++) {
          const fq = dofIndex[gdof[q]];
          if (fq >= 0 && fq <= fp) K.add(fp, fq, ke[p * 6 + q]);
        }
      } else {
        const slot = restrainedSlot[gdof[p]];
        const map = rowMaps[slot];
        for (let q = 0; q < 6; q++) {
          const fq = dofIndex[gdof[q]];
          if (fq >= 0) map.set(fq, (map.get(fq) ?? 0) + ke[p * 6 + q]);
        }
      }
    }
  }
  const start = new Int32Array(restrainedDofs.length + 1);
  rowMaps.forEach((m, k) => (start[k + 1] = start[k] + m.size));
  const cols = new Int32Array(start[restrainedDofs.length]);
  const vals = new Float64Array(start[restrainedDofs.length]);
  rowMaps.forEach((m, k) => {
    let p = start[k];
    for (const [c, v] of m) {
      cols[p] = c;
      vals[p] = v;
      p++;
    }
  });

  let factor: BandLDLT;
  try {
    factor = BandLDLT.factor(K, { pivotTolerance: options.pivotTolerance });
  } catch (e) {
    if (e instanceof SingularPivotError) {
      // free index → global DOF
      let g = -1;
      for (let q = 0; q < dofIndex.length; q++) if (dofIndex[q] === e.index) g = q;
      const node = Math.floor(g / DOF_PER_NODE);
      const d = describe(def, node);
      const loc: MechanismLocation = {
        node,
        direction: DIRS[g % DOF_PER_NODE],
        where: d.where,
        girder: d.girder,
        x: def.nodes[node].x,
        y: def.nodes[node].y,
      };
      throw new GrillageMechanismError(loc, e.pivot, e.diagonal);
    }
    throw e;
  }
  return {
    definition: def,
    nodeCount: nn,
    n,
    dofIndex,
    restrainedDofs,
    restrainedRows: { start, cols, vals },
    memberMatrices,
    K,
    factor,
    nodeBandwidth: nodeBandwidth(position, ei, ej),
    halfBandwidth: K.bandwidth,
    order,
  };
}

/** Free-unknown part of a global nodal load vector (3 per node). */
export function freeLoadVector(grid: AssembledGrid, globalLoads: ArrayLike<number>): Float64Array {
  const f = new Float64Array(grid.n);
  for (let g = 0; g < grid.dofIndex.length; g++) {
    const k = grid.dofIndex[g];
    if (k >= 0) f[k] += globalLoads[g];
  }
  return f;
}

/** Global displacement vector (3 per node, restrained DOFs 0) from the free solution. */
export function globalDisplacements(grid: AssembledGrid, uFree: ArrayLike<number>): Float64Array {
  const u = new Float64Array(grid.dofIndex.length);
  for (let g = 0; g < u.length; g++) {
    const k = grid.dofIndex[g];
    if (k >= 0) u[g] = uFree[k];
  }
  return u;
}

/**
 * Solves the grid for global nodal loads (N at w, N·m at θx, θy; 3 per node) and returns
 * the global displacements (m, rad) and the restraint reactions (in each restrained DOF's
 * positive direction, i.e. a vertical reaction is positive DOWN here; callers flip it).
 */
export function solveGrid(grid: AssembledGrid, globalLoads: ArrayLike<number>): { u: Float64Array; restraintForces: Float64Array } {
  const uf = grid.factor.solveInPlace(freeLoadVector(grid, globalLoads));
  const u = globalDisplacements(grid, uf);
  const r = new Float64Array(grid.restrainedDofs.length);
  const { start, cols, vals } = grid.restrainedRows;
  for (let k = 0; k < r.length; k++) {
    let s = 0;
    for (let p = start[k]; p < start[k + 1]; p++) s += vals[p] * uf[cols[p]];
    // restraint force = K_r·u − F_r (force the support applies on the structure, in the DOF's direction)
    r[k] = s - globalLoads[grid.restrainedDofs[k]];
  }
  return { u, restraintForces: r };
}

/** End forces a member receives from its nodes, global components: f = K_e·u_e (no member loads). */
export function memberEndForces(grid: AssembledGrid, member: number, u: ArrayLike<number>, out: Float64Array = new Float64Array(6)): Float64Array {
  const m = grid.definition.members[member];
  const K = grid.memberMatrices;
  const base = member * 36;
  const ue = [
    u[m.i * 3], u[m.i * 3 + 1], u[m.i * 3 + 2],
    u[m.j * 3], u[m.j * 3 + 1], u[m.j * 3 + 2],
  ];
  for (let p = 0; p < 6; p++) {
    let s = 0;
    for (let q = 0; q < 6; q++) s += K[base + p * 6 + q] * ue[q];
    out[p] = s;
  }
  return out;
}
