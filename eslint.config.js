import pluginVue from 'eslint-plugin-vue'
import { defineConfigWithVueTs, vueTsConfigs } from '@vue/eslint-config-typescript'
import { importX } from 'eslint-plugin-import-x'
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript'
import tsParser from '@typescript-eslint/parser'

// Node's own modules, by bare and node: name: the engine and the shared code use none of them.
const NODE_IO = ['node:*', 'fs', 'fs/*', 'path', 'os', 'net', 'http', 'https', 'child_process', 'worker_threads', 'stream', 'crypto']

export default defineConfigWithVueTs(
  { ignores: ['tests/lint-fixtures/**', 'dist/**', 'dist-server/**', 'dist-server.*/**', '.tmp/**', 'node_modules/**', 'screenshots/**', '.data/**', 'coverage/**'] },
  pluginVue.configs['flat/essential'],
  vueTsConfigs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/multi-word-component-names': 'off',
    },
  },
  {
    // No import cycles anywhere in the product (client, shared code, server, engine, command lines).
    // tests/lint-fixtures/ is ignored by `npm run lint`; tests/shared/lint-boundaries.spec.ts lints it on purpose.
    files: ['src/**/*.{ts,vue}', 'shared/**/*.ts', 'server/**/*.ts', 'scripts/**/*.ts', 'tests/lint-fixtures/**/*.{ts,vue}'],
    plugins: { 'import-x': importX },
    // import-x parses a .vue dependency with the importing file's parser options: name the
    // TypeScript parser for the SFC's <script lang="ts"> (the TypeScript parser itself ignores it).
    languageOptions: { parserOptions: { parser: tsParser } },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: ['tsconfig.json', 'tsconfig.server.json'], noWarnOnMultipleProjects: true })],
      'import-x/extensions': ['.ts', '.vue', '.js', '.mjs'],
      // Single-file components are followed too: their <script> is read with the Vue SFC parser
      // (TypeScript inside), so a cycle through a .vue file is found like any other.
      'import-x/parsers': { 'vue-eslint-parser': ['.vue'], '@typescript-eslint/parser': ['.ts', '.mts'] },
    },
    rules: {
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
    },
  },
  {
    // The client never reaches into the server; it shares only shared/.
    files: ['src/**/*.{ts,vue}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/server/**', 'server/*'], message: 'The client imports only shared/ code, never the server.' }] }],
    },
  },
  {
    // Services hold use cases; the HTTP layer (middleware, routes) sits above them, never below.
    files: ['server/services/**/*.ts', 'server/db/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [
        { group: ['**/middleware/**'], message: 'Services never import middleware: move the helper to server/errors.ts or a service.' },
        { group: ['**/routes/**', 'express'], message: 'Services never import routes or Express.' },
      ] }],
    },
  },
  {
    // Routes parse, call one service and shape the answer: models are reached through services only.
    files: ['server/routes/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/db/**', 'sequelize'], message: 'Routes reach the database through a service.' }] }],
    },
  },
  {
    // The engine stays pure: no web framework, database, UI or Node I/O.
    files: ['server/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['express', 'sequelize', 'vue', ...NODE_IO, '**/db/**', '**/routes/**', '**/services/**', '**/middleware/**', '**/cli/**'] }],
    },
  },
  {
    // Code shared by client and server imports only zod, mathjs and itself.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['express', 'sequelize', 'vue', ...NODE_IO, '**/server/**', '**/src/**'] }],
    },
  },
)
