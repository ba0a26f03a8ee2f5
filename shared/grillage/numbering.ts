/**
 * Bandwidth-reducing node numbering: reverse Cuthill–McKee on the node graph of the grid
 * (nodes joined by members). No units.
 *
 * Source: E. Cuthill & J. McKee (1969), "Reducing the bandwidth of sparse symmetric
 * matrices"; the reversal by A. George (1971); the pseudo-peripheral starting node by the
 * George–Liu heuristic (A. George & J. Liu, Computer Solution of Large Sparse Positive
 * Definite Systems, 1981). From memory.
 *
 * Each connected component (simple spans give one per span) is numbered in turn.
 */

/** Compressed adjacency of an undirected graph: neighbours of v are nbr[start[v] .. start[v+1]). */
export interface Adjacency {
  start: Int32Array;
  nbr: Int32Array;
}

/** Builds a compressed adjacency from edge endpoints (duplicates and self-loops dropped). */
export function adjacencyFromEdges(nodeCount: number, edgeI: ArrayLike<number>, edgeJ: ArrayLike<number>): Adjacency {
  const sets: Set<number>[] = Array.from({ length: nodeCount }, () => new Set<number>());
  for (let e = 0; e < edgeI.length; e++) {
    const i = edgeI[e];
    const j = edgeJ[e];
    if (i === j) continue;
    sets[i].add(j);
    sets[j].add(i);
  }
  const start = new Int32Array(nodeCount + 1);
  for (let v = 0; v < nodeCount; v++) start[v + 1] = start[v] + sets[v].size;
  const nbr = new Int32Array(start[nodeCount]);
  for (let v = 0; v < nodeCount; v++) {
    let k = start[v];
    for (const u of sets[v]) nbr[k++] = u;
  }
  return { start, nbr };
}

/** Breadth-first level structure from `root` restricted to unvisited-in-`mask` nodes (mask[v] = 1 marks the component). */
function levelStructure(adj: Adjacency, root: number, mark: Int32Array, stamp: number, order: Int32Array): { count: number; depth: number; lastLevelStart: number } {
  let head = 0;
  let tail = 0;
  order[tail++] = root;
  mark[root] = stamp;
  let depth = 0;
  let levelEnd = 1;
  let lastLevelStart = 0;
  while (head < tail) {
    const v = order[head++];
    for (let k = adj.start[v]; k < adj.start[v + 1]; k++) {
      const u = adj.nbr[k];
      if (mark[u] !== stamp) {
        mark[u] = stamp;
        order[tail++] = u;
      }
    }
    if (head === levelEnd && head < tail) {
      depth++;
      lastLevelStart = head;
      levelEnd = tail;
    }
  }
  return { count: tail, depth, lastLevelStart };
}

/**
 * Reverse Cuthill–McKee ordering. Returns `order` (order[k] = old node placed at position k)
 * and `position` (position[old] = k).
 */
export function reverseCuthillMcKee(adj: Adjacency): { order: Int32Array; position: Int32Array } {
  const n = adj.start.length - 1;
  const degree = new Int32Array(n);
  for (let v = 0; v < n; v++) degree[v] = adj.start[v + 1] - adj.start[v];
  const placed = new Uint8Array(n);
  const mark = new Int32Array(n).fill(-1);
  const scratch = new Int32Array(n);
  const order = new Int32Array(n);
  let stamp = 0;
  let filled = 0;
  const neighbours: number[] = [];
  // visit nodes by increasing degree to pick each component's seed
  const byDegree = Array.from({ length: n }, (_, v) => v).sort((a, b) => degree[a] - degree[b] || a - b);
  for (const seed of byDegree) {
    if (placed[seed]) continue;
    // George–Liu pseudo-peripheral node
    let root = seed;
    let ls = levelStructure(adj, root, mark, ++stamp, scratch);
    for (let iter = 0; iter < 20; iter++) {
      let best = -1;
      for (let k = ls.lastLevelStart; k < ls.count; k++) {
        const v = scratch[k];
        if (best < 0 || degree[v] < degree[best]) best = v;
      }
      const next = levelStructure(adj, best, mark, ++stamp, scratch);
      if (next.depth > ls.depth) {
        root = best;
        ls = next;
      } else break;
    }
    // Cuthill–McKee from root: neighbours in increasing degree
    const compStart = filled;
    order[filled++] = root;
    placed[root] = 1;
    let head = compStart;
    while (head < filled) {
      const v = order[head++];
      neighbours.length = 0;
      for (let k = adj.start[v]; k < adj.start[v + 1]; k++) {
        const u = adj.nbr[k];
        if (!placed[u]) {
          placed[u] = 1;
          neighbours.push(u);
        }
      }
      neighbours.sort((a, b) => degree[a] - degree[b] || a - b);
      for (const u of neighbours) order[filled++] = u;
    }
    // reverse this component's block
    for (let a = compStart, b = filled - 1; a < b; a++, b--) {
      const t = order[a];
      order[a] = order[b];
      order[b] = t;
    }
  }
  const position = new Int32Array(n);
  for (let k = 0; k < n; k++) position[order[k]] = k;
  return { order, position };
}

/** Largest |position(i) − position(j)| over the edges (node bandwidth). */
export function nodeBandwidth(position: Int32Array, edgeI: ArrayLike<number>, edgeJ: ArrayLike<number>): number {
  let bw = 0;
  for (let e = 0; e < edgeI.length; e++) bw = Math.max(bw, Math.abs(position[edgeI[e]] - position[edgeJ[e]]));
  return bw;
}
