import { defineConfig, mergeConfig } from 'vitest/config'
import viteConfig from './vite.config.ts'

// Three projects: pure engine tests, client component tests (happy-dom) and
// API tests against a real MariaDB (scripts/test.sh starts it and sets DATABASE_URL).
export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      projects: [
        { extends: true, test: { name: 'engine', environment: 'node', include: ['tests/engine/**/*.spec.ts'] } },
        {
          extends: true,
          test: {
            name: 'unit',
            environment: 'happy-dom',
            include: ['tests/client/**/*.spec.ts'],
            server: { deps: { inline: ['vuetify'] } },
          },
        },
        {
          extends: true,
          test: {
            name: 'api',
            environment: 'node',
            include: ['tests/server/**/*.spec.ts'],
            fileParallelism: false,
            testTimeout: 30000,
            hookTimeout: 60000,
          },
        },
      ],
    },
  }),
)
