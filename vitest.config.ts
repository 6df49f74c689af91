import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

const root = fileURLToPath(new URL('./', import.meta.url))
// Plain unit tests resolve the same aliases Nuxt gives the app, so shared/ and
// server/utils/ modules can use `#shared/...` and `~~/...` imports.
const alias = {
  '#shared': `${root}shared`,
  '~~': root.replace(/\/$/, ''),
}

export default defineConfig({
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      await defineVitestProject({
        test: {
          name: 'components',
          include: ['tests/components/**/*.test.ts'],
          environment: 'nuxt',
          // Booting the Nuxt environment can take well over vitest's 10 s default
          // on a busy 2-core CI machine; these are start-up limits, not assertions.
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      }),
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/api/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        // performance runs (npm run perf:*): never part of npm test
        resolve: { alias },
        test: {
          name: 'perf',
          include: ['tests/perf/**/*.run.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 900_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})
