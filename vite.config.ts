/// <reference types="vitest/config" />
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const apiTarget = `http://127.0.0.1:${process.env.API_PORT ?? 3000}`;

export default defineConfig({
  // The page lives in src/ (the project's top level is fixed by the customer); public/ holds static files.
  root: here('./src'),
  publicDir: here('./public'),
  plugins: [react(), tailwindcss()],
  worker: { format: 'es' },
  build: {
    outDir: here('./dist'),
    emptyOutDir: true,
    sourcemap: true,
    chunkSizeWarningLimit: 1500,
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    strictPort: true,
    proxy: { '/api': { target: apiTarget, changeOrigin: false } },
    // as the server sends them: cross-origin isolated, so the Bench can share the map with its workers
    headers: { 'Cross-Origin-Opener-Policy': 'same-origin', 'Cross-Origin-Embedder-Policy': 'require-corp' },
  },
  test: {
    root: here('.'),
    // Projects run in group order: pure units in parallel first, then the database-backed API tests and the
    // browser tests one file at a time (they share one test database and one server).
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.{ts,tsx}'],
          environment: 'node',
          sequence: { groupOrder: 0 },
          // CLI tests run whole commands in child processes; on a loaded 2-core machine 5 s is too tight
          testTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          sequence: { groupOrder: 1 },
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'browser',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          globalSetup: ['tests/e2e/global-setup.ts'],
          sequence: { groupOrder: 2 },
          // a loaded 2-core CI machine is slower than a desk: wait longer before a poll fails
          expect: { poll: { timeout: 20_000 } },
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
