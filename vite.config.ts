import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import type { Plugin } from 'vite';

// Content-Security-Policy for the built app (issue 6 item 5): only this origin,
// no inline scripts. Added at build time only, because the dev server's React
// refresh preamble is an inline script.
export const CSP =
  "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; " +
  "font-src 'self'; worker-src 'self' blob:; connect-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'";

function cspForBuild(): Plugin {
  return {
    name: 'swathe-csp',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler: () => [{ tag: 'meta', attrs: { 'http-equiv': 'Content-Security-Policy', content: CSP }, injectTo: 'head-prepend' }],
    },
  };
}

// One config for the app (vite) and the unit/reference tests (vitest).
// Browser tests live in tests/e2e and run under Playwright, not vitest.
export default defineConfig({
  plugins: [react(), cspForBuild()],
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
