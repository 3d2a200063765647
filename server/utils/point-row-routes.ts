import type { z } from 'zod'
import type { Capability } from '#shared/auth/roles'
import { PointParamsSchema, PointRowParamsSchema } from '#shared/schemas/investigation'
import { createPointRow, type PointRowKind, updatePointRow } from '~~/server/services/point-rows'

/**
 * The routes of the simple rows that hang off a point (SPT, groundwater, vane):
 * guard → params and body through zod → one service call. `toValues` turns the
 * validated body into the stored values (SPT adds its N from the blows).
 */
type RowValues = Record<string, unknown> & { depth?: number | null }

/** POST `…/points/{pointId}/{kind}`: 201 with the new row. */
export function pointRowCreateHandler<S extends z.ZodType<RowValues>>(kind: PointRowKind, capability: Capability, schema: S, toValues: (body: z.output<S>) => RowValues = body => body) {
  return defineEventHandler(async (event) => {
    const { user, project } = await requireProjectRole(event, capability)
    const { pointId } = validateParams(event, PointParamsSchema)
    const body = await validateBody(event, schema)
    const row = await createPointRow(kind, { actorId: user.id, projectId: project.id, pointId }, toValues(body))
    setResponseStatus(event, 201)
    return { row }
  })
}

/** PATCH `…/points/{pointId}/{kind}/{rowId}`: the changed row (a stale `version` is 409). */
export function pointRowUpdateHandler<S extends z.ZodType<RowValues & { version: number }>>(kind: PointRowKind, capability: Capability, schema: S, toValues: (values: Omit<z.output<S>, 'version'>) => RowValues = values => values) {
  return defineEventHandler(async (event) => {
    const { user, project } = await requireProjectRole(event, capability)
    const { pointId, rowId } = validateParams(event, PointRowParamsSchema)
    const { version, ...values } = await validateBody(event, schema)
    const row = await updatePointRow(kind, { actorId: user.id, projectId: project.id, pointId }, rowId, version, toValues(values))
    return { row }
  })
}
