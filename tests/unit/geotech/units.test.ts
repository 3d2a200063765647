import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { create, createUnitDependencies, unitDependencies } from 'mathjs'
import { POUND_FORCE_N, QUANTITIES, UNIT_LABELS, US_TO_SI, conversionFactor, convert, displayDigits, formatQuantity, unitLabel } from '../../../shared/units/index'

/*
 * Conversion factors from NIST Special Publication 811 (2008), Appendix B:
 * ft = 3.048 E−01 m (exact); ft² = 9.290 304 E−02 m² (exact);
 * lbf/ft² = 4.788 026 E+01 Pa; ton-force (2000 lbf) = 8.896 443 E+03 N, so
 * tsf = 9.576 05 E+04 Pa; lb/ft³ = 1.601 846 E+01 kg/m³, times standard gravity
 * 9.806 65 m/s² gives pcf = 1.570 87 E+02 N/m³ (table rows recalled: memory).
 */

function relative(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b)
}

describe('convert: US customary → SI', () => {
  it('1 ft = 0.3048 m exactly (NIST SP 811, 2008, App. B)', () => {
    expect(convert(1, 'length', 'US', 'SI')).toBe(0.3048)
    expect(convert(10, 'length', 'US', 'SI')).toBeCloseTo(3.048, 14)
  })

  it('1 psf = 0.04788026 kPa (NIST SP 811, 2008, App. B)', () => {
    expect(relative(convert(1, 'stress', 'US', 'SI'), 0.04788026)).toBeLessThan(1e-7)
  })

  it('1 tsf (2000 lbf/ft²) = 95.7605 kPa (NIST SP 811, 2008, App. B)', () => {
    expect(relative(convert(1, 'stress', 'US', 'SI', { usStress: 'tsf' }), 95.7605)).toBeLessThan(1e-6)
    expect(convert(1, 'stress', 'US', 'SI', { usStress: 'tsf' }) / convert(1, 'stress', 'US', 'SI')).toBeCloseTo(2000, 9)
  })

  it('1 pcf (lbf/ft³) = 0.157087 kN/m³ (NIST SP 811, 2008, App. B)', () => {
    expect(relative(convert(1, 'unitWeight', 'US', 'SI'), 0.157087)).toBeLessThan(5e-6)
    // γw: 9.81 kN/m³ ≈ 62.4 pcf (common practice).
    expect(convert(9.81, 'unitWeight', 'SI', 'US')).toBeCloseTo(62.45, 2)
  })

  it('1 ft²/yr = 0.09290304 m²/yr exactly (NIST SP 811, 2008, App. B)', () => {
    expect(convert(1, 'coefficientOfConsolidation', 'US', 'SI')).toBeCloseTo(0.09290304, 15)
  })

  it('120 kPa of fill is 2506 psf and 1.253 tsf (hand calc from the factors above)', () => {
    expect(convert(120, 'stress', 'SI', 'US')).toBeCloseTo(120 / 0.04788026, 3)
    expect(convert(120, 'stress', 'SI', 'US')).toBeCloseTo(2506.25, 1)
    expect(convert(120, 'stress', 'SI', 'US', { usStress: 'tsf' })).toBeCloseTo(1.2531, 4)
  })
})

describe('convert: round trips and identity', () => {
  it('SI → US → SI returns the value (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...QUANTITIES),
        fc.constantFrom('psf' as const, 'tsf' as const),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        (quantity, usStress, value) => {
          const back = convert(convert(value, quantity, 'SI', 'US', { usStress }), quantity, 'US', 'SI', { usStress })
          expect(Math.abs(back - value)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(value)))
        },
      ),
    )
  })

  it('same system is the identity', () => {
    expect(convert(12.5, 'stress', 'SI', 'SI')).toBe(12.5)
    expect(convert(12.5, 'length', 'US', 'US')).toBe(12.5)
    expect(conversionFactor('unitWeight', 'SI', 'SI')).toBe(1)
  })

  it('conversionFactor is the inverse the other way', () => {
    for (const q of QUANTITIES) {
      expect(conversionFactor(q, 'US', 'SI') * conversionFactor(q, 'SI', 'US')).toBeCloseTo(1, 14)
    }
  })

  it('rejects unknown systems and quantities', () => {
    expect(() => convert(1, 'length', 'SI', 'metric' as 'US')).toThrow(RangeError)
    expect(() => convert(1, 'pressure' as 'stress', 'SI', 'US')).toThrow(RangeError)
  })
})

describe('unit labels', () => {
  it('per system, with psf or tsf for US stress', () => {
    expect(UNIT_LABELS.SI).toEqual({ length: 'm', unitWeight: 'kN/m³', stress: 'kPa', coefficientOfConsolidation: 'm²/yr' })
    expect(UNIT_LABELS.US).toEqual({ length: 'ft', unitWeight: 'pcf', stress: 'psf', coefficientOfConsolidation: 'ft²/yr' })
    expect(unitLabel('stress', 'US', { usStress: 'tsf' })).toBe('tsf')
    expect(unitLabel('stress', 'SI', { usStress: 'tsf' })).toBe('kPa')
  })
})

describe('the exact factors agree with mathjs unit definitions', () => {
  // mathjs defines ft = 0.3048 m, lbm = 0.45359237 kg and lbf = 4.4482216152605 N (exact, NIST SP 811, 2008,
  // App. B.8); the product's factors are built from the same definitions, so they agree to a few ulp.
  const math = create({ ...unitDependencies, ...createUnitDependencies })
  math.createUnit('psf', '1 lbf/ft^2')
  math.createUnit('pcf', '1 lbf/ft^3')
  math.createUnit('tsf', '2000 lbf/ft^2')
  const cases: Array<[keyof typeof US_TO_SI, string, string]> = [
    ['length', 'ft', 'm'],
    ['unitWeight', 'pcf', 'kN/m^3'],
    ['stress', 'psf', 'kPa'],
    ['stressTsf', 'tsf', 'kPa'],
    ['coefficientOfConsolidation', 'ft^2/year', 'm^2/year'],
  ]
  for (const [key, us, si] of cases) {
    it(`1 ${us} in ${si}`, () => {
      expect(relative(US_TO_SI[key], math.unit(1, us).toNumber(si))).toBeLessThan(4e-16)
    })
  }

  it('1 lbf = 4.4482216152605 N exactly (NIST SP 811, 2008, App. B.8)', () => {
    expect(POUND_FORCE_N).toBeCloseTo(4.4482216152605, 13)
    expect(math.unit(1, 'lbf').toNumber('N')).toBeCloseTo(POUND_FORCE_N, 13)
  })
})

// The one formatter of numbers with units, for pages, files and reports (1 ft = 0.3048 m, 1 psf = 0.047880 kPa,
// 1 tsf = 2000 psf, NIST SP 811, 2008, App. B.8).
describe('formatQuantity and displayDigits', () => {
  it('writes BH-01\'s 30.0 m final depth as 98.43 ft, and stresses in psf whole or tsf to 0.01', () => {
    expect(formatQuantity(30, 'length', 'SI')).toBe('30.00 m')
    expect(formatQuantity(30, 'length', 'US')).toBe('98.43 ft')
    expect(formatQuantity(47.88026, 'stress', 'US')).toBe('1000 psf')
    expect(formatQuantity(95.76052, 'stress', 'US', { usStress: 'tsf' })).toBe('1.00 tsf')
    expect(formatQuantity(100, 'stress', 'SI', { usStress: 'tsf' })).toBe('100.0 kPa')
    expect(formatQuantity(18, 'unitWeight', 'US', {}, 0)).toBe('115 pcf')
    expect(formatQuantity(null, 'length', 'US')).toBe('—')
    expect(formatQuantity(Number.NaN, 'length', 'US')).toBe('—')
  })

  it('gives tsf two decimals where psf has none', () => {
    expect(displayDigits('stress', 'US')).toBe(0)
    expect(displayDigits('stress', 'US', { usStress: 'tsf' })).toBe(2)
    expect(displayDigits('stress', 'SI', { usStress: 'tsf' })).toBe(1)
    expect(displayDigits('length', 'US')).toBe(2)
  })
})

