/**
 * The size of a deck's refined (grillage) model, counted cheaply before any job is queued,
 * and the server's limit on it.
 *
 * Nodes follow the mesher's own count (shared/grillage/mesh.ts, its node-count guard): one
 * longitudinal line per girder (the refined run has no edge members); per line and span,
 * skew-parallel layout: segmentsPerSpan + intermediate diaphragms nodes (plus the support
 * nodes); perpendicular layout (any |skew| above 20°): the girder's span length over the
 * segment length + diaphragms + its two bearings. Diaphragms are counted whenever the deck
 * has them in the grillage (diaphragms.includeInGrillage), so the count is at or a little above the mesh's (within 10 %, tested).
 *
 * The measure limited is nodes × girder lines: the run's time and memory grow with it (each
 * girder's influence surfaces span the whole mesh, and the banded stiffness holds about
 * 9 × nodes × girders numbers). On this project's 2-core machine the run took about
 * 0.17 ms per node-girder (6 to 40 girders, 1 to 3 spans, 30° skew; figures in the README).
 * Lengths m, angles degrees.
 */
import type { Deck } from '../../shared/deck/schema.js';
import { deckGeometry } from '../../shared/deck/geometry.js';
import { REFINED_SEGMENTS_PER_SPAN } from '../../shared/grillage/refinedFactors.js';
import { DEFAULT_SKEW_PARALLEL_LIMIT } from '../../shared/grillage/model.js';

export interface ModelSize {
  girders: number;
  spans: number;
  /** Estimated mesh nodes. */
  nodes: number;
  /** nodes × girder lines: the measure the server limits. */
  nodeGirders: number;
}

const DEG = Math.PI / 180;

/** The refined run's model size for a valid deck, at `segmentsPerSpan` segments per span. */
export function refinedModelSize(deck: Deck, segmentsPerSpan = REFINED_SEGMENTS_PER_SPAN): ModelSize {
  const ys = deckGeometry(deck).offsets;
  const lines = ys.length;
  const N = deck.spans.length;
  const m = segmentsPerSpan;
  const diaphragms = deck.diaphragms.type === 'none' || deck.diaphragms.includeInGrillage === false ? 0 : deck.diaphragms.intermediatePerSpan;
  const maxSkew = Math.max(...deck.supports.map((s) => Math.abs(s.skew)));
  let nodes: number;
  if (maxSkew <= DEFAULT_SKEW_PARALLEL_LIMIT) {
    // the stations of every span, shared at interior supports when continuous
    nodes = lines * (N * (m + diaphragms) + 1) + (deck.continuous ? 0 : lines * (N - 1));
  } else {
    // support line j: x = A_j + B_j·y (mesh.ts), spans measured at the girder group's centreline
    const yc = ys[lines - 1] / 2;
    const B = deck.supports.map((s) => Math.tan(s.skew * DEG));
    const A: number[] = [];
    let C = 0;
    for (let j = 0; j <= N; j++) {
      A.push(C - yc * B[j] + yc * B[0]);
      if (j < N) C += deck.spans[j].length;
    }
    // each girder meets the transverse lines (spacing h) inside its own span, plus its two bearings
    nodes = 0;
    for (let j = 0; j < N; j++) {
      const h = deck.spans[j].length / m;
      for (const y of ys) nodes += (A[j + 1] + B[j + 1] * y - (A[j] + B[j] * y)) / h + diaphragms + 2;
    }
  }
  nodes = Math.round(nodes);
  return { girders: lines, spans: N, nodes, nodeGirders: nodes * lines };
}

/** Why a deck's refined model is refused, or null when it is within `limit` node-girders. */
export function modelSizeRefusal(size: ModelSize, limit: number): string | null {
  if (size.nodeGirders <= limit) return null;
  const fmt = (n: number) => Math.round(n).toLocaleString('en-US');
  return (
    `the grillage of this deck (${size.girders} girders, ${size.spans} span${size.spans === 1 ? '' : 's'}) would have about ${fmt(size.nodes)} nodes ` +
    `× ${size.girders} girder lines = ${fmt(size.nodeGirders)}, above this server's limit of ${fmt(limit)} for a refined run ` +
    `(about ${fmt(limit / size.girders)} nodes at ${size.girders} girders). Run the grillage in the workspace with a coarser mesh, ` +
    'or split the deck into fewer spans; an administrator can raise REFINED_MAX_NODE_GIRDERS'
  );
}
