import { and, asc, count, eq, isNull, type SQL } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import { RESULT_CAUTION } from '#shared/caution'
import { isGeotechError } from '#shared/geotech/errors'
import type { OedometerInterpretation } from '#shared/geotech/oedometer'
import { ADOPTION_METHOD_LABELS, type AdoptionInput, type OedometerTestInput } from '#shared/schemas/lab'
import { useDb } from '../db/client'
import { investigationPoints, oedometerTests, preconsolidationAdoptions, samples, users } from '../db/schema'
import { runEngine } from '../utils/engine'
import { rehomeAttachmentsOf } from './attachments'
import { recordAudit } from './audit'
import { unprocessableError } from './http-errors'
import { projectDepthWords } from './project-units'
import {
  adoptionHistory, ccCheck, insituAt, interpretTest, isEngineMethod, loggedIntervals, prepareSpecimen, requireProjectSample, requireTest, reviseTest, sampleDepth,
  stratumAtLogged, stressContext, type TestChanges, testJson, timeAnalysis, timeSummary,
} from './lab'

/**
 * Edits a test from the form (version → 409 with the current test). When the curve changes (stages,
 * convention, e0, specimen height), the σ'p adopted from the old curve is withdrawn (`reviseTest`).
 */
export async function editTest(projectId: string, actorId: string, testId: string, { version, ...changes }: TestChanges & { version: number }) {
  const result = await useDb().transaction(tx => reviseTest(tx, { projectId, actorId, testId, version, changes }))
  return { test: testJson(result.test), adoptionWithdrawn: result.withdrawn, notes: result.notes }
}

/** A live reading of a curve for the list: Casagrande σ'p, sample quality, Cc, Cr, virgin cv and Cα, or the engine's reason. */
interface CurveReading { casagrande: number | null, deltaEOverE0: number | null, qualityClass: string | null, cc: number | null, cr: number | null, cv: number | null, calpha: number | null, error: string | null }

function readCurve(test: typeof oedometerTests.$inferSelect, effectiveStress: number | null): CurveReading {
  try {
    const out = interpretTest(test, effectiveStress)
    const casagrande = out.results.find(m => m.method === 'casagrande')?.preconsolidation ?? null
    // cv and Cα of the virgin range, where settlement happens (median of its stages).
    const time = timeSummary(timeAnalysis(test), casagrande).virgin
    return {
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
    return { casagrande: null, deltaEOverE0: null, qualityClass: null, cc: null, cr: null, cv: null, calpha: null, error: err.message }
  }
}

/**
 * The project's oedometer tests (one page) with their sample, point and logged stratum, the σ'p in
 * force (if adopted) and a live reading of the curve at σ'v0 from the stress model in force.
 */
export async function listTests(projectId: string, { pointId, limit, offset }: { pointId?: string, limit: number, offset: number }) {
  const where: SQL[] = [eq(investigationPoints.projectId, projectId)]
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
      .where(and(eq(preconsolidationAdoptions.projectId, projectId), isNull(preconsolidationAdoptions.supersededAt))),
    stressContext(projectId),
  ])
  const intervals = await loggedIntervals([...new Set(rows.map(r => r.point.id))])
  const adopted = new Map(current.map(c => [c.adoption.oedometerTestId, { ...c.adoption, adoptedByName: c.adoptedByName }]))
  const tests = rows.map((r) => {
    const { stages, ...test } = testJson(r)
    const insitu = insituAt(ctx, sampleDepth(r.sample))
    const reading = readCurve(r.test, insitu.effectiveStress)
    const stratumCode = stratumAtLogged(intervals.get(r.point.id) ?? [], insitu.depth)
    return { ...test, stageCount: stages.length, stratumCode, effectiveStress: insitu.effectiveStress, reading, adoption: adopted.get(r.test.id) ?? null }
  })
  return { tests, total: total?.n ?? 0, limit, offset, stressModel: ctx.info }
}

/**
 * The four σ'p constructions side by side with Cc, Cr, sample quality at σ'v0 (from the stress
 * model in force, at the sample's mid-depth), cv and Cα from time readings, the liquid-limit check
 * on Cc, and the adoption in force with its history. A curve with no yield is 422 with the
 * engine's message.
 */
export async function testInterpretation(projectId: string, testId: string) {
  const ctx = await requireTest(projectId, testId)
  const stress = await stressContext(projectId)
  const insitu = insituAt(stress, sampleDepth(ctx.sample))
  const out = runEngine(() => interpretTest(ctx.test, insitu.effectiveStress))
  const warnings = [...out.warnings]
  if (stress.definition === null) {
    warnings.push(`${stress.info.description} No OCR or sample quality until a version of the design model is saved.`)
  }
  else if (insitu.effectiveStress === null) {
    const { depth } = await projectDepthWords(projectId)
    warnings.push(`The stress model in force does not reach ${depth(Number(insitu.depth.toFixed(2)))} (or gives σ'v0 ≤ 0 there): no σ'v0, OCR or sample quality.`)
  }
  const [history, cc] = await Promise.all([adoptionHistory(testId), ccCheck(ctx, out.cc)])
  const adoption = history.find(a => a.supersededAt === null) ?? null
  const casagrande = out.results.find(r => r.method === 'casagrande')?.preconsolidation ?? null
  const time = timeAnalysis(ctx.test)
  const summary = timeSummary(time, adoption?.value ?? casagrande)
  const sigmaV0 = insitu.effectiveStress
  return {
    test: testJson(ctx),
    stressModel: { ...stress.info, ...insitu },
    e0: out.e0,
    cc: out.cc,
    cr: out.cr,
    recompressionBasis: out.recompressionBasis,
    virginLine: out.virginLine,
    loading: out.loading,
    loops: out.loops,
    methods: out.results.map(r => ({ ...r, ocr: sigmaV0 ? r.preconsolidation / sigmaV0 : null, pop: sigmaV0 ? r.preconsolidation - sigmaV0 : null })),
    sampleQuality: out.sampleQuality ?? null,
    timeCurves: {
      method: 'taylor-sqrt-t' as const,
      reference: 'cv by Taylor\'s √t method (Taylor 1948), Tv90 = 0.848, double drainage with Hdr = half the mean specimen height over the stage; Cα = Δe per log cycle of time after Taylor\'s t100 (common practice).',
      stages: time,
      summary,
      calphaOverCc: summary.virgin.calpha !== null && out.cc > 0 ? summary.virgin.calpha / out.cc : null,
    },
    ccCheck: cc,
    warnings,
    adoption,
    history,
    caution: RESULT_CAUTION,
  }
}

/** A new oedometer test on a sample of the project; stages converted to void ratios from the chosen convention. */
export async function createTest(projectId: string, actorId: string, body: OedometerTestInput) {
  const prepared = prepareSpecimen(body)
  const created = await useDb().transaction(async (tx) => {
    const { sample, point } = await requireProjectSample(projectId, body.sampleId, tx)
    const test = returnedRow(await tx.insert(oedometerTests).values({
      sampleId: sample.id,
      label: body.label,
      testType: body.testType,
      specimenHeight: body.specimenHeight,
      initialWaterContent: body.initialWaterContent,
      specificGravity: body.specificGravity,
      e0: prepared.e0,
      convention: body.convention,
      stages: prepared.stages,
      remarks: body.remarks,
    }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'oedometer-test', entityId: test.id, after: test }, tx)
    return { test: test, sample, point }
  })
  return { test: testJson(created), e0Computed: prepared.e0Computed, notes: prepared.notes }
}

/** Deletes a test and its adoption history (audited with the test row); its files move to the project. */
export async function deleteTest(projectId: string, actorId: string, testId: string) {
  await useDb().transaction(async (tx) => {
    const { test, sample, point } = await requireTest(projectId, testId, tx, { lock: true })
    await rehomeAttachmentsOf(tx, { projectId, actorId, ownerType: 'test', ownerId: test.id, label: `the oedometer test on ${point.identifier} ${sample.identifier}` })
    await tx.delete(oedometerTests).where(eq(oedometerTests.id, test.id))
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'oedometer-test', entityId: testId, before: test }, tx)
  })
}

/** A named construction's value may differ from the engine's by rounding only. */
const MATCH_TOLERANCE = 0.01

/**
 * Adopts a σ'p for the test with a reason: the adoption in force is superseded (kept in the
 * history), the new one records the sample quality and σ'v0 from the stress model in force now.
 * A value named after one of the constructions must be that construction's σ'p.
 */
export async function adoptPreconsolidation(projectId: string, actor: { id: string, displayName: string | null }, testId: string, body: AdoptionInput) {
  const stress = await stressContext(projectId)
  const { adoption, superseded } = await useDb().transaction(async (tx) => {
    const ctx = await requireTest(projectId, testId, tx, { lock: true })
    const insitu = insituAt(stress, sampleDepth(ctx.sample))
    let out: OedometerInterpretation | null = null
    try {
      out = interpretTest(ctx.test, insitu.effectiveStress)
    }
    catch (err) {
      // A curve the engine cannot read may still carry the engineer's own value; a named construction needs the engine.
      if (!isGeotechError(err) || isEngineMethod(body.method)) runEngine(() => { throw err })
    }
    if (out && isEngineMethod(body.method)) {
      const r = out.results.find(m => m.method === body.method)
      const label = ADOPTION_METHOD_LABELS[body.method]
      if (!r) throw unprocessableError(`The ${label} construction gives no σ'p on this curve; adopt another method's value, or type one.`, { code: 'method-without-result' })
      if (Math.abs(body.value / r.preconsolidation - 1) > MATCH_TOLERANCE) {
        const { stress: s } = await projectDepthWords(projectId, tx)
        throw unprocessableError(`The ${label} σ'p of this curve is ${s(r.preconsolidation)}, not ${s(body.value)}. Adopt it as it is, or type your own value.`, { code: 'value-does-not-match-method' })
      }
    }
    const now = new Date()
    // The adoption in force, if any, is superseded (a first adoption finds none).
    const [previous] = await tx.update(preconsolidationAdoptions).set({ supersededAt: now })
      .where(and(eq(preconsolidationAdoptions.oedometerTestId, testId), isNull(preconsolidationAdoptions.supersededAt))).returning()
    const row = returnedRow(await tx.insert(preconsolidationAdoptions).values({
      projectId,
      oedometerTestId: testId,
      method: body.method,
      value: body.value,
      reason: body.reason,
      deltaEOverE0: out?.sampleQuality?.deltaEOverE0 ?? null,
      qualityClass: out?.sampleQuality?.class ?? null,
      effectiveStress: insitu.effectiveStress,
      adoptedBy: actor.id,
      adoptedAt: now,
    }).returning())
    await recordAudit({ actorId: actor.id, projectId, action: 'adopt', entity: 'preconsolidation-adoption', entityId: row.id, before: previous ?? null, after: row }, tx)
    return { adoption: row, superseded: previous ?? null }
  })
  return { adoption: { ...adoption, adoptedByName: actor.displayName }, superseded, history: await adoptionHistory(testId) }
}
