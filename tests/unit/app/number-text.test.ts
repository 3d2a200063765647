import seedrandom from 'seedrandom'
import { describe, expect, it } from 'vitest'
import { groupedNumber } from '../../../shared/number-text'

describe('groupedNumber writes what toLocaleString(\'en-GB\') writes', () => {
  it('for whole numbers, one to three decimals, negatives and the edge cases', () => {
    const rnd = seedrandom('grouped') // seeded: the same values on every run
    const values = [0, -0, 1, -1, 12, 999, 1000, -1000, 1234.5, 12345.67, 1_000_000, 123_456_789.123, 0.1, 0.5, -0.25, 1e15, 1e21, 1.23456, 2 ** 53, Number.NaN, Infinity, -Infinity, 1e-7, 0.1 + 0.2]
    for (let k = 0; k < 2000; k++) {
      const scale = 10 ** Math.floor(rnd() * 10)
      const decimals = Math.floor(rnd() * 5)
      const v = Math.round((rnd() - 0.3) * scale * 10 ** decimals) / 10 ** decimals
      values.push(v)
    }
    const differ = values.filter(v => groupedNumber(v) !== v.toLocaleString('en-GB')).map(v => `${v}: ${groupedNumber(v)} ≠ ${v.toLocaleString('en-GB')}`)
    expect(differ).toEqual([])
    expect(groupedNumber(1234567.5)).toBe('1,234,567.5')
  })
})
