import { describe, expect, it } from 'vitest'
import { meanCompressibility, type TestCompressibility } from '../../../shared/site-model/compressibility'

const t = (id: string, code: string, cc: number, quality = 'good-to-fair', cv: number | null = 1.2): TestCompressibility => ({ id, stratumCode: code, qualityClass: quality, cc, cr: cc / 10, e0: 2, cv, calpha: 0.034 })

describe('meanCompressibility (arithmetic mean, common practice)', () => {
  it('averages the stratum\'s tests, leaving out very poor samples and reviewer exclusions', () => {
    const tests = [t('a', 'EST', 0.8), t('b', 'EST', 0.9), t('c', 'EST', 0.5, 'very-poor'), t('d', 'EST', 0.6), t('e', 'GLAC', 0.22)]
    const m = meanCompressibility(tests, 'EST', new Set(['d']))!
    expect(m).toEqual({ cc: 0.85, cr: 0.085, e0: 2, cv: 1.2, calpha: 0.034, n: 2, used: ['a', 'b'] })
  })

  it('omits cv when no test measured it, and is null for a stratum without tests', () => {
    expect(meanCompressibility([t('a', 'EST', 0.8, 'poor', null)], 'EST')).toEqual({ cc: 0.8, cr: 0.08, e0: 2, calpha: 0.034, n: 1, used: ['a'] })
    expect(meanCompressibility([t('a', 'EST', 0.8)], 'CRUST')).toBeNull()
  })
})
