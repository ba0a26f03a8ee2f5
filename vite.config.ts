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
    // three.js, loaded lazily with the 3D view, is about 565 kB minified; the limit flags
    // growth beyond that.
    chunkSizeWarningLimit: 1000,
    rolldownOptions: {
      output: {
        // One vendor chunk that changes rarely (long cache life) for Vue, its router and Pinia.
        // ant-design-vue is left to the bundler's own splitting: each view's chunk group carries
        // the components it uses, so the sign-in page loads the form, input and button, not the
        // table, the tree and the date pickers (about 270 kB gzipped as one chunk).
        codeSplitting: {
          groups: [{ name: 'vendor-vue', test: /[\\/]node_modules[\\/](vue|@vue|vue-router|pinia)[\\/]/, priority: 2 }],
        },
      },
    },
  },
});
