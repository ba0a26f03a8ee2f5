/**
 * Framing the deck view's camera: every bounding point of the deck projects inside the view
 * and the outermost one reaches 90 % of the half-view (so the deck fills the view), for long
 * decks and short wide ones, wide and narrow views, the 3D and the plan view. Pinhole
 * projection of a perspective camera, hand derivation; the 90 % fill is common practice, no
 * source. Projections are recomputed here with three.js's own camera, not with the module's
 * arithmetic, so that a mistake in the module's projection cannot hide itself.
 */
import { describe, expect, it } from 'vitest';
import { PerspectiveCamera, Vector3 } from 'three';
import { assertDeck, type Deck } from '@shared/deck/schema';
import { deckTemplate } from '@/components/deck/deckTemplates';
import { deckBoundingPoints, planFrame } from '@/components/scene/sceneModel';
import { VIEW_CAMERAS, frameDeckView, frameView, type FramedView, type Vec3 } from '@/components/scene/cameraFraming';

function shortWideDeck(): Deck {
  const d = deckTemplate('steel-wide-twelve').build() as Deck;
  // one 8 m span under a 12-girder, 30 m wide deck: wider than long
  return assertDeck({ ...d, spans: [{ length: 8 }], supports: [{ skew: 0 }, { skew: 0 }], girders: { kind: 'uniform', count: 12, spacing: 2.6 } });
}

const DECKS: [string, Deck][] = [
  ['precast, one 110 ft span, 20° skew', assertDeck(deckTemplate('precast-one-span').build())],
  ['steel, three spans 120–150–120 ft', assertDeck(deckTemplate('steel-three-span').build())],
  ['twelve girders, 100 ft span', assertDeck(deckTemplate('steel-wide-twelve').build())],
  ['short and wide: 8 m span, 30 m wide', shortWideDeck()],
];

/** Normalised view coordinates of each point through a three.js camera placed as framed. */
function projectWithThree(points: readonly Vec3[], view: FramedView, aspect: number): { x: number; y: number }[] {
  const f = frameDeckView(points, view, aspect);
  if (!f) throw new Error('no framing');
  const cam = new PerspectiveCamera(VIEW_CAMERAS[view].fovDeg, aspect, f.near, f.far);
  cam.position.set(...f.position);
  cam.up.set(0, 1, 0);
  cam.lookAt(new Vector3(...f.target));
  cam.updateMatrixWorld();
  cam.updateProjectionMatrix();
  return points.map((p) => {
    const v = new Vector3(...p).project(cam);
    expect(v.z).toBeGreaterThan(-1); // in front of the near plane
    expect(v.z).toBeLessThan(1); // before the far plane
    return { x: v.x, y: v.y };
  });
}

describe('framing the deck in the view', () => {
  for (const [name, deck] of DECKS) {
    const frame = planFrame(deck);
    const points = deckBoundingPoints(frame, -2.5, 1.5);
    for (const view of ['3d', 'plan'] as const) {
      for (const aspect of [2.44, 1.3]) {
        it(`${name}: ${view} view at aspect ${aspect} holds every point and fills 90 %`, () => {
          const ndc = projectWithThree(points, view, aspect);
          const reach = Math.max(...ndc.map((p) => Math.max(Math.abs(p.x), Math.abs(p.y))));
          for (const p of ndc) {
            expect(Math.abs(p.x)).toBeLessThanOrEqual(0.9 + 1e-6);
            expect(Math.abs(p.y)).toBeLessThanOrEqual(0.9 + 1e-6);
          }
          // the outermost point is within 10 % of the border: the deck fills the view
          expect(reach).toBeGreaterThan(0.9 - 1e-3);
          // and the drawing is centred: it reaches 90 % on both sides of its tighter direction
          const xs = ndc.map((p) => p.x);
          const ys = ndc.map((p) => p.y);
          const tight = Math.max(...xs) - Math.min(...xs) > Math.max(...ys) - Math.min(...ys) ? xs : ys;
          expect(Math.min(...tight)).toBeLessThan(-0.85);
          expect(Math.max(...tight)).toBeGreaterThan(0.85);
        });
      }
    }
  }

  it('puts a cube seen face-on exactly at 90 % of the half-height (closed form)', () => {
    // A 2 m cube centred at the origin, seen along +Z at fov 90°: its front face (z = 1) is the
    // outermost, at depth D − 1; 1 / ((D − 1)·tan 45°) = 0.9 gives D = 1 + 1/0.9.
    const cube: Vec3[] = [];
    for (const x of [-1, 1]) for (const y of [-1, 1]) for (const z of [-1, 1]) cube.push([x, y, z]);
    const f = frameView({ points: cube, direction: [0, 0, 1], fovDeg: 90, aspect: 1, fill: 0.9 });
    expect(f?.distance).toBeRelativelyClose(1 + 1 / 0.9, 1e-9);
    expect(f?.target[0]).toBeCloseTo(0, 12);
    expect(f?.target[1]).toBeCloseTo(0, 12);
  });

  it('refuses what cannot be framed instead of returning a camera at NaN', () => {
    expect(frameView({ points: [], direction: [0, 1, 0], fovDeg: 35, aspect: 2 })).toBeNull();
    expect(frameView({ points: [[0, 0, 0]], direction: [0, 0, 0], fovDeg: 35, aspect: 2 })).toBeNull();
    expect(frameView({ points: [[Number.NaN, 0, 0]], direction: [0, 1, 1], fovDeg: 35, aspect: 2 })).toBeNull();
    expect(frameView({ points: [[0, 0, 0]], direction: [0, 1, 1], fovDeg: 35, aspect: 0 })).toBeNull();
    // straight down with the world's up along the view: no right-hand direction
    expect(frameView({ points: [[0, 0, 0], [1, 1, 1]], direction: [0, 1, 0], fovDeg: 35, aspect: 2 })).toBeNull();
  });
});
