/**
 * Typed errors of the grillage analysis. No units of their own: messages quote lengths in
 * metres (internal units) and name girders, spans and support lines counting from 1, the
 * way an engineer reads a drawing, while the fields carry the 0-based indices the API uses.
 *
 * - `GrillageInputError` (a `DeckInputError`): an option, a response request, a load or a
 *   deck the mesher cannot build. `path` names the field (deck fields as in the deck
 *   schema; options under `['grillage', <option>]`), `code` the rule.
 * - `GrillageMechanismError`: the assembled stiffness is singular or not positive definite
 *   (a pivot of the banded factorisation that is non-positive or tiny relative to its own
 *   diagonal). It names the node (line, girder, station) and the unrestrained direction.
 */
import { DeckInputError } from '../deck/schema.js';

export type GrillageErrorCode =
  | 'invalid-option'
  | 'unbuildable-deck'
  | 'degenerate-mesh'
  | 'zero-stiffness'
  | 'unsupported-girder'
  | 'mesh-too-large'
  | 'invalid-response'
  | 'invalid-load';

export class GrillageInputError extends DeckInputError {
  readonly code: GrillageErrorCode;
  constructor(code: GrillageErrorCode, path: (string | number)[], message: string) {
    super(path, message);
    this.name = 'GrillageInputError';
    this.code = code;
  }
}

/** Directions of a grid node's three degrees of freedom. */
export type GridDirection = 'w' | 'rx' | 'ry';

export const DIRECTION_WORDS: Record<GridDirection, string> = {
  w: 'vertical displacement w',
  rx: 'rotation θx about the longitudinal (girder) axis',
  ry: 'rotation θy about the transverse axis',
};

export interface MechanismLocation {
  /** Node index in the mesh. */
  node: number;
  direction: GridDirection;
  /** Plain description of the node, e.g. "girder 3 at x = 12.200 m (span 1, 0.400 of the span)". */
  where: string;
  /** 0-based girder index when the node lies on a girder line. */
  girder?: number;
  /** Station x of the node, m (along the girders from support line 0 at girder 1). */
  x: number;
  y: number;
}

export class GrillageMechanismError extends Error {
  readonly code = 'mechanism' as const;
  readonly location: MechanismLocation;
  /** The pivot found and the diagonal it is compared with (stiffness units of the direction). */
  readonly pivot: number;
  readonly diagonal: number;
  constructor(location: MechanismLocation, pivot: number, diagonal: number) {
    const ratio = diagonal > 0 ? pivot / diagonal : Number.NaN;
    super(
      `the grillage is a mechanism: ${location.where}: ${DIRECTION_WORDS[location.direction]} is unrestrained ` +
        `(pivot ${pivot.toExponential(3)}${Number.isFinite(ratio) ? `, ${ratio.toExponential(3)} of its diagonal` : ', diagonal not positive'}). ` +
        'Check the bearings, the member stiffnesses and the torsion settings.',
    );
    this.name = 'GrillageMechanismError';
    this.location = location;
    this.pivot = pivot;
    this.diagonal = diagonal;
  }
}
