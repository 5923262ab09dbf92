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
