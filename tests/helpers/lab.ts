import type { InvestigationRecord } from '../../shared/investigation/types'
import { SITE_MODEL_SCHEMA_VERSION, type SiteModelDefinition } from '../../shared/site-model/definition'
// Synthetic oedometer curves for the lab API tests: the textbook bilinear e–log10 σ' idealisation
// (Terzaghi & Peck; common practice), e = e0 − Cr·log10(σ'/σ's) below σ'p and a further
// −Cc·log10(σ'/σ'p) beyond it, so the σ'p every construction aims at is known.
export interface Soil { e0: number, cr: number, cc: number }

/** Load-increment ratio 1, usual for incremental tests (ASTM D2435; common practice). */
export const DOUBLING = [10, 20, 40, 80, 160, 320, 640, 1280, 2560]
/** Compressibility of the demo scenario's estuarine clay. */
export const ESTUARINE: Soil = { e0: 2.1, cr: 0.09, cc: 0.85 }

export function bilinearCurve(soil: Soil, sigmaP: number, stresses = DOUBLING): { stress: number, voidRatio: number }[] {
  const xs = Math.log10(stresses[0]!)
  const xp = Math.log10(sigmaP)
  return stresses.map((stress) => {
    const x = Math.log10(stress)
    return { stress, voidRatio: soil.e0 - soil.cr * (Math.min(x, xp) - xs) - soil.cc * Math.max(x - xp, 0) }
  })
}

/** The same curve as cumulative compression Δh (mm) of a specimen of height h0 (mm): Δh = H0·(e0 − e)/(1 + e0). */
export function asDial(points: { stress: number, voidRatio: number }[], e0: number, h0: number): { stress: number, value: number }[] {
  return points.map(p => ({ stress: p.stress, value: (h0 * (e0 - p.voidRatio)) / (1 + e0) }))
}

/** A test body on a sample: the bilinear estuarine curve with σ'p = 80 kPa, in void ratios. */
export interface StageBody { stress: number, value: number, readings?: { minutes: number, dial: number }[] }

export function testBody(sampleId: string, label = 'OED-T1'): { sampleId: string, label: string, testType: string, specimenHeight: number, e0: number, convention: string, stages: StageBody[] } {
  return {
    sampleId,
    label,
    testType: 'incremental',
    specimenHeight: 20,
    e0: ESTUARINE.e0,
    convention: 'void-ratio',
    stages: bilinearCurve(ESTUARINE, 80).map(p => ({ stress: p.stress, value: p.voidRatio })),
  }
}

/**
 * The stress model the interpretation pages use while a project has no site model
 * (`definitionFromLogs` in ./site-models), built from the record itself: the seed's rows are not
 * visible outside its transaction yet. Same rule: each stratum at its mean logged thickness over
 * the holes that log it, unit weights from the strata list, the water table at the median
 * standing level, hydrostatic below it.
 */
/** An independent rebuild of the logs-derived stress model from the demo record (the test's oracle). */
export function demoDefinitionFromRecord(record: InvestigationRecord): SiteModelDefinition {
  const perHole = new Map<string, Map<string, number>>()
  for (const p of record.points) {
    for (const iv of p.intervals) {
      if (!iv.stratumCode) continue
      const m = perHole.get(iv.stratumCode) ?? new Map<string, number>()
      m.set(p.identifier, (m.get(p.identifier) ?? 0) + (iv.bottom - iv.top))
      perHole.set(iv.stratumCode, m)
    }
  }
  const ordered = [...record.strata].sort((a, b) => a.displayOrder - b.displayOrder || a.code.localeCompare(b.code))
  const levels = record.points.flatMap(p => p.groundwater.filter(g => g.kind === 'standing' && g.depth !== null).map(g => g.depth!)).sort((a, b) => a - b)
  return {
    schemaVersion: SITE_MODEL_SCHEMA_VERSION,
    surcharge: 0,
    gammaW: 9.81,
    groundwater: { waterTableDepth: levels.length ? levels[Math.floor(levels.length / 2)]! : 1, piezometers: [] },
    strata: ordered.map((s) => {
      const t = [...(perHole.get(s.code)?.values() ?? [])]
      const thickness = t.length ? t.reduce((a, b) => a + b, 0) / t.length : 1
      return { code: s.code, name: s.name, thickness: Math.round(thickness * 100) / 100, unitWeight: s.unitWeight, unitWeightSaturated: s.unitWeightSaturated, compressible: false, cptFactor: 0.33 }
    }),
    flagsInForce: [],
  }
}

