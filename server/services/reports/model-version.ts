import { and, desc, eq, lt } from 'drizzle-orm'
import { computeStressProfile } from '#shared/geotech/stress'
import { fitTrend } from '#shared/geotech/trends'
import type { TrendBandPoint } from '#shared/geotech/trend-model'
import { assignBands, stressAt } from '#shared/plots/stress-history'
import type { PointState } from '#shared/plots/model-tracks'
import { modelVersionDocument, MODEL_VERSION_REPORT_TITLE, type ModelVersionReportData, type ModelVersionReportFlag } from '#shared/reports/model-version'
import { FLAG_VERDICTS, type FlagVerdict } from '#shared/review/flags'
import { toStressInput } from '#shared/site-model/convert'
import { diffDefinitions } from '#shared/site-model/diff'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { ProfilePoint } from '#shared/types/calc'
import { useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { preconsolidationAdoptions, projects, reviewFlags, siteModelVersions } from '~~/server/db/schema'
import { runEngine } from '~~/server/utils/engine'
import { cleanFilename } from '../attachments'
import { notFound } from '../http-errors'
import { stressContextOf } from '../lab'
import { versionReview } from '../model-review'
import { requireModel, requireVersion } from '../model-versions'
import { allPreconsolidationPoints, type PreconsolidationPoint } from '../preconsolidation-points'
import type { ReportBuild, ReportContext, ReportHeading } from './kinds'
import { renderReport } from './render'
import { renderPooledReport } from './render-worker'

/**
 * The site-model version report: the version's definition and review record, its stresses, the project's
 * σ'p points through that definition (as the version page's canvas shows them: `allPreconsolidationPoints`
 * with the version's stresses), each point's state from the version's snapshot (its trends' left-out ids
 * and the reviewer flags in force when it was saved), the fits' bands recomputed from the fitted points,
 * and the changes since the previous approved version.
 */

/** The CPT resampling the canvas asks for (the σ'p points routes' default spacing, m). */
const CPT_SPACING = 0.25
const RANK: Record<FlagVerdict, number> = { accepted: 1, questionable: 2, exclude: 3 }
const SOURCE_WORDS: Record<string, string> = { oedometer: 'oedometer', cpt: 'CPT', vane: 'field vane' }

export async function buildModelVersionReport(ctx: ReportContext, modelId: string, version: number): Promise<ReportBuild> {
  const db = useDb()
  const [project] = await db.select().from(projects).where(eq(projects.id, ctx.projectId))
  if (!project) notFound('Project')
  const model = await requireModel(ctx.projectId, modelId)
  const v = await requireVersion(modelId, version)
  const def = v.definition

  const [review, profile, pointsReply, previous] = await Promise.all([
    versionReview(ctx.projectId, v),
    Promise.resolve(profileOf(def)),
    allPreconsolidationPoints(ctx.projectId, stressContextOf(def, { source: 'given', modelId, modelName: model.name, version, status: v.status, description: `The stresses of ${model.name} version ${version}.` }), { spacing: CPT_SPACING, dense: false }),
    db.select({ version: siteModelVersions.version, definition: siteModelVersions.definition }).from(siteModelVersions)
      .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.status, 'approved'), lt(siteModelVersions.version, version)))
      .orderBy(desc(siteModelVersions.version)).limit(1),
  ])
  const points = pointsReply.points
  const flagsByPoint = await flagsOnPoints(ctx.projectId, def)
  const drawn = pointStates(def, points, profile, flagsByPoint)
  const fitBands = def.strata.map((s, band) => bandOf(s.trend, drawn.filter(p => p.band === band && p.state === 'included'), profile))
  const flags = await flagRows(ctx.projectId, def, points)

  const approvedAt = v.status === 'approved' && v.approvalHash ? v.decidedAt : null
  const approved = !!approvedAt
  const data: ModelVersionReportData = {
    project: { name: project.name, jobNumber: project.jobNumber, client: project.client, units: project.unitSystem, usStress: project.usStressUnit },
    model: { name: model.name },
    version: { number: v.version, status: v.status, message: v.message, savedBy: v.author, savedAt: v.createdAt.toISOString(), savedFrom: v.savedFrom, superseded: v.supersededAt !== null, supersededBy: v.supersededBy },
    approval: approvedAt ? { by: review.decidedBy, at: approvedAt.toISOString(), hash: v.approvalHash ?? '', override: v.approvalOverride, overFlags: v.approvalFlags?.length ?? 0 } : null,
    submitted: v.submittedAt ? { by: review.submittedBy, at: v.submittedAt.toISOString() } : null,
    definition: def,
    profile,
    points: drawn,
    fitBands,
    flags,
    previousApproved: previous[0]
      ? {
          version: previous[0].version,
          changes: diffDefinitions(previous[0].definition, def).filter(c => !c.path.startsWith('flagsInForce')),
          flagsChanged: diffDefinitions(previous[0].definition.flagsInForce, def.flagsInForce).length > 0,
        }
      : null,
    issue: ctx.issue,
  }
  // On the job queue (a long report) the drawing and writing are done in the worker pool; otherwise here.
  ctx.onStage?.('drawing')
  const { pdf, pages } = ctx.onStage
    ? await renderPooledReport({ kind: 'model-version', input: data }, ctx.onStage)
    : await renderReport(modelVersionDocument(data))
  return {
    pdf,
    ...modelReportHeading(project.jobNumber, model.name, version),
    approvedRecord: approved,
    source: { kind: 'model-version', id: modelId, version },
    pages,
  }
}

function modelReportHeading(jobNumber: string, modelName: string, version: number): Omit<ReportHeading, 'approvedRecord'> {
  return {
    filename: cleanFilename(`${jobNumber}_${modelName}_v${version}_model-report.pdf`.replace(/\s+/g, '_')),
    title: MODEL_VERSION_REPORT_TITLE,
    subject: `${modelName}, version ${version}`,
  }
}

/**
 * A site-model report with more strata than this is made on the job queue: each stratum adds a page of drawings
 * (its σ'v0 / σ'p / OCR / POP tracks with every point), so such a report runs past a dozen pages.
 */
export const LONG_MODEL_REPORT_STRATA = 8

/**
 * For a version with more than LONG_MODEL_REPORT_STRATA strata: the checks of `buildModelVersionReport` without
 * the work (404 for a model or version not in the project) and what the issued list shows meanwhile. Null for a
 * short report (made in the request).
 */
export async function longModelVersionReportHeading(projectId: string, modelId: string, version: number): Promise<ReportHeading | null> {
  const [project] = await useDb().select({ jobNumber: projects.jobNumber }).from(projects).where(eq(projects.id, projectId))
  if (!project) notFound('Project')
  const model = await requireModel(projectId, modelId)
  const v = await requireVersion(modelId, version)
  if (v.definition.strata.length <= LONG_MODEL_REPORT_STRATA) return null
  return { ...modelReportHeading(project.jobNumber, model.name, version), approvedRecord: v.status === 'approved' && !!v.approvalHash && !!v.decidedAt }
}

/** σv, u and σ'v0 at the definition's breakpoints (the canvas asks the same of the engine). */
function profileOf(def: SiteModelDefinition): ProfilePoint[] {
  return runEngine(() => computeStressProfile({ ...toStressInput(def) })).points
    .map(p => ({ depth: p.depth, layer: p.layer, totalStress: p.totalStress, porePressure: p.porePressure, effectiveStress: p.effectiveStress }))
}

/**
 * The verdicts of the flags in force (the version's snapshot) per σ'p point id: a flag on an oedometer
 * test bears on the σ'p adopted from it, as on the canvas.
 */
async function flagsOnPoints(projectId: string, def: SiteModelDefinition): Promise<Map<string, FlagVerdict[]>> {
  const testIds = def.flagsInForce.filter(f => f.targetType === 'oedometer-test').map(f => f.targetId)
  const adoptions = testIds.length
    ? await useDb().select({ id: preconsolidationAdoptions.id, testId: preconsolidationAdoptions.oedometerTestId }).from(preconsolidationAdoptions)
        .where(and(eq(preconsolidationAdoptions.projectId, projectId), anyOf(preconsolidationAdoptions.oedometerTestId, testIds)))
    : []
  const adoptionsOf = new Map<string, string[]>()
  for (const a of adoptions) adoptionsOf.set(a.testId, [...(adoptionsOf.get(a.testId) ?? []), a.id])
  const out = new Map<string, FlagVerdict[]>()
  for (const f of def.flagsInForce) {
    if (!(FLAG_VERDICTS as readonly string[]).includes(f.verdict)) continue
    const targets = f.targetType === 'oedometer-test' ? adoptionsOf.get(f.targetId) ?? [] : [f.targetId]
    for (const id of targets) out.set(id, [...(out.get(id) ?? []), f.verdict as FlagVerdict])
  }
  return out
}

/** Each point's band and state as the version holds them: flagged out, left out by its trend, or fitted. */
function pointStates(def: SiteModelDefinition, points: readonly PreconsolidationPoint[], profile: readonly ProfilePoint[], flags: Map<string, FlagVerdict[]>): ModelVersionReportData['points'] {
  const bands = assignBands(points, def)
  const excluded = def.strata.map(s => new Set(s.trend?.excludedPointIds ?? []))
  return points.map((p, k) => {
    const band = bands[k] ?? -1
    const verdicts = flags.get(p.id) ?? []
    const verdict = verdicts.reduce<FlagVerdict | null>((best, x) => (!best || RANK[x] > RANK[best] ? x : best), null)
    let state: PointState
    if (band < 0 || !def.strata[band]) state = 'unassigned'
    else if (verdicts.includes('exclude')) state = 'flagged-out'
    else if (excluded[band]?.has(p.id) || !(stressAt(profile, p.depth)?.effectiveStress ?? 0)) state = 'excluded'
    else state = 'included'
    return { band, depth: p.depth, preconsolidation: p.preconsolidation, source: p.source, qualityClass: p.qualityClass, state, verdict }
  })
}

/** The fit's confidence band on the fitted points (as the canvas asks of the trend fit); null when it cannot be had. */
function bandOf(trend: SiteModelDefinition['strata'][number]['trend'], fitted: readonly { depth: number, preconsolidation: number }[], profile: readonly ProfilePoint[]): TrendBandPoint[] | null {
  if (!trend || trend.manual || fitted.length < 2) return null
  try {
    const pts = fitted.map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: stressAt(profile, p.depth)?.effectiveStress ?? 0 }))
    return fitTrend(pts, { model: trend.model, logSpace: trend.logSpace }).band
  }
  catch {
    return null
  }
}

/** The flags in force when the version was saved, with their comments, what they are on and where they stand now. */
async function flagRows(projectId: string, def: SiteModelDefinition, points: readonly PreconsolidationPoint[]): Promise<ModelVersionReportFlag[]> {
  if (!def.flagsInForce.length) return []
  const ids = def.flagsInForce.map(f => f.flagId)
  const rows = await useDb().select({ id: reviewFlags.id, comment: reviewFlags.comment, status: reviewFlags.status })
    .from(reviewFlags).where(and(eq(reviewFlags.projectId, projectId), anyOf(reviewFlags.id, ids)))
  const byId = new Map(rows.map(r => [r.id, r]))
  const pointById = new Map(points.map(p => [p.id, p]))
  return def.flagsInForce.map((f) => {
    const p = pointById.get(f.targetId)
    const target = p
      ? `${p.pointIdentifier} ${SOURCE_WORDS[p.source] ?? p.source} σ'p at ${p.depth.toFixed(2)} m`
      : f.targetType.replace(/-/g, ' ')
    const r = byId.get(f.flagId)
    return { verdict: (FLAG_VERDICTS as readonly string[]).includes(f.verdict) ? f.verdict as FlagVerdict : 'questionable', target, comment: r?.comment ?? '', statusNow: r?.status ?? 'deleted' }
  })
}
