import { eq } from 'drizzle-orm'
import { fitTrend, type TrendModel } from '#shared/geotech/trends'
import { DEMO_PEOPLE, DEMO_PROJECT } from '#shared/demo/scenario'
import { trendFromFit, type Compressibility, type SiteModelDefinition } from '#shared/site-model/definition'
import type { Database } from '../db/client'
import { projects, reviewFlags, siteModels, siteModelVersionEvents, siteModelVersionReviewers, siteModelVersions, users } from '../db/schema'
import { present, returnedRow } from '../db/rows'
import { contentHash } from '../utils/content-hash'
import { logServerError } from '../utils/error-log'
import { recordAudit } from './audit'
import { stressContextOf } from './lab'
import { notify } from './notify'
import { allPreconsolidationPoints } from './preconsolidation-points'
import { definitionFromLogs } from './site-models'

/**
 * The demo's design model, "Yard model", seeded after the investigation so that a newcomer sees
 * the whole review story: version 1 fitted per stratum and approved by the reviewer, version 2
 * (a lower cone factor in the estuarine clay, trends refitted) submitted for review with one open
 * flag, the approval notice in the design lead's inbox and the e-mails waiting in the outbox.
 * Everything is invented (docs/demo.md); the compressibility is the scenario's ground model.
 */

/** The scenario's compressibility per stratum code (docs/demo.md); strata not listed are not compressible. */
const COMPRESSIBILITY: Record<string, Compressibility> = {
  CRUST: { cc: 0.35, cr: 0.04, e0: 1.1, cv: 3, drainage: 'double', source: 'manual' },
  EST: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double', source: 'manual' },
  GLAC: { cc: 0.22, cr: 0.03, e0: 0.65, cv: 6, drainage: 'double', source: 'manual' },
}

/** The trend each compressible stratum is fitted with: σ'p falling through the crust, constant POP, constant OCR. */
const TREND_MODEL: Record<string, TrendModel> = { CRUST: 'linear', EST: 'pop', GLAC: 'ocr' }

const GAMMA_W = 9.81
const round1 = (v: number) => Math.round(v * 10) / 10

/**
 * Groundwater as the scenario has it: standing level 1.6 m, hydrostatic to 12 m, then under-drained
 * toward the sand aquifer whose piezometric level is 4.5 m below ground (pore pressure at the sand's top).
 */
function demoGroundwater(sandTop: number): SiteModelDefinition['groundwater'] {
  return {
    waterTableDepth: 1.6,
    piezometers: [
      { depth: 12, porePressure: round1((12 - 1.6) * GAMMA_W) },
      { depth: sandTop, porePressure: round1((sandTop - 4.5) * GAMMA_W) },
    ],
  }
}

/** Fits each compressible stratum's trend to the σ'p points the definition gives (its own σ'v0). */
async function fitted(projectId: string, definition: SiteModelDefinition): Promise<{ definition: SiteModelDefinition, pointIds: Map<string, string[]> }> {
  const ctx = stressContextOf(definition, { source: 'given', modelId: null, modelName: null, version: null, status: null, description: 'Demo model being seeded.' })
  const { points } = await allPreconsolidationPoints(projectId, ctx, { spacing: 0.25, dense: false })
  const pointIds = new Map<string, string[]>()
  const strata = definition.strata.map((s) => {
    const model = TREND_MODEL[s.code]
    if (!model) return s
    const mine = points.filter(p => p.stratumCode === s.code && p.effectiveStress !== null && p.effectiveStress > 0)
    const fit = fitTrend(mine.map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: p.effectiveStress ?? undefined })), {
      model,
      effectiveStressAt: d => ctx.at(d)?.effectiveStress ?? 0,
    })
    pointIds.set(s.code, mine.map(p => p.id))
    return {
      ...s,
      trend: trendFromFit(fit, false, mine.map(p => p.id), []),
    }
  })
  return { definition: { ...definition, strata }, pointIds }
}

const DAY = 24 * 3600_000

/** Seeds "Yard model" into the demo project (only when the demo was just seeded and has no model). */
export async function seedDemoModel(db: Database): Promise<void> {
  const [project] = await db.select({ id: projects.id }).from(projects).where(eq(projects.jobNumber, DEMO_PROJECT.jobNumber)).limit(1)
  if (!project) return
  const [existing] = await db.select({ id: siteModels.id }).from(siteModels).where(eq(siteModels.projectId, project.id)).limit(1)
  if (existing) return
  const people = await db.select({ id: users.id, email: users.email }).from(users)
  const person = (role: string) => present(people.find(u => u.email === DEMO_PEOPLE.find(d => d.role === role)?.email), `the demo ${role}`).id
  const engineer = person('engineer')
  const reviewer = person('reviewer')
  const designer = person('designer')

  const fromLogs = await definitionFromLogs(project.id, db)
  let depth = 0
  let sandTop = 21.5
  const strata = fromLogs.strata.map((s) => {
    if (s.code === 'SAND') sandTop = Math.round(depth * 100) / 100
    depth += s.thickness
    const compressibility = COMPRESSIBILITY[s.code]
    return compressibility ? { ...s, compressible: true, compressibility } : { ...s, compressible: false }
  })
  const base: SiteModelDefinition = { ...fromLogs, schemaVersion: 2, gammaW: GAMMA_W, groundwater: demoGroundwater(sandTop), strata }
  const v1 = (await fitted(project.id, base)).definition
  // Version 2: the cone factor in the estuarine clay lowered after comparing the CPT σ'p with the vanes; trends refitted.
  const second = await fitted(project.id, { ...v1, strata: v1.strata.map(s => (s.code === 'EST' ? { ...s, cptFactor: 0.3 } : s)) })
  const v2 = second.definition
  const flagged = (second.pointIds.get('EST') ?? []).find(id => id.startsWith('cpt:'))

  const now = Date.now()
  const at = (daysAgo: number) => new Date(now - daysAgo * DAY)
  await db.transaction(async (tx) => {
    const model = returnedRow(await tx.insert(siteModels).values({
      projectId: project.id,
      name: 'Yard model',
      description: 'Design model of the container yard: strata from the logs, under-drained groundwater, σ\'p trends fitted per stratum.',
      draft: v2,
      basedOn: 2,
      createdBy: engineer,
      createdAt: at(9),
      updatedAt: at(2),
    }).returning())
    await tx.update(projects).set({ designModelId: model.id }).where(eq(projects.id, project.id))
    const versionPath = (n: number) => `/projects/${project.id}/models/${model.id}/versions/${n}`

    const first = returnedRow(await tx.insert(siteModelVersions).values({
      modelId: model.id,
      version: 1,
      definition: v1,
      message: 'Strata from the logs, under-drained water below 12 m, σ\'p trends fitted per stratum',
      status: 'approved',
      createdBy: engineer,
      createdAt: at(8),
      submittedBy: engineer,
      submittedAt: at(8),
      decidedBy: reviewer,
      decidedAt: at(6),
      decisionComment: 'Trends agree with the oedometer tests and the vanes. Approved for settlement design.',
      approvalHash: contentHash(v1),
      approvalFlags: [],
    }).returning())
    await tx.insert(siteModelVersionReviewers).values({ versionId: first.id, userId: reviewer })
    await tx.insert(siteModelVersionEvents).values([
      { versionId: first.id, kind: 'submitted', actorId: engineer, comment: 'Ready for review: fits per stratum, under-drained water.', at: at(8) },
      { versionId: first.id, kind: 'approved', actorId: reviewer, comment: 'Trends agree with the oedometer tests and the vanes. Approved for settlement design.', at: at(6) },
    ])

    const secondVersion = returnedRow(await tx.insert(siteModelVersions).values({
      modelId: model.id,
      version: 2,
      definition: v2,
      message: 'Cone factor 0.30 in the estuarine clay after comparing CPT σ\'p with the vanes; trends refitted',
      status: 'submitted',
      savedFrom: 1,
      createdBy: engineer,
      createdAt: at(2),
      submittedBy: engineer,
      submittedAt: at(1),
    }).returning())
    await tx.insert(siteModelVersionReviewers).values({ versionId: secondVersion.id, userId: reviewer })
    await tx.insert(siteModelVersionEvents).values({ versionId: secondVersion.id, kind: 'submitted', actorId: engineer, comment: 'Lower cone factor in the estuarine clay; please check the CPT fit.', at: at(1) })
    if (flagged) {
      await tx.insert(reviewFlags).values({
        projectId: project.id,
        targetType: 'cpt-point',
        targetId: flagged,
        verdict: 'questionable',
        comment: 'Spike from a shell layer? Check this point before the estuarine fit uses it.',
        createdBy: reviewer,
        createdAt: at(0.5),
        updatedAt: at(0.5),
      })
    }
    await recordAudit({ actorId: engineer, projectId: project.id, action: 'create', entity: 'site-model', entityId: model.id, after: { seeded: 'demo', versions: 2 } }, tx)

    await notify({ kind: 'version-approved', projectId: project.id, recipients: [engineer, designer], actorId: reviewer, title: 'Version 1 of Yard model approved by Priya Natarajan', body: 'Trends agree with the oedometer tests and the vanes. Approved for settlement design.', link: versionPath(1) }, tx)
    await notify({ kind: 'review-requested', projectId: project.id, recipients: [reviewer], actorId: engineer, title: 'Tomas Lindqvist asks you to review version 2 of Yard model', body: 'Lower cone factor in the estuarine clay; please check the CPT fit.', link: versionPath(2) }, tx)
  })
}

/** Runs after the demo seed; a failure leaves the demo without its model (logged), never half a model. */
export async function seedDemoModelAfterDemoSeed(db: Database): Promise<void> {
  try {
    await seedDemoModel(db)
  }
  catch (err) {
    logServerError('demo model seed failed', err)
  }
}
