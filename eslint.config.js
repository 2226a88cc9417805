// ESLint flat config for the whole repository (all workspaces and scripts).
import { builtinModules } from 'node:module';
import js from '@eslint/js';
import { defineConfig, globalIgnores } from 'eslint/config';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** Node built-ins by bare name ("fs", "path", …); "node:*" is caught by a pattern. */
const nodeBuiltins = builtinModules.filter((name) => !name.startsWith('_') && !name.startsWith('node:'));

export default defineConfig([
  globalIgnores([
    '**/dist/',
    '**/node_modules/',
    '**/coverage/',
    '.data/',
    '.screenshots/',
    'test-results/',
    'pwa/dev-dist/',
  ]),

  js.configs.recommended,
  tseslint.configs.recommended,

  {
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
    },
  },

  // Scripts, configs and CLIs run in Node.
  {
    files: ['**/*.{js,mjs,cjs}', '**/*.config.ts', 'physics-core/cli/**', 'physics-core/bench/**', 'sync-server/**', 'db/**', 'scripts/**'],
    languageOptions: { globals: { ...globals.node } },
  },

  // Browser code and its tests; plain scripts the page loads as they are.
  {
    files: ['pwa/public/**/*.js'],
    languageOptions: { globals: { ...globals.browser }, sourceType: 'script' },
  },
  {
    files: ['pwa/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    extends: [reactHooks.configs.flat.recommended],
  },
  {
    // Browser tests and the icon script pass functions to page.evaluate(): they run in the page.
    files: ['pwa/scripts/**', 'scripts/e2e/**'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },

  // Named exports only in TypeScript; tools that load a config file expect a default export.
  {
    files: ['**/*.{ts,tsx,mts,cts}'],
    ignores: ['**/*.config.{ts,mts,cts}'],
    rules: {
      'no-restricted-syntax': [
        'error',
        { selector: 'ExportDefaultDeclaration', message: 'Use named exports (team convention).' },
        { selector: 'ExportSpecifier[exported.name="default"]', message: 'Use named exports (team convention).' },
      ],
    },
  },

  // physics-core/src runs in browsers, workers, Node and the server alike: no Node-only
  // modules, no DOM. Node-only code lives in physics-core/cli and physics-core/bench.
  // Tests beside the code run only under Node and are exempt.
  {
    files: ['physics-core/src/**/*.ts'],
    ignores: ['physics-core/src/**/*.test.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: nodeBuiltins.map((name) => ({
            name,
            message: 'physics-core/src must not use Node built-ins; put Node-only code in physics-core/cli.',
          })),
          patterns: [
            {
              group: ['node:*'],
              message: 'physics-core/src must not use Node built-ins; put Node-only code in physics-core/cli.',
            },
          ],
        },
      ],
      'no-restricted-globals': [
        'error',
        ...['window', 'document', 'localStorage', 'sessionStorage', 'process', 'Buffer', 'require', '__dirname', '__filename'].map(
          (name) => ({ name, message: `physics-core/src must not depend on "${name}" (DOM or Node only).` }),
        ),
      ],
    },
  },
]);
