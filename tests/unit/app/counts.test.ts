import { describe, expect, it } from 'vitest'
import { groupThousands } from '../../../shared/text/count'
import { formatCount } from '../../../app/utils/counts'

describe('counts with their thousands grouped', () => {
  // Reference: the runtime's Intl.NumberFormat in British English (ICU's CLDR data), which the pages used before.
  const numbers = [0, 7, 42, 999, 1000, 1234, 20_000, 99_999, 100_000, 250_001, 1_000_000, 12_345_678, 2_147_483_647]

  it('on the pages, as Intl writes them in British English', () => {
    for (const n of numbers) expect(formatCount(n)).toBe(new Intl.NumberFormat('en-GB').format(n))
  })

  it('in messages that quote a limit, with a plain space; a fraction is rounded', () => {
    expect(groupThousands(20_000)).toBe('20 000')
    expect(groupThousands(1_000_001)).toBe('1 000 001')
    expect(groupThousands(999)).toBe('999')
    expect(groupThousands(1234.6, ',')).toBe('1,235')
  })
})
