/**
 * Small cross-section sketches of the deck types a…k of AASHTO LRFD Table 4.6.2.2.1-1, drawn
 * as simple shapes (in a 160 × 64 box) for the type picker. Each sketch shows a part of a
 * typical section: the slab or overlay and two or three units below it.
 */
import type { SectionType } from '@shared/deck/schema';

export type SketchMaterial = 'slab' | 'steel' | 'precast' | 'castInPlace' | 'void' | 'tendon';

export interface SketchShape {
  material: SketchMaterial;
  /** SVG path data. */
  d: string;
}

const rect = (x: number, y: number, w: number, h: number) => `M${x} ${y}h${w}v${h}h${-w}Z`;
const poly = (pts: [number, number][]) => `M${pts.map(([x, y]) => `${x} ${y}`).join('L')}Z`;

function steelI(cx: number, top: number, depth: number, flange = 18): SketchShape[] {
  const tf = 3;
  return [
    { material: 'steel', d: rect(cx - flange / 2, top, flange, tf) },
    { material: 'steel', d: rect(cx - 1.5, top + tf, 3, depth - 2 * tf) },
    { material: 'steel', d: rect(cx - (flange + 2) / 2, top + depth - tf, flange + 2, tf) },
  ];
}

function bulbTee(cx: number, top: number): SketchShape {
  // Top flange, tapering into a thin web, bulb at the bottom.
  return {
    material: 'precast',
    d: poly([
      [cx - 13, top], [cx + 13, top], [cx + 13, top + 3], [cx + 3, top + 7], [cx + 2.5, top + 26],
      [cx + 8, top + 31], [cx + 8, top + 36], [cx - 8, top + 36], [cx - 8, top + 31], [cx - 2.5, top + 26],
      [cx - 3, top + 7], [cx - 13, top + 3],
    ]),
  };
}

const SLAB: SketchShape = { material: 'slab', d: rect(6, 12, 148, 8) };

export const SECTION_SKETCHES: Record<SectionType, SketchShape[]> = {
  a: [SLAB, ...steelI(32, 20, 34), ...steelI(80, 20, 34), ...steelI(128, 20, 34)],
  b: [
    SLAB,
    { material: 'precast', d: rect(28, 20, 40, 34) },
    { material: 'void', d: rect(33, 25, 30, 24) },
    { material: 'precast', d: rect(92, 20, 40, 34) },
    { material: 'void', d: rect(97, 25, 30, 24) },
  ],
  c: [
    SLAB,
    { material: 'steel', d: poly([[24, 20], [30, 20], [38, 50], [58, 50], [66, 20], [72, 20], [72, 23], [68, 23], [61, 54], [35, 54], [28, 23], [24, 23]]) },
    { material: 'steel', d: poly([[88, 20], [94, 20], [102, 50], [122, 50], [130, 20], [136, 20], [136, 23], [132, 23], [125, 54], [99, 54], [92, 23], [88, 23]]) },
  ],
  d: [
    { material: 'castInPlace', d: rect(6, 12, 148, 7) },
    { material: 'castInPlace', d: rect(16, 48, 128, 6) },
    { material: 'castInPlace', d: rect(16, 19, 5, 29) },
    { material: 'castInPlace', d: rect(57, 19, 5, 29) },
    { material: 'castInPlace', d: rect(98, 19, 5, 29) },
    { material: 'castInPlace', d: rect(139, 19, 5, 29) },
  ],
  e: [
    { material: 'castInPlace', d: rect(6, 12, 148, 8) },
    { material: 'castInPlace', d: rect(26, 20, 12, 30) },
    { material: 'castInPlace', d: rect(74, 20, 12, 30) },
    { material: 'castInPlace', d: rect(122, 20, 12, 30) },
  ],
  f: [
    { material: 'slab', d: rect(8, 12, 144, 6) },
    { material: 'precast', d: rect(8, 18, 47, 26) },
    { material: 'void', d: rect(16, 24, 31, 14) },
    { material: 'precast', d: rect(56.5, 18, 47, 26) },
    { material: 'void', d: rect(64.5, 24, 31, 14) },
    { material: 'precast', d: rect(105, 18, 47, 26) },
    { material: 'void', d: rect(113, 24, 31, 14) },
  ],
  g: [
    { material: 'precast', d: rect(8, 16, 47, 28) },
    { material: 'void', d: rect(16, 22, 31, 16) },
    { material: 'precast', d: rect(56.5, 16, 47, 28) },
    { material: 'void', d: rect(64.5, 22, 31, 16) },
    { material: 'precast', d: rect(105, 16, 47, 28) },
    { material: 'void', d: rect(113, 22, 31, 16) },
    { material: 'tendon', d: 'M8 41H152' },
  ],
  h: [
    { material: 'slab', d: rect(8, 12, 144, 5) },
    ...[8, 56.5, 105].flatMap((x): SketchShape[] => [
      { material: 'precast', d: poly([[x, 17], [x + 47, 17], [x + 47, 22], [x + 41, 22], [x + 40, 44], [x + 33, 44], [x + 33, 22], [x + 14, 22], [x + 14, 44], [x + 7, 44], [x + 6, 22], [x, 22]]) },
    ]),
  ],
  i: [
    ...[8, 81].map((x): SketchShape => ({
      material: 'precast',
      d: poly([[x, 16], [x + 71, 16], [x + 71, 21], [x + 54, 21], [x + 52, 48], [x + 46, 48], [x + 44, 21], [x + 27, 21], [x + 25, 48], [x + 19, 48], [x + 17, 21], [x, 21]]),
    })),
  ],
  j: [
    ...[8, 56.5, 105].map((x): SketchShape => ({
      material: 'precast',
      d: poly([[x, 16], [x + 47, 16], [x + 47, 21], [x + 27, 23], [x + 26.5, 50], [x + 20.5, 50], [x + 20, 23], [x, 21]]),
    })),
  ],
  k: [SLAB, bulbTee(32, 20), bulbTee(80, 20), bulbTee(128, 20)],
};

export const SKETCH_FILL: Record<SketchMaterial, string> = {
  slab: '#cfd8d3',
  steel: '#5b7896',
  precast: '#b9b09d',
  castInPlace: '#c4cbc2',
  void: '#ffffff',
  tendon: 'none',
};
