import fs from 'node:fs';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import importX from 'eslint-plugin-import-x';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const serverDomains = fs.readdirSync(new URL('./packages/server/src/modules', import.meta.url));
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
    // A server module reaches another domain through its service, never its model.
    files: ['packages/server/src/modules/**/*.ts'],
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            boundaries.server,
            ...serverDomains.map((domain) => ({
              target: `./packages/server/src/modules/!(${domain})/**/!(*.model).ts`,
              from: `./packages/server/src/modules/${domain}/**/*.model.ts`,
              message: `Reach the ${domain} domain through its service, not its model`,
            })),
          ],
        },
      ],
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
