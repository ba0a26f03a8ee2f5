/**
 * The band solver against LAPACK on the same stiffness matrices (issue targets: the
 * factorisation within 1.5× of dpbtrf, the many-right-hand-side solve within 2× of dpbtrs).
 *
 * For grillages of 8 girders × 40 segments, 12 × 100 and 24 × 160 (one 100 ft span, steel
 * girders at 8 ft, perpendicular members), times BandLDLT.factor and solveManyInPlace with one
 * right-hand side per influence surface of the grillage benchmark (each girder's midspan
 * moment and both end shears), then hands the same band and right-hand sides to
 * lapackBand.py (scipy's dpbtrf/dpbtrs, OPENBLAS_NUM_THREADS=1) when python3 with scipy is on
 * this machine, and prints the ratios and the largest relative difference of the two
 * solutions. Without scipy it says so and prints its own figures only. Times are medians;
 * nothing is asserted.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { BandLDLT, buildGrillage, type SymmetricBandMatrix } from '../../shared/grillage/index.js';
import { steelDeck } from '../shared/grillage/fixtures.js';

const here = dirname(fileURLToPath(import.meta.url));
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

interface Lapack {
  factorMs: number;
  solveMs: number;
  maxRelativeDifference?: number;
}

function hasScipy(): boolean {
  const r = spawnSync('python3', ['-c', 'import scipy.linalg.lapack'], { encoding: 'utf8' });
  return r.status === 0;
}

/** The lower band in LAPACK's column-major storage, then the right-hand sides column by column. */
function lapackInput(K: SymmetricBandMatrix, B: Float64Array, m: number): Float64Array {
  const { n, bandwidth: b } = K;
  const out = new Float64Array((b + 1) * n + n * m);
  for (let j = 0; j < n; j++) for (let d = 0; d <= b && j + d < n; d++) out[j * (b + 1) + d] = K.get(j + d, j);
  const off = (b + 1) * n;
  for (let i = 0; i < n; i++) for (let r = 0; r < m; r++) out[off + r * n + i] = B[i * m + r];
  return out;
}

function columns(X: Float64Array<ArrayBufferLike>, n: number, m: number): Float64Array {
  const out = new Float64Array(n * m);
  for (let i = 0; i < n; i++) for (let r = 0; r < m; r++) out[r * n + i] = X[i * m + r];
  return out;
}

const scipy = hasScipy();
const dir = mkdtempSync(join(tmpdir(), 'deckshare-band-'));
console.log(
  scipy
    ? 'band solver against LAPACK (scipy dpbtrf / dpbtrs, one thread), same matrices and right-hand sides:'
    : 'band solver (python3 with scipy is not on this machine: no LAPACK reference figures):',
);
try {
  for (const [girders, segments] of [
    [8, 40],
    [12, 100],
    [24, 160],
  ] as const) {
    const model = buildGrillage(steelDeck({ girders, spacingFt: 8, spansFt: [100] }), { segmentsPerSpan: segments, layout: 'perpendicular' });
    const K = model.grid.K;
    const n = K.n;
    const m = girders * 3;
    const B = new Float64Array(n * m).map((_, k) => ((k * 7919) % 101) / 101 - 0.5);
    const repeats = n > 5000 ? 7 : 21;
    const factorMs: number[] = [];
    const solveMs: number[] = [];
    let X: Float64Array = B;
    for (let k = 0; k < repeats + 2; k++) {
      const t0 = performance.now();
      const f = BandLDLT.factor(K);
      const t1 = performance.now();
      X = f.solveManyInPlace(Float64Array.from(B), m);
      const t2 = performance.now();
      if (k >= 2) {
        factorMs.push(t1 - t0);
        solveMs.push(t2 - t1);
      }
    }
    const ours = { factor: median(factorMs), solve: median(solveMs) };
    const flop = (n * K.bandwidth * K.bandwidth) / 1e6; // ≈ n·b² flops (n·b²/2 multiply-adds)
    let text = `  ${girders} girders × ${segments} segments: ${n} unknowns, half-bandwidth ${K.bandwidth}, ${m} right-hand sides — factor ${ours.factor.toFixed(2)} ms (${(flop / ours.factor).toFixed(2)} GFLOP/s), solve ${ours.solve.toFixed(2)} ms`;
    if (scipy) {
      const file = join(dir, `band-${girders}x${segments}.f64`);
      writeFileSync(file, lapackInput(K, B, m));
      writeFileSync(`${file}.x`, columns(X, n, m));
      const r = spawnSync('python3', [join(here, 'lapackBand.py'), file, String(n), String(K.bandwidth), String(m), String(repeats)], {
        encoding: 'utf8',
        env: { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1', MKL_NUM_THREADS: '1' },
      });
      if (r.status !== 0) text += `; LAPACK run failed: ${r.stderr.trim().split('\n').pop()}`;
      else {
        const l = JSON.parse(r.stdout) as Lapack;
        text +=
          `\n      LAPACK dpbtrf ${l.factorMs.toFixed(2)} ms, dpbtrs ${l.solveMs.toFixed(2)} ms; ours/LAPACK: factor ${(ours.factor / l.factorMs).toFixed(2)}× (target ≤ 1.5×), ` +
          `solve ${(ours.solve / l.solveMs).toFixed(2)}× (target ≤ 2×); solutions agree to ${(l.maxRelativeDifference ?? NaN).toExponential(1)} (relative)`;
      }
    }
    console.log(text);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
