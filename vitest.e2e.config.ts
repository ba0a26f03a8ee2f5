import { defineProject } from 'vitest/config';

// Browser tests: real headless Chromium against the built app (run `vite build` first).
export default defineProject({
  test: {
    name: 'e2e',
    include: ['tests/e2e/**/*.spec.ts'],
    pool: 'forks',
    fileParallelism: false,
    testTimeout: 120000,
    hookTimeout: 180000,
  },
});
