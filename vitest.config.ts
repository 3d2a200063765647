import { fileURLToPath } from 'node:url'
import seedrandom from 'seedrandom'
import { defineConfig } from 'vitest/config'
import { BaseSequencer, type TestSpecification } from 'vitest/node'

const root = fileURLToPath(new URL('./', import.meta.url))

// PASTLOAD_TEST_SHUFFLE=<seed> shuffles the files of each layer and the tests of the api and e2e files with
// that seed while keeping the layers' order (vitest's own random file order and its --sequence.* flags ignore
// or replace each project's groupOrder): a check that no test depends on another's leftovers or on the order
// of its `it`s.
const shuffleSeed = process.env.PASTLOAD_TEST_SHUFFLE ? Number(process.env.PASTLOAD_TEST_SHUFFLE) : undefined
const shuffle = shuffleSeed !== undefined && Number.isFinite(shuffleSeed)

class LayeredShuffle extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const random = seedrandom(String(shuffleSeed))
    const keyed = [...files].sort((a, b) => a.moduleId.localeCompare(b.moduleId)).map(spec => ({ spec, key: random() }))
    keyed.sort((a, b) => (a.spec.project.config.sequence.groupOrder - b.spec.project.config.sequence.groupOrder) || (a.key - b.key))
    return keyed.map(k => k.spec)
  }
}

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
    sequence: shuffle ? { seed: shuffleSeed, sequencer: LayeredShuffle } : {},
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
