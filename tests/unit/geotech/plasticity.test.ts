import { describe, expect, it } from 'vitest'
import { expectGeotechError } from '../../helpers/geotech'
import {
  aLine,
  classifyFineGrained,
  isUscsGroupSymbol,
  plasticityIndex,
  uLine,
  USCS_GROUP_SYMBOLS,
} from '../../../shared/geotech/plasticity'


describe('plasticity index and chart lines', () => {
  it('PI = LL − PL (ASTM D4318): 60 − 25 = 35', () => {
    expect(plasticityIndex(60, 25)).toBe(35)
    expect(plasticityIndex(30, 30)).toBe(0)
    expectGeotechError(() => plasticityIndex(30, 35), 'plastic-limit-above-liquid-limit')
    expectGeotechError(() => plasticityIndex(-1, 0), 'atterberg-limit-not-valid')
  })

  it('A-line PI = 0.73(LL − 20) and U-line PI = 0.9(LL − 8) (ASTM D2487, Fig. 4 plasticity chart)', () => {
    expect(aLine(50)).toBeCloseTo(21.9, 12)
    expect(aLine(20)).toBe(0)
    expect(uLine(50)).toBeCloseTo(37.8, 12)
    expect(uLine(16)).toBeCloseTo(7.2, 12)
  })
})

describe('classifyFineGrained — ASTM D2487 plasticity chart (Fig. 4) and fine-grained criteria', () => {
  // Each case: LL, PI, expected group, with the A-line PI at that LL for the reader.
  it.each([
    // Either side of the A-line, LL < 50 (A-line PI = 14.6 at LL = 40)
    [40, 15, 'CL'],
    [40, 14.6, 'CL'], // on the line counts as above
    [40, 14, 'ML'],
    // Either side of the A-line, LL ≥ 50 (A-line PI = 36.5 at LL = 70)
    [70, 37, 'CH'],
    [70, 36, 'MH'],
    // Across the LL = 50 boundary (A-line PI ≈ 21.9 there)
    [49.9, 30, 'CL'],
    [50, 30, 'CH'],
    [49.9, 20, 'ML'],
    [50, 20, 'MH'],
    // The hatched CL-ML zone: 4 ≤ PI ≤ 7 on or above the A-line
    [20, 5, 'CL-ML'],
    [25, 4, 'CL-ML'],
    [25, 7, 'CL-ML'],
    [25, 8, 'CL'],
    [25, 3.9, 'ML'],
    [28, 6, 'CL-ML'], // A-line PI = 5.84
    [28, 5, 'ML'], // below the A-line
    [30, 0, 'ML'], // non-plastic
  ] as const)('LL = %f, PI = %f → %s', (ll, pi, expected) => {
    const out = classifyFineGrained({ liquidLimit: ll, plasticityIndex: pi })
    expect(out.group).toBe(expected)
    expect(out.aLine).toBeCloseTo(0.73 * (ll - 20), 12)
    expect(out.warnings).toEqual([])
  })

  it('takes PI from the plastic limit', () => {
    const out = classifyFineGrained({ liquidLimit: 85, plasticLimit: 30 }) // PI 55, A-line 47.45
    expect(out.group).toBe('CH')
    expect(out.plasticityIndex).toBe(55)
    expect(out.highPlasticity).toBe(true)
  })

  it('gives OL/OH only for organic soil (oven-dried LL / LL < 0.75, ASTM D2487)', () => {
    expect(classifyFineGrained({ liquidLimit: 80, plasticityIndex: 45, ovenDriedLiquidLimit: 56 }).group).toBe('OH') // ratio 0.70
    expect(classifyFineGrained({ liquidLimit: 40, plasticityIndex: 15, ovenDriedLiquidLimit: 29 }).group).toBe('OL') // ratio 0.725
    expect(classifyFineGrained({ liquidLimit: 80, plasticityIndex: 45, ovenDriedLiquidLimit: 60 }).group).toBe('CH') // ratio 0.75, not below
    const described = classifyFineGrained({ liquidLimit: 80, plasticityIndex: 45, organic: true })
    expect(described.group).toBe('OH')
    expect(described.warnings).toHaveLength(1)
    const contradicted = classifyFineGrained({ liquidLimit: 80, plasticityIndex: 45, organic: true, ovenDriedLiquidLimit: 70 })
    expect(contradicted.group).toBe('CH')
    expect(contradicted.warnings[0]).toContain('the ratio decides')
  })

  it('warns for points above the U-line', () => {
    const out = classifyFineGrained({ liquidLimit: 40, plasticityIndex: 30 }) // U-line PI = 28.8
    expect(out.group).toBe('CL')
    expect(out.warnings.some(w => w.includes('U-line'))).toBe(true)
    expect(classifyFineGrained({ liquidLimit: 40, plasticityIndex: 28.8 }).warnings).toEqual([])
  })

  it('rejects impossible or missing limits', () => {
    expectGeotechError(() => classifyFineGrained({ liquidLimit: 30, plasticityIndex: 35 }), 'plasticity-index-above-liquid-limit')
    expectGeotechError(() => classifyFineGrained({ liquidLimit: 30 }), 'plasticity-index-missing')
    expectGeotechError(() => classifyFineGrained({ liquidLimit: 30, plasticLimit: 20, plasticityIndex: 12 }), 'plasticity-index-inconsistent')
    expectGeotechError(() => classifyFineGrained({ liquidLimit: Number.NaN, plasticityIndex: 5 }), 'atterberg-limit-not-valid')
  })
})

describe('USCS group symbols (ASTM D2487)', () => {
  it('lists the 26 symbols of the standard, dual symbols included', () => {
    expect(USCS_GROUP_SYMBOLS).toHaveLength(26)
    expect(new Set(USCS_GROUP_SYMBOLS).size).toBe(26)
    for (const s of ['GW-GC', 'SP-SM', 'CL-ML', 'GC-GM', 'SC-SM', 'PT', 'OH']) expect(isUscsGroupSymbol(s)).toBe(true)
    for (const s of ['CX', 'cl', 'CL/CH', 'ML-CL']) expect(isUscsGroupSymbol(s)).toBe(false)
  })

  it('every group the chart can return is a valid symbol', () => {
    for (let ll = 5; ll <= 120; ll += 5) {
      for (let pi = 0; pi <= Math.min(ll, 80); pi += 2.5) {
        expect(isUscsGroupSymbol(classifyFineGrained({ liquidLimit: ll, plasticityIndex: pi }).group)).toBe(true)
      }
    }
  })
})
