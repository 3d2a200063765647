import { describe, expect, it } from 'vitest'
import { checkIntervals } from '../../../shared/investigation/intervals'

// Rules of a borehole log (common practice): no overlaps, nothing below the final depth, gaps allowed.
describe('checkIntervals', () => {
  it('accepts a continuous log to the final depth with no gaps', () => {
    const r = checkIntervals([{ top: 0, bottom: 1.2 }, { top: 1.2, bottom: 3.4 }, { top: 3.4, bottom: 15 }], 15)
    expect(r).toEqual({ issues: [], gaps: [] })
  })

  it('reports gaps between intervals and below the last one, without calling them errors', () => {
    const r = checkIntervals([{ top: 0, bottom: 1.2 }, { top: 2, bottom: 3 }], 5)
    expect(r.issues).toEqual([])
    expect(r.gaps).toEqual([{ top: 1.2, bottom: 2 }, { top: 3, bottom: 5 }])
  })

  it('reports an overlap on the later interval, naming the one it overlaps', () => {
    const r = checkIntervals([{ top: 0, bottom: 2 }, { top: 1.5, bottom: 3 }], 5)
    expect(r.issues).toEqual([{ index: 1, field: 'top', message: 'Overlaps the interval 0–2 m (row 1).' }])
  })

  it('finds overlaps whatever order the rows come in', () => {
    const r = checkIntervals([{ top: 3, bottom: 4 }, { top: 0, bottom: 3.5 }], 5)
    expect(r.issues.map(i => i.index)).toEqual([0])
  })

  it('reports an interval below the final depth', () => {
    const r = checkIntervals([{ top: 20, bottom: 23 }], 22)
    expect(r.issues).toEqual([{ index: 0, field: 'bottom', message: 'Bottom (23 m) is below the hole\'s final depth (22 m).' }])
  })

  it('reports a bottom above the top and a negative top', () => {
    const r = checkIntervals([{ top: 2, bottom: 1 }, { top: -1, bottom: 0.5 }], 5)
    expect(r.issues.map(i => [i.index, i.field])).toEqual([[0, 'bottom'], [1, 'top']])
  })

  it('treats touching intervals within 0.1 mm as continuous', () => {
    const r = checkIntervals([{ top: 0, bottom: 0.1 + 0.2 }, { top: 0.3, bottom: 1 }], 1)
    expect(r).toEqual({ issues: [], gaps: [] })
  })

  it('words its depths in the unit given (a US project: feet)', () => {
    const ft = { number: (m: number) => (m / 0.3048).toFixed(2), unit: 'ft' }
    const r = checkIntervals([{ top: 0, bottom: 3.048 }, { top: 1.524, bottom: 6.096 }], 4.572, ft)
    expect(r.issues.map(i => i.message)).toEqual([
      "Bottom (20.00 ft) is below the hole's final depth (15.00 ft).",
      'Overlaps the interval 0.00–10.00 ft (row 1).',
    ])
  })
})
