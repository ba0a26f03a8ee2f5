/**
 * Section properties of a built-up (welded plate) steel I girder from its three plates: top
 * flange, web and bottom flange, stacked with no gaps. Units: internal SI (m in, m² and m⁴
 * out). The centroid is measured down from the top of the top flange (the deck schema's
 * `centroidFromTop`); I is about the girder's own horizontal centroidal axis (parallel-axis
 * theorem); J is the open thin-walled approximation Σ b·t³/3 (common practice for plate
 * girders; AISC Design Guide 9, "Torsional Analysis of Structural Steel Members", from memory).
 */
import { DeckInputError } from '@shared/deck/schema';

export interface PlateDimensions {
  /** Plate width (horizontal), m. */
  width: number;
  /** Plate thickness (vertical for flanges, horizontal for the web), m. */
  thickness: number;
}

export interface BuiltUpIDimensions {
  topFlange: PlateDimensions;
  /** Web: `width` is its depth (vertical, between the flanges), `thickness` its thickness. */
  web: PlateDimensions;
  bottomFlange: PlateDimensions;
}

export interface BuiltUpIProperties {
  /** A, m². */
  area: number;
  /** I about the horizontal centroidal axis, m⁴. */
  inertia: number;
  /** Depth of the centroid below the top of the top flange, m. */
  centroidFromTop: number;
  /** Overall depth d, m. */
  depth: number;
  /** St Venant torsional constant J ≈ Σ b·t³/3, m⁴. */
  torsion: number;
}

const PLATE_NAMES = { topFlange: 'top flange', web: 'web', bottomFlange: 'bottom flange' } as const;

/** @throws DeckInputError naming the plate and dimension when one is not a positive finite number. */
export function builtUpISection(dims: BuiltUpIDimensions): BuiltUpIProperties {
  for (const plate of ['topFlange', 'web', 'bottomFlange'] as const) {
    for (const dim of ['width', 'thickness'] as const) {
      const v = dims[plate][dim];
      if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) {
        const what = plate === 'web' && dim === 'width' ? 'depth' : dim;
        throw new DeckInputError([plate, dim], `${PLATE_NAMES[plate]} ${what} must be a number greater than 0`);
      }
    }
  }
  const tf = dims.topFlange;
  const bf = dims.bottomFlange;
  const webDepth = dims.web.width;
  const tw = dims.web.thickness;
  // Each plate: area, centroid depth from the top, own inertia about its centroid.
  const parts = [
    { a: tf.width * tf.thickness, y: tf.thickness / 2, i: (tf.width * tf.thickness ** 3) / 12 },
    { a: tw * webDepth, y: tf.thickness + webDepth / 2, i: (tw * webDepth ** 3) / 12 },
    { a: bf.width * bf.thickness, y: tf.thickness + webDepth + bf.thickness / 2, i: (bf.width * bf.thickness ** 3) / 12 },
  ];
  const area = parts.reduce((s, p) => s + p.a, 0);
  const centroidFromTop = parts.reduce((s, p) => s + p.a * p.y, 0) / area;
  const inertia = parts.reduce((s, p) => s + p.i + p.a * (p.y - centroidFromTop) ** 2, 0);
  const torsion = (tf.width * tf.thickness ** 3 + webDepth * tw ** 3 + bf.width * bf.thickness ** 3) / 3;
  return { area, inertia, centroidFromTop, depth: tf.thickness + webDepth + bf.thickness, torsion };
}
