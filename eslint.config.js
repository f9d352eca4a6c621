import pluginVue from 'eslint-plugin-vue'
import { defineConfigWithVueTs, vueTsConfigs } from '@vue/eslint-config-typescript'
import { importX } from 'eslint-plugin-import-x'
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript'

// Node's own modules, by bare and node: name: the engine and the shared code use none of them.
const NODE_IO = ['node:*', 'fs', 'fs/*', 'path', 'os', 'net', 'http', 'https', 'child_process', 'worker_threads', 'stream', 'crypto']

export default defineConfigWithVueTs(
  { ignores: ['dist/**', 'dist-server/**', 'dist-server.*/**', '.tmp/**', 'node_modules/**', 'screenshots/**', '.data/**', 'coverage/**'] },
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
    files: ['src/**/*.{ts,vue}', 'shared/**/*.ts', 'server/**/*.ts', 'scripts/**/*.ts'],
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: ['tsconfig.json', 'tsconfig.server.json'], noWarnOnMultipleProjects: true })],
      'import-x/extensions': ['.ts', '.vue', '.js', '.mjs'],
      // Single-file components are not followed (their template is not TypeScript); .ts modules are.
      'import-x/ignore': ['\\.vue$'],
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
