import { isUniqueViolation } from '../utils/db-errors'

/**
 * Optimistic concurrency for rows that carry a `version`: the update's WHERE
 * includes the version the client read and bumps it. No row back means either
 * the row is gone (404) or someone else saved first (409 with the current row,
 * so the UI can show both).
 */
export async function versionedUpdate<Row>(args: {
  entity: string
  update: () => Promise<Row[]>
  /** The row as it stands now (already read, or read on demand). */
  current: () => Row | undefined | Promise<Row | undefined>
}): Promise<Row> {
  const [row] = await args.update()
  if (row) return row
  const current = await args.current()
  if (!current) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: `${args.entity} not found.` })
  throw createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `This ${args.entity.toLowerCase()} was changed by someone else since you opened it. Review their version and apply your change again.`,
    data: { current },
  })
}

export function notFound(what: string): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: `${what} not found.` })
}

/**
 * The one way to build a 422: input that is well-formed but cannot be accepted (a depth below the hole,
 * a model the engine cannot use). `message` says what and where; `data` carries a `code` or `issues`
 * the client can act on. Callers `throw` it (or return it from an error mapper).
 */
export function unprocessableError(message: string, data?: Record<string, unknown>) {
  return createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message, data })
}

/**
 * Runs a write whose unique index may refuse it (a name or identifier already taken): that refusal
 * is 409 with `message` (and `data`, e.g. the field's issue for the form), anything else passes through.
 */
export async function conflictOnDuplicate<T>(work: () => Promise<T>, message: string, data?: Record<string, unknown>): Promise<T> {
  try {
    return await work()
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message, data })
    throw err
  }
}
