import * as d3 from 'd3'
import { describe, expect, it } from 'vitest'
import { displayTicks, fittedLogTicks, fittedTicks, labelWidthPx, ticksOverlap } from '#shared/plots/axes'
import { convert } from '#shared/units'

/** psf per kPa (NIST SP 811, 2008, App. B.8: 1 lbf/ft² = 47.880 26 Pa). */
const PSF_PER_KPA = convert(1, 'stress', 'SI', 'US')

describe('axis ticks that never overlap', () => {
  it('psf per kPa is 20.885 (NIST SP 811, 2008, App. B.8)', () => {
    expect(PSF_PER_KPA).toBeCloseTo(20.885, 3)
  })

  it('a POP track 0–60 kPa, 120 px wide: five plain d3 ticks in psf touch, the fitted ones do not', () => {
    const pop = d3.scaleLinear().domain([0, 60]).range([0, 120])
    // What a fixed count gives: 0, 200, 400 … 1,200 psf, one every 11.5 px — labels 30 px wide overlap.
    const naive = displayTicks(pop, PSF_PER_KPA, 5)
    expect(naive.length).toBeGreaterThan(3)
    expect(ticksOverlap(naive)).toBe(true)
    const fitted = fittedTicks(pop, { factor: PSF_PER_KPA })
    expect(fitted.length).toBeGreaterThanOrEqual(2)
    expect(ticksOverlap(fitted)).toBe(false)
    // Still at round psf values, placed on the SI scale: 500 psf sits at 500 / 20.885 kPa.
    const at500 = fitted.find(t => t.label === '500')
    expect(at500?.at).toBeCloseTo(pop(500 / PSF_PER_KPA), 6)
  })

  it('derives the count from the axis length: a longer axis gets more ticks, none overlapping', () => {
    const short = fittedTicks(d3.scaleLinear().domain([0, 200]).range([0, 150]), { factor: PSF_PER_KPA })
    const long = fittedTicks(d3.scaleLinear().domain([0, 200]).range([0, 900]), { factor: PSF_PER_KPA })
    expect(long.length).toBeGreaterThan(short.length)
    for (const t of [short, long]) expect(ticksOverlap(t)).toBe(false)
  })

  it('stacks depth labels on a vertical axis one font height and a gap apart at least', () => {
    const depth = d3.scaleLinear().domain([0, 30]).range([0, 200]) // 30 m = 98.4 ft over 200 px
    const ticks = fittedTicks(depth, { factor: 1 / 0.3048, orientation: 'vertical', fontPx: 10 })
    expect(ticksOverlap(ticks, { orientation: 'vertical', fontPx: 10 })).toBe(false)
    const gaps = ticks.slice(1).map((t, i) => t.at - ticks[i]!.at)
    expect(Math.min(...gaps)).toBeGreaterThanOrEqual(16)
    expect(ticks.map(t => t.label)).toContain('20')
  })

  it('keeps SI labels as d3 writes them when they fit', () => {
    const s = d3.scaleLinear().domain([0, 400]).range([0, 600])
    expect(fittedTicks(s).map(t => t.label)).toEqual(displayTicks(s, 1, fittedTicks(s).length).map(t => t.label))
  })

  it('thins a log stress axis in psf from 1-2-5 to fewer marks when the plot is narrow', () => {
    const wide = d3.scaleLog().domain([10, 1000]).range([0, 800])
    const narrow = d3.scaleLog().domain([10, 1000]).range([0, 180])
    const w = fittedLogTicks(wide, { factor: PSF_PER_KPA })
    const n = fittedLogTicks(narrow, { factor: PSF_PER_KPA })
    expect(w.map(t => t.label)).toEqual(['500', '1,000', '2,000', '5,000', '10,000', '20,000'])
    expect(n.length).toBeLessThan(w.length)
    expect(ticksOverlap(n)).toBe(false)
  })

  it('estimates a label at 0.6 em a character (common practice for sans-serif digits)', () => {
    expect(labelWidthPx('1,000', 10)).toBe(30)
  })
})
