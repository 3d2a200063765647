import { eq } from 'drizzle-orm'
import type { PointLogData, LogStress } from '#shared/plots/point-log'
import { pointLogDocument, pointLogFilename, POINT_LOG_TITLE, POINT_KIND_WORDS } from '#shared/reports/point-log'
import type { LogScale } from '#shared/reports/point-log-layout'
import { trendPreconsolidation } from '#shared/site-model/convert'
import { stratumBounds } from '#shared/site-model/definition'
import { useDb } from '~~/server/db/client'
import { projects } from '~~/server/db/schema'
import { stressContextOf, type StressContext } from '~~/server/services/lab'
import { stressModelInForce } from '~~/server/services/site-models'
import { pointDetail, requirePoint } from '~~/server/services/points'
import { cptResampled, cptSoundingRows, cptThroughModel, derivedHere, oedometerPoints, vanePoints } from '~~/server/services/preconsolidation-points'
import { cptDerivationOff, listStrata } from '~~/server/services/strata'
import { notFound } from '~~/server/services/http-errors'
import { isGeotechError } from '#shared/geotech/errors'
import type { ReportBuild, ReportContext } from './kinds'
import { renderReport } from './render'

/**
 * The point log report: the point's log, samples, SPT, water and the stress-history strip from the
 * project's stress model in force (`stressModelInForce`), drawn by `shared/reports/point-log.ts`.
 */

/** Depth step of the σ'v0 and trend lines, m. */
const STRESS_STEP = 0.25
/** CPT σ'p resampling window on the log, m. */
const CPT_SPACING = 0.5

function depthsDown(top: number, bottom: number): number[] {
  const out: number[] = []
  for (let d = top; d < bottom - 1e-9; d += STRESS_STEP) out.push(Math.round(d * 1000) / 1000)
  out.push(bottom)
  return out
}

async function stressStrip(projectId: string, pointId: string, finalDepth: number, ctx: StressContext): Promise<LogStress> {
  if (!ctx.definition) return { available: false, model: ctx.info.description, profile: [], trend: [], points: [] }
  const def = ctx.definition
  const bottom = Math.min(finalDepth, ctx.base)
  const profile = depthsDown(0, bottom)
    .map(depth => ({ depth, s: ctx.at(depth) }))
    .filter((e): e is { depth: number, s: NonNullable<ReturnType<StressContext['at']>> } => e.s !== null)
    .map(e => ({ depth: e.depth, effectiveStress: e.s.effectiveStress }))
  const bounds = stratumBounds(def)
  const trend: LogStress['trend'] = []
  def.strata.forEach((s, i) => {
    const b = bounds[i]
    if (!b || !s.trend || b.top >= bottom) return
    const run: LogStress['trend'][number] = []
    for (const depth of depthsDown(b.top, Math.min(b.bottom, bottom))) {
      // Just inside the band at its edges, so a band's own trend is evaluated there.
      const d = Math.min(Math.max(depth, b.top + 1e-6), b.bottom - 1e-6)
      const sv = ctx.at(d)?.effectiveStress
      if (sv === undefined || !(sv > 0)) continue
      const p = trendPreconsolidation(s, d, sv)
      if (p !== null && Number.isFinite(p)) run.push({ depth, preconsolidation: p, effectiveStress: sv })
    }
    if (run.length >= 2) trend.push(run)
  })
  const [oedometer, vane, soundings, off] = await Promise.all([oedometerPoints(projectId, ctx), vanePoints(projectId, ctx), cptSoundingRows(projectId, pointId), cptDerivationOff(projectId)])
  const cpt = soundings.flatMap((c) => {
    try {
      return cptResampled(ctx, c, cptThroughModel(ctx, c), CPT_SPACING, undefined)
    }
    catch (err) {
      if (isGeotechError(err)) return []
      throw err
    }
  })
  // CPT and vane σ'p only in strata whose "derive σ'p from CPT and vane" switch is on, as on the canvas.
  const derived = derivedHere(off)
  const points = [...oedometer, ...vane.points.filter(derived), ...cpt.filter(derived)]
    .filter(p => p.pointId === pointId)
    .map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: p.effectiveStress, source: p.source, qualityClass: p.qualityClass }))
  return { available: true, model: ctx.info.description, profile, trend, points }
}

/**
 * The stress model in force as an evaluator. A log can be drawn without stresses: a model version the
 * engine refuses (a 422 elsewhere) leaves the strip empty with the engine's reason instead.
 */
async function logStressContext(projectId: string): Promise<StressContext> {
  const { definition, info } = await stressModelInForce(projectId)
  try {
    return stressContextOf(definition, info)
  }
  catch (err) {
    const status = (err as { statusCode?: unknown } | null)?.statusCode
    if (status !== 422 || !(err instanceof Error)) throw err
    return stressContextOf(null, { ...info, description: `${info.description} σ'v0 cannot be computed from it: ${err.message}` })
  }
}

/** What the log of one point draws: the sheet page's data and the report's. */
export async function pointLogData(projectId: string, pointId: string): Promise<PointLogData> {
  const [project] = await useDb().select().from(projects).where(eq(projects.id, projectId))
  if (!project) notFound('Project')
  const point = await requirePoint(projectId, pointId)
  const [detail, strata, ctx] = await Promise.all([pointDetail(point), listStrata(projectId), logStressContext(projectId)])
  const byId = new Map(strata.map(s => [s.id, s]))
  const stress = await stressStrip(projectId, pointId, point.finalDepth, ctx)
  return {
    project: { name: project.name, jobNumber: project.jobNumber, client: project.client },
    units: project.unitSystem,
    usStress: project.usStressUnit,
    point: {
      identifier: point.identifier,
      kind: point.kind,
      easting: point.easting,
      northing: point.northing,
      groundElevation: point.groundElevation,
      finalDepth: point.finalDepth,
      startedOn: point.startedOn,
      endedOn: point.endedOn,
      method: point.method,
      loggedBy: point.loggedBy,
      remarks: point.remarks,
    },
    intervals: detail.intervals.map((iv) => {
      const s = iv.stratumId ? byId.get(iv.stratumId) : undefined
      return {
        top: iv.top,
        bottom: iv.bottom,
        description: iv.description,
        uscs: iv.uscs,
        consistency: iv.consistency,
        moisture: iv.moisture,
        stratum: s ? { code: s.code, name: s.name, colour: s.colour, pattern: s.pattern } : null,
      }
    }),
    gaps: detail.intervals.length ? detail.gaps : [{ top: 0, bottom: point.finalDepth }],
    samples: detail.samples.map(s => ({ identifier: s.identifier, type: s.type, top: s.top, bottom: s.bottom, recovery: s.recovery })),
    spt: detail.spt.map(s => ({ depth: s.depth, blows: s.blows, n: s.n, penetration: s.penetration })),
    groundwater: detail.groundwater.map(g => ({ kind: g.kind, depth: g.depth, observedAt: g.observedAt, remarks: g.remarks })),
    stress,
  }
}

/** The PDF of one point's stress-history log at 1:scale. */
export async function buildPointLogReport(ctx: ReportContext, pointId: string, opts: { scale: LogScale }): Promise<ReportBuild> {
  const data = await pointLogData(ctx.projectId, pointId)
  const { doc } = pointLogDocument(data, {
    scale: opts.scale,
    revision: ctx.issue?.revision ?? null,
    prepared: ctx.issue?.issuedBy ?? null,
  })
  const { pdf, pages } = await renderReport(doc)
  return {
    pdf,
    filename: pointLogFilename(data.project.jobNumber, data.point.identifier, opts.scale),
    title: POINT_LOG_TITLE,
    subject: `${data.point.identifier} · ${POINT_KIND_WORDS[data.point.kind]}`,
    approvedRecord: true,
    source: { kind: 'point-log', id: pointId, options: { scale: opts.scale } },
    pages,
  }
}
