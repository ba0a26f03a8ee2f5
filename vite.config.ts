import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import templateCompilerOptions from '@tresjs/core/template-compiler-options';
import { fileURLToPath, URL } from 'node:url';

// The client build. The API server (server/index.ts) serves dist/ in production; in
// development `vite` serves the client and forwards /api to the server on port 3000.
export default defineConfig({
  plugins: [
    vue({
      // TresJS's <Tres*> elements are custom elements for the template compiler.
      ...templateCompilerOptions,
    }),
  ],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  server: {
    port: 5173,
    proxy: {
      '/api': { target: 'http://localhost:3000', changeOrigin: false },
    },
  },
  worker: {
    format: 'es',
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: false,
    // The ant-design-vue vendor chunk holds every component any view uses (about 880 kB
    // minified, 270 kB gzipped, with the table alone near 460 kB); three.js, loaded lazily with
    // the 3D view, is about 565 kB. The limit flags growth beyond those.
    chunkSizeWarningLimit: 1000,
    rolldownOptions: {
      output: {
        // Two vendor chunks that change rarely (long cache life); the application code and
        // each lazily loaded view stay in their own small chunks.
        codeSplitting: {
          groups: [
            { name: 'vendor-vue', test: /[\\/]node_modules[\\/](vue|@vue|vue-router|pinia)[\\/]/, priority: 2 },
            { name: 'vendor-antd', test: /[\\/]node_modules[\\/](ant-design-vue|@ant-design)[\\/]/, priority: 1 },
          ],
        },
      },
    },
  },
});
