import { and, eq } from 'drizzle-orm'
import { computeStressProfile } from '#shared/geotech/stress'
import { fitTrend } from '#shared/geotech/trends'
import type { TrendBandPoint } from '#shared/geotech/trend-model'
import { modelDrawing, type DrawingPoint } from '#shared/plots/model-drawing'
import type { PointState } from '#shared/plots/model-tracks'
import { assignBands, stressAt } from '#shared/plots/stress-history'
import { isVerdict, strongestVerdict, type FlagVerdict } from '#shared/review/flags'
import { toStressInput } from '#shared/site-model/convert'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { ProfilePoint } from '#shared/types/calc'
import type { ServerModelDrawing } from '#shared/types/models'
import type { UnitSystem, UsStressUnit } from '#shared/units'
import { useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { preconsolidationAdoptions, reviewFlags } from '~~/server/db/schema'
import { runEngine } from '~~/server/utils/engine'
import { stressContextOf, type StressContext } from './lab'
import { requireModel } from './model-versions'
import { allPreconsolidationPoints, type PreconsolidationPoint } from './preconsolidation-points'

/**
 * What the model's drawing shows of a definition, worked out on the server: σv, u and σ'v0, the project's σ'p
 * points through its stresses, each point's band and state (flagged out, left out by its trend, or fitted) and
 * the fits' bands recomputed from the fitted points. The version report draws it on its pages; the stress-model
 * page draws the draft with it before its workspace is opened.
 */

/** The CPT resampling the canvas asks for (the σ'p points routes' default spacing, m). */
const CPT_SPACING = 0.25

/** A flag's verdict on what it is on (a version's flags in force, or the open flags of the project). */
export interface FlagOnTarget { targetType: string, targetId: string, verdict: string }

export interface DrawnPoint extends DrawingPoint { band: number }

export interface ModelDrawingData {
  profile: ProfilePoint[]
  /** The points as the stresses give them (ids and identifiers, for the report's flag rows). */
  points: PreconsolidationPoint[]
  /** The same points as drawn, in the same order. */
  drawn: DrawnPoint[]
  fitBands: (TrendBandPoint[] | null)[]
}

export async function modelDrawingData(projectId: string, def: SiteModelDefinition, stress: StressContext, flags: readonly FlagOnTarget[]): Promise<ModelDrawingData> {
  const profile = profileOf(def)
  const [reply, verdicts] = await Promise.all([
    allPreconsolidationPoints(projectId, stress, { spacing: CPT_SPACING, dense: false }),
    verdictsOnPoints(projectId, flags),
  ])
  const drawn = pointStates(def, reply.points, profile, verdicts)
  const fitBands = def.strata.map((s, band) => bandOf(s.trend, drawn.filter(p => p.band === band && p.state === 'included'), profile))
  return { profile, points: reply.points, drawn, fitBands }
}

/**
 * The drawing of a model's saved draft as the page opens with it: its stresses, the σ'p points through them with
 * the open flags' verdicts, its trends and their bands, and the key. A draft the engine cannot work out is 422 with
 * the engine's message.
 */
export async function draftDrawing(projectId: string, modelId: string, units: UnitSystem, usStress: UsStressUnit): Promise<ServerModelDrawing> {
  const model = await requireModel(projectId, modelId)
  const def = model.draft
  const stress = stressContextOf(def, { source: 'given', modelId, modelName: model.name, version: null, status: null, description: `The stresses of the saved draft of ${model.name}.` })
  const open = await useDb().select({ targetType: reviewFlags.targetType, targetId: reviewFlags.targetId, verdict: reviewFlags.verdict })
    .from(reviewFlags).where(and(eq(reviewFlags.projectId, projectId), eq(reviewFlags.status, 'open')))
  const d = await modelDrawingData(projectId, def, stress, open)
  const drawing = modelDrawing({ definition: def, profile: d.profile, points: d.drawn, fitBands: d.fitBands, units, usStress, width: 720, height: 880 })
  return { revision: model.draftRevision, svg: drawing.svg, width: drawing.width, height: drawing.height, points: d.drawn.length }
}

/** σv, u and σ'v0 at the definition's breakpoints (the canvas asks the same of the engine). */
function profileOf(def: SiteModelDefinition): ProfilePoint[] {
  return runEngine(() => computeStressProfile({ ...toStressInput(def) })).points
    .map(p => ({ depth: p.depth, layer: p.layer, totalStress: p.totalStress, porePressure: p.porePressure, effectiveStress: p.effectiveStress }))
}

/** The verdicts per σ'p point id: a flag on an oedometer test bears on the σ'p adopted from it, as on the canvas. */
async function verdictsOnPoints(projectId: string, flags: readonly FlagOnTarget[]): Promise<Map<string, FlagVerdict[]>> {
  const testIds = flags.filter(f => f.targetType === 'oedometer-test').map(f => f.targetId)
  const adoptions = testIds.length
    ? await useDb().select({ id: preconsolidationAdoptions.id, testId: preconsolidationAdoptions.oedometerTestId }).from(preconsolidationAdoptions)
        .where(and(eq(preconsolidationAdoptions.projectId, projectId), anyOf(preconsolidationAdoptions.oedometerTestId, testIds)))
    : []
  const adoptionsOf = new Map<string, string[]>()
  for (const a of adoptions) adoptionsOf.set(a.testId, [...(adoptionsOf.get(a.testId) ?? []), a.id])
  const out = new Map<string, FlagVerdict[]>()
  for (const f of flags) {
    const verdict = f.verdict
    if (!isVerdict(verdict)) continue
    const targets = f.targetType === 'oedometer-test' ? adoptionsOf.get(f.targetId) ?? [] : [f.targetId]
    for (const id of targets) out.set(id, [...(out.get(id) ?? []), verdict])
  }
  return out
}

/** Each point's band and state as the definition holds them: flagged out, left out by its trend, or fitted. */
function pointStates(def: SiteModelDefinition, points: readonly PreconsolidationPoint[], profile: readonly ProfilePoint[], flags: Map<string, FlagVerdict[]>): DrawnPoint[] {
  const bands = assignBands(points, def)
  const excluded = def.strata.map(s => new Set(s.trend?.excludedPointIds ?? []))
  return points.map((p, k) => {
    const band = bands[k] ?? -1
    const verdicts = flags.get(p.id) ?? []
    const verdict = strongestVerdict(verdicts)
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
