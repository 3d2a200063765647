import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

const root = fileURLToPath(new URL('./', import.meta.url))

// PASTLOAD_TEST_SHUFFLE=<seed> shuffles the api and e2e files and tests with that seed while keeping the
// layers' order (vitest's own --sequence.* flags replace each project's groupOrder): a check that no test
// depends on another's leftovers or on the order of its `it`s.
const shuffleSeed = process.env.PASTLOAD_TEST_SHUFFLE ? Number(process.env.PASTLOAD_TEST_SHUFFLE) : undefined
const shuffle = shuffleSeed !== undefined && Number.isFinite(shuffleSeed) ? { files: true, tests: true } : false

// Three layers (see DEVELOPERS.md): unit (pure engine and utilities, node),
// api (real HTTP against the built server and a real PostgreSQL),
// e2e (Chromium driving real pages). `sequence.groupOrder` makes vitest run them
// one after the other in that order (unit, then api, then e2e), whatever the
// results cache says; without it the three would start together in any order.
export default defineConfig({
  resolve: {
    alias: {
      '#shared': `${root}shared`,
      '~~': root,
    },
  },
  test: {
    sequence: shuffle ? { seed: shuffleSeed } : {},
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 0 },
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 1, shuffle },
          globalSetup: ['tests/setup/global-server.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 120_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 2, shuffle },
          globalSetup: ['tests/setup/global-server.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})
