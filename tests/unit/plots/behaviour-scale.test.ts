import { describe, expect, it } from 'vitest'
import { BEHAVIOUR_BANDS, behaviourRuns, behaviourStyle } from '../../../shared/plots/behaviour-scale'

describe('Pastload\'s Ic colour scale', () => {
  it('labels six bands by the published Ic ranges, each with its own colour', () => {
    expect(BEHAVIOUR_BANDS.map(b => b.range)).toEqual(['< 1.31', '1.31–2.05', '2.05–2.60', '2.60–2.95', '2.95–3.60', '> 3.60'])
    expect(new Set(BEHAVIOUR_BANDS.map(b => b.colour)).size).toBe(6)
    expect(BEHAVIOUR_BANDS.filter(b => b.clayLike).map(b => b.band)).toEqual([3, 4, 5])
    expect(behaviourStyle(3.1)?.words).toBe('clay-like')
    expect(behaviourStyle(Number.NaN)).toBeNull()
  })

  it('joins rows of one band into runs that meet halfway between rows, and breaks at gaps', () => {
    const runs = behaviourRuns([1, 1.1, 1.2, 1.3, 1.4, 3, 3.1], [3.1, 3.2, 1.8, 1.9, null, 3.7, 3.8])
    expect(runs).toHaveLength(3)
    expect(runs[0]!.band).toBe(4)
    expect(runs[0]!.top).toBe(1)
    expect(runs[0]!.bottom).toBeCloseTo(1.15, 12)
    expect(runs[1]!.band).toBe(1)
    expect(runs[1]!.top).toBeCloseTo(1.15, 12)
    expect(runs[1]!.bottom).toBeCloseTo(1.35, 12)
    expect(runs[2]).toMatchObject({ band: 5, top: 3 })
    expect(runs[2]!.bottom).toBeCloseTo(3.1, 12)
  })
})
