import { expect } from 'vitest'
import { GeotechError } from '../../shared/geotech/errors'

/** Runs `fn`, asserts it threw a GeotechError and returns it (fails the test when nothing was thrown). */
export function catchGeotechError(fn: () => unknown): GeotechError {
  try {
    fn()
  }
  catch (error) {
    expect(error).toBeInstanceOf(GeotechError)
    const geotechError = error as GeotechError
    // Every engine error explains itself in words a user can act on.
    expect(geotechError.message.length).toBeGreaterThan(20)
    return geotechError
  }
  throw new Error('expected a GeotechError')
}

/** Asserts `fn` throws a GeotechError with this code and returns the error. */
export function expectGeotechError(fn: () => unknown, code: string): GeotechError {
  const error = catchGeotechError(fn)
  expect(error.code).toBe(code)
  return error
}
