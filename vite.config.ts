import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';
// With its extension, as a config loaded without bundling needs (TypeScript maps .js to the .ts file).
import { PAGE_CHUNKS_FILE, lazyPageModules } from './shared/page-modules.js';

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

/**
 * Writes `.vite/page-chunks.json`: for each page path of the router, the files of its lazy route and
 * everything that route imports statically, less what the entry loads anyway. The server names them in
 * the page's HTML as module preloads, so a phone fetches the page's code beside the entry instead of
 * only once the entry has run and the router has asked for it.
 */
const pageChunks = (): Plugin => ({
  name: 'tenthmark:page-chunks',
  apply: 'build',
  generateBundle(_options, bundle) {
    const chunks = Object.values(bundle).flatMap((file) => (file.type === 'chunk' ? [file] : []));
    const byFile = new Map(chunks.map((chunk) => [chunk.fileName, chunk]));
    const closure = (fileName: string, into = new Set<string>()) => {
      if (into.has(fileName)) return into;
      into.add(fileName);
      for (const next of byFile.get(fileName)?.imports ?? []) closure(next, into);
      return into;
    };
    const entry = chunks.find((chunk) => chunk.isEntry);
    if (!entry) return;
    const loadedAnyway = closure(entry.fileName);
    const root = here('./');
    const byModule = new Map(chunks.flatMap((chunk) => (chunk.facadeModuleId?.startsWith(root) ? [[chunk.facadeModuleId.slice(root.length), chunk]] : [])));
    const pages: Record<string, string[]> = {};
    for (const { path, module } of lazyPageModules(readFileSync(here('./client/app/router.tsx'), 'utf8'))) {
      const chunk = byModule.get(module);
      if (chunk) pages[path] = [...closure(chunk.fileName)].filter((file) => !loadedAnyway.has(file)).map((file) => `/${file}`);
    }
    this.emitFile({ type: 'asset', fileName: PAGE_CHUNKS_FILE, source: JSON.stringify(pages, null, 1) });
  },
});

export default defineConfig({
  plugins: [react(), tailwindcss(), fontDisplayOptional(), pageChunks()],
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
    // The AWS SDK warns once per process that its releases from 2027 on need Node 22; the
    // version is pinned in package.json, so in test output the warning says nothing new.
    env: { AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' },
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
          include: ['tests/api/**/*.test.ts', 'tests/realtime/**/*.test.ts', 'tests/cluster/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/setup/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        // The photo and document suites once more with files in the S3 stand-in instead of the uploads folder
        // (tests/setup/storage.ts): the same files, so both storages meet the same checks.
        extends: true,
        test: {
          name: 'integration-s3',
          include: ['tests/api/photos.test.ts', 'tests/api/inspections.test.ts', 'tests/api/documents.test.ts', 'tests/realtime/messaging.test.ts'],
          environment: 'node',
          env: { TENTHMARK_TEST_STORAGE: 's3' },
          globalSetup: ['tests/setup/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
