import { eq } from 'drizzle-orm'
import { useDb } from '../../../../../db/client'
import { cptSoundings } from '../../../../../db/schema'
import { requirePoint } from '../../../../../services/points'
import { notFound } from '../../../../../services/versioned'

/** The whole CPT sounding as parallel arrays (kPa, m). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParams)
  const point = await requirePoint(project.id, pointId)
  const [row] = await useDb().select().from(cptSoundings).where(eq(cptSoundings.pointId, point.id))
  if (!row) notFound('CPT sounding')
  return { areaRatio: row.areaRatio, count: row.count, depth: row.depth, qc: row.qc, fs: row.fs, u2: row.u2, version: row.version }
})
