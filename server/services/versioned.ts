/**
 * Optimistic concurrency for rows that carry a `version`: the update's WHERE
 * includes the version the client read and bumps it. No row back means either
 * the row is gone (404) or someone else saved first (409 with the current row,
 * so the UI can show both).
 */
export async function versionedUpdate<Row>(args: {
  entity: string
  update: () => Promise<Row[]>
  current: () => Promise<Row | undefined>
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

export function unprocessable(message: string, data?: Record<string, unknown>): never {
  throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message, data })
}
