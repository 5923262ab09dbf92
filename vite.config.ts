/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiPort = Number(process.env.PORT ?? 3000);

export default defineConfig({
  root: 'src',
  publicDir: false,
  plugins: [react(), tailwindcss()],
  build: {
    outDir: '../dist/client',
    emptyOutDir: true,
    sourcemap: true,
    rolldownOptions: {
      output: {
        // Pages are loaded on demand (src/app/router.tsx). The large libraries several of them
        // share go into named chunks, each fetched once, by the first page that needs it: the
        // framework every page runs on, mathjs and jstat (the engine: the job page and the
        // template editor), KaTeX (typeset symbols and equations) and recharts (the job page's
        // charts). A group takes the packages its test matches and the packages they import;
        // the app's own modules (shared/engine, shared/schemas…) are left to the automatic
        // chunking, so that a page never loads a library chunk for a small module of ours.
        // The mathjs chunk stays above Vite's 500 kB warning (716 kB, 204 kB gzip): the engine
        // builds its instance from the whole of mathjs (shared/engine/model/math.ts, create(all)).
        // The warning is left on, so that any other chunk that grows past it is still named.
        codeSplitting: {
          groups: [
            { name: 'framework', priority: 40, test: /node_modules[\\/](react|react-dom|scheduler|react-router|@tanstack|zod)[\\/]/ },
            { name: 'mathjs', priority: 30, test: /node_modules[\\/](mathjs|jstat)[\\/]/ },
            { name: 'katex', priority: 20, test: /node_modules[\\/]katex[\\/]/ },
            { name: 'charts', priority: 10, test: /node_modules[\\/]recharts[\\/]/ },
          ],
        },
      },
    },
  },
  server: {
    port: 5173,
    strictPort: true,
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
  test: {
    root: '.',
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          root: '.',
          include: ['tests/shared/**/*.test.ts', 'tests/templates/**/*.test.ts'],
          environment: 'node',
          // Monte Carlo tests run 10^6 trials; on a loaded 2-core machine that can take a while.
          testTimeout: 300_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          root: '.',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          root: '.',
          include: ['tests/client/**/*.test.tsx'],
          environment: 'happy-dom',
          setupFiles: ['tests/setup/client-setup.ts'],
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: '.',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 240_000,
          hookTimeout: 300_000,
          fileParallelism: false,
          globalSetup: ['tests/e2e/global-setup.ts'],
        },
      },
    ],
  },
});
