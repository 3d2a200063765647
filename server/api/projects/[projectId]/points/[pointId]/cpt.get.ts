import { eq } from 'drizzle-orm'
import { cptSoundings } from '~~/server/db/schema'
import { requirePoint } from '~~/server/services/points'
import { notFound } from '~~/server/services/http-errors'
import { PointParamsSchema } from '#shared/schemas/investigation'
import type { CptSounding } from '#shared/types/investigation'

/** The whole CPT sounding as parallel arrays (kPa, m). */
export default defineEventHandler(async (event): Promise<CptSounding> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParamsSchema)
  const point = await requirePoint(project.id, pointId)
  const [row] = await useDb().select().from(cptSoundings).where(eq(cptSoundings.pointId, point.id))
  if (!row) notFound('CPT sounding')
  return { areaRatio: row.areaRatio, count: row.count, depth: row.depth, qc: row.qc, fs: row.fs, u2: row.u2, version: row.version }
})
