import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/**
 * The web font (the @fontsource files say `font-display: swap`) never swaps in under text already on
 * screen, which would re-wrap every line and move the page (layout shift): with `optional` the browser
 * uses Manrope when it is there for the first paint (from the cache on later visits: hashed files are
 * kept a year) and otherwise keeps the fallback for that page. Runs on the compiled CSS.
 */
const fontDisplayOptional = (): Plugin => ({
  name: 'tenthmark:font-display-optional',
  transform(code, id) {
    if (!/\.css(\?|$)/.test(id) || !code.includes('font-display')) return null;
    return { code: code.replace(/font-display:\s*swap/g, 'font-display: optional'), map: null };
  },
});

export default defineConfig({
  plugins: [react(), tailwindcss(), fontDisplayOptional()],
  resolve: {
    alias: {
      '@shared': here('./shared'),
      '@client': here('./client'),
    },
  },
  publicDir: 'client/public',
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    sourcemap: true,
    // .vite/manifest.json: which chunks each page loads (npm run bench:client reads it).
    manifest: true,
    rolldownOptions: {
      output: {
        codeSplitting: {
          // Everything the entry imports statically goes into the entry chunk itself, as one file,
          // instead of being cut into small shared chunks that each page would fetch separately.
          groups: [{ name: 'index', tags: ['$initial'] }],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
  },
  test: {
    reporters: ['default', './tests/setup/summary-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/api/**/*.test.ts', 'tests/realtime/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
