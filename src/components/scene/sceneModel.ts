/**
 * What the 3D deck view draws, as plain numbers: the deck's plan and cross-section from the
 * deck model, the loaded lanes, wheel lines and axles from the placement.
 *
 * Plan coordinates (as shared/grillage and shared/placement): x along the girders
 * (up-station) from support line 0 at girder 1; y across, from girder 1's centreline,
 * positive to the right. Support line j is x = A_j + B_j·y with B_j = tan θ_j; span lengths
 * are measured at the centreline of the girder group y_c (as the grillage mesh does), so
 * A_0 = 0 and A_j = ΣL − y_c·(B_j − B_0).
 *
 * World coordinates of the view (three.js, y up): X = x − x_c, Y = elevation above the top
 * of the girders (slab soffit at the haunch), Z = y − y_c, so looking up-station (+X) girder 1
 * is on the left. Units: metres throughout.
 */
import type { Deck } from '@shared/deck/schema';
import { deckGeometry } from '@shared/deck/geometry';

const DEG = Math.PI / 180;

export interface PlanFrame {
  /** Girder offsets from girder 1, m. */
  offsets: number[];
  deckLeft: number;
  deckRight: number;
  curbLeft: number;
  curbRight: number;
  /** Centre of the girder group, m (y). */
  yc: number;
  /** Support line j: x = A[j] + B[j]·y. */
  A: number[];
  B: number[];
  /** x range of the deck over its width (for the camera), m. */
  xMin: number;
  xMax: number;
  /** Middle of the deck in plan, m. */
  xc: number;
}

export function planFrame(deck: Deck): PlanFrame {
  const g = deckGeometry(deck);
  const yc = g.offsets[g.offsets.length - 1] / 2;
  const B = deck.supports.map((s) => Math.tan(s.skew * DEG));
  const A: number[] = [];
  let run = 0;
  for (let j = 0; j < B.length; j++) {
    A.push(run - yc * (B[j] - B[0]));
    if (j < deck.spans.length) run += deck.spans[j].length;
  }
  const last = B.length - 1;
  const xs = [g.deckLeft, g.deckRight].flatMap((y) => [A[0] + B[0] * y, A[last] + B[last] * y]);
  const xMin = Math.min(...xs);
  const xMax = Math.max(...xs);
  return {
    offsets: g.offsets,
    deckLeft: g.deckLeft,
    deckRight: g.deckRight,
    curbLeft: g.curbLeft,
    curbRight: g.curbRight,
    yc,
    A,
    B,
    xMin,
    xMax,
    xc: (A[0] + B[0] * yc + A[last] + B[last] * yc) / 2,
  };
}

/** x of support line j at y, m. */
export function supportLineX(frame: PlanFrame, j: number, y: number): number {
  return frame.A[j] + frame.B[j] * y;
}

/** World position of plan point (x, y) at elevation h. */
export function toWorld(frame: PlanFrame, x: number, y: number, h = 0): [number, number, number] {
  return [x - frame.xc, h, y - frame.yc];
}

/** Plan point of a world position (inverse of toWorld, elevation dropped). */
export function toPlan(frame: PlanFrame, world: { x: number; z: number }): { x: number; y: number } {
  return { x: world.x + frame.xc, y: world.z + frame.yc };
}

/** Cross-section dimensions used for drawing, m (the structure's, or plain defaults for drawing only). */
export interface SectionDrawing {
  /** Girder depth below the slab soffit, m. */
  depth: number;
  /** Drawn flange width, m. */
  flangeWidth: number;
  /** Drawn web thickness, m. */
  webThickness: number;
  /** Shape drawn for each girder. */
  shape: 'i-beam' | 'box' | 'web';
  slabThickness: number;
  haunch: number;
}

/**
 * Drawing dimensions. The girder depth is the section's d when entered; otherwise it is
 * estimated for drawing only from I and A (depth ≈ 2·√(3·I/A), the depth of a rectangle
 * with the same radius of gyration), else 1/20 of the longest span.
 */
export function sectionDrawing(deck: Deck): SectionDrawing {
  const s = deck.section;
  const longest = Math.max(...deck.spans.map((sp) => sp.length));
  let depth = s.depth;
  if (depth === undefined && s.inertia !== undefined && s.area !== undefined) depth = 2 * Math.sqrt((3 * s.inertia) / s.area);
  if (depth === undefined || !Number.isFinite(depth) || depth <= 0) depth = longest / 20;
  const boxy = ['b', 'c', 'f', 'g'].includes(deck.sectionType);
  const spacing = (() => {
    const g = deckGeometry(deck);
    return g.spacings.length ? Math.min(...g.spacings) : 2;
  })();
  const flange = s.width ?? (boxy ? Math.min(spacing * 0.9, 1.2) : Math.min(spacing * 0.45, Math.max(0.3, depth * 0.5)));
  return {
    depth,
    flangeWidth: flange,
    webThickness: Math.max(0.02, Math.min(0.2, depth * 0.06)),
    shape: boxy ? 'box' : deck.sectionType === 'd' || deck.sectionType === 'e' ? 'web' : 'i-beam',
    slabThickness: deck.slab.thickness,
    haunch: deck.slab.haunch,
  };
}

/**
 * Outline of one girder in its own cross-section plane, m: z across (0 at the girder's
 * centreline, positive to the right), h up (0 at the top of the girder, −depth at its
 * bottom). Drawing only: an I-beam with flanges of about 6 % of the depth, a solid box, or a
 * single web for cast-in-place multicell boxes and tee beams.
 */
export function girderOutline(s: SectionDrawing): [number, number][] {
  const d = s.depth;
  const b = s.flangeWidth;
  if (s.shape === 'box') return [[-b / 2, 0], [b / 2, 0], [b / 2, -d], [-b / 2, -d]];
  if (s.shape === 'web') {
    const tw = Math.max(s.webThickness * 2.5, Math.min(b, 0.35));
    return [[-tw / 2, 0], [tw / 2, 0], [tw / 2, -d], [-tw / 2, -d]];
  }
  const tf = Math.max(0.025, Math.min(0.12, d * 0.06));
  const tw = s.webThickness;
  const bb = b * 1.05;
  return [
    [-b / 2, 0],
    [b / 2, 0],
    [b / 2, -tf],
    [tw / 2, -tf],
    [tw / 2, -d + tf],
    [bb / 2, -d + tf],
    [bb / 2, -d],
    [-bb / 2, -d],
    [-bb / 2, -d + tf],
    [-tw / 2, -d + tf],
    [-tw / 2, -tf],
    [-b / 2, -tf],
  ];
}

/** One loaded lane as drawn. */
export interface LaneDrawing {
  index: number;
  /** Lane edges, m (y). */
  left: number;
  right: number;
  /** Wheel lines, m (y). */
  wheels: [number, number];
  /** Axle stations, m (x), front first. */
  axles: number[];
  /** Axle weights, N, front first (drawn as marker size). */
  weights: number[];
}

export interface VehicleDrawing {
  /** Axle positions behind the front axle, m, front first (variable spacing already set). */
  positions: number[];
  weights: number[];
  gauge: number;
}

/**
 * Lanes, wheel lines and axles in plan. `frontAxleAt` and `direction` place each lane's
 * vehicle along the girders (direction +1: front axle at the largest x).
 */
export function laneDrawings(
  lanes: readonly { left: number; wheelOffset: number; frontAxleAt?: number; direction?: 1 | -1 }[],
  laneWidth: number,
  vehicle: VehicleDrawing,
  defaultFrontAxleAt: number,
): LaneDrawing[] {
  return lanes.map((lane, index) => {
    const front = lane.frontAxleAt ?? defaultFrontAxleAt;
    const dir = lane.direction ?? 1;
    const wl = lane.left + lane.wheelOffset;
    return {
      index,
      left: lane.left,
      right: lane.left + laneWidth,
      wheels: [wl, wl + vehicle.gauge],
      axles: vehicle.positions.map((p) => front - dir * p),
      weights: vehicle.weights,
    };
  });
}

/** Plan outline of the slab (deck edges between the first and last support lines), m. */
export function slabOutline(frame: PlanFrame): [number, number][] {
  const last = frame.A.length - 1;
  const L = frame.deckLeft;
  const R = frame.deckRight;
  return [
    [supportLineX(frame, 0, L), L],
    [supportLineX(frame, last, L), L],
    [supportLineX(frame, last, R), R],
    [supportLineX(frame, 0, R), R],
  ];
}

/** Girder g's plan extent between the first and last support lines, m. */
export function girderExtent(frame: PlanFrame, g: number): { x0: number; x1: number; y: number } {
  const y = frame.offsets[g];
  return { x0: supportLineX(frame, 0, y), x1: supportLineX(frame, frame.A.length - 1, y), y };
}

/** Height of the girder labels drawn beside support line 0, m (world). */
export function girderLabelHeight(frame: PlanFrame): number {
  return Math.max(0.45, Math.min(1.2, (frame.deckRight - frame.deckLeft) / 28));
}

/**
 * World points that bound what the view draws, for framing the camera: the slab's plan
 * corners (between the first and last support lines) from below the support caps
 * (`bottom`, m) to above the barriers and wheels (`top`, m), and the girder labels beside
 * support line 0. World coordinates as `toWorld` (X along, Y up, Z across), m.
 */
export function deckBoundingPoints(frame: PlanFrame, bottom: number, top: number): [number, number, number][] {
  const points: [number, number, number][] = [];
  for (const [x, y] of slabOutline(frame)) for (const h of [bottom, top]) points.push(toWorld(frame, x, y, h));
  const label = girderLabelHeight(frame);
  for (const y of frame.offsets) {
    // label centre at 1.6 label heights before support line 0; "G12" is about 1.6 heights wide
    const x = supportLineX(frame, 0, y) - label * 2.5;
    points.push(toWorld(frame, x, y, top));
  }
  return points;
}
