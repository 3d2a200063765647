import { describe, expect, it } from 'vitest'
import { medianRun, type LighthouseRow } from '../../bench/lighthouse-rows'

const run = (performance: number, tbtMs: number, error?: string): LighthouseRow => ({ page: 'stress-model page', performance, accessibility: 100, lcpMs: 2400, tbtMs, cls: 0, load: 0.5, failed: [], ...(error ? { error } : {}) })

describe('a page\'s Lighthouse row from several runs', () => {
  it('is the run with the median score, its figures kept together, with the lowest and highest score beside it', () => {
    const row = medianRun([run(88, 310), run(79, 720), run(93, 150)])
    expect(row.performance).toBe(88)
    expect(row.tbtMs).toBe(310)
    expect(row.range).toEqual([79, 93])
    expect(row.runs).toBe(3)
  })

  it('takes the lower middle run of an even count and sets aside runs without a result', () => {
    const row = medianRun([run(90, 200), run(Number.NaN, Number.NaN, 'NO_FCP'), run(86, 380), run(95, 90), run(92, 160)])
    expect(row.performance).toBe(90)
    expect(row.range).toEqual([86, 95])
    expect(row.runs).toBe(4)
  })

  it('says so when no run gave a result', () => {
    expect(medianRun([run(Number.NaN, Number.NaN, 'NO_FCP')]).error).toBe('NO_FCP')
  })
})
