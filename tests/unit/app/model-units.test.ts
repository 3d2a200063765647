import { describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useModelUnits } from '../../../app/composables/useModelUnits'

// 1 ft = 0.3048 m and 1 lbf = 4.448 221 615 260 5 N exactly (NIST SP 811, 2008, App. B.8), so
// 1 psf = 47.880 26 Pa and 1 tsf = 2000 psf = 95.760 52 kPa.
describe('numbers with units at the edge (useModelUnits / useProjectUnits)', () => {
  it('writes a length in m or ft: BH-01\'s 30.0 m final depth is 98.43 ft', () => {
    expect(useModelUnits('SI').format(30, 'length')).toBe('30.00 m')
    expect(useModelUnits('US').format(30, 'length')).toBe('98.43 ft')
    expect(useModelUnits('US').heading('Depth', 'length')).toBe('Depth (ft)')
  })

  it('shows US stresses in psf (whole numbers) or tsf (two decimals), as the project chose', () => {
    expect(useModelUnits('US').format(47.88026, 'stress')).toBe('1000 psf')
    expect(useModelUnits('US', 'psf').label('stress')).toBe('psf')
    const tsf = useModelUnits('US', 'tsf')
    expect(tsf.format(95.76052, 'stress')).toBe('1.00 tsf')
    expect(tsf.heading('σ\'p', 'stress')).toBe('σ\'p (tsf)')
    expect(tsf.read(1, 'stress')).toBeCloseTo(95.76052, 4)
    // The stress unit never applies to an SI project.
    expect(useModelUnits('SI', 'tsf').format(95.76, 'stress')).toBe('95.8 kPa')
  })

  it('converts other quantities: 18 kN/m³ is 114.6 pcf, 1 m²/yr is 10.76 ft²/yr', () => {
    const us = useModelUnits('US')
    expect(us.format(18, 'unitWeight')).toBe('114.6 pcf')
    expect(us.format(1, 'coefficientOfConsolidation')).toBe('10.76 ft²/yr')
  })

  it('reads typed values back to SI and follows a change of the project\'s choice', () => {
    const system = ref<'SI' | 'US'>('SI')
    const stress = ref<'psf' | 'tsf'>('psf')
    const u = useModelUnits(system, stress)
    expect(u.read(100, 'length')).toBe(100)
    system.value = 'US'
    expect(u.read(100, 'length')).toBeCloseTo(30.48, 10)
    stress.value = 'tsf'
    expect(u.label('stress')).toBe('tsf')
    expect(u.format(null, 'stress')).toBe('—')
    expect(u.number(undefined, 'length')).toBe('—')
  })
})
