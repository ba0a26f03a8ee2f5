/**
 * The grillage mesh of a slab-on-girder deck: longitudinal lines (girders, optional edge
 * members), transverse members (slab strips, diaphragms), bearings.
 *
 * Units: m for every coordinate and length; stiffness N·m² (see stiffness.ts).
 *
 * Plan coordinates and sign conventions
 * - x along the girders (up-station) from support line 0 at girder 1; y transverse from
 *   girder 1's centreline, positive to the right (as shared/deck/geometry.ts). z is down.
 * - Support line j is the straight line x = X_j(y) = A_j + B_j·y with B_j = tan θ_j: a
 *   positive skew θ (support line rotated counter-clockwise in plan, deck schema) puts the
 *   right-hand end of the line further up-station. Span lengths are measured along the
 *   girders at the centreline of the girder group (y_c = midway between the exterior
 *   girders); for parallel support lines every girder has that span length.
 * - Girders are parallel straight lines at their offsets; each girder has a bearing (a
 *   vertical restraint, w = 0; rotations free) where it crosses each support line.
 * - Simple spans (deck.continuous false): every span is its own structure; girders and slab
 *   are jointed over interior supports (two bearings per girder there, one per span end).
 *   Continuous: girders and slab run through; one bearing per girder per support line.
 *
 * Transverse members (the layout)
 * - 'skew-parallel': in each span the girders are divided at the same fractions of their
 *   span (uniform segments, plus intermediate diaphragm positions); the nodes at one
 *   fraction lie on a straight line parallel to the supports (fanned between support lines
 *   of different skew), and slab-strip members join them. Support lines are such lines.
 * - 'perpendicular': transverse members run at right angles to the girders on lines
 *   x = X_j(y_c) + i·h (h = span / segments) across the girders that the line meets inside
 *   their span; a girder node lies where the line crosses it, or the line snaps to the
 *   girder's bearing when it passes within h/2 of it. Bearings stay on the skewed support
 *   lines, which carry slab-strip (and end-diaphragm) members joining the bearings.
 *   Intermediate diaphragms are perpendicular lines at their fractions of the centreline span.
 * - 'auto' (default): skew-parallel when every |θ| ≤ 20°, else perpendicular (research
 *   comparisons show skew-parallel members give the wrong trend at larger skew; the limit
 *   follows common practice, no source).
 * Slab-strip widths: the tributary length along the girders, measured at right angles to
 *   the member (for a skew member: tributary length × cos of its angle to the y axis).
 *   Perpendicular layout: a line's tributary band h is clipped to the bay's span extent at
 *   the bay's centre; a support-line member carries half a segment.
 * Edge members (option): a longitudinal line at each deck edge (when the overhang is at
 *   least 0.15 m) joined to the exterior girder by slab strips; it stands for the outer half
 *   of the overhang slab (I = b·ts³/12, J = b·ts³/6 with b = overhang / 2, unless given) and
 *   the exterior girder's tributary flange then stops at mid-overhang.
 */
import { deckGeometry } from '../deck/geometry.js';
import { DeckInputError, type Deck } from '../deck/schema.js';
import type { TraceStep } from '../trace.js';
import type { GridMember } from './assemble.js';
import { GrillageInputError } from './errors.js';
import { lengthInText } from '../quantities/inText.js';
import { deckStiffness, type DeckStiffness, type StiffnessOptions } from './stiffness.js';
import { meshQualityFindings, type GrillageFinding } from './quality.js';

export type TransverseLayout = 'skew-parallel' | 'perpendicular';

export interface MeshOptions {
  /** Segments per span along the girders (whole number 1–1000). */
  segmentsPerSpan: number;
  layout: 'auto' | TransverseLayout;
  /** Largest |skew|, degrees, for which 'auto' keeps skew-parallel members. */
  skewParallelLimit: number;
  /** Edge members: false, or their properties (m⁴, in deck concrete; defaults as stated above). */
  edgeMembers: false | { inertia?: number; torsion?: number };
  /** Bearings left out, by 0-based girder and support line. */
  omitBearings: { girder: number; support: number }[];
  /** Guard against meshes too large to solve interactively. */
  maxNodes: number;
  stiffness: StiffnessOptions;
}

export const MIN_EDGE_OVERHANG = 0.15;
/** Smallest girder spacing and span length the mesher accepts, m (shorter members make the stiffness meaningless). */
export const MIN_GIRDER_SPACING = 0.05;
export const MIN_SPAN_LENGTH = 0.5;

export interface MeshNode {
  x: number;
  y: number;
  /** Longitudinal line index. */
  line: number;
  /** Span (0-based) whose piece of the line holds the node (for a continuous interior support: the span ending there). */
  span: number;
}

export type MemberKind = 'girder' | 'edge' | 'slab' | 'diaphragm';

export interface MeshMember extends GridMember {
  kind: MemberKind;
  /** Span (0-based) the member belongs to. */
  span: number;
  /** Slab strip width represented, m (transverse members). */
  stripWidth: number;
  /** Longitudinal members: line index and segment position (nodes[seg] → nodes[seg + 1]); −1 otherwise. */
  line: number;
  seg: number;
}

export interface LongitudinalLine {
  kind: 'girder' | 'edge';
  /** 0-based girder index (girder lines), −1 for edge lines. */
  girder: number;
  side?: 'left' | 'right';
  label: string;
  y: number;
  /** Node ids by increasing x; a simple-span joint appears twice (end of one span, start of the next). */
  nodes: Int32Array;
  xs: Float64Array;
  /** Member id of segment k (nodes[k] → nodes[k + 1]); −1 across a simple-span joint. */
  segMember: Int32Array;
  /** Per span: first and last position in `nodes`. */
  spanFirst: Int32Array;
  spanLast: Int32Array;
}

export interface Bearing {
  node: number;
  girder: number;
  support: number;
  /** Span piece the bearing node belongs to. */
  span: number;
}

export interface GrillageMesh {
  layout: TransverseLayout;
  segmentsPerSpan: number;
  spanCount: number;
  continuous: boolean;
  nodes: MeshNode[];
  members: MeshMember[];
  lines: LongitudinalLine[];
  /** girderLine[g] = line index of girder g. */
  girderLine: Int32Array;
  bearings: Bearing[];
  /** Support line j: x = A[j] + B[j]·y. */
  supportA: Float64Array;
  supportB: Float64Array;
  /** Centreline of the girder group, m. */
  yc: number;
  deckLeft: number;
  deckRight: number;
  /** Deck span lengths at the centreline, m. */
  spanLengths: number[];
  stiffness: DeckStiffness;
  findings: GrillageFinding[];
  trace: TraceStep[];
}

/** x of support line j at transverse position y, m. */
export function supportX(mesh: Pick<GrillageMesh, 'supportA' | 'supportB'>, j: number, y: number): number {
  return mesh.supportA[j] + mesh.supportB[j] * y;
}

interface LineSpec {
  kind: 'girder' | 'edge';
  girder: number;
  side?: 'left' | 'right';
  y: number;
  label: string;
}

/** A node to create on one line piece (perpendicular layout): a support node or a grid-line crossing. */
interface PieceNode {
  x: number;
  /** Support index for a support node, −1 for a grid-line crossing. */
  support: number;
}

const DEG = Math.PI / 180;

/** Support lines x = A_j + B_j·y (see the module comment), the group centreline and span lengths. */
interface SupportLines {
  A: Float64Array;
  B: Float64Array;
  Xs: (j: number, y: number) => number;
  yc: number;
  spanLengths: number[];
}

/** Mutable state of a mesh under construction, shared by the building steps. */
interface MeshBuild {
  deck: Deck;
  N: number;
  m: number;
  lineSpecs: LineSpec[];
  sup: SupportLines;
  stiff: DeckStiffness;
  nodes: MeshNode[];
  members: MeshMember[];
  /** Node ids per line per span. */
  linePieces: number[][][];
  /** Node id of line l at support j ending span j − 1 (End) / starting span j (Start); the same node when continuous. */
  supportNodeEnd: number[][];
  supportNodeStart: number[][];
  diaphragmFractions: number[];
  supportDiaphragms: boolean;
}

export function buildMesh(deck: Deck, opt: MeshOptions): GrillageMesh {
  const geom = deckGeometry(deck);
  const N = deck.spans.length;
  if (deck.supports.length !== N + 1) {
    throw new DeckInputError(['supports'], `a deck of ${N} span(s) needs ${N + 1} support lines, not ${deck.supports.length}`);
  }
  const sup = supportLines(deck, geom);
  const findings: GrillageFinding[] = [];
  const { lineSpecs, edgeLeft, edgeRight } = longitudinalLineSpecs(deck, geom, opt, findings);
  checkMemberLengths(deck, geom, sup.spanLengths);
  checkSpansOpen(geom, lineSpecs, sup, N);
  const { layout, maxSkew } = chooseLayout(deck, opt, findings);

  const Nb = geom.girderCount;
  const s0 = geom.spacings;
  const tribLeft = (g: number) => (g === 0 ? (edgeLeft ? deck.overhangLeft / 2 : deck.overhangLeft) : s0[g - 1] / 2);
  const tribRight = (g: number) => (g === Nb - 1 ? (edgeRight ? deck.overhangRight / 2 : deck.overhangRight) : s0[g] / 2);
  const stiff = deckStiffness(deck, opt.stiffness, {
    interior: Nb > 2 ? tribLeft(1) + tribRight(1) : undefined,
    exterior: tribLeft(0) + tribRight(0),
  });
  findings.push(...stiff.findings);
  const intermediate = stiff.diaphragmsModelled ? deck.diaphragms.intermediatePerSpan : 0;
  const b: MeshBuild = {
    deck,
    N,
    m: opt.segmentsPerSpan,
    lineSpecs,
    sup,
    stiff,
    nodes: [],
    members: [],
    linePieces: lineSpecs.map(() => Array.from({ length: N }, () => [] as number[])),
    supportNodeEnd: lineSpecs.map(() => new Array<number>(N + 1).fill(-1)),
    supportNodeStart: lineSpecs.map(() => new Array<number>(N + 1).fill(-1)),
    diaphragmFractions: Array.from({ length: intermediate }, (_, k) => (k + 1) / (intermediate + 1)),
    supportDiaphragms: stiff.diaphragmsModelled && deck.diaphragms.atSupports,
  };
  checkMeshSize(b, layout, opt.maxNodes);
  if (layout === 'skew-parallel') buildSkewParallelMembers(b);
  else buildPerpendicularMembers(b);
  const lines = buildLongitudinalMembers(b, (g) => tribLeft(g) + tribRight(g), opt.edgeMembers);
  const girderLine = new Int32Array(Nb);
  lineSpecs.forEach((spec, l) => {
    if (spec.kind === 'girder') girderLine[spec.girder] = l;
  });
  const bearings = placeBearings(b, girderLine, opt.omitBearings);
  const diaphragmFinding = diaphragmMembersFinding(b);
  if (diaphragmFinding) findings.push(diaphragmFinding);

  const mesh: GrillageMesh = {
    layout,
    segmentsPerSpan: b.m,
    spanCount: N,
    continuous: deck.continuous,
    nodes: b.nodes,
    members: b.members,
    lines,
    girderLine,
    bearings,
    supportA: sup.A,
    supportB: sup.B,
    yc: sup.yc,
    deckLeft: geom.deckLeft,
    deckRight: geom.deckRight,
    spanLengths: sup.spanLengths,
    stiffness: stiff,
    findings,
    trace: meshTrace(b, layout, maxSkew, bearings.length),
  };
  mesh.findings.push(...meshQualityFindings(mesh));
  return mesh;
}

function supportLines(deck: Deck, geom: ReturnType<typeof deckGeometry>): SupportLines {
  const N = deck.spans.length;
  const W = geom.offsets[geom.girderCount - 1];
  const yc = W / 2;
  const B = Float64Array.from(deck.supports, (s) => Math.tan(s.skew * DEG));
  const A = new Float64Array(N + 1);
  let C = 0;
  for (let j = 0; j <= N; j++) {
    A[j] = C - yc * B[j] + yc * B[0];
    if (j < N) C += deck.spans[j].length;
  }
  return { A, B, Xs: (j, y) => A[j] + B[j] * y, yc, spanLengths: deck.spans.map((s) => s.length) };
}

/** The longitudinal lines: girders, and edge members where the overhang allows. */
function longitudinalLineSpecs(deck: Deck, geom: ReturnType<typeof deckGeometry>, opt: MeshOptions, findings: GrillageFinding[]) {
  const edges = opt.edgeMembers;
  const lineSpecs: LineSpec[] = [];
  const edgeLeft = edges !== false && deck.overhangLeft >= MIN_EDGE_OVERHANG;
  const edgeRight = edges !== false && deck.overhangRight >= MIN_EDGE_OVERHANG;
  if (edges !== false && (!edgeLeft || !edgeRight)) {
    findings.push({
      code: 'edge-line-skipped',
      severity: 'info',
      message: `edge members need an overhang of at least ${lengthInText(MIN_EDGE_OVERHANG)}: none on the ${!edgeLeft && !edgeRight ? 'left or right' : !edgeLeft ? 'left' : 'right'}`,
    });
  }
  if (edgeLeft) lineSpecs.push({ kind: 'edge', girder: -1, side: 'left', y: geom.deckLeft, label: 'the left edge member' });
  geom.offsets.forEach((y, g) => lineSpecs.push({ kind: 'girder', girder: g, y, label: `girder ${g + 1}` }));
  if (edgeRight) lineSpecs.push({ kind: 'edge', girder: -1, side: 'right', y: geom.deckRight, label: 'the right edge member' });
  return { lineSpecs, edgeLeft, edgeRight };
}

/** Members must have a length a grillage can use. */
function checkMemberLengths(deck: Deck, geom: ReturnType<typeof deckGeometry>, spanLengths: number[]): void {
  geom.spacings.forEach((sp, k) => {
    if (sp < MIN_GIRDER_SPACING) {
      throw new GrillageInputError(
        'degenerate-mesh',
        ['girders', deck.girders.kind === 'offsets' ? 'offsets' : 'spacing', ...(deck.girders.kind === 'offsets' ? [k + 1] : [])],
        `girders ${k + 1} and ${k + 2} are ${lengthInText(sp)} apart: the grillage needs at least ${lengthInText(MIN_GIRDER_SPACING)} between girders`,
      );
    }
  });
  spanLengths.forEach((len, j) => {
    if (len < MIN_SPAN_LENGTH) {
      throw new GrillageInputError('degenerate-mesh', ['spans', j, 'length'], `span ${j + 1} is ${lengthInText(len)} long: the grillage needs spans of at least ${lengthInText(MIN_SPAN_LENGTH)}`);
    }
  });
}

/** Spans must stay open along every line and at the deck edges. */
function checkSpansOpen(geom: ReturnType<typeof deckGeometry>, lineSpecs: LineSpec[], sup: SupportLines, N: number): void {
  const checkYs = [geom.deckLeft, ...lineSpecs.map((l) => l.y), geom.deckRight];
  for (let j = 0; j < N; j++) {
    for (const y of checkYs) {
      const len = sup.Xs(j + 1, y) - sup.Xs(j, y);
      if (!(len > 1e-3 * sup.spanLengths[j])) {
        throw new GrillageInputError(
          'unbuildable-deck',
          ['supports', j + 1, 'skew'],
          `support lines ${j + 1} and ${j + 2} meet or cross at y = ${lengthInText(y)} (span ${j + 1} would be ${lengthInText(len)} long there): reduce the difference in skew or lengthen the span`,
        );
      }
    }
  }
}

function chooseLayout(deck: Deck, opt: MeshOptions, findings: GrillageFinding[]): { layout: TransverseLayout; maxSkew: number } {
  const maxSkew = Math.max(...deck.supports.map((s) => Math.abs(s.skew)));
  const layout: TransverseLayout = opt.layout === 'auto' ? (maxSkew <= opt.skewParallelLimit ? 'skew-parallel' : 'perpendicular') : opt.layout;
  findings.push({
    code: 'layout',
    severity: 'info',
    message:
      layout === 'skew-parallel'
        ? `transverse members parallel to the supports (largest skew ${maxSkew.toFixed(1)}°${opt.layout === 'auto' ? `, within ${opt.skewParallelLimit}°` : ', chosen by the user'})`
        : `transverse members perpendicular to the girders, bearings on the skewed support lines (largest skew ${maxSkew.toFixed(1)}°${opt.layout === 'auto' ? `, above ${opt.skewParallelLimit}°` : ', chosen by the user'})`,
    values: { maxSkew, limit: opt.skewParallelLimit },
  });
  if (layout === 'skew-parallel' && maxSkew > opt.skewParallelLimit) {
    findings.push({
      code: 'skew-parallel-above-limit',
      severity: 'warning',
      message: `transverse members parallel to supports skewed ${maxSkew.toFixed(1)}° (above ${opt.skewParallelLimit}°): such meshes are known to give the wrong trend with skew; the perpendicular layout is advised`,
      values: { maxSkew, limit: opt.skewParallelLimit },
    });
  }
  return { layout, maxSkew };
}

/** Node-count guard, before anything large is allocated. */
function checkMeshSize(b: MeshBuild, layout: TransverseLayout, maxNodes: number): void {
  const { N, m, lineSpecs, sup } = b;
  const nL = lineSpecs.length;
  const intermediate = b.diaphragmFractions.length;
  let estimate = 0;
  if (layout === 'skew-parallel') estimate = nL * (N * (m + intermediate) + 1);
  else {
    for (let j = 0; j < N; j++) {
      const h = sup.spanLengths[j] / m;
      const { xmin, xmax } = spanExtent(b, j);
      estimate += nL * ((xmax - xmin) / h + intermediate + 3);
    }
  }
  if (!(estimate <= maxNodes)) {
    throw new GrillageInputError(
      'mesh-too-large',
      ['grillage', 'segmentsPerSpan'],
      `the mesh would need about ${Math.round(estimate)} nodes, more than the limit of ${maxNodes}: lower the mesh density (or, for extreme skew, check the skew angles)`,
    );
  }
}

/** Smallest and largest x of span j over every line. */
function spanExtent(b: MeshBuild, j: number): { xmin: number; xmax: number } {
  let xmin = Infinity;
  let xmax = -Infinity;
  for (const l of b.lineSpecs) {
    xmin = Math.min(xmin, b.sup.Xs(j, l.y));
    xmax = Math.max(xmax, b.sup.Xs(j + 1, l.y));
  }
  return { xmin, xmax };
}

function addNode(b: MeshBuild, x: number, line: number, span: number): number {
  b.nodes.push({ x, y: b.lineSpecs[line].y, line, span });
  return b.nodes.length - 1;
}

/** A slab strip (with the diaphragm's stiffness added on a girder bay of a diaphragm line) from node a to node b. */
function addTransverse(b: MeshBuild, a: number, c: number, span: number, width: number, diaphragm: boolean): void {
  if (!(width > 0)) return;
  const pa = b.nodes[a];
  const pb = b.nodes[c];
  const len = Math.hypot(pb.x - pa.x, pb.y - pa.y);
  const perp = (width * Math.abs(pb.y - pa.y)) / len;
  const sp = b.stiff.slabStrip(perp);
  const l = Math.min(pa.line, pb.line);
  const withDiaphragm = diaphragm && b.lineSpecs[l].kind === 'girder' && b.lineSpecs[l + 1].kind === 'girder';
  b.members.push({
    i: a,
    j: c,
    EI: sp.EI + (withDiaphragm ? b.stiff.diaphragmEI(Math.abs(pb.y - pa.y)) : 0),
    GJ: sp.GJ,
    kind: withDiaphragm ? 'diaphragm' : 'slab',
    span,
    stripWidth: perp,
    line: -1,
    seg: -1,
  });
}

/** Skew-parallel layout: nodes at the same span fractions on every line, transverse members joining them. */
function buildSkewParallelMembers(b: MeshBuild): void {
  const { deck, N, m, lineSpecs, linePieces, nodes } = b;
  const nL = lineSpecs.length;
  const Xs = b.sup.Xs;
  // fractions per span: uniform i/m, with intermediate diaphragm fractions replacing uniform ones nearby
  const fractions: { f: number; diaphragm: boolean }[] = [];
  for (let i = 0; i <= m; i++) {
    const f = i / m;
    if (i > 0 && i < m && b.diaphragmFractions.some((d) => Math.abs(d - f) < 0.25 / m)) continue;
    fractions.push({ f, diaphragm: false });
  }
  for (const d of b.diaphragmFractions) fractions.push({ f: d, diaphragm: true });
  fractions.sort((p, q) => p.f - q.f);
  const F = fractions.length;
  // station node ids: station[l][j][k]
  const station: number[][][] = lineSpecs.map(() => Array.from({ length: N }, () => new Array<number>(F).fill(-1)));
  lineSpecs.forEach((spec, l) => {
    for (let j = 0; j < N; j++) {
      const x0 = Xs(j, spec.y);
      const len = Xs(j + 1, spec.y) - x0;
      for (let k = 0; k < F; k++) {
        let id: number;
        if (k === 0 && j > 0 && deck.continuous) id = station[l][j - 1][F - 1];
        else id = addNode(b, k === F - 1 ? Xs(j + 1, spec.y) : x0 + fractions[k].f * len, l, j);
        station[l][j][k] = id;
        linePieces[l][j].push(id);
      }
      b.supportNodeStart[l][j] = station[l][j][0];
      b.supportNodeEnd[l][j + 1] = station[l][j][F - 1];
    }
  });
  // transverse members at each station
  const tribAlong = (l: number, j: number, k: number): number => {
    const piece = linePieces[l][j];
    const x = nodes[piece[k]].x;
    let prev = k > 0 ? nodes[piece[k - 1]].x : x;
    let next = k < F - 1 ? nodes[piece[k + 1]].x : x;
    if (deck.continuous) {
      if (k === 0 && j > 0) prev = nodes[linePieces[l][j - 1][F - 2]].x;
      if (k === F - 1 && j < N - 1) next = nodes[linePieces[l][j + 1][1]].x;
    }
    return (next - prev) / 2;
  };
  for (let j = 0; j < N; j++) {
    for (let k = 0; k < F; k++) {
      if (k === 0 && j > 0 && deck.continuous) continue; // shared with the previous span's last station
      const atSupport = k === 0 || k === F - 1;
      const diaphragm = atSupport ? b.supportDiaphragms : fractions[k].diaphragm;
      for (let l = 0; l + 1 < nL; l++) {
        const width = (tribAlong(l, j, k) + tribAlong(l + 1, j, k)) / 2;
        addTransverse(b, station[l][j][k], station[l + 1][j][k], j, width, diaphragm);
      }
    }
  }
}

/** Perpendicular layout: grid lines at right angles to the girders, then the support-line members. */
function buildPerpendicularMembers(b: MeshBuild): void {
  for (let j = 0; j < b.N; j++) buildPerpendicularSpan(b, j);
  buildSupportLineMembers(b);
}

/** One span of the perpendicular layout: its grid lines, the nodes where they meet each line, their members. */
function buildPerpendicularSpan(b: MeshBuild, j: number): void {
  const { deck, m, lineSpecs, linePieces } = b;
  const nL = lineSpecs.length;
  const Xs = b.sup.Xs;
  const spanLength = b.sup.spanLengths[j];
  const h = spanLength / m;
  const xc0 = Xs(j, b.sup.yc);
  const { xmin, xmax } = spanExtent(b, j);
  const hard = b.diaphragmFractions.map((f) => xc0 + f * spanLength);
  const grid: { x: number; diaphragm: boolean }[] = hard.map((x) => ({ x, diaphragm: true }));
  const i0 = Math.ceil((xmin - 0.5 * h - xc0) / h);
  const i1 = Math.floor((xmax + 0.5 * h - xc0) / h);
  for (let i = i0; i <= i1; i++) {
    const x = xc0 + i * h;
    if (hard.some((xh) => Math.abs(xh - x) < 0.5 * h)) continue;
    grid.push({ x, diaphragm: false });
  }
  grid.sort((p, q) => p.x - q.x);
  // attachment of each grid line to each line: node id or −1; `attachSupport` marks snaps to a support node
  const attach: Int32Array[] = grid.map(() => new Int32Array(nL).fill(-1));
  const attachSupport: Int32Array[] = grid.map(() => new Int32Array(nL).fill(-1));
  lineSpecs.forEach((spec, l) => {
    const xs = Xs(j, spec.y);
    const xe = Xs(j + 1, spec.y);
    const pieceNodes: PieceNode[] = [];
    const snaps: { g: number; slot: number }[] = []; // grid line g → pieceNodes slot
    pieceNodes.push({ x: xs, support: j }, { x: xe, support: j + 1 });
    grid.forEach((gl, g) => {
      const ds = Math.abs(gl.x - xs);
      const de = Math.abs(gl.x - xe);
      const snapTol = gl.diaphragm ? 0.1 * h : 0.5 * h;
      if (ds < snapTol && ds <= de) snaps.push({ g, slot: 0 });
      else if (de < snapTol) snaps.push({ g, slot: 1 });
      else if (gl.x > xs && gl.x < xe) {
        pieceNodes.push({ x: gl.x, support: -1 });
        snaps.push({ g, slot: pieceNodes.length - 1 });
      }
    });
    // create nodes in x order
    const orderIdx = pieceNodes.map((_, k) => k).sort((p, q) => pieceNodes[p].x - pieceNodes[q].x);
    const ids = new Array<number>(pieceNodes.length);
    for (const k of orderIdx) {
      const pn = pieceNodes[k];
      let id: number;
      if (pn.support === j && j > 0 && deck.continuous) id = b.supportNodeEnd[l][j];
      else id = addNode(b, pn.x, l, j);
      ids[k] = id;
      linePieces[l][j].push(id);
    }
    b.supportNodeStart[l][j] = ids[0];
    b.supportNodeEnd[l][j + 1] = ids[1];
    for (const s of snaps) {
      attach[s.g][l] = ids[s.slot];
      attachSupport[s.g][l] = pieceNodes[s.slot].support;
    }
  });
  // grid-line members
  grid.forEach((gl, g) => {
    for (let l = 0; l + 1 < nL; l++) {
      const a = attach[g][l];
      const c = attach[g][l + 1];
      if (a < 0 || c < 0) continue;
      const sa = attachSupport[g][l];
      if (sa >= 0 && sa === attachSupport[g][l + 1]) continue; // would duplicate the support-line member
      const ym = (lineSpecs[l].y + lineSpecs[l + 1].y) / 2;
      const lo = Math.max(gl.x - h / 2, Xs(j, ym));
      const hi = Math.min(gl.x + h / 2, Xs(j + 1, ym));
      const width = hi - lo;
      if (width < 0.05 * h) continue;
      addTransverse(b, a, c, j, width, gl.diaphragm);
    }
  });
}

/** Perpendicular layout: slab-strip (and end-diaphragm) members along each skewed support line. */
function buildSupportLineMembers(b: MeshBuild): void {
  const { N, m, deck } = b;
  const nL = b.lineSpecs.length;
  for (let sup = 0; sup <= N; sup++) {
    const hBefore = sup > 0 ? b.sup.spanLengths[sup - 1] / m : 0;
    const hAfter = sup < N ? b.sup.spanLengths[sup] / m : 0;
    for (let l = 0; l + 1 < nL; l++) {
      if (deck.continuous || sup === 0 || sup === N) {
        const a = sup < N ? b.supportNodeStart[l][sup] : b.supportNodeEnd[l][sup];
        const c = sup < N ? b.supportNodeStart[l + 1][sup] : b.supportNodeEnd[l + 1][sup];
        addTransverse(b, a, c, sup < N ? sup : sup - 1, (hBefore + hAfter) / 2, b.supportDiaphragms);
      } else {
        addTransverse(b, b.supportNodeEnd[l][sup], b.supportNodeEnd[l + 1][sup], sup - 1, hBefore / 2, b.supportDiaphragms);
        addTransverse(b, b.supportNodeStart[l][sup], b.supportNodeStart[l + 1][sup], sup, hAfter / 2, b.supportDiaphragms);
      }
    }
  }
}

/** Longitudinal lines and their members (girders: composite tributary section; edge members: outer half of the overhang). */
function buildLongitudinalMembers(b: MeshBuild, tributary: (g: number) => number, edges: MeshOptions['edgeMembers']): LongitudinalLine[] {
  const { deck, N, nodes, members, stiff } = b;
  return b.lineSpecs.map((spec, l) => {
    const ids: number[] = [];
    const spanFirst = new Int32Array(N);
    const spanLast = new Int32Array(N);
    for (let j = 0; j < N; j++) {
      const piece = b.linePieces[l][j];
      const shared = deck.continuous && j > 0;
      spanFirst[j] = shared ? ids.length - 1 : ids.length;
      for (let k = shared ? 1 : 0; k < piece.length; k++) ids.push(piece[k]);
      spanLast[j] = ids.length - 1;
    }
    const nodeIds = Int32Array.from(ids);
    const xs = Float64Array.from(ids, (id) => nodes[id].x);
    const segMember = new Int32Array(Math.max(0, ids.length - 1)).fill(-1);
    let props: { EI: number; GJ: number };
    if (spec.kind === 'girder') props = stiff.girder(tributary(spec.girder));
    else {
      const half = (spec.side === 'left' ? deck.overhangLeft : deck.overhangRight) / 2;
      const e = edges === false ? {} : edges;
      props = {
        EI: stiff.Ed * (e.inertia ?? (half * stiff.ts ** 3) / 12),
        GJ: stiff.Gd * (e.torsion ?? (half * stiff.ts ** 3) / 6),
      };
    }
    for (let j = 0; j < N; j++) {
      for (let k = spanFirst[j]; k < spanLast[j]; k++) {
        members.push({ i: nodeIds[k], j: nodeIds[k + 1], EI: props.EI, GJ: props.GJ, kind: spec.kind, span: j, stripWidth: 0, line: l, seg: k });
        segMember[k] = members.length - 1;
      }
    }
    return { kind: spec.kind, girder: spec.girder, side: spec.side, label: spec.label, y: spec.y, nodes: nodeIds, xs, segMember, spanFirst, spanLast };
  });
}

/** Bearings where each girder crosses each support line, less those left out; every girder (piece) keeps one. */
function placeBearings(b: MeshBuild, girderLine: Int32Array, omitBearings: MeshOptions['omitBearings']): Bearing[] {
  const { N, deck } = b;
  const Nb = girderLine.length;
  omitBearings.forEach((ob, k) => {
    if (!Number.isInteger(ob.girder) || ob.girder < 0 || ob.girder >= Nb) {
      throw new GrillageInputError('invalid-option', ['grillage', 'omitBearings', k, 'girder'], `girder index must be a whole number from 0 to ${Nb - 1}, not ${ob.girder}`);
    }
    if (!Number.isInteger(ob.support) || ob.support < 0 || ob.support > N) {
      throw new GrillageInputError('invalid-option', ['grillage', 'omitBearings', k, 'support'], `support index must be a whole number from 0 to ${N}, not ${ob.support}`);
    }
  });
  const omitted = new Set(omitBearings.map((o) => `${o.girder}:${o.support}`));
  const bearings: Bearing[] = [];
  for (let g = 0; g < Nb; g++) {
    const l = girderLine[g];
    for (let sup = 0; sup <= N; sup++) {
      if (omitted.has(`${g}:${sup}`)) continue;
      const startNode = sup < N ? b.supportNodeStart[l][sup] : -1;
      const endNode = sup > 0 ? b.supportNodeEnd[l][sup] : -1;
      if (startNode >= 0) bearings.push({ node: startNode, girder: g, support: sup, span: sup });
      if (endNode >= 0 && endNode !== startNode) bearings.push({ node: endNode, girder: g, support: sup, span: sup - 1 });
    }
    // every girder (each span piece, for simple spans) needs a bearing
    if (deck.continuous) {
      if (!bearings.some((x) => x.girder === g)) {
        throw new GrillageInputError('unsupported-girder', ['grillage', 'omitBearings'], `girder ${g + 1} has no bearing on any support line: every girder needs at least one`);
      }
    } else {
      for (let j = 0; j < N; j++) {
        if (!bearings.some((x) => x.girder === g && x.span === j)) {
          throw new GrillageInputError('unsupported-girder', ['grillage', 'omitBearings'], `girder ${g + 1} has no bearing in span ${j + 1} (simple spans): every girder of every span needs at least one`);
        }
      }
    }
  }
  return bearings;
}

/** Which diaphragm members the model holds (their stiffness per bay is in the trace). */
function diaphragmMembersFinding(b: MeshBuild): GrillageFinding | undefined {
  if (!b.stiff.diaphragmsModelled) return undefined;
  const count = b.members.filter((x) => x.kind === 'diaphragm').length;
  const what = b.deck.diaphragms.type === 'concrete-diaphragms' ? 'concrete diaphragm' : 'steel cross-frame';
  return {
    code: 'diaphragms-modelled',
    severity: 'info',
    message: `${count} ${what} members in the grillage (${b.diaphragmFractions.length} intermediate line(s) per span${b.supportDiaphragms ? ' and the support lines' : ''}), each added to the slab strip of its line; their stiffness per girder bay is in the model trace`,
    values: { members: count },
  };
}

function meshTrace(b: MeshBuild, layout: TransverseLayout, maxSkew: number, bearings: number): TraceStep[] {
  return [
    ...b.stiff.trace,
    {
      label: 'Grillage mesh',
      formula: layout === 'skew-parallel' ? 'transverse members parallel to the supports' : 'transverse members perpendicular to the girders',
      inputs: [
        { symbol: 'θmax', description: 'largest support skew', value: maxSkew, kind: 'angle' },
        { symbol: 'm', description: 'segments per span', value: b.m, kind: 'none' },
      ],
      value: b.nodes.length,
      kind: 'none',
      article: 'AASHTO LRFD Art. 4.6.3.3.1 (refined methods: grids)',
      note: `${b.nodes.length} nodes, ${b.members.length} members, ${bearings} bearings`,
    },
  ];
}

/** Plain description of a node for messages. */
export function describeMeshNode(mesh: GrillageMesh, node: number): { where: string; girder?: number } {
  const p = mesh.nodes[node];
  const line = mesh.lines[p.line];
  const x0 = supportX(mesh, p.span, p.y);
  const x1 = supportX(mesh, p.span + 1, p.y);
  const f = (p.x - x0) / (x1 - x0);
  return {
    where: `${line.label} at x = ${lengthInText(p.x)} (span ${p.span + 1}, ${f.toFixed(3)} of the span)`,
    girder: line.kind === 'girder' ? line.girder : undefined,
  };
}
