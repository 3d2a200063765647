// The orphaned-file sweep's settings from the environment: defaults, bounds, and nonsense ignored.
import { describe, expect, it } from 'vitest'
import { DEFAULT_ORPHAN_AGE_MS, sweepSettingsFromEnv } from '../../../server/services/orphan-sweep'

describe('orphaned-file sweep settings', () => {
  it('defaults to an hour of age and a 15-minute interval', () => {
    expect(sweepSettingsFromEnv({})).toEqual({ olderThanMs: 3_600_000, intervalMs: 900_000 })
    expect(DEFAULT_ORPHAN_AGE_MS).toBe(3_600_000)
  })

  it('takes whole milliseconds from the variables', () => {
    expect(sweepSettingsFromEnv({ PASTLOAD_ORPHAN_AGE_MS: '1000', PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS: '300' })).toEqual({ olderThanMs: 1000, intervalMs: 300 })
    expect(sweepSettingsFromEnv({ PASTLOAD_ORPHAN_AGE_MS: '0' }).olderThanMs).toBe(0)
  })

  it('bounds the values: no negative age, no interval under 200 ms or over a day', () => {
    expect(sweepSettingsFromEnv({ PASTLOAD_ORPHAN_AGE_MS: '-5', PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS: '1' })).toEqual({ olderThanMs: 0, intervalMs: 200 })
    expect(sweepSettingsFromEnv({ PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS: '1e12' }).intervalMs).toBe(86_400_000)
  })

  it('ignores values that are not numbers', () => {
    expect(sweepSettingsFromEnv({ PASTLOAD_ORPHAN_AGE_MS: 'soon', PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS: ' ' })).toEqual({ olderThanMs: 3_600_000, intervalMs: 900_000 })
  })
})
