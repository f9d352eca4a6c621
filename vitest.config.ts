import { defineConfig, mergeConfig } from 'vitest/config'
import viteConfig from './vite.config.ts'

// Four projects: pure engine tests, client component tests (happy-dom), API tests against a
// real MariaDB and browser tests (scripts/test.sh starts the database and server, sets the URLs).
export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      projects: [
        {
          extends: true,
          test: {
            name: 'engine',
            environment: 'node',
            include: ['tests/engine/**/*.spec.ts', 'tests/shared/**/*.spec.ts'],
            testTimeout: 60000,
          },
        },
        {
          extends: true,
          test: {
            name: 'unit',
            environment: 'happy-dom',
            include: ['tests/client/**/*.spec.ts'],
            // The first test of a file loads Vuetify and the units library; on a busy 2-core machine
            // that alone can pass vitest's 5 s default. A generous limit is not a timing check.
            testTimeout: 30000,
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
            globalSetup: ['tests/server/global-setup.ts'],
            testTimeout: 30000,
            hookTimeout: 60000,
          },
        },
        {
          extends: true,
          test: {
            name: 'e2e',
            environment: 'node',
            include: ['tests/e2e/**/*.e2e.spec.ts'],
            fileParallelism: false,
            testTimeout: 120000,
            hookTimeout: 60000,
          },
        },
      ],
    },
  }),
)
