import { and, asc, count, eq, isNull, type SQL } from 'drizzle-orm'
import { isGeotechError } from '#shared/geotech/errors'
import { OedometerListQuerySchema } from '#shared/schemas/lab'
import { investigationPoints, oedometerTests, preconsolidationAdoptions, samples, users } from '~~/server/db/schema'
import { insituAt, interpretTest, loggedIntervals, sampleDepth, stratumAtLogged, stressContext, testJson, timeAnalysis, timeSummary } from '~~/server/services/lab'
import type { ServerOedometerList } from '#shared/types/lab'

/**
 * The project's oedometer tests with their sample, point and logged stratum, the σ'p in force (if adopted) and a
 * live reading of the curve: Casagrande σ'p and sample quality at σ'v0 from the stress model in
 * force, or the engine's reason when the curve cannot be read.
 */
export default defineEventHandler(async (event): Promise<ServerOedometerList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId, limit, offset } = validateQuery(event, OedometerListQuerySchema)
  const where: SQL[] = [eq(investigationPoints.projectId, project.id)]
  if (pointId) where.push(eq(investigationPoints.id, pointId))
  const db = useDb()
  const [rows, [total], current, ctx] = await Promise.all([
    db.select({ test: oedometerTests, sample: samples, point: investigationPoints })
      .from(oedometerTests)
      .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(and(...where))
      .orderBy(asc(investigationPoints.identifier), asc(samples.top), asc(oedometerTests.createdAt))
      .limit(limit).offset(offset),
    db.select({ n: count() }).from(oedometerTests)
      .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(and(...where)),
    db.select({ adoption: preconsolidationAdoptions, adoptedByName: users.displayName })
      .from(preconsolidationAdoptions)
      .leftJoin(users, eq(users.id, preconsolidationAdoptions.adoptedBy))
      .where(and(eq(preconsolidationAdoptions.projectId, project.id), isNull(preconsolidationAdoptions.supersededAt))),
    stressContext(project.id),
  ])
  const intervals = await loggedIntervals([...new Set(rows.map(r => r.point.id))])
  const adopted = new Map(current.map(c => [c.adoption.oedometerTestId, { ...c.adoption, adoptedByName: c.adoptedByName }]))
  const tests = rows.map((r) => {
    const { stages, ...test } = testJson(r)
    const insitu = insituAt(ctx, sampleDepth(r.sample))
    let reading: { casagrande: number | null, deltaEOverE0: number | null, qualityClass: string | null, cc: number | null, cr: number | null, cv: number | null, calpha: number | null, error: string | null }
    try {
      const out = interpretTest(r.test, insitu.effectiveStress)
      const casagrande = out.results.find(m => m.method === 'casagrande')?.preconsolidation ?? null
      // cv and Cα of the virgin range, where settlement happens (median of its stages).
      const time = timeSummary(timeAnalysis(r.test), casagrande).virgin
      reading = {
        casagrande,
        deltaEOverE0: out.sampleQuality?.deltaEOverE0 ?? null,
        qualityClass: out.sampleQuality?.class ?? null,
        cc: out.cc,
        cr: out.cr,
        cv: time.cv,
        calpha: time.calpha,
        error: null,
      }
    }
    catch (err) {
      if (!isGeotechError(err)) throw err
      reading = { casagrande: null, deltaEOverE0: null, qualityClass: null, cc: null, cr: null, cv: null, calpha: null, error: err.message }
    }
    const stratumCode = stratumAtLogged(intervals.get(r.point.id) ?? [], insitu.depth)
    return { ...test, stageCount: stages.length, stratumCode, effectiveStress: insitu.effectiveStress, reading, adoption: adopted.get(r.test.id) ?? null }
  })
  return { tests, total: total?.n ?? 0, limit, offset, stressModel: ctx.info }
})
