import { fileURLToPath } from 'node:url'
import seedrandom from 'seedrandom'
import { defineConfig } from 'vitest/config'
import { BaseSequencer, type TestSpecification } from 'vitest/node'

const root = fileURLToPath(new URL('./', import.meta.url))

// PASTLOAD_TEST_SHUFFLE=<seed> turns on a seeded shuffle: `LayeredShuffle` orders the files by their project's
// `sequence.groupOrder` first (the layers stay unit → api → e2e) and by a seeded random key within a layer, and the
// api and e2e projects also shuffle the tests inside each file (`sequence.shuffle` with the same seed). One seed
// gives one order, so a failing order can be replayed. It checks that no test depends on another's leftovers or on
// the order of its `it`s.
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

// Three layers (see DEVELOPERS.md), always in this order: unit (pure engine and utilities, node), then api (real
// HTTP against the built server and a real PostgreSQL), then e2e (Chromium driving real pages). Each project's
// `sequence.groupOrder` (0, 1, 2) puts it in its own group, and vitest runs the groups one after the other in
// ascending order; without a shuffle seed the files within a layer keep vitest's default order.
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
