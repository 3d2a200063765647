import { and, eq } from 'drizzle-orm'
import { DEMO_PEOPLE, DEMO_PROJECT } from '#shared/demo/scenario'
import { DEMO_EMBANKMENT, SITE_PLAN } from '#shared/demo/site'
import { RunOptionsSchema, type RunGrid, type RunLoad, type RunPoint } from '#shared/schemas/settlement-runs'
import { computeRun } from '#shared/settlement-run/compute'
import type { ServerRunModel } from '#shared/types/settlement-runs'
import type { Database } from '../db/client'
import { investigationPoints, projects, settlementRunPoints, settlementRuns, siteModels, siteModelVersions, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { logServerError } from '../utils/error-log'
import { recordAudit } from './audit'

/**
 * The demo's settlement run: the yard embankment on the approved "Yard model" version 1, made by
 * the design lead and computed here, at seed time, in one go (it is a seed: no queue).
 *
 * The yard (120 m × 80 m, easting 50–170 m, northing 40–120 m on the site grid) is taken as the
 * embankment's TOE, so the fill stays inside the yard: 6 m high with 2:1 side slopes, each slope
 * runs 12 m, leaving a crest of 96 m × 56 m centred on (110, 80).
 */
export const DEMO_RUN_NAME = 'Yard embankment, 6 m on version 1'

const yard = SITE_PLAN.yard
const centre = { x: (yard.minEasting + yard.maxEasting) / 2, y: (yard.minNorthing + yard.maxNorthing) / 2 }
const SIDE_SLOPE = 2
const slopeRun = DEMO_EMBANKMENT.height * SIDE_SLOPE

export const DEMO_RUN_LOADS: RunLoad[] = [{
  type: 'embankment',
  label: 'Yard embankment',
  x: centre.x,
  y: centre.y,
  crestWidth: yard.maxEasting - yard.minEasting - 2 * slopeRun,
  crestLength: yard.maxNorthing - yard.minNorthing - 2 * slopeRun,
  height: DEMO_EMBANKMENT.height,
  sideSlope: SIDE_SLOPE,
  unitWeight: DEMO_EMBANKMENT.unitWeight,
  rotation: 0,
}]

export const DEMO_RUN_GRID: RunGrid = { spacing: 5, margin: 10 }

/** Seeds the run when the demo project has its approved Yard model version 1 and no run yet. */
export async function seedDemoRuns(db: Database): Promise<void> {
  const [project] = await db.select({ id: projects.id }).from(projects).where(eq(projects.jobNumber, DEMO_PROJECT.jobNumber)).limit(1)
  if (!project) return
  const [existing] = await db.select({ id: settlementRuns.id }).from(settlementRuns).where(eq(settlementRuns.projectId, project.id)).limit(1)
  if (existing) return
  const [found] = await db.select({ model: siteModels, version: siteModelVersions }).from(siteModelVersions)
    .innerJoin(siteModels, eq(siteModels.id, siteModelVersions.modelId))
    .where(and(eq(siteModels.projectId, project.id), eq(siteModels.name, 'Yard model'), eq(siteModelVersions.version, 1)))
  if (!found || found.version.status !== 'approved') return
  const [approver] = found.version.decidedBy ? await db.select({ name: users.displayName }).from(users).where(eq(users.id, found.version.decidedBy)) : []
  const designerEmail = DEMO_PEOPLE.find(p => p.role === 'designer')?.email
  const [designer] = designerEmail ? await db.select({ id: users.id }).from(users).where(eq(users.email, designerEmail)) : []
  const [bh03] = await db.select({ id: investigationPoints.id, x: investigationPoints.easting, y: investigationPoints.northing }).from(investigationPoints)
    .where(and(eq(investigationPoints.projectId, project.id), eq(investigationPoints.identifier, 'BH-03')))

  const points: RunPoint[] = [
    { label: 'Yard centre', x: centre.x, y: centre.y },
    { label: 'South-west corner', x: yard.minEasting, y: yard.minNorthing },
    { label: 'South edge, middle', x: centre.x, y: yard.minNorthing },
    ...(bh03 ? [{ label: 'BH-03', x: bh03.x, y: bh03.y, pointId: bh03.id }] : []),
  ]
  const options = RunOptionsSchema.parse({})
  const model: ServerRunModel = {
    modelId: found.model.id,
    modelName: found.model.name,
    version: 1,
    status: 'approved',
    approvedBy: approver?.name ?? null,
    approvedAt: found.version.decidedAt,
  }
  const out = computeRun({ definition: found.version.definition, loads: DEMO_RUN_LOADS, points, grid: DEMO_RUN_GRID, options })
  const made = new Date(Math.max(Date.now() - 3600_000, (found.version.decidedAt ?? new Date()).getTime() + 60_000))
  await db.transaction(async (tx) => {
    const row = returnedRow(await tx.insert(settlementRuns).values({
      projectId: project.id,
      name: DEMO_RUN_NAME,
      model,
      definition: found.version.definition,
      loads: DEMO_RUN_LOADS,
      points,
      grid: DEMO_RUN_GRID,
      options,
      status: 'finished',
      progress: 1,
      attempts: 1,
      results: out.results,
      createdBy: designer?.id ?? null,
      createdAt: made,
      startedAt: made,
      finishedAt: new Date(made.getTime() + Math.max(1, Math.round(out.results.stats.computeMs))),
    }).returning())
    await tx.insert(settlementRunPoints).values(out.details.map(d => ({ runId: row.id, index: d.index, detail: d })))
    await recordAudit({ actorId: designer?.id ?? null, projectId: project.id, action: 'create', entity: 'settlement-run', entityId: row.id, after: { seeded: 'demo', name: DEMO_RUN_NAME } }, tx)
  })
}

/** Called after the demo seed: a failure is logged and leaves the demo without its run, never stops the server. */
export async function seedDemoRunsAfterDemoSeed(db: Database): Promise<void> {
  try {
    await seedDemoRuns(db)
  }
  catch (err) {
    logServerError('demo settlement run seed failed', err)
  }
}
