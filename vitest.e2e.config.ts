import { defineProject } from 'vitest/config';
import { fileURLToPath, URL } from 'node:url';

// Browser tests: a real server on a fresh database and Debian's headless Chromium driven by
// playwright-core (tests/e2e/harness.ts). They expect `npm run build` to have produced dist/.
// One fork, one file at a time: each file starts its own server and browser.
export default defineProject({
  // the example decks of the units check are read from the client's starting decks
  resolve: { alias: { '@': fileURLToPath(new URL('./src', import.meta.url)), '@shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
  test: {
    name: 'e2e',
    include: ['tests/e2e/**/*.spec.ts'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 1,
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 180_000,
  },
});
