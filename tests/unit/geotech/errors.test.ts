import { describe, expect, it } from 'vitest'
import { GeotechError, plainNumbers } from '../../../shared/geotech/errors'
import { computeStressProfile } from '../../../shared/geotech/stress'

describe('engine messages read as plain sentences', () => {
  it('replaces a non-finite value given in brackets', () => {
    expect(plainNumbers('Layer thickness must be a finite number (got NaN).')).toBe('Layer thickness must be a finite number (got a value that is not a finite number).')
    expect(plainNumbers('The time must be finite (got -Infinity years).')).toBe('The time must be finite (got a value that is not a finite number).')
  })

  it('replaces NaN and Infinity anywhere else, and leaves finite numbers alone', () => {
    expect(plainNumbers('σ\'p is NaN kPa at 3 m; Cc is Infinity; Cr is -Infinity')).toBe('σ\'p is a value that is not a number kPa at 3 m; Cc is an infinitely large value; Cr is an infinitely large negative value')
    expect(plainNumbers('e0 is -0.5; it must be positive.')).toBe('e0 is -0.5; it must be positive.')
  })

  it('every GeotechError is built that way', () => {
    expect(new GeotechError('x', 'value NaN').message).toBe('value a value that is not a number')
  })

  it('a non-finite thickness reaching the engine gives a message without NaN', () => {
    let message = ''
    try {
      computeStressProfile({ layers: [{ name: 'Clay', thickness: Number.NaN, unitWeight: 17, unitWeightSaturated: 17 }], groundwater: { waterTableDepth: 0 } })
    }
    catch (err) {
      if (err instanceof GeotechError) message = err.message
    }
    expect(message).toMatch(/thickness/i)
    expect(message).not.toMatch(/NaN|Infinity/)
  })
})
