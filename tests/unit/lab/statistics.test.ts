import { describe, expect, it } from 'vitest'
import { median } from '../../../shared/lab/statistics'

describe('median of lab results', () => {
  it('takes the middle value of an odd count and the mean of the middle two of an even count, in any order', () => {
    expect(median([3, 1, 2])).toBe(2)
    expect(median([4, 1, 3, 2])).toBe(2.5)
    expect(median([22])).toBe(22)
  })

  it('is null for no values', () => {
    expect(median([])).toBeNull()
  })
})
