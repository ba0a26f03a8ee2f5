/**
 * three.js objects of the deck view, built from the plain drawing data of sceneModel.ts:
 * the fixed structure (slab, girders, barriers, support lines, girder labels) and the loaded
 * lanes (translucent strips, wheel lines, axle markers). Lanes are moved in place while
 * dragging; the structure is rebuilt only when the deck changes.
 *
 * Visual language: a pale concrete slab over blue-grey steel or warm stone precast girders,
 * plum support lines, lanes as translucent strips in calm, well separated hues, dark wheel
 * markers sized by axle weight; the girder under study in amber.
 */
import {
  BoxGeometry,
  BufferGeometry,
  CanvasTexture,
  Color,
  CylinderGeometry,
  DoubleSide,
  ExtrudeGeometry,
  Float32BufferAttribute,
  Group,
  Line,
  LineBasicMaterial,
  LineDashedMaterial,
  LineSegments,
  Mesh,
  MeshBasicMaterial,
  MeshLambertMaterial,
  Shape,
  ShapeGeometry,
  Sprite,
  SpriteMaterial,
  type Material,
  type Object3D,
} from 'three';
import type { Deck } from '@shared/deck/schema';
import {
  girderExtent,
  girderLabelHeight,
  girderOutline,
  sectionDrawing,
  slabOutline,
  supportLineX,
  toWorld,
  type LaneDrawing,
  type PlanFrame,
  type SectionDrawing,
} from './sceneModel';
import { SCENE_COLOURS, laneColour } from './sceneColours';

export { SCENE_COLOURS, laneColour };

/** Elevations of the drawing, m (0 = top of the girders). */
export function elevations(section: SectionDrawing) {
  const slabBottom = section.haunch;
  const slabTop = section.haunch + section.slabThickness;
  return { girderBottom: -section.depth, slabBottom, slabTop, laneTop: slabTop + 0.012 };
}

function disposeTree(root: Object3D): void {
  root.traverse((o) => {
    const mesh = o as Mesh;
    if (mesh.geometry) mesh.geometry.dispose();
    const m = (mesh as { material?: Material | Material[] }).material;
    if (Array.isArray(m)) m.forEach((x) => x.dispose());
    else if (m) {
      const map = (m as MeshBasicMaterial).map;
      if (map) map.dispose();
      m.dispose();
    }
  });
}

export function disposeObject(root: Object3D | null | undefined): void {
  if (root) disposeTree(root);
}

/** A text label as a sprite that always faces the camera; `height` in m. */
function textSprite(text: string, height: number, colour: string = SCENE_COLOURS.label): Sprite {
  const pad = 8;
  const fontPx = 44;
  const canvas = document.createElement('canvas');
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('the browser gave no 2D canvas for labels');
  ctx.font = `600 ${fontPx}px "Open Sans", system-ui, sans-serif`;
  const w = Math.ceil(ctx.measureText(text).width) + 2 * pad;
  canvas.width = w;
  canvas.height = fontPx + 2 * pad;
  ctx.font = `600 ${fontPx}px "Open Sans", system-ui, sans-serif`;
  ctx.fillStyle = 'rgba(255,255,255,0.82)';
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  ctx.fillStyle = colour;
  ctx.textBaseline = 'middle';
  ctx.fillText(text, pad, canvas.height / 2 + 2);
  const texture = new CanvasTexture(canvas);
  const sprite = new Sprite(new SpriteMaterial({ map: texture, depthTest: false, transparent: true }));
  sprite.scale.set((height * canvas.width) / canvas.height, height, 1);
  sprite.renderOrder = 10;
  return sprite;
}

/** Cross-section shape of one girder in its own (z, y) plane: z across, y up (top at 0). */
function girderShape(s: SectionDrawing): Shape {
  const shape = new Shape();
  girderOutline(s).forEach(([z, h], i) => (i === 0 ? shape.moveTo(z, h) : shape.lineTo(z, h)));
  shape.closePath();
  return shape;
}

/** A flat plan polygon at elevation h (world), as a mesh. */
function planPolygon(frame: PlanFrame, pts: [number, number][], h: number, material: Material): Mesh {
  const shape = new Shape();
  // Shape lies in (X, −Z) so that rotating −90° about X puts it in the world's X–Z plane.
  pts.forEach(([x, y], i) => {
    const [wx, , wz] = toWorld(frame, x, y);
    if (i === 0) shape.moveTo(wx, -wz);
    else shape.lineTo(wx, -wz);
  });
  shape.closePath();
  const mesh = new Mesh(new ShapeGeometry(shape), material);
  mesh.rotation.x = -Math.PI / 2;
  mesh.position.y = h;
  return mesh;
}

/** A prism of plan outline `pts` between elevations h0 and h1 (world). */
function planPrism(frame: PlanFrame, pts: [number, number][], h0: number, h1: number, material: Material): Mesh {
  const shape = new Shape();
  pts.forEach(([x, y], i) => {
    const [wx, , wz] = toWorld(frame, x, y);
    if (i === 0) shape.moveTo(wx, -wz);
    else shape.lineTo(wx, -wz);
  });
  shape.closePath();
  const geometry = new ExtrudeGeometry(shape, { depth: h1 - h0, bevelEnabled: false });
  const mesh = new Mesh(geometry, material);
  mesh.rotation.x = -Math.PI / 2;
  mesh.position.y = h0;
  return mesh;
}

export interface StructureObjects {
  group: Group;
  /** Girder meshes by index (for the highlight). */
  girders: Mesh[];
  /** Girder centrelines drawn on the roadway, by index. */
  lines: Line[];
  /** The top of the slab as a flat mesh, for ray casts. */
  deckTop: Mesh;
  section: SectionDrawing;
  elevation: ReturnType<typeof elevations>;
}

/** The fixed structure of a deck. */
export function buildStructure(deck: Deck, frame: PlanFrame): StructureObjects {
  const section = sectionDrawing(deck);
  const el = elevations(section);
  const group = new Group();
  group.name = 'deck-structure';
  const girderMaterial = new MeshLambertMaterial({ color: ['a', 'b', 'c'].includes(deck.sectionType) ? SCENE_COLOURS.steel : SCENE_COLOURS.precast });

  // Slab: the deck plan between the first and last support lines, ts thick.
  const outline = slabOutline(frame);
  const slab = planPrism(frame, outline, el.slabBottom, el.slabTop, new MeshLambertMaterial({ color: SCENE_COLOURS.slab, transparent: true, opacity: 0.82 }));
  slab.name = 'slab';
  group.add(slab);

  // Roadway surface between the curb faces, a shade darker, just above the slab.
  const last = frame.A.length - 1;
  const roadway = planPolygon(
    frame,
    [
      [supportLineX(frame, 0, frame.curbLeft), frame.curbLeft],
      [supportLineX(frame, last, frame.curbLeft), frame.curbLeft],
      [supportLineX(frame, last, frame.curbRight), frame.curbRight],
      [supportLineX(frame, 0, frame.curbRight), frame.curbRight],
    ],
    el.slabTop + 0.004,
    new MeshLambertMaterial({ color: SCENE_COLOURS.roadway, side: DoubleSide }),
  );
  roadway.name = 'deck-top';
  group.add(roadway);

  // Girders: the section shape extruded along x between the first and last support lines.
  const girders: Mesh[] = [];
  const lines: Line[] = [];
  const shape = girderShape(section);
  const labelHeight = girderLabelHeight(frame);
  frame.offsets.forEach((_, g) => {
    const { x0, x1, y } = girderExtent(frame, g);
    const geometry = new ExtrudeGeometry(shape, { depth: x1 - x0, bevelEnabled: false });
    const mesh = new Mesh(geometry, girderMaterial.clone());
    // Extrusion runs along local +z; turn it to run along world +X, shape z → world Z.
    mesh.rotation.y = Math.PI / 2;
    const [wx, , wz] = toWorld(frame, x0, y);
    mesh.position.set(wx, 0, wz);
    mesh.name = `girder-${g + 1}`;
    group.add(mesh);
    girders.push(mesh);

    // Centreline drawn on the roadway so girders read in plan.
    const a = toWorld(frame, x0, y, el.slabTop + 0.02);
    const b = toWorld(frame, x1, y, el.slabTop + 0.02);
    const lineGeometry = new BufferGeometry();
    lineGeometry.setAttribute('position', new Float32BufferAttribute([...a, ...b], 3));
    const line = new Line(lineGeometry, new LineDashedMaterial({ color: SCENE_COLOURS.girderLine, dashSize: 1.2, gapSize: 0.8, transparent: true, opacity: 0.7 }));
    line.computeLineDistances();
    line.name = `girder-line-${g + 1}`;
    group.add(line);
    lines.push(line);

    const label = textSprite(`G${g + 1}`, labelHeight);
    const [lx, , lz] = toWorld(frame, x0 - labelHeight * 1.6, y);
    label.position.set(lx, el.slabTop + labelHeight * 0.6, lz);
    label.name = `girder-label-${g + 1}`;
    group.add(label);
  });

  // Barriers along the deck edges, from the edge to the inside face.
  const barrierMaterial = new MeshLambertMaterial({ color: SCENE_COLOURS.barrier });
  const sides: [number, number, number][] = [
    [frame.deckLeft, frame.curbLeft, deck.barrierLeft.height],
    [frame.curbRight, frame.deckRight, deck.barrierRight.height],
  ];
  for (const [ya, yb, height] of sides) {
    if (!(yb - ya > 1e-6) || !(height > 0)) continue;
    const pts: [number, number][] = [
      [supportLineX(frame, 0, ya), ya],
      [supportLineX(frame, last, ya), ya],
      [supportLineX(frame, last, yb), yb],
      [supportLineX(frame, 0, yb), yb],
    ];
    const barrier = planPrism(frame, pts, el.slabTop, el.slabTop + height, barrierMaterial);
    barrier.name = 'barrier';
    group.add(barrier);
  }

  // Support lines: a thin bar under the girders along each (skewed) line, bearings as blocks.
  const supportMaterial = new MeshLambertMaterial({ color: SCENE_COLOURS.support });
  const bearingGeometry = new BoxGeometry(0.5, 0.18, 0.6);
  for (let j = 0; j <= last; j++) {
    const ya = frame.deckLeft;
    const yb = frame.deckRight;
    const half = 0.25;
    const pts: [number, number][] = [
      [supportLineX(frame, j, ya) - half, ya],
      [supportLineX(frame, j, yb) - half, yb],
      [supportLineX(frame, j, yb) + half, yb],
      [supportLineX(frame, j, ya) + half, ya],
    ];
    const cap = planPrism(frame, pts, el.girderBottom - 0.5, el.girderBottom - 0.18, supportMaterial);
    cap.name = `support-${j}`;
    group.add(cap);
    for (const y of frame.offsets) {
      const bearing = new Mesh(bearingGeometry, supportMaterial);
      const [bx, , bz] = toWorld(frame, supportLineX(frame, j, y), y, 0);
      bearing.position.set(bx, el.girderBottom - 0.09, bz);
      group.add(bearing);
    }
    // The support line also drawn on the roadway, so its skew reads in plan.
    const a = toWorld(frame, supportLineX(frame, j, ya), ya, el.slabTop + 0.03);
    const b = toWorld(frame, supportLineX(frame, j, yb), yb, el.slabTop + 0.03);
    const g = new BufferGeometry();
    g.setAttribute('position', new Float32BufferAttribute([...a, ...b], 3));
    const line = new LineSegments(g, new LineBasicMaterial({ color: SCENE_COLOURS.support }));
    line.name = `support-line-${j}`;
    group.add(line);
  }

  return { group, girders, lines, deckTop: roadway, section, elevation: el };
}

/** Paints girder `studied` in the highlight colour and the others in their own. */
export function highlightGirder(structure: StructureObjects, studied: number, deck: Deck): void {
  const base = new Color(['a', 'b', 'c'].includes(deck.sectionType) ? SCENE_COLOURS.steel : SCENE_COLOURS.precast);
  const hot = new Color(SCENE_COLOURS.studied);
  structure.girders.forEach((mesh, g) => {
    const m = mesh.material as MeshLambertMaterial;
    m.color.copy(g === studied ? hot : base);
    m.emissive.set(g === studied ? '#5a3000' : '#000000');
    const line = structure.lines[g];
    if (line) {
      const lm = line.material as LineDashedMaterial;
      lm.color.set(g === studied ? SCENE_COLOURS.studied : SCENE_COLOURS.girderLine);
      lm.opacity = g === studied ? 1 : 0.7;
      lm.dashSize = g === studied ? 3 : 1.2;
      lm.gapSize = g === studied ? 0.4 : 0.8;
    }
  });
}

export interface LaneObjects {
  group: Group;
  /** Per lane: the strip (drag the lane) and the wheel group (drag the wheels). */
  strips: Mesh[];
  wheelGroups: Group[];
  /** Per lane: the strip's edge lines and the two wheel lines (positions updated in place). */
  edges: LineSegments[];
  wheelLines: LineSegments[];
}

/** A flat quad between the first and last support lines over [ya, yb], world coordinates at h. */
function stripVertices(frame: PlanFrame, ya: number, yb: number, h: number, out: Float32Array): void {
  const last = frame.A.length - 1;
  const corners: [number, number][] = [
    [supportLineX(frame, 0, ya), ya],
    [supportLineX(frame, last, ya), ya],
    [supportLineX(frame, last, yb), yb],
    [supportLineX(frame, 0, yb), yb],
  ];
  corners.forEach(([x, y], i) => {
    const [wx, wy, wz] = toWorld(frame, x, y, h);
    out[i * 3] = wx;
    out[i * 3 + 1] = wy;
    out[i * 3 + 2] = wz;
  });
}

/** Two lines along the deck at y1 and y2, between the first and last support lines, at h. */
function pairOfLines(frame: PlanFrame, y1: number, y2: number, h: number, out: Float32Array): void {
  const last = frame.A.length - 1;
  let k = 0;
  for (const y of [y1, y2]) {
    for (const j of [0, last]) {
      const [wx, wy, wz] = toWorld(frame, supportLineX(frame, j, y), y, h);
      out[k++] = wx;
      out[k++] = wy;
      out[k++] = wz;
    }
  }
}

/**
 * Lane strips (clipped to the deck between its first and last support lines), wheel lines and
 * axle markers of the loaded lanes.
 */
export function buildLanes(frame: PlanFrame, lanes: LaneDrawing[], laneTop: number, selected: number): LaneObjects {
  const group = new Group();
  group.name = 'lanes';
  const objects: LaneObjects = { group, strips: [], wheelGroups: [], edges: [], wheelLines: [] };
  for (const lane of lanes) {
    const colour = laneColour(lane.index);
    const stripGeometry = new BufferGeometry();
    stripGeometry.setAttribute('position', new Float32BufferAttribute(new Float32Array(12), 3));
    stripGeometry.setIndex([0, 2, 1, 0, 3, 2]);
    const strip = new Mesh(
      stripGeometry,
      new MeshBasicMaterial({ color: colour, transparent: true, opacity: lane.index === selected ? 0.42 : 0.26, depthWrite: false, side: DoubleSide }),
    );
    strip.name = `lane-${lane.index + 1}`;
    strip.userData = { kind: 'lane', lane: lane.index };
    strip.renderOrder = 2;
    group.add(strip);
    objects.strips.push(strip);

    const edgeGeometry = new BufferGeometry();
    edgeGeometry.setAttribute('position', new Float32BufferAttribute(new Float32Array(12), 3));
    const edges = new LineSegments(edgeGeometry, new LineBasicMaterial({ color: colour }));
    edges.name = `lane-edges-${lane.index + 1}`;
    group.add(edges);
    objects.edges.push(edges);

    const lineGeometry = new BufferGeometry();
    lineGeometry.setAttribute('position', new Float32BufferAttribute(new Float32Array(12), 3));
    const wheelLines = new LineSegments(lineGeometry, new LineDashedMaterial({ color: SCENE_COLOURS.wheel, dashSize: 0.9, gapSize: 0.6 }));
    wheelLines.name = `wheel-lines-${lane.index + 1}`;
    group.add(wheelLines);
    objects.wheelLines.push(wheelLines);

    const wheels = new Group();
    wheels.name = `wheels-${lane.index + 1}`;
    wheels.userData = { kind: 'wheels', lane: lane.index };
    const maxWeight = Math.max(...lane.weights);
    const wheelMaterial = new MeshLambertMaterial({ color: SCENE_COLOURS.wheel });
    const axleMaterial = new MeshLambertMaterial({ color: SCENE_COLOURS.axle });
    const gauge = lane.wheels[1] - lane.wheels[0];
    lane.axles.forEach((_, a) => {
      const size = 0.55 + 0.35 * (lane.weights[a] / maxWeight);
      for (const side of [0, 1]) {
        const wheel = new Mesh(new CylinderGeometry(size / 2, size / 2, 0.42, 20), wheelMaterial);
        wheel.rotation.x = Math.PI / 2;
        wheel.position.set(0, size / 2, side * gauge);
        wheel.userData = { kind: 'wheels', lane: lane.index, axle: a };
        wheel.name = `wheel-${lane.index + 1}-${a + 1}-${side + 1}`;
        wheels.add(wheel);
      }
      const bar = new Mesh(new BoxGeometry(0.12, 0.12, gauge), axleMaterial);
      bar.position.set(0, size / 2, gauge / 2);
      bar.userData = { kind: 'wheels', lane: lane.index, axle: a };
      wheels.add(bar);
    });
    group.add(wheels);
    objects.wheelGroups.push(wheels);
  }
  placeLanes(objects, frame, lanes, laneTop, selected);
  return objects;
}

/** Moves the lane objects to the lanes' current positions (no new objects). */
export function placeLanes(objects: LaneObjects, frame: PlanFrame, lanes: LaneDrawing[], laneTop: number, selected: number): void {
  lanes.forEach((lane, i) => {
    const strip = objects.strips[i];
    const wheels = objects.wheelGroups[i];
    if (!strip || !wheels) return;
    const position = strip.geometry.getAttribute('position') as Float32BufferAttribute;
    stripVertices(frame, lane.left, lane.right, laneTop, position.array as Float32Array);
    position.needsUpdate = true;
    strip.geometry.computeBoundingSphere();
    strip.geometry.computeBoundingBox();
    (strip.material as MeshBasicMaterial).opacity = i === selected ? 0.42 : 0.26;

    const edges = objects.edges[i];
    const ep = edges.geometry.getAttribute('position') as Float32BufferAttribute;
    pairOfLines(frame, lane.left, lane.right, laneTop + 0.01, ep.array as Float32Array);
    ep.needsUpdate = true;
    edges.geometry.computeBoundingSphere();

    const lines = objects.wheelLines[i];
    const lp = lines.geometry.getAttribute('position') as Float32BufferAttribute;
    pairOfLines(frame, lane.wheels[0], lane.wheels[1], laneTop + 0.02, lp.array as Float32Array);
    lp.needsUpdate = true;
    lines.geometry.computeBoundingSphere();
    lines.computeLineDistances();

    const [, , wz] = toWorld(frame, 0, lane.wheels[0]);
    wheels.position.set(0, laneTop, wz);
    for (const child of wheels.children) {
      const axle = child.userData.axle as number | undefined;
      if (axle === undefined) continue;
      const [ax] = toWorld(frame, lane.axles[axle], 0);
      child.position.x = ax;
    }
  });
}
