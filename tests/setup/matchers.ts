/**
 * Custom matchers for numerical tests.
 * `toBeRelativelyClose(expected, rtol)`: |actual − expected| ≤ rtol·max(|expected|, tiny).
 * Also fixes fast-check's seed under CI (see the end of this file).
 */
import { expect } from 'vitest';
import fc from 'fast-check';

expect.extend({
  toBeRelativelyClose(received: number, expected: number, rtol = 1e-9) {
    const scale = Math.max(Math.abs(expected), 1e-300);
    const err = Math.abs(received - expected) / scale;
    const pass = Number.isFinite(received) && err <= rtol;
    return {
      pass,
      message: () =>
        `expected ${received} ${pass ? 'not ' : ''}to be within relative ${rtol} of ${expected} (relative error ${err.toExponential(3)})`,
    };
  },
});

interface CustomMatchers<R = unknown> {
  toBeRelativelyClose(expected: number, rtol?: number): R;
}

declare module 'vitest' {
  // eslint-disable-next-line @typescript-eslint/no-empty-object-type
  interface Matchers<T = any> extends CustomMatchers<T> {}
}

// Property tests explore new random cases on every local run; under CI (CI=true) they use one
// fixed seed so that a landing run is reproducible. FC_SEED overrides both, to replay a case.
const fcSeed = process.env.FC_SEED ?? (process.env.CI ? '20261201' : undefined);
if (fcSeed !== undefined) fc.configureGlobal({ seed: Number(fcSeed) });
