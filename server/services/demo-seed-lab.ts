import { DEMO_OEDOMETER_PLAN, plannedOedometerSample } from '#shared/demo/generate'
import { demoStratum } from '#shared/demo/site'
import { degreeOfConsolidation } from '#shared/geotech/consolidation'
import { interpretOedometer } from '#shared/geotech/oedometer'
import { createStressEvaluator } from '#shared/geotech/stress'
import type { InvestigationRecord, OedometerTestRecord } from '#shared/investigation/types'
import { specimenHeightAt } from '#shared/lab/stages'
import { toStressInput } from '#shared/site-model/convert'
import { oedometerTests, preconsolidationAdoptions, type OedometerStageJson } from '../db/schema'
import { recordAudit } from './audit'
import { definitionFromLogs } from './site-models'
import type { Tx } from '../db/client'
import { present, returnedRow } from '../db/rows'

/** A common laboratory reading schedule for one 24 h stage, minutes (common practice). */
const LAST_READING_MINUTES = 1440
const READING_MINUTES = [0, 0.1, 0.25, 0.5, 1, 2, 4, 8, 15, 30, 60, 120, 240, 480, LAST_READING_MINUTES]
const MINUTES_PER_YEAR = 365.25 * 24 * 60
/** Secondary compression starts where Terzaghi's Tv reaches 2 (U ≈ 99.4 %). */
const END_OF_PRIMARY_TV = 2
/** Cα/Cc of inorganic clays (Mesri & Godlewski 1977, memory), for the invented readings. */
const CALPHA_OVER_CC = 0.04
/** Secondary compression is kept below this share of a stage's compression (small recompression stages). */
const SECONDARY_SHARE_MAX = 0.3

/**
 * Invented time readings for the loading stages of a demo test: Terzaghi's (1925) U(Tv) with the
 * stratum's cv from the scenario, then Cα·log10(t/tp) after primary, ending exactly on the stage's
 * 24 h void ratio. The drainage path follows the rule the interpretation uses (half the mean
 * specimen height over the stage), so cv read back by Taylor's method is the scenario's cv.
 */
export function demoTimeReadings(oed: OedometerTestRecord, heightMm: number, stratum: 'CRUST' | 'EST' | 'GLAC'): OedometerStageJson[] {
  const truth = present(demoStratum(stratum).compressibility, 'The demo stratum\'s compressibility')
  const basis = { e0: oed.e0, specimenHeight: heightMm }
  const toMm = (e: number) => (heightMm * (oed.e0 - e)) / (1 + oed.e0)
  let peak = oed.stages[0]?.stress ?? 0
  return oed.stages.map((stage, i) => {
    const out: OedometerStageJson = { stress: stage.stress, entered: stage.voidRatio, voidRatio: stage.voidRatio }
    if (i === 0 || stage.stress <= peak) {
      peak = Math.max(peak, stage.stress)
      return out
    }
    peak = stage.stress
    const ePrev = present(oed.stages[i - 1], 'The previous stage').voidRatio
    const hdr = 0.25 * (specimenHeightAt(ePrev, basis) + specimenHeightAt(stage.voidRatio, basis)) / 1000
    const start = toMm(ePrev)
    const total = toMm(stage.voidRatio) - start
    const tp = (END_OF_PRIMARY_TV * hdr * hdr / truth.cv) * MINUTES_PER_YEAR
    const cycles = Math.log10(LAST_READING_MINUTES / tp)
    const slope = Math.min((CALPHA_OVER_CC * truth.cc * heightMm) / (1 + oed.e0), (SECONDARY_SHARE_MAX * total) / cycles)
    const primary = total - slope * cycles
    out.readings = READING_MINUTES.map((t) => {
      const u = degreeOfConsolidation((truth.cv * (t / MINUTES_PER_YEAR)) / (hdr * hdr))
      const d = start + primary * u + (t > tp ? slope * Math.log10(t / tp) : 0)
      return { minutes: t, dial: Math.round(d * 1000) / 1000 }
    })
    return out
  })
}

/**
 * The scenario's 14 oedometer tests on their tubes, with invented time readings, and the
 * Casagrande σ'p adopted by the engineer for all but the two disturbed specimens, which are left
 * for the reviewer. σ'v0 and the sample quality at adoption come from the model the pages use
 * while the project has no site model.
 */
export async function seedDemoLab(tx: Tx, projectId: string, investigation: InvestigationRecord, sampleIds: Map<string, string>, adopterId: string): Promise<{ tests: number, adoptions: number }> {
  // The model the pages use while the project has no site model, built from the rows just written.
  const stressAt = createStressEvaluator(toStressInput(await definitionFromLogs(projectId, tx)))
  let adoptions = 0
  for (const [n, plan] of DEMO_OEDOMETER_PLAN.entries()) {
    const sample = plannedOedometerSample(investigation, plan)
    const oed = sample?.oedometer
    const sampleId = sample ? sampleIds.get(`${plan.point}/${sample.identifier}`) : undefined
    if (!sample || !oed || !sampleId) throw new Error(`Demo oedometer test ${plan.point} ${plan.stratum} #${plan.ordinal} has no sample.`)
    // The record gives the specimen height in metres; the test stores millimetres.
    const heightMm = Math.round(oed.specimenHeight * 1000 * 100) / 100
    const test = returnedRow(await tx.insert(oedometerTests).values({
      sampleId,
      label: `OED-${String(n + 1).padStart(2, '0')}`,
      testType: oed.testType,
      specimenHeight: heightMm,
      initialWaterContent: oed.initialWaterContent,
      specificGravity: oed.specificGravity,
      e0: oed.e0,
      convention: 'void-ratio',
      stages: demoTimeReadings(oed, heightMm, plan.stratum),
      remarks: oed.remarks,
    }).returning({ id: oedometerTests.id }))
    if (plan.quality === 'very-poor') continue
    const depth = 0.5 * (sample.top + sample.bottom)
    const effectiveStress = stressAt(depth).effectiveStress
    const out = interpretOedometer({ points: oed.stages, e0: oed.e0, insituStress: effectiveStress })
    const casagrande = present(out.results.find(r => r.method === 'casagrande'), 'The Casagrande result').preconsolidation
    const spread = Math.max(...out.results.map(r => Math.abs(r.preconsolidation / casagrande - 1)))
    await tx.insert(preconsolidationAdoptions).values({
      projectId,
      oedometerTestId: test.id,
      method: 'casagrande',
      value: Math.round(casagrande * 10) / 10,
      reason: `Clear break in the curve; the other constructions fall within ${Math.max(1, Math.ceil(spread * 100))} % of Casagrande.`,
      deltaEOverE0: out.sampleQuality?.deltaEOverE0 ?? null,
      qualityClass: out.sampleQuality?.class ?? null,
      effectiveStress,
      adoptedBy: adopterId,
    })
    adoptions++
  }
  await recordAudit({ actorId: adopterId, projectId, action: 'import', entity: 'oedometer-tests', after: { seeded: 'demo', tests: DEMO_OEDOMETER_PLAN.length, adoptions } }, tx)
  return { tests: DEMO_OEDOMETER_PLAN.length, adoptions }
}
