import { and, desc, eq, lt } from 'drizzle-orm'
import { modelVersionDocument, MODEL_VERSION_REPORT_TITLE, type ModelVersionReportData, type ModelVersionReportFlag } from '#shared/reports/model-version'
import { isVerdict } from '#shared/review/flags'
import { diffDefinitions } from '#shared/site-model/diff'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { projects, reviewFlags, siteModelVersions } from '~~/server/db/schema'
import { cleanFilename } from '../attachments'
import { notFound } from '../http-errors'
import { stressContextOf } from '../lab'
import { modelDrawingData } from '../model-drawing'
import { versionReview } from '../model-review'
import { requireModel, requireVersion } from '../model-versions'
import type { PreconsolidationPoint } from '../preconsolidation-points'
import type { ReportBuild, ReportContext, ReportHeading } from './kinds'
import { renderReport } from './render'
import { renderPooledReport } from './render-worker'

/**
 * The site-model version report: the version's definition and review record, and its drawing (`modelDrawingData`:
 * the stresses, the project's σ'p points through them, each point's state from the version's snapshot — its
 * trends' left-out ids and the reviewer flags in force when it was saved — and the fits' bands), and the changes
 * since the previous approved version.
 */

const SOURCE_WORDS: Record<string, string> = { oedometer: 'oedometer', cpt: 'CPT', vane: 'field vane' }

export async function buildModelVersionReport(ctx: ReportContext, modelId: string, version: number): Promise<ReportBuild> {
  const db = useDb()
  const [project] = await db.select().from(projects).where(eq(projects.id, ctx.projectId))
  if (!project) notFound('Project')
  const model = await requireModel(ctx.projectId, modelId)
  const v = await requireVersion(modelId, version)
  const def = v.definition

  const [review, drawing, previous] = await Promise.all([
    versionReview(ctx.projectId, v),
    modelDrawingData(ctx.projectId, def, stressContextOf(def, { source: 'given', modelId, modelName: model.name, version, status: v.status, description: `The stresses of ${model.name} version ${version}.` }), def.flagsInForce),
    db.select({ version: siteModelVersions.version, definition: siteModelVersions.definition }).from(siteModelVersions)
      .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.status, 'approved'), lt(siteModelVersions.version, version)))
      .orderBy(desc(siteModelVersions.version)).limit(1),
  ])
  const flags = await flagRows(ctx.projectId, def, drawing.points)

  const approvedAt = v.status === 'approved' && v.approvalHash ? v.decidedAt : null
  const approved = !!approvedAt
  const data: ModelVersionReportData = {
    project: { name: project.name, jobNumber: project.jobNumber, client: project.client, units: project.unitSystem, usStress: project.usStressUnit },
    model: { name: model.name },
    version: { number: v.version, status: v.status, message: v.message, savedBy: v.author, savedAt: v.createdAt.toISOString(), savedFrom: v.savedFrom, superseded: v.supersededAt !== null, supersededBy: v.supersededBy },
    approval: approvedAt ? { by: review.decidedBy, at: approvedAt.toISOString(), hash: v.approvalHash ?? '', override: v.approvalOverride, overFlags: v.approvalFlags?.length ?? 0 } : null,
    submitted: v.submittedAt ? { by: review.submittedBy, at: v.submittedAt.toISOString() } : null,
    definition: def,
    profile: drawing.profile,
    points: drawing.drawn,
    fitBands: drawing.fitBands,
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
    return { verdict: isVerdict(f.verdict) ? f.verdict : 'questionable', target, comment: r?.comment ?? '', statusNow: r?.status ?? 'deleted' }
  })
}
