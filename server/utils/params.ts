import { z } from 'zod'
import { UuidSchema } from '#shared/schemas/common'

/** Route params shared by several routes. */
export const MemberUserParams = z.object({ projectId: UuidSchema, userId: UuidSchema })
