import { type H3Event, isError } from 'h3'
import type { z } from 'zod'

/** zod issues as the API returns them: `{ path: "layers.0.thickness", message }`. */
export function formatIssues(error: z.ZodError): { path: string, message: string }[] {
  return error.issues.map(issue => ({
    path: issue.path.map(String).join('.'),
    message: issue.message,
  }))
}

function fail(error: z.ZodError, where: string): never {
  const issues = formatIssues(error)
  const first = issues[0]
  throw createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: first ? `Invalid ${where}: ${first.path ? `${first.path} ` : ''}${first.message}` : `Invalid ${where}`,
    data: { issues },
  })
}

/** Reads and validates a JSON body; a shape error is 400 with every zod issue. */
export async function validateBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  let raw: unknown
  try {
    raw = await readBody(event)
  }
  catch (err) {
    // A body past the limit while it was read (server/middleware/01.body-limit.ts) keeps its 413.
    if (isError(err) && err.statusCode === 413) throw err
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The request body is not valid JSON.' })
  }
  const result = schema.safeParse(raw ?? {})
  if (!result.success) fail(result.error, 'body')
  return result.data
}

export function validateParams<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getRouterParams(event, { decode: true }))
  // A malformed id names nothing that exists: 404, so ids cannot be probed by shape.
  if (!result.success) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Not found.' })
  return result.data
}

export function validateQuery<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getQuery(event))
  if (!result.success) fail(result.error, 'query')
  return result.data
}

/** Validates request headers (names lower-case), e.g. `Last-Event-ID`; a bad value is 400. */
export function validateHeaders<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  const result = schema.safeParse(getRequestHeaders(event))
  if (!result.success) fail(result.error, 'header')
  return result.data
}
