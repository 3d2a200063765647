import { isGeotechError } from '#shared/geotech/errors'
import { unprocessableError } from '~~/server/services/http-errors'

/**
 * Runs an engine call; a GeotechError (physically impossible input) becomes 422
 * with its plain message, code and depth. Anything else is a real fault and
 * propagates as 500.
 */
export function runEngine<T>(fn: () => T): T {
  try {
    return fn()
  }
  catch (err) {
    if (isGeotechError(err)) {
      throw unprocessableError(
        err.message,
        { code: err.code, ...(err.depth !== undefined ? { depth: err.depth } : {}), ...(err.detail ? { detail: err.detail } : {}) },
      )
    }
    throw err
  }
}

/** Most sublayers one settlement request may ask for (keeps one call bounded in time and memory). */
export const MAX_SUBLAYERS = 200_000
