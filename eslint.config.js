import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import importX from 'eslint-plugin-import-x';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import serverModules from './eslint/server-modules.js';

const clientFeatures = fs.readdirSync(new URL('./packages/client/src/features', import.meta.url));
/** A feature's public file: the only part of it another feature may import (exceptions match absolute paths). */
const featurePublicFile = fileURLToPath(new URL('./packages/client/src/features/*/index.ts', import.meta.url));

/** Import boundaries of DEVELOPERS.md ("Imports that must never exist"). */
const boundaries = {
  shared: { target: './packages/shared', from: ['./packages/client', './packages/server', './seed', './test'] },
  client: { target: './packages/client', from: ['./packages/server'] },
  server: { target: './packages/server', from: ['./packages/client'] },
};

export default tseslint.config(
  { ignores: ['**/node_modules/**', '**/dist/**', '.data/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  { files: ['**/*.{js,mjs}'], languageOptions: { globals: globals.node } },
  {
    files: ['**/*.{ts,tsx}'],
    plugins: { 'import-x': importX },
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    settings: { 'import-x/resolver-next': [importX.createNodeResolver({ extensions: ['.ts', '.tsx', '.js'] })] },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'import-x/no-restricted-paths': ['error', { zones: Object.values(boundaries) }],
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['@burrowline/server', '@burrowline/client'], message: 'Packages talk over HTTP, not imports' }] },
      ],
    },
  },
  {
    /*
     * Server module contracts. A module (packages/server/src/modules/<name>/) is reached from another
     * module only through its PUBLIC files:
     *   - `*-facts.service.ts`  reads published for other modules, inside the caller's transaction;
     *   - `*.service.ts`        the module's documented reads and writes (what routes and other modules call);
     *   - `farms/farm-access.ts`, `farms/farm-clock.ts`  the one farm access check and the farm's clock.
     * Everything else (models, presenters, queries, contexts, private helpers) is private to its module;
     * a model may still name another module's model for an association (the composition root wires them).
     * No folder loops: an import may not close a loop between server folders (modules/<name>, db, lib,
     * http, composition). Where two modules need each other, the one below declares a port
     * (lib/port.ts) and composition/ports.ts plugs the other's function in.
     */
    files: ['packages/server/src/**/*.ts'],
    plugins: { 'server-modules': serverModules },
    rules: {
      'server-modules/public-only': [
        'error',
        {
          srcDir: 'packages/server/src',
          publicFiles: ['*.service.ts', 'farms/farm-access.ts', 'farms/farm-clock.ts'],
          modelsMayReferenceModels: true,
        },
      ],
      'server-modules/no-folder-cycle': ['error', { srcDir: 'packages/server/src' }],
    },
  },
  {
    // Client features are islands. A feature imports lib/, components/ and what another feature exports on
    // purpose from its index.ts; anything two features share (dates, names, error text, inputs) moves to lib/ or
    // components/. Routes compose features and may import their files; lib/ and components/ import no feature.
    files: ['packages/client/**/*.{ts,tsx}'],
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            boundaries.client,
            ...clientFeatures.map((feature) => ({
              target: `./packages/client/src/features/${feature}/**`,
              from: `./packages/client/src/features/!(${feature})/**`,
              except: [featurePublicFile],
              message: 'Import what another feature exports from its index.ts, or move the shared piece to lib/ or components/',
            })),
            {
              target: ['./packages/client/src/lib/**', './packages/client/src/components/**'],
              from: './packages/client/src/features/**',
              message: 'lib/ and components/ sit below the features and import none of them',
            },
          ],
        },
      ],
    },
  },
);
