import { describe, expect, it } from 'vitest'
import { strongestVerdict } from '../../../shared/review/flags'

describe('strongestVerdict: the verdict a marker shows for several open flags', () => {
  it('ranks an exclusion over a question over an acceptance, whatever the order', () => {
    expect(strongestVerdict(['accepted', 'questionable', 'exclude'])).toBe('exclude')
    expect(strongestVerdict(['accepted', 'questionable'])).toBe('questionable')
    expect(strongestVerdict(['questionable', 'accepted'])).toBe('questionable')
    expect(strongestVerdict(['accepted'])).toBe('accepted')
  })

  it('is null without flags', () => {
    expect(strongestVerdict([])).toBeNull()
  })
})
