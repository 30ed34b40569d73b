import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

// One config for the app (vite) and the unit/reference tests (vitest).
// Browser tests live in tests/e2e and run under Playwright, not vitest.
export default defineConfig({
  plugins: [react()],
  base: './',
  worker: { format: 'es' },
  server: { port: 5173, strictPort: false },
  build: { target: 'es2022', chunkSizeWarningLimit: 2000 },
  test: {
    include: ['tests/unit/**/*.test.ts', 'tests/reference/**/*.test.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
