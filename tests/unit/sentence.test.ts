import { describe, expect, it } from 'vitest'
import { fitTrend } from '../../shared/geotech/trends'
import { startSentence } from '../../shared/sentence'

describe('startSentence', () => {
  it('capitalises a plain first word', () => {
    expect(startSentence('constant POP fits best')).toBe('Constant POP fits best')
    expect(startSentence('crust over constant σ\'p')).toBe('Crust over constant σ\'p')
    expect(startSentence('a trend')).toBe('A trend')
  })

  it.each([
    ['σ\'p linear in depth fits best'],
    ['e0 from the tests'],
    ['cv from t90'],
    ['su/0.22'],
    ['γ of the fill'],
    [''],
  ])('leaves “%s” as written (a symbol of the trade: its case is its meaning)', (text) => {
    expect(startSentence(text)).toBe(text)
  })
})

describe('the automatic fit\'s reason', () => {
  it('keeps σ\'p lower-case when σ\'p linear in depth fits best', () => {
    // σ'p rising 10 kPa/m from 20 kPa with small scatter: linear in depth wins (hand-made points).
    const points = [1, 2, 3, 4, 5, 6, 7, 8].map((z, k) => ({ depth: z, preconsolidation: 20 + 10 * z + (k % 2 ? 0.8 : -0.8) }))
    const fit = fitTrend(points, { model: 'auto' })
    expect(fit.model).toBe('linear')
    expect(fit.reason).toMatch(/^σ'p linear in depth fits best/)
    expect(fit.reason).not.toContain('Σ\'p')
  })
})
