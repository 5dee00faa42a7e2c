/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiPort = Number(process.env.API_PORT ?? 3001);

export default defineConfig({
  root: 'client',
  publicDir: 'public',
  plugins: [react(), tailwindcss()],
  build: { outDir: '../dist/client', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 1500 },
  worker: { format: 'es' },
  server: {
    port: Number(process.env.PORT ?? 5173),
    proxy: {
      '/api': `http://127.0.0.1:${apiPort}`,
      '/socket.io': { target: `http://127.0.0.1:${apiPort}`, ws: true },
      '/collab': { target: `ws://127.0.0.1:${apiPort}`, ws: true },
    },
  },
  test: {
    root: '.',
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    // The PostgreSQL and several-process suites need servers of their own: scripts/pg-test.sh and
    // scripts/scale-test.sh start them and set these variables.
    exclude: [
      '**/node_modules/**',
      ...(process.env.DATABASE_URL ? [] : ['tests/pg/**']),
      ...(process.env.DATABASE_URL && process.env.REDIS_URL ? [] : ['tests/scale/**']),
    ],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 20_000,
    hookTimeout: 30_000,
    setupFiles: ['tests/setup/fail-on-console-error.ts'],
    env: { TZ: 'UTC', LOG_LEVEL: 'silent' },
  },
});
