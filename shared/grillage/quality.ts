/**
 * Findings of the grillage (typed data, never console output) and the mesh-quality checks.
 * Units: lengths m; ratios dimensionless. Lengths inside messages are tokens shown in the
 * reader's units (shared/quantities/inText.ts).
 *
 * Checks
 * - Panel aspect ratio: longer side / shorter side of each grid panel (between two adjacent
 *   longitudinal lines and two consecutive transverse members) should not exceed 5.0
 *   (AASHTO LRFD Art. 4.6.3.3.1: "The aspect ratio of finite elements and grid panels
 *   should not exceed 5.0"; quoted from memory).
 * - Nodes per span: at least five, and preferably nine, nodes along each girder in each
 *   span (the guidance for beam-slab grids in AASHTO LRFD Art. 4.6.3.3, from memory).
 */
import type { GrillageMesh } from './mesh.js';
import { lengthInText } from '../quantities/inText.js';

export type GrillageFindingCode =
  | 'layout'
  | 'skew-parallel-above-limit'
  | 'edge-line-skipped'
  | 'composite-section-unavailable'
  | 'girder-torsion-estimated'
  | 'diaphragms-left-out'
  | 'diaphragms-modelled'
  | 'panel-aspect-ratio'
  | 'few-nodes-per-span';

export interface GrillageFinding {
  code: GrillageFindingCode;
  severity: 'info' | 'warning';
  message: string;
  article?: string;
  /** Numbers behind the finding (internal units), e.g. { ratio: 6.2, limit: 5 }. */
  values?: Record<string, number>;
}

export const PANEL_ASPECT_LIMIT = 5;
export const MIN_NODES_PER_SPAN = 5;
export const PREFERRED_NODES_PER_SPAN = 9;

export interface PanelAspect {
  ratio: number;
  /** Where: the bay (between lines `line` and `line + 1`), the span (0-based) and the panel's x, m. */
  line: number;
  span: number;
  x: number;
  longitudinal: number;
  transverse: number;
}

/** The worst panel of the mesh (undefined when there is no panel). */
export function worstPanel(mesh: GrillageMesh): PanelAspect | undefined {
  // group transverse members by bay and span; each member's mid-x sorts the panels
  const groups = new Map<string, { line: number; span: number; mids: { x: number; len: number }[] }>();
  for (const m of mesh.members) {
    if (m.kind !== 'slab' && m.kind !== 'diaphragm') continue;
    const a = mesh.nodes[m.i];
    const b = mesh.nodes[m.j];
    const line = Math.min(a.line, b.line);
    const key = `${line}:${m.span}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { line, span: m.span, mids: [] }));
    g.mids.push({ x: (a.x + b.x) / 2, len: Math.hypot(b.x - a.x, b.y - a.y) });
  }
  let worst: PanelAspect | undefined;
  for (const g of groups.values()) {
    g.mids.sort((p, q) => p.x - q.x);
    for (let k = 1; k < g.mids.length; k++) {
      const along = g.mids[k].x - g.mids[k - 1].x;
      if (!(along > 0)) continue;
      const across = (g.mids[k].len + g.mids[k - 1].len) / 2;
      const ratio = Math.max(along, across) / Math.min(along, across);
      if (!worst || ratio > worst.ratio) {
        worst = { ratio, line: g.line, span: g.span, x: (g.mids[k].x + g.mids[k - 1].x) / 2, longitudinal: along, transverse: across };
      }
    }
  }
  return worst;
}

/** Quality findings of a mesh: panel aspect ratio and nodes per span. */
export function meshQualityFindings(mesh: GrillageMesh): GrillageFinding[] {
  const out: GrillageFinding[] = [];
  const worst = worstPanel(mesh);
  if (worst && worst.ratio > PANEL_ASPECT_LIMIT) {
    out.push({
      code: 'panel-aspect-ratio',
      severity: 'warning',
      message:
        `grid panel aspect ratio ${worst.ratio.toFixed(2)} exceeds ${PANEL_ASPECT_LIMIT} ` +
        `(span ${worst.span + 1}, between ${mesh.lines[worst.line].label} and ${mesh.lines[worst.line + 1].label}, near x = ${lengthInText(worst.x)}: ` +
        `${lengthInText(worst.longitudinal)} along the girders by ${lengthInText(worst.transverse)} across); refine or coarsen the mesh density`,
      article: 'AASHTO LRFD Art. 4.6.3.3.1',
      values: { ratio: worst.ratio, limit: PANEL_ASPECT_LIMIT, x: worst.x, span: worst.span },
    });
  }
  let fewest = Infinity;
  let where = { line: 0, span: 0 };
  mesh.lines.forEach((line, l) => {
    if (line.kind !== 'girder') return;
    for (let j = 0; j < mesh.spanCount; j++) {
      const count = line.spanLast[j] - line.spanFirst[j] + 1;
      if (count < fewest) {
        fewest = count;
        where = { line: l, span: j };
      }
    }
  });
  if (fewest < PREFERRED_NODES_PER_SPAN) {
    out.push({
      code: 'few-nodes-per-span',
      severity: fewest < MIN_NODES_PER_SPAN ? 'warning' : 'info',
      message:
        `${mesh.lines[where.line].label} has only ${fewest} nodes in span ${where.span + 1}; ` +
        `at least ${MIN_NODES_PER_SPAN}, preferably ${PREFERRED_NODES_PER_SPAN}, are advised: raise the mesh density`,
      article: 'AASHTO LRFD Art. 4.6.3.3 (from memory)',
      values: { nodes: fewest, minimum: MIN_NODES_PER_SPAN, preferred: PREFERRED_NODES_PER_SPAN, span: where.span },
    });
  }
  return out;
}
