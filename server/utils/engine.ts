import { isGeotechError } from '#shared/geotech/errors'

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
      throw createError({
        statusCode: 422,
        statusMessage: 'Unprocessable Entity',
        message: err.message,
        data: { code: err.code, ...(err.depth !== undefined ? { depth: err.depth } : {}), ...(err.detail ? { detail: err.detail } : {}) },
      })
    }
    throw err
  }
}

/** Most sublayers one settlement request may ask for (keeps one call bounded in time and memory). */
export const MAX_SUBLAYERS = 200_000

export function refuse422(message: string, code: string): never {
  throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message, data: { code } })
}
