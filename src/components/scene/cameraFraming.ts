/**
 * Framing a perspective camera on a set of points (the deck's bounding points), as plain
 * vector arithmetic so that it can be checked without a browser.
 *
 * Units: world units of the deck view (metres); angles in degrees. The camera looks along
 * −`direction` (direction points from the target toward the camera); `fovDeg` is the vertical
 * field of view, `aspect` = view width / view height, as three.js's PerspectiveCamera.
 * Normalised view coordinates (as three.js's NDC): x right, y up, −1…1 across the view.
 *
 * The target is moved so that the points' projection is centred in the view, then the camera
 * distance is the least that keeps every point within `fill` of the half-view (0.9: the
 * farthest point lies 5 % of the view's width or height from its border, never beyond it).
 */

export type Vec3 = readonly [number, number, number];

export interface FramingRequest {
  /** World points that must be in view (corners of the deck's bounding box). */
  points: readonly Vec3[];
  /** From the target toward the camera (any length but zero). */
  direction: Vec3;
  /** The world's up direction (the camera's up), not parallel to `direction`. */
  worldUp?: Vec3;
  /** Vertical field of view, degrees. */
  fovDeg: number;
  /** View width / view height. */
  aspect: number;
  /** Fraction of the half-view the outermost point reaches, 0 < fill ≤ 1 (0.9 by default). */
  fill?: number;
}

export interface Framing {
  target: Vec3;
  position: Vec3;
  /** Distance from the camera to the target, m. */
  distance: number;
  /** Clip planes that hold every point, with room to zoom in and out, m. */
  near: number;
  far: number;
}

interface Basis {
  /** Unit vector from the target toward the camera. */
  back: Vec3;
  right: Vec3;
  up: Vec3;
}

const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const scale = (a: Vec3, k: number): Vec3 => [a[0] * k, a[1] * k, a[2] * k];
const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: Vec3): Vec3 => scale(a, 1 / Math.hypot(a[0], a[1], a[2]));

/** The camera's axes for a view along −direction with the world's up (three.js's lookAt). */
export function viewBasis(direction: Vec3, worldUp: Vec3 = [0, 1, 0]): Basis {
  const back = unit(direction);
  const right = unit(cross(worldUp, back));
  const up = cross(back, right);
  return { back, right, up };
}

/** Half-view tangents: vertical from the field of view, horizontal from it and the aspect. */
function halfTangents(fovDeg: number, aspect: number): { tanV: number; tanH: number } {
  const tanV = Math.tan((fovDeg * Math.PI) / 360);
  return { tanV, tanH: tanV * aspect };
}

/** Least distance from `target` that keeps every point within `fill` of the half-view. */
function distanceToHold(points: readonly Vec3[], target: Vec3, b: Basis, tanV: number, tanH: number, fill: number): number {
  let distance = 0;
  for (const p of points) {
    const q = sub(p, target);
    const along = dot(q, b.back);
    const needed = Math.max(Math.abs(dot(q, b.right)) / (fill * tanH), Math.abs(dot(q, b.up)) / (fill * tanV));
    distance = Math.max(distance, needed + along);
  }
  return distance;
}

/** Normalised view coordinates of `p` for a camera at `position` with basis `b`. */
export function projectPoint(p: Vec3, position: Vec3, b: Basis, fovDeg: number, aspect: number): { x: number; y: number; depth: number } {
  const { tanV, tanH } = halfTangents(fovDeg, aspect);
  const q = sub(p, position);
  const depth = -dot(q, b.back);
  return { x: dot(q, b.right) / (depth * tanH), y: dot(q, b.up) / (depth * tanV), depth };
}

/** Moves the target so that the projected points are centred (one step; repeated, it settles). */
function centreStep(points: readonly Vec3[], target: Vec3, distance: number, b: Basis, fovDeg: number, aspect: number): Vec3 {
  const position = add(target, scale(b.back, distance));
  let minX = Infinity;
  let maxX = -Infinity;
  let minY = Infinity;
  let maxY = -Infinity;
  for (const p of points) {
    const v = projectPoint(p, position, b, fovDeg, aspect);
    if (!(v.depth > 1e-9)) continue;
    minX = Math.min(minX, v.x);
    maxX = Math.max(maxX, v.x);
    minY = Math.min(minY, v.y);
    maxY = Math.max(maxY, v.y);
  }
  if (!Number.isFinite(minX) || !Number.isFinite(minY)) return target;
  const { tanV, tanH } = halfTangents(fovDeg, aspect);
  const shiftRight = ((minX + maxX) / 2) * distance * tanH;
  const shiftUp = ((minY + maxY) / 2) * distance * tanV;
  return add(target, add(scale(b.right, shiftRight), scale(b.up, shiftUp)));
}

function centroid(points: readonly Vec3[]): Vec3 {
  const s = points.reduce<Vec3>((acc, p) => add(acc, p), [0, 0, 0]);
  return scale(s, 1 / points.length);
}

/**
 * Clip planes around the points' depths from the camera, with room for the user to zoom: in
 * to a hundredth of the nearest point's depth, out to ten times the farthest.
 */
function clipPlanes(points: readonly Vec3[], position: Vec3, b: Basis): { near: number; far: number } {
  let nearest = Infinity;
  let farthest = 0;
  for (const p of points) {
    const depth = -dot(sub(p, position), b.back);
    nearest = Math.min(nearest, depth);
    farthest = Math.max(farthest, depth);
  }
  return { near: Math.max(0.05, nearest / 100), far: farthest * 10 + 100 };
}

function usable(r: FramingRequest): boolean {
  const finite = (v: Vec3) => v.every(Number.isFinite);
  const upOk = !r.worldUp || finite(r.worldUp);
  return (
    r.points.length > 0 &&
    r.points.every(finite) &&
    finite(r.direction) &&
    Math.hypot(...r.direction) > 0 &&
    upOk &&
    r.fovDeg > 0 &&
    r.fovDeg < 180 &&
    r.aspect > 0 &&
    Number.isFinite(r.aspect)
  );
}

/**
 * The camera that fills the view with `points`: target centred on their projection, distance
 * the least that keeps them all within `fill`. Null when the request cannot be framed
 * (no points, a value that is not finite, a zero direction, an aspect of 0).
 */
export function frameView(r: FramingRequest): Framing | null {
  if (!usable(r)) return null;
  const fill = Math.min(1, Math.max(0.05, r.fill ?? 0.9));
  const b = viewBasis(r.direction, r.worldUp);
  if (!b.right.every(Number.isFinite)) return null;
  const { tanV, tanH } = halfTangents(r.fovDeg, r.aspect);
  let target = centroid(r.points);
  for (let i = 0; i < 6; i++) {
    const d = distanceToHold(r.points, target, b, tanV, tanH, fill);
    target = centreStep(r.points, target, d, b, r.fovDeg, r.aspect);
  }
  const distance = Math.max(distanceToHold(r.points, target, b, tanV, tanH, fill), 1e-3);
  const position = add(target, scale(b.back, distance));
  return { target, position, distance, ...clipPlanes(r.points, position, b) };
}

/** The views the canvas frames, with their fixed camera directions and fields of view. */
export type FramedView = '3d' | 'plan';

/**
 * 3D: from behind the first support and to the right of the deck, so that up-station runs to
 * the right and girder 1 lies on the far side, as in the plan. Plan: from above, with a
 * narrow field of view so that it reads nearly orthographic, girder 1 at the top.
 */
export const VIEW_CAMERAS: Record<FramedView, { direction: Vec3; fovDeg: number }> = {
  '3d': { direction: [-0.42, 0.55, 0.72], fovDeg: 35 },
  plan: { direction: [0, 1, 1e-3], fovDeg: 5 },
};

/** The camera of `view` framing `points` (the deck's bounding points) for a view of `aspect`. */
export function frameDeckView(points: readonly Vec3[], view: FramedView, aspect: number, fill = 0.9): Framing | null {
  const cam = VIEW_CAMERAS[view];
  return frameView({ points, direction: cam.direction, fovDeg: cam.fovDeg, aspect, fill });
}
