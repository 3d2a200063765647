import { z } from 'zod'
import { UuidSchema } from '#shared/schemas/common'

/** Route params shared by several routes. */
export const MemberUserParams = z.object({ projectId: UuidSchema, userId: UuidSchema })

export const PointParams = z.object({ projectId: UuidSchema, pointId: UuidSchema })
export const SampleParams = PointParams.extend({ sampleId: UuidSchema })
export const StratumParams = z.object({ projectId: UuidSchema, stratumId: UuidSchema })
/** A row that belongs to a point (SPT, groundwater, vane) by its `rowId`. */
export const PointRowParams = PointParams.extend({ rowId: UuidSchema })
