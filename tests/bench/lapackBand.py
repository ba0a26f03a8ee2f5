"""Reference timings for the band solver benchmark (bandSolver.bench.ts): LAPACK's dpbtrf
(banded Cholesky) and dpbtrs (solve with many right-hand sides) through scipy, one thread.

Usage: python3 lapackBand.py FILE N B M REPEATS
FILE holds the lower band in LAPACK storage, column-major: ab[d, j] = A[j + d, j] for
d = 0..B, as (B + 1) * N little-endian float64 values, followed by the N * M right-hand sides
(column r at offset r * N). Prints one JSON line: median and best times in ms, and the
largest relative difference of the solution from the one the benchmark wrote beside FILE
(FILE + '.x', same layout as the right-hand sides) when that file exists.
Used only by the benchmark; the product never depends on it.
"""
import json
import os
import sys
import time

import numpy as np
from scipy.linalg import lapack


def main() -> None:
    path, n, b, m, repeats = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4]), int(sys.argv[5])
    raw = np.fromfile(path, dtype='<f8')
    ab = np.asfortranarray(raw[: (b + 1) * n].reshape((n, b + 1)).T)
    rhs = np.asfortranarray(raw[(b + 1) * n :].reshape((m, n)).T)
    factor_ms, solve_ms = [], []
    c = None
    x = None
    for _ in range(repeats):
        t0 = time.perf_counter()
        c, info = lapack.dpbtrf(ab, lower=1)
        t1 = time.perf_counter()
        if info != 0:
            raise SystemExit(f'dpbtrf failed: info = {info}')
        x, info = lapack.dpbtrs(c, rhs, lower=1)
        t2 = time.perf_counter()
        if info != 0:
            raise SystemExit(f'dpbtrs failed: info = {info}')
        factor_ms.append((t1 - t0) * 1e3)
        solve_ms.append((t2 - t1) * 1e3)
    out = {
        'factorMs': float(np.median(factor_ms)),
        'factorBestMs': float(min(factor_ms)),
        'solveMs': float(np.median(solve_ms)),
        'solveBestMs': float(min(solve_ms)),
    }
    theirs = path + '.x'
    if os.path.exists(theirs):
        ours = np.fromfile(theirs, dtype='<f8').reshape((m, n)).T
        out['maxRelativeDifference'] = float(np.max(np.abs(ours - x)) / np.max(np.abs(x)))
    print(json.dumps(out))


if __name__ == '__main__':
    main()
