import { and, asc, desc, eq, getTableColumns, isNull, sql } from 'drizzle-orm'
import { GeotechError, isGeotechError } from '#shared/geotech/errors'
import { checkCompressionIndex } from '#shared/geotech/insitu'
import { interpretOedometer, type OedometerInterpretation, type OedometerMethod } from '#shared/geotech/oedometer'
import { createStressEvaluator, type StressAtDepth } from '#shared/geotech/stress'
import { convertStages, degreeOfSaturation, e0FromWaterContent, specimenHeightAt, type StageConvention, type StageEntry } from '#shared/lab/stages'
import { median } from '#shared/lab/statistics'
import { analyseTimeCurve, MIN_TIME_READINGS } from '#shared/lab/time-curve'
import { toStressInput } from '#shared/site-model/convert'
import { type ModelStratum, type SiteModelDefinition, stratumBounds } from '#shared/site-model/definition'
import type { ServerPointRow, ServerSampleRow } from '#shared/types/investigation'
import type { CcCheck, InsituAtSample, ServerAdoptionRow, ServerOedometerTest, ServerOedometerTestRow, StageTimeAnalysis, StressModelInfo, TimeSummary } from '#shared/types/lab'
import { type Tx, useDb } from '../db/client'
import { anyOf } from '../db/any'
import { indexTests, investigationPoints, logIntervals, oedometerTests, preconsolidationAdoptions, samples, strata, users, type OedometerStageJson } from '../db/schema'
import { runEngine } from '../utils/engine'
import { type AuditEntry, recordAudit } from './audit'
import { stressModelInForce } from './site-models'
import { notFound, versionedUpdate } from './http-errors'

type AdoptionRecord = typeof preconsolidationAdoptions.$inferSelect

type Db = ReturnType<typeof useDb> | Tx

// ---------------------------------------------------------------------------
// The stress model in force
// ---------------------------------------------------------------------------

export interface StressContext {
  info: StressModelInfo
  /** null when the design model has no saved version: σ'v0 is unavailable everywhere. */
  definition: SiteModelDefinition | null
  /** Depth of the model's base, m (0 without a model). */
  base: number
  /** σv, u, σ'v0 at a depth; null outside the model (always null without one). */
  at: (depth: number) => StressAtDepth | null
  /** The model's stratum band at a depth (a band's top belongs to it); null outside the model. */
  bandAt: (depth: number) => ModelStratum | null
}

/**
 * σ'v0 for the interpretation pages: the design model's version in force (`stressModelInForce`)
 * turned into an evaluator. A model the engine cannot use is 422 with the engine's message.
 */
export async function stressContext(projectId: string): Promise<StressContext> {
  const { definition, info } = await stressModelInForce(projectId)
  return stressContextOf(definition, info)
}

/** The evaluator for a given definition (a working copy sent by the canvas, or a saved version); none gives no stresses. */
export function stressContextOf(definition: SiteModelDefinition | null, info: StressModelInfo): StressContext {
  if (!definition) return { info, definition: null, base: 0, at: () => null, bandAt: () => null }
  const evaluate = runEngine(() => createStressEvaluator(toStressInput(definition)))
  const bounds = stratumBounds(definition)
  const base = bounds.length ? bounds[bounds.length - 1]!.bottom : 0
  return {
    info,
    definition,
    base,
    at: (depth) => {
      try {
        return evaluate(depth)
      }
      catch (err) {
        if (isGeotechError(err)) return null
        throw err
      }
    },
    bandAt: (depth) => {
      if (!(depth >= 0) || depth > base) return null
      const i = bounds.findIndex(b => depth >= b.top && depth < b.bottom)
      return definition.strata[i === -1 ? bounds.length - 1 : i] ?? null
    },
  }
}

// ---------------------------------------------------------------------------
// Tests scoped to the project
// ---------------------------------------------------------------------------

export interface TestContext {
  test: ServerOedometerTestRow
  sample: ServerSampleRow
  point: ServerPointRow
}

/** The test in the route with its sample and point, scoped to the project (another project's test is 404). */
export async function requireTest(projectId: string, testId: string, tx?: Tx, opts: { lock?: boolean } = {}): Promise<TestContext> {
  const db: Db = tx ?? useDb()
  const q = db.select({ test: oedometerTests, sample: samples, point: investigationPoints })
    .from(oedometerTests)
    .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
    .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
    .where(and(eq(oedometerTests.id, testId), eq(investigationPoints.projectId, projectId)))
  const [row] = opts.lock ? await q.for('update', { of: oedometerTests }) : await q
  if (!row) notFound('Oedometer test')
  return row
}

/** The sample in a create request, scoped to the project. */
export async function requireProjectSample(projectId: string, sampleId: string, tx: Tx): Promise<{ sample: ServerSampleRow, point: ServerPointRow }> {
  const [row] = await tx.select({ sample: samples, point: investigationPoints })
    .from(samples)
    .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
    .where(and(eq(samples.id, sampleId), eq(investigationPoints.projectId, projectId)))
  if (!row) notFound('Sample')
  return row
}

/** Mid-depth of the sample: the specimen is trimmed from the middle of the tube (common practice). */
export function sampleDepth(sample: Pick<ServerSampleRow, 'top' | 'bottom'>): number {
  return 0.5 * (sample.top + sample.bottom)
}

/** A test as the API returns it: the row, where it came from, and the e0 check. */
export function testJson({ test, sample, point }: TestContext): ServerOedometerTest {
  const gs = test.specificGravity
  const w = test.initialWaterContent
  const fromWaterContent = gs !== null && w !== null && w > 0 ? e0FromWaterContent(gs, w) : null
  return {
    ...test,
    sample: { id: sample.id, identifier: sample.identifier, top: sample.top, bottom: sample.bottom, type: sample.type },
    point: { id: point.id, identifier: point.identifier, kind: point.kind },
    depth: sampleDepth(sample),
    e0Check: {
      /** Gs·w/100: e0 of the specimen if it were saturated. */
      fromWaterContent,
      /** S = w·Gs/(100·e0) (phase relation). */
      saturation: gs !== null && w !== null ? degreeOfSaturation(gs, w, test.e0) : null,
    },
  }
}

// ---------------------------------------------------------------------------
// Writing a test: e0 and the stages
// ---------------------------------------------------------------------------

export interface SpecimenFields {
  specimenHeight: number
  initialWaterContent: number | null
  specificGravity: number | null
  /** null: Gs·w/100. */
  e0: number | null
  convention: StageConvention
  stages: StageEntry[]
}

/**
 * e0 as entered, or computed from Gs·w for a saturated specimen; stages converted to void ratios.
 * Physically impossible values are 422 with the engine's message.
 */
export function prepareSpecimen(fields: SpecimenFields): { e0: number, e0Computed: boolean, stages: OedometerStageJson[], notes: string[] } {
  return runEngine(() => {
    const notes: string[] = []
    let e0 = fields.e0
    let e0Computed = false
    if (e0 === null) {
      if (fields.specificGravity === null || fields.initialWaterContent === null) {
        throw new GeotechError('e0-missing', 'Give e0, or Gs and the initial water content to compute it.')
      }
      e0 = e0FromWaterContent(fields.specificGravity, fields.initialWaterContent)
      e0Computed = true
      notes.push(`e0 = Gs·w/100 = ${fields.specificGravity} × ${fields.initialWaterContent} / 100 = ${e0.toFixed(3)}, assuming a saturated specimen (S = 1).`)
    }
    const stages = convertStages(fields.convention, fields.stages, { e0, specimenHeight: fields.specimenHeight })
    return { e0, e0Computed, stages, notes }
  })
}

/** The 409 of a test edited from a stale version, with the current test for the page to show. */
export function staleTest(ctx: TestContext): never {
  throw createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: 'This test was changed by someone else since you opened it. Review their version and apply your change again.',
    data: { current: testJson(ctx) },
  })
}

/** What an edit may change on a test; left out, a field keeps its value. */
export interface TestChanges extends Partial<SpecimenFields> {
  label?: string
  testType?: ServerOedometerTestRow['testType']
  remarks?: string
}

/**
 * Revises a test in the caller's transaction — the one path for the edit form and the stage import:
 * the version the client read must still be current (409 with the current test otherwise), the
 * specimen is merged with the changes and its stages converted (e0 from Gs·w when not given), the
 * version is bumped and the write audited (`audit` says how). When the curve changes (its e0 or its
 * stages), the σ'p adopted from the old curve is withdrawn: marked superseded, kept in the history,
 * audited, and the test needs a new adoption.
 */
export async function reviseTest(tx: Tx, args: {
  projectId: string
  actorId: string
  testId: string
  version: number
  /** The changes, or a function of the current row (the import keeps time readings on stages that keep their σ'). */
  changes: TestChanges | ((before: ServerOedometerTestRow) => TestChanges)
  /** The audit entry of the edit; default: an `update` of the test with both rows. */
  audit?: (before: ServerOedometerTestRow, after: ServerOedometerTestRow) => Pick<AuditEntry, 'action' | 'entity' | 'before' | 'after'>
}): Promise<{ test: TestContext, withdrawn: AdoptionRecord | null, notes: string[] }> {
  const ctx = await requireTest(args.projectId, args.testId, tx, { lock: true })
  const before = ctx.test
  if (before.version !== args.version) staleTest(ctx)
  const changes = typeof args.changes === 'function' ? args.changes(before) : args.changes
  const specimen: SpecimenFields = {
    specimenHeight: changes.specimenHeight ?? before.specimenHeight,
    initialWaterContent: changes.initialWaterContent !== undefined ? changes.initialWaterContent : before.initialWaterContent,
    specificGravity: changes.specificGravity !== undefined ? changes.specificGravity : before.specificGravity,
    e0: changes.e0 !== undefined ? changes.e0 : before.e0,
    convention: changes.convention ?? before.convention,
    stages: changes.stages ?? before.stages.map(s => ({ stress: s.stress, value: s.entered, ...(s.readings ? { readings: s.readings } : {}) })),
  }
  const prepared = prepareSpecimen(specimen)
  const curveChanged = prepared.e0 !== before.e0 || JSON.stringify(prepared.stages) !== JSON.stringify(before.stages)
  const row = await versionedUpdate({
    entity: 'Oedometer test',
    update: () => tx.update(oedometerTests).set({
      ...(changes.label !== undefined ? { label: changes.label } : {}),
      ...(changes.testType !== undefined ? { testType: changes.testType } : {}),
      ...(changes.remarks !== undefined ? { remarks: changes.remarks } : {}),
      specimenHeight: specimen.specimenHeight,
      initialWaterContent: specimen.initialWaterContent,
      specificGravity: specimen.specificGravity,
      convention: specimen.convention,
      e0: prepared.e0,
      stages: prepared.stages,
      version: sql`${oedometerTests.version} + 1`,
    }).where(and(eq(oedometerTests.id, before.id), eq(oedometerTests.version, args.version))).returning(),
    current: () => before,
  })
  const audit = args.audit?.(before, row) ?? { action: 'update', entity: 'oedometer-test', before, after: row }
  await recordAudit({ actorId: args.actorId, projectId: args.projectId, entityId: before.id, ...audit }, tx)
  let withdrawn: AdoptionRecord | null = null
  if (curveChanged) {
    const [w] = await tx.update(preconsolidationAdoptions).set({ supersededAt: new Date() })
      .where(and(eq(preconsolidationAdoptions.oedometerTestId, before.id), isNull(preconsolidationAdoptions.supersededAt))).returning()
    if (w) {
      withdrawn = w
      await recordAudit({ actorId: args.actorId, projectId: args.projectId, action: 'withdraw', entity: 'preconsolidation-adoption', entityId: w.id, before: { ...w, supersededAt: null }, after: w }, tx)
    }
  }
  return { test: { ...ctx, test: row }, withdrawn, notes: prepared.notes }
}

/**
 * Replaces a test's stages (an import from a file), in the caller's transaction, through `reviseTest`:
 * time readings stay on a stage that keeps its place and its σ'; the audit entry is the import's.
 */
export async function replaceTestStages(tx: Tx, args: { projectId: string, actorId: string, testId: string, version: number, convention: StageConvention, stages: { stress: number, value: number }[], filename: string }) {
  let readingsKept = 0
  const revised = await reviseTest(tx, {
    ...args,
    changes: (before) => {
      const stages: StageEntry[] = args.stages.map((s, i) => {
        const old = before.stages[i]
        if (old?.readings?.length && old.stress === s.stress) {
          readingsKept++
          return { ...s, readings: old.readings }
        }
        return s
      })
      return { convention: args.convention, stages }
    },
    audit: (before, row) => ({
      action: 'import',
      entity: 'oedometer-stages',
      before: { version: before.version, convention: before.convention, stages: before.stages },
      after: { filename: args.filename, rows: args.stages.length, readingsKept, version: row.version, convention: row.convention, stages: row.stages },
    }),
  })
  return { ...revised, readingsKept }
}

// ---------------------------------------------------------------------------
// Interpretation
// ---------------------------------------------------------------------------

export function insituAt(ctx: StressContext, depth: number): InsituAtSample {
  const s = ctx.at(depth)
  return {
    depth,
    effectiveStress: s && s.effectiveStress > 0 ? s.effectiveStress : null,
    totalStress: s?.totalStress ?? null,
    porePressure: s?.porePressure ?? null,
    modelStratum: ctx.bandAt(depth)?.code ?? null,
  }
}

/** The engine's interpretation of a test's curve; throws `GeotechError` for a curve with no yield. */
export function interpretTest(test: ServerOedometerTestRow, effectiveStress: number | null): OedometerInterpretation {
  return interpretOedometer({
    points: test.stages.map(s => ({ stress: s.stress, voidRatio: s.voidRatio })),
    e0: test.e0,
    ...(effectiveStress !== null ? { insituStress: effectiveStress } : {}),
  })
}

/**
 * Taylor's √t cv and the post-primary Cα for every stage with time readings. The specimen drains
 * top and bottom (the usual oedometer ring, common practice), so Hdr is half the mean height over
 * the stage, from the void ratios at its start and end.
 */
export function timeAnalysis(test: ServerOedometerTestRow): StageTimeAnalysis[] {
  const out: StageTimeAnalysis[] = []
  const basis = { e0: test.e0, specimenHeight: test.specimenHeight }
  test.stages.forEach((stage, i) => {
    const readings = stage.readings ?? []
    if (!readings.length) return
    const eStart = i === 0 ? test.e0 : test.stages[i - 1]!.voidRatio
    const meanHeight = 0.5 * (specimenHeightAt(eStart, basis) + specimenHeightAt(stage.voidRatio, basis))
    const drainagePath = meanHeight / 2
    if (readings.filter(r => r.minutes > 0).length < MIN_TIME_READINGS) {
      out.push({ stage: i, stress: stage.stress, readings: readings.length, drainagePath, ok: false, reason: `Fewer than ${MIN_TIME_READINGS} readings after the load was applied.`, taylor: null, secondary: null, notes: [] })
      return
    }
    const r = analyseTimeCurve(readings, drainagePath, basis)
    out.push(r.ok
      ? { stage: i, stress: stage.stress, readings: readings.length, drainagePath, ok: true, reason: null, taylor: r.taylor, secondary: r.secondary, notes: r.notes }
      : { stage: i, stress: stage.stress, readings: readings.length, drainagePath, ok: false, reason: r.reason, taylor: null, secondary: null, notes: [] })
  })
  return out
}

/** Median cv and Cα of the loading stages beyond σ'p (the virgin range settlement uses) and below it. */
export function timeSummary(stages: StageTimeAnalysis[], preconsolidation: number | null): TimeSummary {
  const ok = stages.filter(s => s.ok && s.taylor)
  const beyond = preconsolidation === null ? [] : ok.filter(s => s.stress > preconsolidation)
  const below = preconsolidation === null ? ok : ok.filter(s => s.stress <= preconsolidation)
  const cv = (list: StageTimeAnalysis[]) => median(list.map(s => s.taylor!.cv))
  const ca = (list: StageTimeAnalysis[]) => median(list.filter(s => s.secondary).map(s => s.secondary!.calpha))
  return {
    virgin: { cv: cv(beyond), calpha: ca(beyond), stages: beyond.length },
    recompression: { cv: cv(below), calpha: ca(below), stages: below.length },
  }
}

/**
 * The liquid-limit check on Cc: the sample's own index test, else the nearest sample at the same
 * point logged in the same stratum. Null when neither has a liquid limit above 10 %.
 */
export async function ccCheck(ctx: TestContext, cc: number): Promise<CcCheck | null> {
  const db = useDb()
  const rows = await db.select({ id: samples.id, identifier: samples.identifier, top: samples.top, bottom: samples.bottom, liquidLimit: indexTests.liquidLimit })
    .from(samples).innerJoin(indexTests, eq(indexTests.sampleId, samples.id))
    .where(eq(samples.pointId, ctx.point.id))
  const usable = rows.filter((r): r is typeof r & { liquidLimit: number } => r.liquidLimit !== null && r.liquidLimit > 10)
  let pick = usable.find(r => r.id === ctx.sample.id)
  if (!pick) {
    const intervals = await loggedIntervals([ctx.point.id])
    const depth = sampleDepth(ctx.sample)
    const own = stratumAtLogged(intervals.get(ctx.point.id) ?? [], depth)
    if (own) {
      pick = usable
        .filter(r => stratumAtLogged(intervals.get(ctx.point.id) ?? [], sampleDepth(r)) === own)
        .sort((a, b) => Math.abs(sampleDepth(a) - depth) - Math.abs(sampleDepth(b) - depth))[0]
    }
  }
  if (!pick || !(cc > 0)) return null
  const check = checkCompressionIndex(cc, pick.liquidLimit)
  return {
    ...check,
    liquidLimit: pick.liquidLimit,
    sampleId: pick.id,
    sampleIdentifier: pick.identifier,
    sameSample: pick.id === ctx.sample.id,
    reference: 'Cc ≈ 0.009 (LL − 10) for normally consolidated clays of low to medium sensitivity (Terzaghi & Peck 1967, after Skempton 1944); flagged beyond a factor of two (common practice).',
  }
}

// ---------------------------------------------------------------------------
// Logged strata
// ---------------------------------------------------------------------------

export interface LoggedInterval { top: number, bottom: number, code: string | null }

/** Logged intervals with their stratum codes, per point, top-down. */
export async function loggedIntervals(pointIds: string[]): Promise<Map<string, LoggedInterval[]>> {
  const out = new Map<string, LoggedInterval[]>()
  if (!pointIds.length) return out
  const rows = await useDb().select({ pointId: logIntervals.pointId, top: logIntervals.top, bottom: logIntervals.bottom, code: strata.code })
    .from(logIntervals).leftJoin(strata, eq(strata.id, logIntervals.stratumId))
    .where(anyOf(logIntervals.pointId, pointIds))
    .orderBy(asc(logIntervals.pointId), asc(logIntervals.top))
  for (const r of rows) {
    const list = out.get(r.pointId) ?? []
    list.push({ top: r.top, bottom: r.bottom, code: r.code })
    out.set(r.pointId, list)
  }
  return out
}

/** Stratum code of the logged interval at a depth (an interval's top belongs to it; the hole's base to the last interval). */
export function stratumAtLogged(intervals: LoggedInterval[], depth: number): string | null {
  const hit = intervals.find(iv => depth >= iv.top && depth < iv.bottom)
    ?? (intervals.length && Math.abs(depth - intervals[intervals.length - 1]!.bottom) < 1e-9 ? intervals[intervals.length - 1] : undefined)
  return hit?.code ?? null
}

// ---------------------------------------------------------------------------
// Adoptions
// ---------------------------------------------------------------------------

/** Every adoption of a test, newest first, with the adopter's name. */
export async function adoptionHistory(testId: string, db: Db = useDb()): Promise<ServerAdoptionRow[]> {
  const rows = await db.select({ ...getTableColumns(preconsolidationAdoptions), adoptedByName: users.displayName })
    .from(preconsolidationAdoptions)
    .leftJoin(users, eq(users.id, preconsolidationAdoptions.adoptedBy))
    .where(eq(preconsolidationAdoptions.oedometerTestId, testId))
    .orderBy(desc(preconsolidationAdoptions.adoptedAt), desc(preconsolidationAdoptions.id))
  return rows
}

/** Engine constructions an adoption can name; `dragged` and `typed` carry the engineer's own value. */
export function isEngineMethod(method: string): method is OedometerMethod {
  return method === 'casagrande' || method === 'pachecoSilva' || method === 'work' || method === 'bilinear'
}
