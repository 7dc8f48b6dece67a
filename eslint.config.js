// ESLint for the whole repository: `npm run lint` (and `npm test`, which lints first).
//
// What it is for, above all: the import direction. client/ may use shared/, never server/;
// server/ never uses client/; shared/ uses neither (nor Node built-ins, which would break the
// browser bundle); a client feature is reached from outside only through its public file,
// client/features/<name>/index.ts. tests/ may import anything.
//
// The boundaries use eslint-plugin-import-x's `no-restricted-paths` rather than ESLint's own
// `no-restricted-imports`: it judges the file an import RESOLVES to (through the tsconfig paths
// @client/* and @shared/*, and through relative paths like ../../features/jobs/api/jobs),
// where `no-restricted-imports` only sees the import's text and would need a pattern per way of
// spelling the same file.
//
// Type-aware linting is left off on purpose: the whole run must stay a few seconds.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import js from '@eslint/js';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import importX from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import { defineConfig, globalIgnores } from 'eslint/config';
import tseslint from 'typescript-eslint';

const root = import.meta.dirname;
const features = readdirSync(join(root, 'client/features'), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);
const publicFiles = features.map((feature) => `./${feature}/index.ts`);
// Files a feature lets the app load lazily with import(): going through index.ts would put them
// (and all they import) into the importer's chunk, which the lazy import exists to avoid.
const lazyEntries = ['./messages/components/messages-live.tsx', './messages/outbox.ts'];
// client/ outside the features: app/ (routes, layout, router), main.tsx, components/, lib/ and the rest.
const clientOutsideFeatures = readdirSync(join(root, 'client'))
  .filter((name) => name !== 'features')
  .map((name) => `./client/${name}`);

const boundaries = [
  { target: './client', from: './server', message: 'The client reaches the server only over HTTP and sockets; shared types live in shared/.' },
  { target: './server', from: './client', message: 'The server never imports client code; move what both need to shared/.' },
  {
    target: './shared',
    from: ['./client', './server'],
    message: 'shared/ is used by both sides, so it imports neither.',
  },
  // Everything in client/ outside the features uses a feature through its public file only.
  {
    target: clientOutsideFeatures,
    from: './client/features',
    except: [...publicFiles, ...lazyEntries],
    message: 'Use the feature through its public file, client/features/<name>/index.ts (add the export there).',
  },
  // A feature uses its own files freely, and another feature only through that feature's public file.
  ...features.map((feature) => ({
    target: `./client/features/${feature}`,
    from: './client/features',
    except: [`./${feature}`, ...publicFiles],
    message: 'Reach another feature only through its public file, client/features/<name>/index.ts (add the export there).',
  })),
];

export default defineConfig([
  globalIgnores([
    'dist/',
    'coverage/',
    'node_modules/',
    'uploads/',
    'drizzle/',
    'tests/artifacts/',
    '.data/',
    '**/*.d.ts',
  ]),
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ['**/*.{js,mjs,cjs,ts,tsx}'],
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
    },
    linterOptions: {
      reportUnusedDisableDirectives: 'error',
    },
    rules: {
      // A leading underscore marks a name kept on purpose: Express's four-argument error handler,
      // a field taken out of an object so the rest can be passed on.
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
      // Off: the control characters in our patterns (file names, header values) are there on purpose.
      'no-control-regex': 'off',
    },
  },
  {
    // Off in tests: they feed deliberately ill-typed input to see the server refuse it.
    files: ['tests/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    files: ['client/**/*.{ts,tsx}', 'server/**/*.ts', 'shared/**/*.ts'],
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: join(root, 'tsconfig.json') })],
    },
    rules: {
      'import-x/no-restricted-paths': ['error', { basePath: root, zones: boundaries }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      // shared/ runs in the browser too: no node:fs, node:crypto, Buffer-based helpers and the like.
      'import-x/no-nodejs-modules': 'error',
    },
  },
  {
    // The two classic hook rules only: the plugin's recommended set also runs the React Compiler's
    // analysis on every component, which took over a minute of the run on its own.
    files: ['client/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
]);
