/**
 * The grillage model of a deck: options, mesh, banded factorisation and the load transfer,
 * built once and reused for every response, load case and influence surface.
 *
 * Units: SI (m, N, N·m, Pa); angles in degrees. Coordinates and signs as mesh.ts: x along
 * the girders from support line 0 at girder 1, y transverse from girder 1 positive right,
 * w positive DOWN, loads positive down, sagging moments positive, reactions positive up.
 */
import { assertDeck, type Deck } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import { assembleGrid, type AssembledGrid, type GridDefinition, type GridRestraint } from './assemble.js';
import { GrillageInputError } from './errors.js';
import { LoadTransfer } from './loadTransfer.js';
import { buildMesh, describeMeshNode, supportX, type GrillageMesh, type MeshOptions, type TransverseLayout } from './mesh.js';
import type { GrillageFinding } from './quality.js';

/** Options of the grillage analysis; every field is optional. */
export interface GrillageOptions {
  /** Segments per span along the girders, whole number 1–1000 (default 20). */
  segmentsPerSpan?: number;
  /** Transverse members: 'auto' (default), 'skew-parallel' or 'perpendicular' (see mesh.ts). */
  layout?: 'auto' | TransverseLayout;
  /** Largest |skew|, degrees, for which 'auto' keeps skew-parallel members (default 20). */
  skewParallelLimit?: number;
  /** Longitudinal edge members at the deck edges: true for the default slab-edge properties, or explicit I and J (m⁴, deck concrete). Default false. */
  edgeMembers?: boolean | { inertia?: number; torsion?: number };
  /**
   * Multiplies the bending stiffness of transverse slab strips and diaphragms (default 1;
   * studies such as the rigid limit). Ratios beyond ~10⁶ lose digits (ill-conditioning).
   */
  transverseStiffnessFactor?: number;
  /**
   * Multiplies every St Venant torsional stiffness (default 1; 0 removes torsion, e.g. for the
   * rigid limit). Without torsion, girder nodes with no transverse member (the skewed end zones
   * of a perpendicular mesh) cannot hold their twist: a GrillageMechanismError says where.
   */
  torsionFactor?: number;
  /** Girder torsion constant J, m⁴, overriding section.torsion. */
  girderTorsion?: number;
  /** Poisson's ratio of the girder material (default 0.2 concrete, 0.3 steel). */
  girderPoisson?: number;
  /** Bearings left out, by 0-based girder and support line index. */
  omitBearings?: { girder: number; support: number }[];
  /** Largest mesh accepted, nodes (default 60,000). */
  maxNodes?: number;
  /** Relative pivot tolerance of mechanism detection (default 1e-10). */
  pivotTolerance?: number;
}

export const DEFAULT_SEGMENTS_PER_SPAN = 20;
export const DEFAULT_SKEW_PARALLEL_LIMIT = 20;
export const DEFAULT_MAX_NODES = 60000;

export interface GrillageModel {
  deck: Deck;
  mesh: GrillageMesh;
  grid: AssembledGrid;
  transfer: LoadTransfer;
  layout: TransverseLayout;
  girderCount: number;
  spanCount: number;
  /** Plan extent of the deck, m. */
  extent: { xMin: number; xMax: number; yMin: number; yMax: number };
  /** x of support line j at transverse position y, m. */
  supportLineX(support: number, y: number): number;
  /** Girder centreline offsets from girder 1, m. */
  girderOffsets: number[];
  findings: GrillageFinding[];
  trace: TraceStep[];
  stats: { nodes: number; members: number; unknowns: number; halfBandwidth: number; nodeBandwidth: number; bearings: number };
}

function optNumber(
  value: unknown,
  name: string,
  fallback: number,
  rule: { min?: number; gt?: number; max?: number; integer?: boolean },
): number {
  if (value === undefined) return fallback;
  const path = ['grillage', name];
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new GrillageInputError('invalid-option', path, `${name} must be a finite number, not ${String(value)}`);
  if (rule.integer && !Number.isInteger(value)) throw new GrillageInputError('invalid-option', path, `${name} must be a whole number, not ${value}`);
  if (rule.gt !== undefined && !(value > rule.gt)) throw new GrillageInputError(rule.gt === 0 ? 'zero-stiffness' : 'invalid-option', path, `${name} must be greater than ${rule.gt}, not ${value}`);
  if (rule.min !== undefined && !(value >= rule.min)) throw new GrillageInputError('invalid-option', path, `${name} must be ${rule.min} or more, not ${value}`);
  if (rule.max !== undefined && !(value <= rule.max)) throw new GrillageInputError('invalid-option', path, `${name} must be at most ${rule.max}, not ${value}`);
  return value;
}

/** Validates options and fills defaults. */
export function resolveOptions(options: GrillageOptions = {}): MeshOptions & { pivotTolerance: number } {
  const segmentsPerSpan = optNumber(options.segmentsPerSpan, 'segmentsPerSpan', DEFAULT_SEGMENTS_PER_SPAN, { min: 1, max: 1000, integer: true });
  const layout = options.layout ?? 'auto';
  if (!['auto', 'skew-parallel', 'perpendicular'].includes(layout)) {
    throw new GrillageInputError('invalid-option', ['grillage', 'layout'], `layout must be 'auto', 'skew-parallel' or 'perpendicular', not ${String(layout)}`);
  }
  const skewParallelLimit = optNumber(options.skewParallelLimit, 'skewParallelLimit', DEFAULT_SKEW_PARALLEL_LIMIT, { min: 0, max: 89 });
  const transverseStiffnessFactor = optNumber(options.transverseStiffnessFactor, 'transverseStiffnessFactor', 1, { gt: 0, max: 1e8 });
  const torsionFactor = optNumber(options.torsionFactor, 'torsionFactor', 1, { min: 0, max: 1e8 });
  const girderTorsion = options.girderTorsion === undefined ? undefined : optNumber(options.girderTorsion, 'girderTorsion', 0, { min: 0 });
  const girderPoisson = options.girderPoisson === undefined ? undefined : optNumber(options.girderPoisson, 'girderPoisson', 0.2, { min: 0, max: 0.5 });
  const maxNodes = optNumber(options.maxNodes, 'maxNodes', DEFAULT_MAX_NODES, { min: 4, integer: true });
  const pivotTolerance = optNumber(options.pivotTolerance, 'pivotTolerance', 1e-10, { gt: 0, max: 1e-3 });
  let edgeMembers: MeshOptions['edgeMembers'] = false;
  if (options.edgeMembers === true) edgeMembers = {};
  else if (options.edgeMembers && typeof options.edgeMembers === 'object') {
    const e = options.edgeMembers;
    edgeMembers = {
      inertia: e.inertia === undefined ? undefined : optNumber(e.inertia, 'edgeMembers.inertia', 0, { gt: 0 }),
      torsion: e.torsion === undefined ? undefined : optNumber(e.torsion, 'edgeMembers.torsion', 0, { min: 0 }),
    };
  } else if (options.edgeMembers !== undefined && options.edgeMembers !== false) {
    throw new GrillageInputError('invalid-option', ['grillage', 'edgeMembers'], 'edgeMembers must be true, false or { inertia, torsion }');
  }
  const omitBearings = options.omitBearings ?? [];
  if (!Array.isArray(omitBearings)) throw new GrillageInputError('invalid-option', ['grillage', 'omitBearings'], 'omitBearings must be a list of { girder, support }');
  return {
    segmentsPerSpan,
    layout,
    skewParallelLimit,
    edgeMembers,
    omitBearings,
    maxNodes,
    pivotTolerance,
    stiffness: { transverseStiffnessFactor, torsionFactor, girderTorsion, girderPoisson },
  };
}

/**
 * Builds the grillage of a deck: mesh, RCM numbering, banded assembly and LDLᵀ
 * factorisation, load transfer. `deck` is validated with the deck schema first.
 *
 * Throws `DeckInputError` for an invalid deck, `GrillageInputError` for a bad option or a
 * deck the mesher cannot build, `GrillageMechanismError` when the grillage is a mechanism.
 */
export function buildGrillage(deckInput: Deck, options: GrillageOptions = {}): GrillageModel {
  const deck = assertDeck(deckInput);
  const opt = resolveOptions(options);
  const mesh = buildMesh(deck, opt);
  const restraints: GridRestraint[] = mesh.bearings.map((b) => ({ node: b.node, direction: 'w' }));
  const def: GridDefinition = {
    nodes: mesh.nodes,
    members: mesh.members,
    restraints,
    describeNode: (k) => describeMeshNode(mesh, k),
  };
  const grid = assembleGrid(def, { pivotTolerance: opt.pivotTolerance });
  const transfer = new LoadTransfer(mesh);
  const offsets = mesh.girderLine.length ? Array.from(mesh.girderLine, (l) => mesh.lines[l].y) : [];
  const trace: TraceStep[] = [
    ...mesh.trace,
    {
      label: 'Banded stiffness and factorisation',
      formula: 'K = L·D·Lᵀ (banded, reverse Cuthill–McKee numbering)',
      inputs: [
        { symbol: 'n', description: 'unknowns', value: grid.n, kind: 'none' },
        { symbol: 'b', description: 'half-bandwidth', value: grid.halfBandwidth, kind: 'none' },
      ],
      value: grid.n,
      kind: 'none',
      article: 'matrix stiffness method',
    },
  ];
  return {
    deck,
    mesh,
    grid,
    transfer,
    layout: mesh.layout,
    girderCount: mesh.girderLine.length,
    spanCount: mesh.spanCount,
    extent: { xMin: transfer.xMin, xMax: transfer.xMax, yMin: transfer.yMin, yMax: transfer.yMax },
    supportLineX: (support: number, y: number) => {
      if (!Number.isInteger(support) || support < 0 || support > mesh.spanCount) {
        throw new GrillageInputError('invalid-response', ['support'], `support index must be a whole number from 0 to ${mesh.spanCount}, not ${support}`);
      }
      return supportX(mesh, support, y);
    },
    girderOffsets: offsets,
    findings: mesh.findings,
    trace,
    stats: {
      nodes: mesh.nodes.length,
      members: mesh.members.length,
      unknowns: grid.n,
      halfBandwidth: grid.halfBandwidth,
      nodeBandwidth: grid.nodeBandwidth,
      bearings: mesh.bearings.length,
    },
  };
}
