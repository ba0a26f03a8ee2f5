import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { fileURLToPath, URL } from 'node:url';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
};

// `npm test` runs both projects in one vitest run and writes one JSON report that
// .ci/run reads for its "N passed, N failed" line.
export default defineConfig({
  test: {
    reporters: ['default', ['json', { outputFile: '.tmp/vitest/report.json' }]],
    projects: [
      {
        plugins: [vue()],
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['tests/**/*.test.ts'],
          exclude: ['tests/e2e/**', 'node_modules/**'],
          setupFiles: ['tests/setup/matchers.ts'],
          pool: 'forks',
          testTimeout: 30000,
          hookTimeout: 30000,
        },
      },
      './vitest.e2e.config.ts',
    ],
  },
});
