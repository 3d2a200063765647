import { and, eq } from 'drizzle-orm'
import { DEMO_PEOPLE, DEMO_PROJECT } from '#shared/demo/scenario'
import { DEMO_EMBANKMENT, SITE_PLAN } from '#shared/demo/site'
import { RunOptionsSchema, RunProbabilisticSchema, type RunGrid, type RunLoad, type RunOptions, type RunPoint } from '#shared/schemas/settlement-runs'
import { computeRun } from '#shared/settlement-run/compute'
import type { ServerRunModel } from '#shared/types/settlement-runs'
import type { Database } from '../db/client'
import { investigationPoints, projects, settlementRunPoints, settlementRuns, siteModels, siteModelVersions, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { logServerError } from '../utils/error-log'
import { recordAudit } from './audit'
import { addProbabilistic } from './settlement-run-probabilistic'
import { runScatterData } from './settlement-run-scatter'

/**
 * The demo's settlement runs: the yard embankment on the approved "Yard model" version 1, and the
 * same embankment built in stages with a surcharge and drains, made by the design lead and
 * computed here, at seed time, in one go (it is a seed: no queue). The yard run is probabilistic
 * "from the data" (`DEMO_RUN_PROBABILISTIC`).
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

const EMBANKMENT = {
  type: 'embankment' as const,
  label: 'Yard embankment',
  x: centre.x,
  y: centre.y,
  crestWidth: yard.maxEasting - yard.minEasting - 2 * slopeRun,
  crestLength: yard.maxNorthing - yard.minNorthing - 2 * slopeRun,
  height: DEMO_EMBANKMENT.height,
  sideSlope: SIDE_SLOPE,
  unitWeight: DEMO_EMBANKMENT.unitWeight,
  rotation: 0,
}
export const DEMO_RUN_LOADS: RunLoad[] = [EMBANKMENT]

export const DEMO_RUN_GRID: RunGrid = { spacing: 5, margin: 10 }

/**
 * The yard run is probabilistic "from the data": 2000 realisations at the named points, and the
 * fewest (100) per grid node so the seed stays quick.
 */
export const DEMO_RUN_PROBABILISTIC = RunProbabilisticSchema.parse({ realizations: 2000, seed: 417, fromData: true, limit: 1.5 })
const DEMO_GRID_NODE_REALIZATIONS = 100

/**
 * The demo's second run, on the same version: the same embankment built in two 3 m lifts (each
 * placed over five weeks, three months apart), a 1.5 m surcharge on its crest (same 2:1 slopes)
 * placed after the second lift and taken off at 9 months, and band drains at 1.5 m in a
 * triangular pattern through the estuarine clay. An invented design for the demo.
 */
export const DEMO_TREATED_RUN_NAME = 'Yard embankment in two lifts, surcharge and drains'
const SURCHARGE_HEIGHT = 1.5
export const DEMO_TREATED_RUN_LOADS: RunLoad[] = [
  { ...EMBANKMENT, label: 'Yard embankment, two lifts', stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] },
  {
    ...EMBANKMENT,
    label: 'Surcharge',
    // On the crest: its toe is the embankment's crest, with the same side slopes.
    crestWidth: EMBANKMENT.crestWidth - 2 * SURCHARGE_HEIGHT * SIDE_SLOPE,
    crestLength: EMBANKMENT.crestLength - 2 * SURCHARGE_HEIGHT * SIDE_SLOPE,
    height: SURCHARGE_HEIGHT,
    stages: [{ start: 0.35, duration: 0.05, fraction: 1 }],
    removeAt: 0.75,
  },
]
export const DEMO_TREATED_RUN_DRAINS = { strata: ['EST'], pattern: 'triangular' as const, spacing: 1.5 }

/** Seeds the demo's runs on the approved Yard model version 1: each one the demo project does not have yet, by name. */
export async function seedDemoRuns(db: Database): Promise<void> {
  const [project] = await db.select({ id: projects.id }).from(projects).where(eq(projects.jobNumber, DEMO_PROJECT.jobNumber)).limit(1)
  if (!project) return
  const existing = new Set((await db.select({ name: settlementRuns.name }).from(settlementRuns).where(eq(settlementRuns.projectId, project.id))).map(r => r.name))
  if (existing.has(DEMO_RUN_NAME) && existing.has(DEMO_TREATED_RUN_NAME)) return
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
  const model: ServerRunModel = {
    modelId: found.model.id,
    modelName: found.model.name,
    version: 1,
    status: 'approved',
    approvedBy: approver?.name ?? null,
    approvedAt: found.version.decidedAt,
  }
  const made = new Date(Math.max(Date.now() - 3600_000, (found.version.decidedAt ?? new Date()).getTime() + 60_000))
  const seed = async (name: string, loads: RunLoad[], runPoints: RunPoint[], grid: RunGrid | null, options: RunOptions, at: Date) => {
    const input = { definition: found.version.definition, loads, points: runPoints, grid, options }
    let out = computeRun(input)
    const scatter = options.probabilistic?.fromData ? await runScatterData(project.id, found.version.definition, options.drains) : null
    if (options.probabilistic) out = await addProbabilistic(input, options.probabilistic, scatter, out, { gridNodeCap: DEMO_GRID_NODE_REALIZATIONS })
    await db.transaction(async (tx) => {
      const row = returnedRow(await tx.insert(settlementRuns).values({
        projectId: project.id,
        name,
        model,
        definition: found.version.definition,
        loads,
        points: runPoints,
        grid,
        options,
        scatter,
        status: 'finished',
        progress: 1,
        attempts: 1,
        results: out.results,
        createdBy: designer?.id ?? null,
        createdAt: at,
        startedAt: at,
        finishedAt: new Date(at.getTime() + Math.max(1, Math.round(out.results.stats.computeMs))),
      }).returning())
      await tx.insert(settlementRunPoints).values(out.details.map(d => ({ runId: row.id, index: d.index, detail: d })))
      await recordAudit({ actorId: designer?.id ?? null, projectId: project.id, action: 'create', entity: 'settlement-run', entityId: row.id, after: { seeded: 'demo', name } }, tx)
    })
  }
  if (!existing.has(DEMO_RUN_NAME)) await seed(DEMO_RUN_NAME, DEMO_RUN_LOADS, points, DEMO_RUN_GRID, RunOptionsSchema.parse({ probabilistic: DEMO_RUN_PROBABILISTIC }), made)
  if (!existing.has(DEMO_TREATED_RUN_NAME)) {
    // The named points only (the schedule is followed at named points; a grid would show final values alone).
    const options = RunOptionsSchema.parse({ years: [0.25, 0.5, 0.75, 1, 2, 5, 10, 20, 50], drains: DEMO_TREATED_RUN_DRAINS })
    await seed(DEMO_TREATED_RUN_NAME, DEMO_TREATED_RUN_LOADS, points, null, options, new Date(made.getTime() + 20 * 60_000))
  }
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
