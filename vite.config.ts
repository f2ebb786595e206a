/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

export default defineConfig({
  root: '.',
  plugins: [react()],
  // INKROUTE_OUT_DIR lets two checks build side by side on one machine (default dist).
  build: { outDir: process.env.INKROUTE_OUT_DIR ?? 'dist', target: 'es2022' },
  worker: { format: 'es' },
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
