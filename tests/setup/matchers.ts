/**
 * Custom matchers for numerical tests.
 * `toBeRelativelyClose(expected, rtol)`: |actual − expected| ≤ rtol·max(|expected|, tiny).
 */
import { expect } from 'vitest';

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
