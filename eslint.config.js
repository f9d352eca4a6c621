import pluginVue from 'eslint-plugin-vue'
import { defineConfigWithVueTs, vueTsConfigs } from '@vue/eslint-config-typescript'

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
    // The engine stays pure: no web framework, database, UI or Node I/O.
    files: ['server/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['express', 'sequelize', 'vue', 'node:*', 'fs', 'path', '**/db/**', '**/routes/**', '**/services/**'] }],
    },
  },
  {
    // Code shared by client and server imports only zod, mathjs and itself.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['express', 'sequelize', 'vue', 'node:*', '**/server/**', '**/src/**'] }],
    },
  },
)
