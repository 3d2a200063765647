import { and, asc, eq, isNotNull, isNull } from 'drizzle-orm'
import { projectDepthWords } from '~~/server/services/project-units'
import { behaviourIndexProfile } from '#shared/geotech/behaviour-index'
import { isGeotechError } from '#shared/geotech/errors'
import { cptProfile, DEFAULT_CONE_FACTOR, MESRI_STRENGTH_RATIO, resamplePreconsolidation, vanePreconsolidation, type CptProfile } from '#shared/geotech/insitu'
import { median } from '#shared/lab/statistics'
import { cptPointId } from '#shared/review/flags'
import { PRECONSOLIDATION_SOURCES, type PreconsolidationPoint as SharedPreconsolidationPoint, type PreconsolidationSource } from '#shared/schemas/lab'
import type { CptBehaviourTrace, DenseCpt, ServerPreconsolidationPoints } from '#shared/types/lab'
import { useDb } from '../db/client'
import { cptSoundings, indexTests, investigationPoints, oedometerTests, preconsolidationAdoptions, samples, users, vaneReadings } from '../db/schema'
import { loggedIntervals, sampleDepth, type LoggedInterval, type StressContext, stratumAtLogged } from './lab'
import { cptDerivationOff } from './strata'

/** One σ'p point of the canvas, whatever its source (adoption time as a Date until serialised). */
export type PreconsolidationPoint = SharedPreconsolidationPoint<Date>

const round = (v: number, digits: number) => {
  const f = 10 ** digits
  return Math.round(v * f) / f
}

/** Stratum at a depth at a point: the logged interval there, else the model's band. */
function stratumAt(ctx: StressContext, intervals: LoggedInterval[] | undefined, depth: number): string | null {
  return (intervals && stratumAtLogged(intervals, depth)) ?? ctx.bandAt(depth)?.code ?? null
}

// ---------------------------------------------------------------------------
// Oedometer: the adoptions in force
// ---------------------------------------------------------------------------

export async function oedometerPoints(projectId: string, ctx: StressContext): Promise<PreconsolidationPoint[]> {
  const rows = await useDb().select({
    adoption: preconsolidationAdoptions,
    sample: { top: samples.top, bottom: samples.bottom },
    point: { id: investigationPoints.id, identifier: investigationPoints.identifier },
    adoptedByName: users.displayName,
  })
    .from(preconsolidationAdoptions)
    .innerJoin(oedometerTests, eq(oedometerTests.id, preconsolidationAdoptions.oedometerTestId))
    .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
    .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
    .leftJoin(users, eq(users.id, preconsolidationAdoptions.adoptedBy))
    .where(and(eq(preconsolidationAdoptions.projectId, projectId), eq(investigationPoints.projectId, projectId), isNull(preconsolidationAdoptions.supersededAt)))
  const intervals = await loggedIntervals([...new Set(rows.map(r => r.point.id))])
  return rows.map((r) => {
    const depth = sampleDepth(r.sample)
    const s = ctx.at(depth)
    return {
      id: r.adoption.id,
      source: 'oedometer' as const,
      method: r.adoption.method,
      pointId: r.point.id,
      pointIdentifier: r.point.identifier,
      depth,
      preconsolidation: r.adoption.value,
      effectiveStress: s ? round(s.effectiveStress, 2) : null,
      stratumCode: stratumAt(ctx, intervals.get(r.point.id), depth),
      qualityClass: r.adoption.qualityClass,
      adoptedBy: r.adoptedByName,
      adoptedAt: r.adoption.adoptedAt,
    }
  })
}

// ---------------------------------------------------------------------------
// CPT: σ'p = k·qnet per row, resampled
// ---------------------------------------------------------------------------

export interface CptSoundingRow {
  pointId: string
  pointIdentifier: string
  areaRatio: number
  depth: number[]
  qc: number[]
  fs: number[]
  u2: number[]
}

/**
 * A sounding through the engine with σv0 and u0 from the stress model in force and k from the
 * model's stratum at each depth (its `cptFactor`, default 0.33 — Mayne 1995, memory). Rows below the
 * model's base have no stresses and come out flagged.
 */
export function cptThroughModel(ctx: StressContext, c: CptSoundingRow): CptProfile {
  return cptProfile({
    depth: c.depth,
    qc: c.qc,
    fs: c.fs,
    u2: c.u2,
    areaRatio: c.areaRatio,
    stressAt: (z) => {
      const s = ctx.at(z)
      return s ? { totalStress: s.totalStress, porePressure: s.porePressure } : { totalStress: Number.NaN, porePressure: Number.NaN }
    },
    k: z => ctx.bandAt(z)?.cptFactor ?? DEFAULT_CONE_FACTOR,
  })
}

/** Resampled CPT σ'p points (median per window) with ids, σ'v0 and strata. */
export function cptResampled(ctx: StressContext, c: CptSoundingRow, profile: CptProfile, spacing: number, intervals: LoggedInterval[] | undefined): PreconsolidationPoint[] {
  return resamplePreconsolidation(profile.depth, profile.preconsolidation, { spacing, statistic: 'median' }).map((p) => {
    const depth = round(p.depth, 3)
    const s = ctx.at(depth)
    return {
      id: cptPointId(c.pointId, depth),
      source: 'cpt' as const,
      method: 'k-qnet',
      pointId: c.pointId,
      pointIdentifier: c.pointIdentifier,
      depth,
      preconsolidation: round(p.preconsolidation, 2),
      effectiveStress: s ? round(s.effectiveStress, 2) : null,
      stratumCode: stratumAt(ctx, intervals, depth),
      qualityClass: null,
      adoptedBy: null,
      adoptedAt: null,
    }
  })
}

/** Ic per row (Robertson 2009) through the stresses of the profile; NaN where it is undefined. */
export function cptBehaviour(c: CptSoundingRow, profile: CptProfile): Float64Array {
  return behaviourIndexProfile({ qt: profile.qt, fs: c.fs, totalStress: profile.totalStress, effectiveStress: profile.effectiveStress })
}

/** Window of the canvas's Ic guide, m: a sounding's 1 000 rows become ~200 medians. */
const BEHAVIOUR_SPACING = 0.1

function behaviourTrace(c: CptSoundingRow, profile: CptProfile): CptBehaviourTrace {
  const resampled = resamplePreconsolidation(profile.depth, cptBehaviour(c, profile), { spacing: BEHAVIOUR_SPACING, statistic: 'median' })
  return { pointId: c.pointId, pointIdentifier: c.pointIdentifier, depth: resampled.map(p => round(p.depth, 3)), ic: resampled.map(p => round(p.preconsolidation, 3)) }
}

export async function cptSoundingRows(projectId: string, pointId?: string): Promise<CptSoundingRow[]> {
  const where = [eq(investigationPoints.projectId, projectId)]
  if (pointId) where.push(eq(investigationPoints.id, pointId))
  return useDb().select({
    pointId: investigationPoints.id,
    pointIdentifier: investigationPoints.identifier,
    areaRatio: cptSoundings.areaRatio,
    depth: cptSoundings.depth,
    qc: cptSoundings.qc,
    fs: cptSoundings.fs,
    u2: cptSoundings.u2,
  })
    .from(cptSoundings)
    .innerJoin(investigationPoints, eq(investigationPoints.id, cptSoundings.pointId))
    .where(and(...where))
    .orderBy(asc(investigationPoints.identifier))
}

function denseRows(ctx: StressContext, c: CptSoundingRow, profile: CptProfile, intervals: LoggedInterval[] | undefined, strataIndex: (code: string | null) => number, off: ReadonlySet<string>): DenseCpt {
  const out: DenseCpt = { pointId: c.pointId, pointIdentifier: c.pointIdentifier, depth: [], preconsolidation: [], effectiveStress: [], stratum: [] }
  for (const [i, z] of profile.depth.entries()) {
    const p = profile.preconsolidation[i] ?? Number.NaN
    if (!Number.isFinite(p)) continue
    const code = stratumAt(ctx, intervals, z)
    if (code !== null && off.has(code)) continue
    const e = profile.effectiveStress[i] ?? Number.NaN
    out.depth.push(round(z, 3))
    out.preconsolidation.push(round(p, 1))
    out.effectiveStress.push(Number.isFinite(e) ? round(e, 1) : null)
    out.stratum.push(strataIndex(code))
  }
  return out
}

// ---------------------------------------------------------------------------
// Field vane: σ'p = μ·su,FV / 0.22
// ---------------------------------------------------------------------------

interface PiSource { pointId: string, depth: number, stratumCode: string | null, pi: number }

/** PI of every index test in the project, with the stratum logged at the sample's mid-depth. */
async function plasticityIndices(projectId: string): Promise<PiSource[]> {
  const rows = await useDb().select({ pointId: samples.pointId, top: samples.top, bottom: samples.bottom, ll: indexTests.liquidLimit, pl: indexTests.plasticLimit })
    .from(indexTests)
    .innerJoin(samples, eq(samples.id, indexTests.sampleId))
    .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
    .where(and(eq(investigationPoints.projectId, projectId), isNotNull(indexTests.liquidLimit), isNotNull(indexTests.plasticLimit)))
  const intervals = await loggedIntervals([...new Set(rows.map(r => r.pointId))])
  return rows.flatMap((r) => {
    if (r.ll === null || r.pl === null || !(r.ll - r.pl > 0)) return []
    const depth = sampleDepth(r)
    return [{ pointId: r.pointId, depth, stratumCode: stratumAtLogged(intervals.get(r.pointId) ?? [], depth), pi: r.ll - r.pl }]
  })
}

/**
 * Vane σ'p with Bjerrum's (1972) μ from the PI of the nearest index test in the same stratum at the
 * point; failing that the project's default for the stratum, the median PI of its index tests; with
 * no PI at all, no correction (μ = 1), marked `uncorrected`. σ'p = μ·su,FV/0.22 (Mesri 1975, memory).
 */
export async function vanePoints(projectId: string, ctx: StressContext): Promise<{ points: PreconsolidationPoint[], warnings: string[], stratumDefaults: Record<string, number> }> {
  const readings = await useDb().select({ id: vaneReadings.id, depth: vaneReadings.depth, peak: vaneReadings.peak, pointId: investigationPoints.id, pointIdentifier: investigationPoints.identifier })
    .from(vaneReadings)
    .innerJoin(investigationPoints, eq(investigationPoints.id, vaneReadings.pointId))
    .where(eq(investigationPoints.projectId, projectId))
    .orderBy(asc(investigationPoints.identifier), asc(vaneReadings.depth))
  if (!readings.length) return { points: [], warnings: [], stratumDefaults: {} }
  const [intervals, pis] = await Promise.all([loggedIntervals([...new Set(readings.map(r => r.pointId))]), plasticityIndices(projectId)])
  const stratumDefaults: Record<string, number> = {}
  for (const code of new Set(pis.map(p => p.stratumCode).filter((c): c is string => c !== null))) {
    const pi = median(pis.filter(p => p.stratumCode === code).map(p => p.pi))
    if (pi !== null) stratumDefaults[code] = pi
  }
  const warnings: string[] = []
  const points: PreconsolidationPoint[] = []
  let uncorrected = 0
  let words: Awaited<ReturnType<typeof projectDepthWords>> | undefined
  for (const r of readings) {
    const code = stratumAt(ctx, intervals.get(r.pointId), r.depth)
    const local = pis
      .filter(p => p.pointId === r.pointId && p.stratumCode === code)
      .sort((a, b) => Math.abs(a.depth - r.depth) - Math.abs(b.depth - r.depth))[0]
    const pi = local?.pi ?? (code ? stratumDefaults[code] : undefined)
    const method = local ? 'pi-at-point' : pi !== undefined ? 'pi-of-stratum' : 'uncorrected'
    try {
      const v = pi !== undefined ? vanePreconsolidation(r.peak, { pi }) : vanePreconsolidation(r.peak, { pi: 1, mu: 1 })
      if (pi === undefined) uncorrected++
      const s = ctx.at(r.depth)
      points.push({
        id: `vane:${r.id}`,
        source: 'vane',
        method,
        pointId: r.pointId,
        pointIdentifier: r.pointIdentifier,
        depth: r.depth,
        preconsolidation: round(v.preconsolidation, 2),
        effectiveStress: s ? round(s.effectiveStress, 2) : null,
        stratumCode: code,
        qualityClass: null,
        adoptedBy: null,
        adoptedAt: null,
      })
    }
    catch (err) {
      if (!isGeotechError(err)) throw err
      // The depth in the project's units (ft on a US project); read only when there is something to say.
      words ??= await projectDepthWords(projectId)
      warnings.push(`${r.pointIdentifier} vane at ${words.depth(r.depth)}: ${err.message}`)
    }
  }
  if (uncorrected) warnings.push(`${uncorrected} vane reading${uncorrected === 1 ? '' : 's'} had no plasticity index in ${uncorrected === 1 ? 'its' : 'their'} stratum: σ'p = su,FV/${MESRI_STRENGTH_RATIO} without Bjerrum's correction (μ = 1).`)
  return { points, warnings, stratumDefaults }
}

// ---------------------------------------------------------------------------
// All sources
// ---------------------------------------------------------------------------

/** True for a CPT or vane point in a stratum whose "derive σ'p from CPT and vane" switch is on (or in none). */
export function derivedHere(off: ReadonlySet<string>) {
  return (p: Pick<PreconsolidationPoint, 'stratumCode'>): boolean => p.stratumCode === null || !off.has(p.stratumCode)
}

/**
 * Every σ'p point of the project through the given stresses. CPT and vane points are kept only in
 * strata whose switch is on (`strataCptDerivation`): k·qnet and su/0.22 hold for fine-grained soils only.
 */
export async function allPreconsolidationPoints(projectId: string, ctx: StressContext, opts: { spacing: number, dense: boolean }): Promise<ServerPreconsolidationPoints> {
  const warnings: string[] = []
  const [oedometer, soundings, vaneAll, off] = await Promise.all([
    oedometerPoints(projectId, ctx),
    cptSoundingRows(projectId),
    vanePoints(projectId, ctx),
    cptDerivationOff(projectId),
  ])
  const derived = derivedHere(off)
  const vane = { ...vaneAll, points: vaneAll.points.filter(derived) }
  warnings.push(...vane.warnings)
  const cptIntervals = await loggedIntervals(soundings.map(s => s.pointId))
  const strataCodes: string[] = []
  const strataIndex = (code: string | null): number => {
    if (code === null) return -1
    let i = strataCodes.indexOf(code)
    if (i === -1) i = strataCodes.push(code) - 1
    return i
  }
  const cpt: PreconsolidationPoint[] = []
  const dense: DenseCpt[] = []
  const behaviour: CptBehaviourTrace[] = []
  // CPT σ'p = k·(qt − σv0) needs the stresses: none without a saved version of the design model.
  if (!ctx.definition && soundings.length) warnings.push(`${ctx.info.description} CPT σ'p (k·qnet needs σv0) are not computed until a version of the design model is saved.`)
  for (const c of ctx.definition ? soundings : []) {
    try {
      const profile = cptThroughModel(ctx, c)
      cpt.push(...cptResampled(ctx, c, profile, opts.spacing, cptIntervals.get(c.pointId)).filter(derived))
      if (opts.dense) {
        dense.push(denseRows(ctx, c, profile, cptIntervals.get(c.pointId), strataIndex, off))
        behaviour.push(behaviourTrace(c, profile))
      }
      if (profile.flaggedRows) warnings.push(`${c.pointIdentifier}: ${profile.flaggedRows} of ${profile.depth.length} CPT rows give no σ'p (qt not above σv0, a missing reading, or below the stress model's base).`)
    }
    catch (err) {
      if (!isGeotechError(err)) throw err
      warnings.push(`${c.pointIdentifier}: ${err.message}`)
    }
  }
  // Laboratory values first, then the in-situ profiles; by point and depth within a source.
  const order = (s: PreconsolidationSource) => PRECONSOLIDATION_SOURCES.indexOf(s)
  const points = [...oedometer, ...cpt, ...vane.points].sort((a, b) => order(a.source) - order(b.source) || a.pointIdentifier.localeCompare(b.pointIdentifier) || a.depth - b.depth)
  return {
    points,
    counts: { oedometer: oedometer.length, cpt: cpt.length, vane: vane.points.length },
    vaneStratumPi: vane.stratumDefaults,
    warnings,
    notDerivedIn: [...off],
    ...(opts.dense ? { dense: { strata: strataCodes, cpt: dense }, behaviour } : {}),
  }
}
