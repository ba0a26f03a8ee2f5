/**
 * Influence lines of simple and continuous beams by the stiffness method.
 *
 * Units (internal SI, shared/units.ts): positions and spans in m; flexural rigidity EI in
 * N·m² (only its ratio between spans matters); ordinates are the response to a unit
 * downward force: moment ordinates in N·m per N (= m), shear and reaction ordinates in N
 * per N (dimensionless).
 *
 * Sign conventions
 * - x is measured from the first support (support 0) along the beam.
 * - Moment: sagging positive (tension at the bottom).
 * - Shear at a section: the resultant of the upward forces on the part left of the
 *   section (the upward force the rest of the beam must supply to the left part, negated:
 *   V = dM/dx). Positive near the left support of a simple span under gravity load.
 *   "Shear just left of x" excludes a load standing exactly at x from the left part; "just
 *   right of x" includes it.
 * - Reaction: upward positive. Supports are numbered 0..spans.length.
 *
 * Method (Müller-Breslau through the stiffness method). The beam is meshed with prismatic
 * Euler-Bernoulli elements (nodes at the supports, at every station and at the section
 * asked for). The influence line of a response is the deflected shape of the beam when the
 * matching unit discontinuity is imposed and no other load acts: a unit rise of the support
 * for a reaction; a unit kink θ(x⁺) − θ(x⁻) = −1 for a sagging moment; a unit slide
 * w(x⁺) − w(x⁻) = +1 with equal slopes for a shear. The discontinuity enters as the
 * equivalent nodal loads −k_e·d₀ of the element next to the section (an initial
 * deformation d₀), one banded Cholesky solve gives the nodal displacements, and the
 * ordinate anywhere is the cubic Hermite interpolation of the element's end displacements
 * and rotations — exact, because the beam carries no load between nodes
 * (Maxwell-Betti reciprocity; any structural analysis text, e.g. the Müller-Breslau
 * principle).
 *
 * Articles: the influence lines serve AASHTO LRFD Art. 3.6.1.3.1 (application of design
 * vehicular live loads) and Art. 4.6.2.1–4.6.2.2 (beam-line effects that distribution
 * factors multiply).
 */
import { DeckInputError } from '../deck/schema.js';
import type { Vehicle } from './vehicles.js';
import { PiecewiseCubic, type HasPiecewise, type HermiteElement } from './piecewiseCubic.js';
import { maxVehicleEffect as searchVehicle, type VehicleEffect } from './movingLoad.js';

export interface BeamModel {
  /** Span lengths, m, from support 0. */
  spans: number[];
  /** true: continuous over the interior supports; false: a chain of simple spans. */
  continuous: boolean;
  /** Optional EI per span, N·m² (uniform if absent). */
  flexuralRigidity?: number[];
}

export type BeamResponse =
  | { kind: 'moment'; x: number } // x m from the first support; sagging positive
  | { kind: 'shear'; x: number; side: 'left' | 'right' } // shear just left/right of x; positive = upward resultant on the left part
  | { kind: 'reaction'; support: number }; // support index 0..spans; upward positive

export interface InfluenceLine {
  xs: Float64Array;
  values: Float64Array;
  /** Ordinate at x (m) for a unit downward load, linear between stations where not exact. */
  at(x: number): number;
}

export interface InfluenceLineOptions {
  /** Elements per span (stations at every 1/n of each span). Integer 1..1000; default 20. */
  pointsPerSpan?: number;
}

/** A beam validated and normalised for analysis. */
interface NormalBeam {
  spans: number[];
  continuous: boolean;
  /** EI per span divided by the first span's. */
  rigidity: number[];
  /** Support positions, m. */
  supports: number[];
  length: number;
}

const DEFAULT_POINTS_PER_SPAN = 20;
const MAX_POINTS_PER_SPAN = 1000;

/** Validate a beam model; throws `DeckInputError` naming the field and the rule. */
export function validateBeam(beam: BeamModel): NormalBeam {
  if (beam === null || typeof beam !== 'object') throw new DeckInputError(['beam'], 'the beam model must be an object with spans and continuous');
  if (!Array.isArray(beam.spans) || beam.spans.length === 0) {
    throw new DeckInputError(['spans'], 'a beam needs at least one span');
  }
  beam.spans.forEach((L, i) => {
    if (typeof L !== 'number' || !Number.isFinite(L) || !(L > 0)) {
      throw new DeckInputError(['spans', i], `span ${i + 1} length must be a finite number greater than 0 m (got ${String(L)})`);
    }
  });
  if (typeof beam.continuous !== 'boolean') {
    throw new DeckInputError(['continuous'], 'continuous must be true (continuous spans) or false (simple spans)');
  }
  let rigidity = beam.spans.map(() => 1);
  if (beam.flexuralRigidity !== undefined) {
    const ei = beam.flexuralRigidity;
    if (!Array.isArray(ei) || ei.length !== beam.spans.length) {
      throw new DeckInputError(['flexuralRigidity'], `give one flexural rigidity per span (${beam.spans.length}), or none for a uniform beam`);
    }
    ei.forEach((v, i) => {
      if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) {
        throw new DeckInputError(['flexuralRigidity', i], `flexural rigidity of span ${i + 1} must be a finite number greater than 0 N·m² (got ${String(v)})`);
      }
    });
    rigidity = ei.map((v) => v / ei[0]);
  }
  const supports = [0];
  for (const L of beam.spans) supports.push(supports[supports.length - 1] + L);
  return { spans: [...beam.spans], continuous: beam.continuous, rigidity, supports, length: supports[supports.length - 1] };
}

function validatePointsPerSpan(n: unknown): number {
  if (n === undefined) return DEFAULT_POINTS_PER_SPAN;
  if (typeof n !== 'number' || !Number.isInteger(n) || n < 1 || n > MAX_POINTS_PER_SPAN) {
    throw new DeckInputError(['pointsPerSpan'], `points per span must be a whole number from 1 to ${MAX_POINTS_PER_SPAN} (got ${String(n)})`);
  }
  return n;
}

/** Element stiffness of a prismatic beam element, DOFs [w1, θ1, w2, θ2], w upward, θ = dw/dx. */
function elementStiffness(ei: number, h: number): Float64Array {
  const k = ei / (h * h * h);
  const h2 = h * h;
  // Row-major 4×4.
  return Float64Array.from([
    12 * k, 6 * h * k, -12 * k, 6 * h * k,
    6 * h * k, 4 * h2 * k, -6 * h * k, 2 * h2 * k,
    -12 * k, -6 * h * k, 12 * k, -6 * h * k,
    6 * h * k, 2 * h2 * k, -6 * h * k, 4 * h2 * k,
  ]);
}

/**
 * An influence line with the engine's exact piecewise-cubic ordinates. `xs`/`values` list
 * the stations; at the section of a shear line the station appears twice (the limit from
 * the left, then from the right).
 */
export class BeamInfluenceLine implements InfluenceLine, HasPiecewise {
  readonly xs: Float64Array;
  readonly values: Float64Array;
  readonly response: BeamResponse;
  private readonly elements: HermiteElement[];
  private readonly breaks: readonly number[];
  private readonly jump: { x: number; take: -1 | 1 } | undefined;
  private cached: PiecewiseCubic | undefined;

  /**
   * @param elements Hermite data of every element, in order
   * @param breaks positions (m) where the line may have a kink or a jump: the supports and
   *   the section. Between two breaks the line is one cubic (the beam carries no load
   *   there), so the elements between them are merged into one exact piece.
   */
  constructor(response: BeamResponse, elements: HermiteElement[], jump: { x: number; take: -1 | 1 } | undefined, breaks: readonly number[] = []) {
    this.response = response;
    this.elements = elements;
    this.breaks = breaks;
    this.jump = jump;
    const xs: number[] = [];
    const vs: number[] = [];
    elements.forEach((e, i) => {
      if (i === 0) {
        xs.push(e.x0);
        vs.push(e.v0);
      } else if (e.v0 !== elements[i - 1].v1) {
        xs.push(e.x0);
        vs.push(e.v0);
      }
      xs.push(e.x1);
      vs.push(e.v1);
    });
    this.xs = Float64Array.from(xs);
    this.values = Float64Array.from(vs);
  }

  /** The exact piecewise-cubic form (cached). */
  piecewise(): PiecewiseCubic {
    if (!this.cached) {
      const merged: HermiteElement[] = [];
      const tol = 1e-9 * Math.max(1, this.elements.length ? this.elements[this.elements.length - 1].x1 : 1);
      const isBreak = (x: number) => this.breaks.some((b) => Math.abs(b - x) <= tol);
      for (const e of this.elements) {
        const last = merged[merged.length - 1];
        if (last && !isBreak(e.x0)) {
          last.x1 = e.x1;
          last.v1 = e.v1;
          last.s1 = e.s1;
        } else merged.push({ ...e });
      }
      const length = this.elements.length ? this.elements[this.elements.length - 1].x1 - this.elements[0].x0 : 1;
      this.cached = PiecewiseCubic.fromHermite(merged, this.response.kind === 'moment' ? length : 1);
    }
    return this.cached;
  }

  /**
   * Ordinate for a unit downward load at x (m); exact (cubic Hermite) between stations, 0 off
   * the beam. At the section of a shear line it follows the side: a load at x belongs to the
   * left part for "just right of x", to the right part for "just left of x".
   */
  at(x: number): number {
    const pw = this.piecewise();
    if (this.jump && Math.abs(x - this.jump.x) <= 1e-12 * Math.max(1, pw.xMax)) return pw.limit(this.jump.x, this.jump.take);
    return pw.limit(x, x >= pw.xMax ? -1 : 1);
  }

  /** One-sided limit of the ordinate at x: side −1 from the left, +1 from the right. */
  limit(x: number, side: -1 | 1): number {
    return this.piecewise().limit(x, side);
  }

  /** Slope of the line at x (per m), one-sided. */
  slope(x: number, side: -1 | 1 = 1): number {
    return this.piecewise().slope(x, side);
  }

  /** ∫ ordinate dx over [x0, x1] (m · ordinate); exact. The effect of a unit uniform load there. */
  integral(x0: number, x1: number): number {
    return this.piecewise().integral(x0, x1);
  }
}

/**
 * A meshed beam with its stiffness matrix factorised once; gives the influence line of any
 * response at a station (nodes at the supports and every station).
 */
export class BeamAnalysis {
  readonly beam: NormalBeam;
  /** Node positions, m. */
  readonly nodes: Float64Array;
  private readonly nodeSpan: Int32Array; // span of the element to the right of each node (last: spans−1)
  private readonly dofW: Int32Array;
  private readonly dofThetaLeft: Int32Array;
  private readonly dofThetaRight: Int32Array;
  private readonly isSupport: Uint8Array;
  private readonly supportNode: Int32Array;
  private readonly ke: Float64Array[]; // per element
  private readonly ndof: number;
  private readonly band: number;
  private readonly chol: Float64Array; // banded Cholesky factor, row i holds L[i][i-band..i]
  private readonly fixed: Uint8Array;

  /**
   * @param beam spans (m), continuity, optional EI per span (N·m²)
   * @param options.pointsPerSpan elements per span (default 20)
   * @param extraStations further node positions, m (e.g. a section between stations)
   */
  constructor(beam: BeamModel, options: InfluenceLineOptions = {}, extraStations: readonly number[] = []) {
    this.beam = validateBeam(beam);
    const n = validatePointsPerSpan(options.pointsPerSpan);
    const b = this.beam;
    const tol = 1e-9 * b.length;
    const pts: { x: number; support: number }[] = [];
    b.spans.forEach((L, s) => {
      for (let j = 0; j < n; j++) pts.push({ x: b.supports[s] + (j === 0 ? 0 : (L * j) / n), support: j === 0 ? s : -1 });
    });
    pts.push({ x: b.length, support: b.spans.length });
    for (const x of extraStations) {
      if (!Number.isFinite(x) || x < -tol || x > b.length + tol) {
        throw new DeckInputError(['x'], `station x = ${x} m lies outside the beam (0 to ${b.length} m)`);
      }
      if (!pts.some((p) => Math.abs(p.x - x) <= tol)) pts.push({ x: Math.min(Math.max(x, 0), b.length), support: -1 });
    }
    pts.sort((p, q) => p.x - q.x);
    const nn = pts.length;
    this.nodes = Float64Array.from(pts.map((p) => p.x));
    this.isSupport = Uint8Array.from(pts.map((p) => (p.support >= 0 ? 1 : 0)));
    this.supportNode = new Int32Array(b.spans.length + 1);
    pts.forEach((p, i) => {
      if (p.support >= 0) this.supportNode[p.support] = i;
    });
    this.nodeSpan = new Int32Array(nn);
    let span = 0;
    for (let i = 0; i < nn; i++) {
      while (span < b.spans.length - 1 && this.nodes[i] >= b.supports[span + 1] - tol) span++;
      this.nodeSpan[i] = span;
    }
    // DOFs: w, θ at each node; at interior supports of simple spans, separate θ left/right.
    this.dofW = new Int32Array(nn);
    this.dofThetaLeft = new Int32Array(nn);
    this.dofThetaRight = new Int32Array(nn);
    let d = 0;
    for (let i = 0; i < nn; i++) {
      this.dofW[i] = d++;
      this.dofThetaLeft[i] = d++;
      const hinge = !b.continuous && this.isSupport[i] === 1 && i > 0 && i < nn - 1;
      this.dofThetaRight[i] = hinge ? d++ : this.dofThetaLeft[i];
    }
    this.ndof = d;
    this.band = 4;
    this.fixed = new Uint8Array(d);
    for (let i = 0; i < nn; i++) if (this.isSupport[i]) this.fixed[this.dofW[i]] = 1;
    this.ke = [];
    for (let e = 0; e < nn - 1; e++) {
      const h = this.nodes[e + 1] - this.nodes[e];
      this.ke.push(elementStiffness(b.rigidity[this.nodeSpan[e]], h));
    }
    this.chol = this.factorise();
  }

  private elementDofs(e: number): [number, number, number, number] {
    return [this.dofW[e], this.dofThetaRight[e], this.dofW[e + 1], this.dofThetaLeft[e + 1]];
  }

  /** Assemble and factorise K (supports' w constrained by unit rows) in band storage. */
  private factorise(): Float64Array {
    const n = this.ndof;
    const w = this.band + 1;
    // A[i*w + (band - (i - j))] for j in [i-band, i]: lower band.
    const A = new Float64Array(n * w);
    const idx = (i: number, j: number) => i * w + (this.band - (i - j));
    for (let e = 0; e < this.ke.length; e++) {
      const dofs = this.elementDofs(e);
      const k = this.ke[e];
      for (let r = 0; r < 4; r++) {
        for (let c = 0; c < 4; c++) {
          const i = dofs[r];
          const j = dofs[c];
          if (j > i || this.fixed[i] || this.fixed[j]) continue;
          A[idx(i, j)] += k[r * 4 + c];
        }
      }
    }
    for (let i = 0; i < n; i++) if (this.fixed[i]) A[idx(i, i)] = 1;
    // Banded Cholesky in place.
    for (let i = 0; i < n; i++) {
      const j0 = Math.max(0, i - this.band);
      for (let j = j0; j <= i; j++) {
        let s = A[idx(i, j)];
        const k0 = Math.max(j0, j - this.band);
        for (let k = k0; k < j; k++) s -= A[idx(i, k)] * A[idx(j, k)];
        if (i === j) {
          if (!(s > 0)) throw new DeckInputError(['spans'], 'the beam is unstable (stiffness matrix not positive definite)');
          A[idx(i, i)] = Math.sqrt(s);
        } else {
          A[idx(i, j)] = s / A[idx(j, j)];
        }
      }
    }
    return A;
  }

  private solve(rhs: Float64Array): Float64Array {
    const n = this.ndof;
    const w = this.band + 1;
    const A = this.chol;
    const idx = (i: number, j: number) => i * w + (this.band - (i - j));
    const y = Float64Array.from(rhs);
    for (let i = 0; i < n; i++) {
      let s = y[i];
      for (let k = Math.max(0, i - this.band); k < i; k++) s -= A[idx(i, k)] * y[k];
      y[i] = s / A[idx(i, i)];
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i];
      for (let k = i + 1; k <= Math.min(n - 1, i + this.band); k++) s -= A[idx(k, i)] * y[k];
      y[i] = s / A[idx(i, i)];
    }
    return y;
  }

  /** Node index at x (m) or −1 when x is not a node. */
  nodeAt(x: number): number {
    const tol = 1e-9 * this.beam.length;
    let lo = 0;
    let hi = this.nodes.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.nodes[mid] < x - tol) lo = mid + 1;
      else hi = mid;
    }
    return Math.abs(this.nodes[lo] - x) <= tol ? lo : -1;
  }

  /**
   * The influence line of `response`. A section x that is not a node of this analysis is
   * analysed on a mesh with x added (same ordinates; exact either way).
   */
  influenceLine(response: BeamResponse): BeamInfluenceLine {
    const r = validateResponse(response, this.beam);
    if (r.kind !== 'reaction' && this.nodeAt(r.x) < 0) {
      const n = (this.nodes.length - 1) / this.beam.spans.length;
      const again = new BeamAnalysis(
        { spans: this.beam.spans, continuous: this.beam.continuous, flexuralRigidity: this.beam.rigidity },
        { pointsPerSpan: Number.isInteger(n) ? n : DEFAULT_POINTS_PER_SPAN },
        [r.x],
      );
      return again.influenceLine(r);
    }
    const nE = this.ke.length;
    const rhs = new Float64Array(this.ndof);
    let dislocated = -1; // element carrying the initial deformation
    const d0 = new Float64Array(4);
    let jump: { x: number; take: -1 | 1 } | undefined;
    if (r.kind === 'reaction') {
      const node = this.supportNode[r.support];
      const dof = this.dofW[node];
      rhs[dof] = 1; // prescribed unit rise (its row is a unit row)
      for (const e of [node - 1, node]) {
        if (e < 0 || e >= nE) continue;
        const dofs = this.elementDofs(e);
        const local = dofs.indexOf(dof);
        const k = this.ke[e];
        for (let q = 0; q < 4; q++) if (!this.fixed[dofs[q]]) rhs[dofs[q]] -= k[q * 4 + local];
      }
    } else {
      const node = this.nodeAt(r.x);
      if (r.kind === 'moment') {
        // Kink θ(x⁺) − θ(x⁻) = −1 on the element to the right (or to the left at the far end).
        if (node < nE) {
          dislocated = node;
          d0[1] = -1;
        } else {
          dislocated = node - 1;
          d0[3] = 1;
        }
      } else if (r.side === 'right') {
        if (node < nE) {
          dislocated = node;
          d0[0] = 1;
        }
        jump = { x: r.x, take: -1 };
      } else {
        if (node > 0) {
          dislocated = node - 1;
          d0[2] = -1;
        }
        jump = { x: r.x, take: 1 };
      }
      if (dislocated >= 0) {
        const dofs = this.elementDofs(dislocated);
        const k = this.ke[dislocated];
        for (let q = 0; q < 4; q++) {
          if (this.fixed[dofs[q]]) continue;
          let s = 0;
          for (let c = 0; c < 4; c++) s += k[q * 4 + c] * d0[c];
          rhs[dofs[q]] -= s;
        }
      }
    }
    const u = this.solve(rhs);
    const elements: HermiteElement[] = [];
    for (let e = 0; e < nE; e++) {
      const [a, b, c, d] = this.elementDofs(e);
      const extra = e === dislocated ? d0 : undefined;
      elements.push({
        x0: this.nodes[e],
        x1: this.nodes[e + 1],
        v0: u[a] + (extra ? extra[0] : 0),
        s0: u[b] + (extra ? extra[1] : 0),
        v1: u[c] + (extra ? extra[2] : 0),
        s1: u[d] + (extra ? extra[3] : 0),
      });
    }
    // A shear line at the far ends is identically zero on one side; nothing to dislocate.
    if (r.kind === 'shear' && dislocated < 0) {
      for (const el of elements) {
        el.v0 = 0;
        el.s0 = 0;
        el.v1 = 0;
        el.s1 = 0;
      }
      jump = undefined;
    }
    const breaks = [...this.beam.supports];
    if (r.kind !== 'reaction') breaks.push(r.x);
    return new BeamInfluenceLine(r, elements, jump, breaks);
  }
}

function validateResponse(response: BeamResponse, beam: NormalBeam): BeamResponse {
  if (response === null || typeof response !== 'object') throw new DeckInputError(['response'], 'the response must be an object with a kind');
  const tol = 1e-9 * beam.length;
  const checkX = (x: unknown): number => {
    if (typeof x !== 'number' || !Number.isFinite(x)) throw new DeckInputError(['x'], `station x must be a finite number of metres (got ${String(x)})`);
    if (x < -tol || x > beam.length + tol) throw new DeckInputError(['x'], `station x = ${x} m lies outside the beam (0 to ${beam.length} m)`);
    return Math.min(Math.max(x, 0), beam.length);
  };
  switch (response.kind) {
    case 'moment':
      return { kind: 'moment', x: checkX(response.x) };
    case 'shear':
      if (response.side !== 'left' && response.side !== 'right') {
        throw new DeckInputError(['side'], `shear side must be 'left' or 'right' (got ${String(response.side)})`);
      }
      return { kind: 'shear', x: checkX(response.x), side: response.side };
    case 'reaction': {
      const s = response.support;
      if (typeof s !== 'number' || !Number.isInteger(s) || s < 0 || s > beam.spans.length) {
        throw new DeckInputError(['support'], `support must be a whole number from 0 to ${beam.spans.length} (got ${String(s)})`);
      }
      return { kind: 'reaction', support: s };
    }
    default:
      throw new DeckInputError(['kind'], `response kind must be 'moment', 'shear' or 'reaction' (got ${String((response as { kind: unknown }).kind)})`);
  }
}

/**
 * Influence line of one response of a beam.
 * @param beam spans (m), continuity, optional EI per span (N·m²)
 * @param response moment or shear at x (m from support 0), or a reaction (support index)
 * @param options.pointsPerSpan stations per span (default 20; the ordinates are exact at any count)
 */
export function influenceLine(beam: BeamModel, response: BeamResponse, options?: { pointsPerSpan?: number }): InfluenceLine {
  const extra = response && typeof response === 'object' && response.kind !== 'reaction' && typeof response.x === 'number' && Number.isFinite(response.x) ? [response.x] : [];
  const b = validateBeam(beam);
  const tol = 1e-9 * b.length;
  const inside = extra.filter((x) => x >= -tol && x <= b.length + tol);
  return new BeamAnalysis(beam, options ?? {}, inside).influenceLine(response);
}

/**
 * Largest effect of a vehicle of axle loads moving along the line (both directions of
 * travel, variable spacing searched). Axles that would reduce the effect are neglected
 * (Art. 3.6.1.3.1). `value` is signed: ≥ 0 for 'positive', ≤ 0 for 'negative'.
 * `direction` +1: travelling towards +x (front axle at the largest x).
 */
export function maxVehicleEffect(
  line: InfluenceLine,
  vehicle: Vehicle,
  sense: 'positive' | 'negative',
): { value: number; frontAxleAt: number; direction: 1 | -1; axleSpacing?: number } & VehicleEffect {
  return searchVehicle(line, vehicle, sense);
}
