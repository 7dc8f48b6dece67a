import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

export default defineConfig({
  plugins: [react(), tailwindcss()],
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
