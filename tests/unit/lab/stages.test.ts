// Stage conventions of the oedometer entry: conversions checked by hand from the constant solids
// height of 1-D compression, Hs = H0/(1 + e0) (common practice; any soil-mechanics text).
import { describe, expect, it } from 'vitest'
import { GeotechError } from '../../../shared/geotech/errors'
import {
  convertStages,
  degreeOfSaturation,
  e0FromWaterContent,
  fromVoidRatio,
  specimenHeightAt,
  strainPercent,
  toVoidRatio,
} from '../../../shared/lab/stages'
import { parseCell, parseReadingsPaste, parseStagePaste } from '../../../shared/lab/paste'

const BASIS = { e0: 2.1, specimenHeight: 20 }

describe('stage conventions', () => {
  it('void ratio passes through unchanged', () => {
    expect(toVoidRatio('void-ratio', 1.734, BASIS)).toBe(1.734)
  })

  it('dial: worked by hand, H0 = 20 mm, e0 = 2.10, Δh = 1.55 mm', () => {
    // Hs = 20/3.10 = 6.4516 mm; H = 20 − 1.55 = 18.45 mm; e = 18.45/6.4516 − 1 = 1.85975.
    // The same from e = e0 − (1 + e0)·Δh/H0 = 2.10 − 3.10 × 0.0775 = 1.85975.
    expect(toVoidRatio('dial', 1.55, BASIS)).toBeCloseTo(1.85975, 10)
    expect(18.45 / (20 / 3.1) - 1).toBeCloseTo(1.85975, 10)
  })

  it('dial: a 19.05 mm ring (0.75 in), e0 = 1.10, Δh = 0.762 mm (0.03 in) gives e = 1.016', () => {
    // Δh/H0 = 0.04 exactly, (1 + e0)·0.04 = 0.084 (hand calculation).
    expect(toVoidRatio('dial', 0.762, { e0: 1.1, specimenHeight: 19.05 })).toBeCloseTo(1.016, 10)
  })

  it('strain: ε = 7.75 % on e0 = 2.10 is the same state as Δh = 1.55 mm of 20 mm', () => {
    expect(toVoidRatio('strain', 7.75, BASIS)).toBeCloseTo(1.85975, 10)
    expect(strainPercent(1.85975, 2.1)).toBeCloseTo(7.75, 10)
  })

  it('from and to void ratio are inverses in every convention', () => {
    for (const convention of ['void-ratio', 'strain', 'dial'] as const) {
      for (const e of [2.1, 1.9, 1.2, 0.4]) {
        expect(toVoidRatio(convention, fromVoidRatio(convention, e, BASIS), BASIS)).toBeCloseTo(e, 12)
      }
    }
  })

  it('specimen height follows the void ratio at constant solids height', () => {
    expect(specimenHeightAt(2.1, BASIS)).toBeCloseTo(20, 12)
    expect(specimenHeightAt(1.85975, BASIS)).toBeCloseTo(18.45, 10)
  })

  it('e0 of a saturated specimen is Gs·w/100; S comes back as 1', () => {
    // Gs = 2.66, w = 79 %: e0 = 2.1014 (S·e = w·Gs with S = 1).
    expect(e0FromWaterContent(2.66, 79)).toBeCloseTo(2.1014, 10)
    expect(degreeOfSaturation(2.66, 79, 2.1014)).toBeCloseTo(1, 10)
    expect(degreeOfSaturation(2.66, 79, 2.2)).toBeCloseTo(0.955182, 5)
    expect(() => e0FromWaterContent(2.66, 0)).toThrow(GeotechError)
  })

  it('converts a whole test in order, keeping what was entered and the time readings', () => {
    const stages = convertStages('dial', [
      { stress: 10, value: 0.2 },
      { stress: 20, value: 0.5, readings: [{ minutes: 0, dial: 0.2 }, { minutes: 1, dial: 0.4 }] },
    ], BASIS)
    expect(stages.map(s => s.entered)).toEqual([0.2, 0.5])
    expect(stages[0]!.voidRatio).toBeCloseTo(2.1 - 3.1 * 0.01, 12)
    expect(stages[1]!.voidRatio).toBeCloseTo(2.1 - 3.1 * 0.025, 12)
    expect(stages[1]!.readings).toHaveLength(2)
    expect(stages[0]!.readings).toBeUndefined()
  })

  it('refuses a compression that would close the pores, naming the stage', () => {
    // Δh/H0 = 15/20 = 0.75 > e0/(1 + e0) = 0.677: e < 0.
    expect(() => convertStages('dial', [{ stress: 10, value: 1 }, { stress: 20, value: 15 }], BASIS)).toThrow(/Stage 2: a compression of 15 mm/)
    expect(() => convertStages('strain', [{ stress: 10, value: 70 }], BASIS)).toThrow(/Stage 1/)
    expect(() => convertStages('void-ratio', [{ stress: 0, value: 1 }], BASIS)).toThrow(/effective stress must be a positive/)
    expect(() => convertStages('void-ratio', [{ stress: 5, value: 1, readings: [{ minutes: 2, dial: 1 }, { minutes: 1, dial: 1.1 }] }], BASIS)).toThrow(/does not increase/)
  })
})

describe('pasting from a spreadsheet', () => {
  it('reads tab-separated σ\', value rows, skipping a header, with decimal commas', () => {
    const text = 'Stress (kPa)\tVoid ratio\n5\t2,083\n10\t2.071\r\n\n20\t2.052\n'
    const out = parseStagePaste(text)
    expect(out.skipped).toBe(1)
    expect(out.issues).toEqual([])
    expect(out.stages).toEqual([{ stress: 5, value: 2.083 }, { stress: 10, value: 2.071 }, { stress: 20, value: 2.052 }])
  })

  it('reports rows it cannot read with their line number', () => {
    const out = parseStagePaste('5\t2.08\n10\tx\n20\n')
    expect(out.stages).toHaveLength(1)
    expect(out.issues.map(i => i.line)).toEqual([2, 3])
    expect(out.issues[0]!.message).toContain('"x" is not a number')
  })

  it('accepts space- or semicolon-separated rows', () => {
    expect(parseStagePaste('5 2.08\n10  2.07').stages).toEqual([{ stress: 5, value: 2.08 }, { stress: 10, value: 2.07 }])
    expect(parseStagePaste('5;2,08').stages).toEqual([{ stress: 5, value: 2.08 }])
  })

  it('reads a cell the spreadsheet quoted without its quotes', () => {
    expect(parseStagePaste('"5"\t"2,08"\n10\t"2.07"').stages).toEqual([{ stress: 5, value: 2.08 }, { stress: 10, value: 2.07 }])
  })

  it('reads cells strictly', () => {
    expect(parseCell(' 1,5 ')).toBe(1.5)
    expect(parseCell('1e3')).toBe(1000)
    expect(parseCell('12abc')).toBeNaN()
    expect(parseCell('')).toBeNaN()
  })

  it('groups time readings by stage number', () => {
    const out = parseReadingsPaste('Stage\tmin\tmm\n2\t0\t0.50\n2\t0.1\t0.52\n3\t0\t0.9\n9\t1\t1', 3)
    expect([...out.readings.keys()]).toEqual([1, 2])
    expect(out.readings.get(1)).toEqual([{ minutes: 0, dial: 0.5 }, { minutes: 0.1, dial: 0.52 }])
    expect(out.issues).toHaveLength(1)
    expect(out.issues[0]!.message).toContain('stage 9')
  })
})
