import type { z } from 'zod'
import type { Capability } from '#shared/auth/roles'

/**
 * POST of a new record in the project of the route: guard → body through zod →
 * one service call (given the project id, the caller's id and the body); 201
 * with what `create` returns.
 */
export function projectCreateHandler<S extends z.ZodType, R>(capability: Capability, schema: S, create: (projectId: string, actorId: string, body: z.output<S>) => Promise<R>) {
  return defineEventHandler(async (event) => {
    const { user, project } = await requireProjectRole(event, capability)
    const body = await validateBody(event, schema)
    const created = await create(project.id, user.id, body)
    setResponseStatus(event, 201)
    return created
  })
}
