// Laboratory API over real HTTP: oedometer tests on samples (conventions, e0 from Gs·w, versions),
// the interpretation on a synthetic curve with a known σ'p, the no-yield 422, adoptions and their
// history, and the σ'p points of the demo project from all three sources.
import { median } from 'simple-statistics'
import { beforeAll, describe, expect, it } from 'vitest'
import { generateDemoInvestigation, DEMO_OEDOMETER_PLAN, plannedOedometerSample } from '../../shared/demo/generate'
import { degreeOfConsolidation } from '../../shared/geotech/consolidation'
import { createStressEvaluator } from '../../shared/geotech/stress'
import { cptPointId } from '../../shared/review/flags'
import { toStressInput } from '../../shared/site-model/convert'
import { type Client, createUser, demoEmail, signIn, signedInDemo } from '../helpers/http'
import { asDial, bilinearCurve, demoDefinitionFromRecord, DOUBLING, ESTUARINE, testBody } from '../helpers/lab'
import { createDemoCopy } from '../helpers/demo-project'
import { createPoint, createProject, createSavedModel } from '../helpers/project'

interface TestJson {
  id: string
  version: number
  label: string
  e0: number
  convention: string
  stages: { stress: number, entered: number, voidRatio: number, readings?: { minutes: number, dial: number }[] }[]
  depth: number
  sample: { id: string, identifier: string }
  point: { id: string, identifier: string }
  e0Check: { fromWaterContent: number | null, saturation: number | null }
}
interface Adoption { id: string, method: string, value: number, reason: string, qualityClass: string | null, deltaEOverE0: number | null, effectiveStress: number | null, adoptedAt: string, supersededAt: string | null, adoptedByName: string | null, oedometerTestId: string }
interface MethodResult { method: string, preconsolidation: number, ocr: number | null }
interface StageTime { stage: number, stress: number, ok: boolean, reason: string | null, taylor: { cv: number, t90: number } | null, secondary: { calpha: number } | null }
interface Interpretation {
  test: TestJson
  stressModel: { source: string, description: string, depth: number, effectiveStress: number | null }
  cc: number
  cr: number
  methods: MethodResult[]
  sampleQuality: { deltaEOverE0: number, class: string, ocrBand: string } | null
  timeCurves: { method: string, stages: StageTime[], summary: { virgin: { cv: number | null, calpha: number | null } } }
  ccCheck: { liquidLimit: number, estimate: number, ratio: number, flagged: boolean, sameSample: boolean } | null
  adoption: Adoption | null
  history: Adoption[]
  caution: string
}
interface SigmaPoint { id: string, source: string, method: string, pointId: string, pointIdentifier: string, depth: number, preconsolidation: number, effectiveStress: number | null, stratumCode: string | null, qualityClass: string | null, adoptedBy: string | null, adoptedAt: string | null }

const MINUTES_PER_YEAR = 365.25 * 24 * 60

describe('oedometer tests and σ\'p adoption', () => {
  const { owner, engineer, geologist } = signedInDemo('owner', 'engineer', 'geologist')
  let projectId: string
  let pointId: string
  let sampleId: string
  let base: string

  beforeAll(async () => {
    projectId = (await createProject(owner, 'LAB', 'Laboratory test site', ['engineer', 'geologist'])).id
    base = `/api/projects/${projectId}/tests/oedometer`
    // One clay stratum, γ = γsat = 18 kN/m³, logged 0–20 m, standing water at 1.0 m.
    const st = await geologist.post<{ stratum: { id: string } }>(`/api/projects/${projectId}/strata`, { code: 'CLAY', name: 'Soft clay', colour: 'c', pattern: 'p', unitWeight: 18, unitWeightSaturated: 18 })
    expect(st.status).toBe(201)
    pointId = await createPoint(geologist, projectId, { identifier: 'BH-L1' })
    const pointUrl = `/api/projects/${projectId}/points/${pointId}`
    expect((await geologist.request('PUT', `${pointUrl}/intervals`, { intervals: [{ top: 0, bottom: 20, description: 'Soft grey CLAY', uscs: 'CH', stratumId: st.body.stratum.id }] })).status).toBe(200)
    expect((await geologist.post(`${pointUrl}/groundwater`, { kind: 'standing', observedAt: '2025-03-04T08:00:00Z', depth: 1 })).status).toBe(201)
    const s = await geologist.post<{ sample: { id: string } }>(`${pointUrl}/samples`, { identifier: 'U1', top: 4.5, bottom: 5, type: 'thin-walled-tube' })
    sampleId = s.body.sample.id
    // LL = 40 %: 0.009 (40 − 10) = 0.27, far below the curve's Cc = 0.85.
    expect((await geologist.request('PUT', `${pointUrl}/samples/${sampleId}/index-test`, { liquidLimit: 40, plasticLimit: 20 })).status).toBe(200)
    // The design model, started from the logs, with version 1 saved: the model in force.
    await createSavedModel(engineer, projectId)
  })

  it('creates a test from dial readings, converting them to void ratios, and lists it with its sample and depth', async () => {
    const curve = bilinearCurve(ESTUARINE, 80)
    const r = await geologist.post<{ test: TestJson }>(base, { sampleId, label: 'OED-D1', testType: 'incremental', specimenHeight: 20, e0: 2.1, convention: 'dial', stages: asDial(curve, 2.1, 20) })
    expect(r.status).toBe(201)
    expect(r.body.test.convention).toBe('dial')
    r.body.test.stages.forEach((s, i) => expect(s.voidRatio).toBeCloseTo(curve[i]!.voidRatio, 10))
    expect(r.body.test.depth).toBeCloseTo(4.75, 10)
    const list = await geologist.get<{ tests: { id: string, stageCount: number, point: { identifier: string }, sample: { identifier: string }, reading: { qualityClass: string | null } }[] }>(base)
    const row = list.body.tests.find(t => t.id === r.body.test.id)!
    expect(row.stageCount).toBe(9)
    expect(row.point.identifier).toBe('BH-L1')
    expect(row.sample.identifier).toBe('U1')
    expect(row.reading.qualityClass).toBe('very-good-to-excellent')
  })

  it('computes e0 from Gs·w for a saturated specimen and says so', async () => {
    const r = await geologist.post<{ test: TestJson, e0Computed: boolean, notes: string[] }>(base, {
      sampleId, label: 'OED-W1', specimenHeight: 20, specificGravity: 2.66, initialWaterContent: 79, convention: 'strain', stages: [{ stress: 10, value: 0.5 }, { stress: 20, value: 1.2 }],
    })
    expect(r.status).toBe(201)
    // e0 = 2.66 × 79 / 100 = 2.1014; ε = 0.5 % → e = 2.1014 − 3.1014 × 0.005 = 2.085893.
    expect(r.body.test.e0).toBeCloseTo(2.1014, 10)
    expect(r.body.e0Computed).toBe(true)
    expect(r.body.notes[0]).toContain('saturated')
    expect(r.body.test.stages[0]!.voidRatio).toBeCloseTo(2.085893, 6)
    expect(r.body.test.e0Check.saturation).toBeCloseTo(1, 10)
    expect((await geologist.delete(`${base}/${r.body.test.id}`)).status).toBe(200)
  })

  it('refuses shape errors with 400, impossible stages with 422 naming the stage, and a sample of another project with 404', async () => {
    const noE0 = await geologist.post<{ data: { issues: { path: string }[] } }>(base, { sampleId, label: 'x', specimenHeight: 20, convention: 'void-ratio', stages: [{ stress: 10, value: 2 }] })
    expect(noE0.status).toBe(400)
    expect(noE0.body.data.issues.map(i => i.path)).toContain('e0')
    const closed = await geologist.post<{ message: string }>(base, { sampleId, label: 'x', specimenHeight: 20, e0: 1, convention: 'dial', stages: [{ stress: 10, value: 1 }, { stress: 20, value: 12 }] })
    expect(closed.status).toBe(422)
    expect(closed.body.message).toContain('Stage 2')
    const other = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `LAB2-${Date.now().toString(36)}`, name: 'Elsewhere' })
    const foreign = await owner.post(`/api/projects/${other.body.project.id}/tests/oedometer`, testBody(sampleId))
    expect(foreign.status).toBe(404)
  })

  it('versions a test: PATCH bumps the version, a stale one is 409 with the current test; delete removes it; another project\'s id is 404', async () => {
    const c = await geologist.post<{ test: TestJson }>(base, testBody(sampleId, 'OED-V1'))
    const url = `${base}/${c.body.test.id}`
    const p1 = await geologist.patch<{ test: TestJson }>(url, { label: 'OED-V1a', version: c.body.test.version })
    expect(p1.status).toBe(200)
    expect(p1.body.test.version).toBe(c.body.test.version + 1)
    const stale = await engineer.patch<{ data: { current: TestJson } }>(url, { label: 'older edit', version: c.body.test.version })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.label).toBe('OED-V1a')
    const conventionOnly = await geologist.patch(url, { convention: 'strain', version: p1.body.test.version })
    expect(conventionOnly.status).toBe(400)
    const other = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `LAB3-${Date.now().toString(36)}`, name: 'Elsewhere too' })
    expect((await owner.get(`/api/projects/${other.body.project.id}/tests/oedometer/${c.body.test.id}`)).status).toBe(404)
    expect((await geologist.delete(url)).status).toBe(200)
    expect((await geologist.get(url)).status).toBe(404)
    expect((await geologist.delete(url)).status).toBe(404)
  })

  describe('interpretation of a synthetic curve with σ\'p = 80 kPa', () => {
    let testId: string
    let interp: Interpretation
    // Readings of the 160 kPa stage from Terzaghi's U(Tv) with cv = 1.2 m²/yr: Hdr is half the mean
    // specimen height over the stage, H = 20·(1 + e)/(1 + e0) mm.
    const curve = bilinearCurve(ESTUARINE, 80)
    const hdrMm = 0.25 * (20 * (1 + curve[3]!.voidRatio) / 3.1 + 20 * (1 + curve[4]!.voidRatio) / 3.1)
    const readings = [0, 0.1, 0.25, 0.5, 1, 2, 4, 8, 15, 30, 60, 120, 240, 480, 1440].map(t => ({
      minutes: t,
      dial: 3 + 0.9 * degreeOfConsolidation((1.2 * t) / MINUTES_PER_YEAR / (hdrMm / 1000) ** 2),
    }))

    beforeAll(async () => {
      const body = testBody(sampleId, 'OED-S1')
      body.stages[4] = { ...body.stages[4]!, readings }
      const c = await geologist.post<{ test: TestJson }>(base, body)
      expect(c.status).toBe(201)
      testId = c.body.test.id
      const r = await geologist.get<Interpretation>(`${base}/${testId}/interpretation`)
      expect(r.status).toBe(200)
      interp = r.body
    })

    it('takes σ\'v0 at the sample\'s mid-depth from the saved version of the design model (started from the logs)', () => {
      // σ'v0(4.75 m) = 18 × 4.75 − 9.81 × (4.75 − 1.0) = 85.5 − 36.7875 = 48.7125 kPa (hand calculation).
      expect(interp.stressModel.source).toBe('version')
      expect(interp.stressModel.depth).toBeCloseTo(4.75, 10)
      expect(interp.stressModel.effectiveStress).toBeCloseTo(48.7125, 3)
      expect(interp.stressModel.description).toContain('not yet approved')
    })

    it('returns the four methods\' σ\'p near 80 kPa, with OCR from σ\'v0', () => {
      const by = Object.fromEntries(interp.methods.map(m => [m.method, m]))
      expect(Object.keys(by).sort()).toEqual(['bilinear', 'casagrande', 'pachecoSilva', 'work'])
      // Work method: exact when σ'p is a load stage (Becker et al. 1987, see the engine tests).
      expect(by.work!.preconsolidation).toBeCloseTo(80, 3)
      for (const m of ['casagrande', 'pachecoSilva']) {
        expect(by[m]!.preconsolidation / 80, m).toBeGreaterThan(0.9)
        expect(by[m]!.preconsolidation / 80, m).toBeLessThan(1.1)
      }
      expect(by.work!.ocr).toBeCloseTo(80 / 48.7125, 3)
    })

    it('recovers Cc and Cr and classes the sample by Δe/e0 at σ\'v0 (Lunne et al. 1997)', () => {
      expect(interp.cc).toBeCloseTo(0.85, 6)
      expect(interp.cr).toBeCloseTo(0.09, 6)
      // e(σ'v0) = 2.10 − 0.09·log10(48.7125/10) = 2.10 − 0.09 × 0.687640 = 2.038112; Δe/e0 = 0.061888/2.10 = 0.029470.
      expect(interp.sampleQuality!.deltaEOverE0).toBeCloseTo(0.029470, 5)
      expect(interp.sampleQuality!.ocrBand).toBe('1-2')
      expect(interp.sampleQuality!.class).toBe('very-good-to-excellent')
      expect(interp.caution).toContain('licensed engineer')
    })

    it('flags Cc against the liquid-limit estimate when off by more than ×2', () => {
      expect(interp.ccCheck!.sameSample).toBe(true)
      expect(interp.ccCheck!.estimate).toBeCloseTo(0.27, 10)
      expect(interp.ccCheck!.ratio).toBeCloseTo(0.85 / 0.27, 5)
      expect(interp.ccCheck!.flagged).toBe(true)
    })

    it('reads cv from the stage\'s time readings by Taylor\'s method within 5 %', () => {
      expect(interp.timeCurves.method).toBe('taylor-sqrt-t')
      const stage = interp.timeCurves.stages.find(s => s.stage === 4)!
      expect(stage.ok).toBe(true)
      expect(Math.abs(stage.taylor!.cv / 1.2 - 1)).toBeLessThan(0.05)
      expect(interp.timeCurves.stages).toHaveLength(1)
    })

    it('adopts with a reason, supersedes the adoption in force and keeps the history newest first', async () => {
      const url = `${base}/${testId}/adoptions`
      expect((await engineer.post(url, { method: 'typed', value: 80, reason: '' })).status).toBe(400)
      expect((await engineer.post(url, { method: 'typed', value: 80, reason: 'ok' })).status).toBe(400)
      expect((await engineer.post(url, { method: 'typed', value: 80 })).status).toBe(400)
      expect((await geologist.post(url, { method: 'typed', value: 80, reason: 'not my call' })).status).toBe(403)
      const cas = interp.methods.find(m => m.method === 'casagrande')!.preconsolidation
      const wrong = await engineer.post<{ message: string }>(url, { method: 'casagrande', value: cas * 1.2, reason: 'mislabelled' })
      expect(wrong.status).toBe(422)
      expect(wrong.body.message).toContain('Casagrande')
      expect(wrong.body.message).toContain(`is ${cas.toFixed(1)} kPa, not ${(cas * 1.2).toFixed(1)} kPa.`)
      // On a US project the same refusal quotes the project's stress unit (1 psf = 0.04788026 kPa, NIST SP 811).
      expect((await owner.patch(`/api/projects/${projectId}`, { unitSystem: 'US', usStressUnit: 'psf' })).status).toBe(200)
      try {
        const us = await engineer.post<{ message: string }>(url, { method: 'casagrande', value: cas * 1.2, reason: 'mislabelled' })
        expect(us.status).toBe(422)
        expect(us.body.message).toContain(`is ${(cas / 0.047880259).toFixed(0)} psf, not ${(cas * 1.2 / 0.047880259).toFixed(0)} psf.`)
        expect(us.body.message).not.toContain('kPa')
      }
      finally {
        expect((await owner.patch(`/api/projects/${projectId}`, { unitSystem: 'SI' })).status).toBe(200)
      }

      const first = await engineer.post<{ adoption: Adoption, superseded: Adoption | null }>(url, { method: 'casagrande', value: Math.round(cas * 10) / 10, reason: 'Clear break; methods agree' })
      expect(first.status).toBe(201)
      expect(first.body.superseded).toBeNull()
      expect(first.body.adoption.qualityClass).toBe('very-good-to-excellent')
      expect(first.body.adoption.effectiveStress).toBeCloseTo(48.7125, 3)
      expect(first.body.adoption.adoptedByName).toBe('Tomas Lindqvist')
      const second = await engineer.post<{ adoption: Adoption, superseded: Adoption, history: Adoption[] }>(url, { method: 'dragged', value: 84, reason: 'Read from the plot at the end of the bend' })
      expect(second.status).toBe(201)
      expect(second.body.superseded.id).toBe(first.body.adoption.id)
      expect(second.body.superseded.supersededAt).toBe(second.body.adoption.adoptedAt)

      const h = await geologist.get<{ adoption: Adoption, history: Adoption[] }>(url)
      expect(h.body.history.map(a => a.method)).toEqual(['dragged', 'casagrande'])
      expect(h.body.history[0]!.supersededAt).toBeNull()
      expect(h.body.history[1]!.supersededAt).toBe(h.body.history[0]!.adoptedAt)
      expect(h.body.adoption.value).toBe(84)

      const again = await geologist.get<Interpretation>(`${base}/${testId}/interpretation`)
      expect(again.body.adoption!.id).toBe(second.body.adoption.id)
      expect(again.body.history).toHaveLength(2)

      const audit = await owner.get<{ events: { action: string, entity: string, entityId: string }[] }>(`/api/projects/${projectId}/audit?limit=100`)
      const mine = new Set([first.body.adoption.id, second.body.adoption.id])
      expect(audit.body.events.filter(e => e.action === 'adopt' && e.entity === 'preconsolidation-adoption' && mine.has(e.entityId)).map(e => e.entityId)).toEqual([second.body.adoption.id, first.body.adoption.id])

      const points = await geologist.get<{ points: SigmaPoint[] }>(`/api/projects/${projectId}/preconsolidation-points`)
      const lab = points.body.points.filter(p => p.source === 'oedometer')
      expect(lab.map(p => p.id)).toContain(second.body.adoption.id)
      expect(lab.map(p => p.id)).not.toContain(first.body.adoption.id)
      expect(lab.find(p => p.id === second.body.adoption.id)!).toMatchObject({ method: 'dragged', preconsolidation: 84, pointIdentifier: 'BH-L1', stratumCode: 'CLAY', qualityClass: 'very-good-to-excellent', adoptedBy: 'Tomas Lindqvist' })
      expect(lab.find(p => p.id === second.body.adoption.id)!.depth).toBeCloseTo(4.75, 10)
    })

    it('withdraws the adoption when the curve changes, and keeps it in the history', async () => {
      const c = await geologist.post<{ test: TestJson }>(base, testBody(sampleId, 'OED-S2'))
      const url = `${base}/${c.body.test.id}`
      const first = await engineer.post<{ adoption: Adoption }>(`${url}/adoptions`, { method: 'work', value: 80, reason: 'Work method on a clear break' })
      expect(first.status).toBe(201)
      const stages = bilinearCurve(ESTUARINE, 160).map(p => ({ stress: p.stress, value: p.voidRatio }))
      const p = await geologist.patch<{ test: TestJson, adoptionWithdrawn: Adoption | null }>(url, { stages, version: c.body.test.version })
      expect(p.status).toBe(200)
      expect(p.body.adoptionWithdrawn!.id).toBe(first.body.adoption.id)
      const h = await geologist.get<{ adoption: Adoption | null, history: Adoption[] }>(`${url}/adoptions`)
      expect(h.body.adoption).toBeNull()
      expect(h.body.history.map(a => a.id)).toEqual([first.body.adoption.id])
      expect(h.body.history[0]!.supersededAt).not.toBeNull()
      // The new curve yields at a load stage, 160 kPa, where the work method is exact.
      const again = await geologist.get<Interpretation>(`${url}/interpretation`)
      expect(again.body.methods.find(m => m.method === 'work')!.preconsolidation).toBeCloseTo(160, 3)
      // A label change leaves the curve and its (new) adoption alone.
      const a = await engineer.post<{ adoption: Adoption }>(`${url}/adoptions`, { method: 'typed', value: 160, reason: 'Re-read after the correction' })
      expect(a.status).toBe(201)
      const label = await geologist.patch<{ adoptionWithdrawn: Adoption | null }>(url, { label: 'OED-S2 (corrected)', version: p.body.test.version })
      expect(label.status).toBe(200)
      expect(label.body.adoptionWithdrawn).toBeNull()
      expect((await geologist.get<{ adoption: Adoption | null }>(`${url}/adoptions`)).body.adoption!.id).toBe(a.body.adoption.id)
    })
  })

  it('answers 422 with the engine\'s message for a curve with no yield; a typed value can still be adopted', async () => {
    // One straight line in e–log σ': no yield.
    const stages = DOUBLING.map(s => ({ stress: s, value: 2.1 - 0.3 * Math.log10(s / 10) }))
    const c = await geologist.post<{ test: TestJson }>(base, { sampleId, label: 'OED-NY', specimenHeight: 20, e0: 2.1, convention: 'void-ratio', stages })
    expect(c.status).toBe(201)
    const r = await geologist.get<{ message: string, data: { code: string } }>(`${base}/${c.body.test.id}/interpretation`)
    expect(r.status).toBe(422)
    expect(r.body.data.code).toBe('no-yield')
    expect(r.body.message).toContain('no yield')
    const named = await engineer.post(`${base}/${c.body.test.id}/adoptions`, { method: 'casagrande', value: 50, reason: 'not possible' })
    expect(named.status).toBe(422)
    const typed = await engineer.post<{ adoption: Adoption }>(`${base}/${c.body.test.id}/adoptions`, { method: 'typed', value: 12, reason: 'Yield below the first stage; from the CPT nearby' })
    expect(typed.status).toBe(201)
    expect(typed.body.adoption.qualityClass).toBeNull()
    const list = await geologist.get<{ tests: { id: string, reading: { error: string | null } }[] }>(base)
    expect(list.body.tests.find(t => t.id === c.body.test.id)!.reading.error).toContain('no yield')
  })
})

describe('σ\'p points of the demo project', () => {
  let c: Client
  let projectId: string
  let points: SigmaPoint[]
  const record = generateDemoInvestigation()

  /** A copy of the demo's content with a design model saved from the logs: σ'v0 is the scenario's. */
  async function read<T extends { stressModel: { source: string } }>(url: string): Promise<T> {
    const r = await c.get<T>(url)
    expect(r.status).toBe(200)
    expect(r.body.stressModel.source).toBe('version')
    return r.body
  }

  beforeAll(async () => {
    c = await signIn(demoEmail('reviewer'))
    projectId = await createDemoCopy('LAB-SIGMA')
    const body = await read<{ points: SigmaPoint[], stressModel: { modelId: string | null, source: string }, caution: string }>(`/api/projects/${projectId}/preconsolidation-points`)
    expect(body.caution).toContain('licensed engineer')
    points = body.points
  })

  it('holds the 12 seeded oedometer adoptions (the two disturbed tests are left for the reviewer), each with its quality class', () => {
    const oed = points.filter(p => p.source === 'oedometer')
    expect(oed).toHaveLength(12)
    expect(oed.every(p => p.adoptedBy === 'Tomas Lindqvist' && p.qualityClass !== null && p.qualityClass !== 'very-poor')).toBe(true)
    // Seeded as Casagrande; a browser test may re-adopt one of them meanwhile.
    expect(oed.filter(p => p.method === 'casagrande').length).toBeGreaterThanOrEqual(11)
    expect(new Set(oed.map(p => p.stratumCode))).toEqual(new Set(['CRUST', 'EST', 'GLAC']))
    // POP of the estuarine clay's good tests about 25 kPa (scenario ground model), within a loose band.
    const est = oed.filter(p => p.stratumCode === 'EST' && p.effectiveStress !== null)
    const pop = median(est.map(p => p.preconsolidation - p.effectiveStress!))
    console.info(`demo EST POP from oedometer adoptions: ${pop.toFixed(1)} kPa (n = ${est.length})`)
    expect(pop).toBeGreaterThan(12)
    expect(pop).toBeLessThan(40)
  })

  it('CPT points: σ\'p − σ\'v0 in the estuarine clay around 25 kPa, ids from cptPointId, resampled at 0.25 m', () => {
    const cpt = points.filter(p => p.source === 'cpt')
    expect(new Set(cpt.map(p => p.pointIdentifier))).toEqual(new Set(['CPT-01', 'CPT-02', 'CPT-03', 'CPT-04']))
    for (const p of cpt.slice(0, 20)) expect(p.id).toBe(cptPointId(p.pointId, p.depth))
    const one = cpt.filter(p => p.pointIdentifier === 'CPT-01')
    // 22 m at 0.25 m windows (88), less the made ground and the model's sand band (the model saved from
    // the logs starts it a few metres above the sounding's end), where σ'p is not derived from the cone.
    expect(one.length).toBeGreaterThan(55)
    expect(one.length).toBeLessThan(85)
    expect(cpt.filter(p => p.stratumCode === 'MG' || p.stratumCode === 'SAND')).toEqual([])
    // Away from the stratum boundaries (which vary by ±0.5 m between holes): 5–12 m.
    const est = cpt.filter(p => p.stratumCode === 'EST' && p.depth > 5 && p.depth < 12 && p.effectiveStress !== null)
    const pop = median(est.map(p => p.preconsolidation - p.effectiveStress!))
    console.info(`demo EST POP from CPTu: ${pop.toFixed(1)} kPa (n = ${est.length})`)
    expect(est.length).toBeGreaterThan(80)
    expect(pop).toBeGreaterThan(15)
    expect(pop).toBeLessThan(35)
  })

  it('vane points: σ\'p = μ·su/0.22 with μ from the estuarine clay\'s PI, σ\'p − σ\'v0 around 25 kPa', () => {
    const vane = points.filter(p => p.source === 'vane')
    expect(vane.length).toBeGreaterThan(50)
    expect(vane.every(p => p.id.startsWith('vane:') && p.stratumCode === 'EST')).toBe(true)
    // The vane holes have no samples: μ comes from the project's PI for the stratum.
    expect(new Set(vane.map(p => p.method))).toEqual(new Set(['pi-of-stratum']))
    const pop = median(vane.filter(p => p.effectiveStress !== null && p.depth < 12).map(p => p.preconsolidation - p.effectiveStress!))
    console.info(`demo EST POP from vanes: ${pop.toFixed(1)} kPa`)
    expect(pop).toBeGreaterThan(15)
    expect(pop).toBeLessThan(35)
  })

  it('dense=1 adds every CPT row as compact arrays', async () => {
    const r = await c.get<{ dense: { strata: string[], cpt: { pointIdentifier: string, depth: number[], preconsolidation: number[], stratum: number[] }[] }, behaviour: { pointIdentifier: string, depth: number[], ic: number[] }[] }>(`/api/projects/${projectId}/preconsolidation-points?dense=1&spacing=0.5`)
    expect(r.status).toBe(200)
    expect(r.body.dense.cpt).toHaveLength(4)
    // 0.02 m rows over 22 m (1 100), less the made ground and the model's sand band (σ'p not derived from the cone there).
    for (const s of r.body.dense.cpt) {
      expect(s.depth.length).toBeGreaterThan(700)
      expect(s.depth.length).toBeLessThan(1060)
      expect(s.preconsolidation).toHaveLength(s.depth.length)
      expect(s.stratum).toHaveLength(s.depth.length)
      expect(s.stratum.map(i => r.body.dense.strata[i]).filter(code => code === 'MG' || code === 'SAND')).toEqual([])
    }
    expect(r.body.dense.strata).toContain('EST')
    // Ic beside them in every stratum, fill and sand included: one median per 0.1 m.
    expect(r.body.behaviour.map(b => b.pointIdentifier).sort()).toEqual(['CPT-01', 'CPT-02', 'CPT-03', 'CPT-04'])
    for (const b of r.body.behaviour) {
      expect(b.depth.length).toBeGreaterThan(200)
      expect(b.ic).toHaveLength(b.depth.length)
      expect(Math.min(...b.depth)).toBeLessThan(1)
    }
    expect((await c.get(`/api/projects/${projectId}/preconsolidation-points?spacing=0`)).status).toBe(400)
  })

  it('the copied adoptions carry σ\'v0 of the version in force (the design model saved from the logs)', async () => {
    const evaluate = createStressEvaluator(toStressInput(demoDefinitionFromRecord(record)))
    const list = await read<{ stressModel: { modelId: string | null, source: string }, tests: { id: string, label: string, depth: number, point: { identifier: string }, sample: { identifier: string }, effectiveStress: number | null, adoption: Adoption | null }[] }>(`/api/projects/${projectId}/tests/oedometer`)
    expect(list.tests).toHaveLength(14)
    const disturbed = DEMO_OEDOMETER_PLAN.filter(p => p.quality === 'very-poor').map(p => `${p.point}/${plannedOedometerSample(record, p)!.identifier}`)
    for (const t of list.tests) {
      const key = `${t.point.identifier}/${t.sample.identifier}`
      // A model started from the logs gives the σ'v0 the seed used.
      expect(t.effectiveStress!, key).toBeCloseTo(evaluate(t.depth).effectiveStress, 6)
      if (disturbed.includes(key)) {
        expect(t.adoption, key).toBeNull()
        continue
      }
      if (t.adoption!.method === 'casagrande') expect(t.adoption!.effectiveStress!, key).toBeCloseTo(evaluate(t.depth).effectiveStress, 6)
    }
  })

  it('a demo estuarine test gives back the scenario\'s cv = 1.2 m²/yr and Cα = 0.04·Cc from its time readings', async () => {
    const list = await c.get<{ tests: { id: string, point: { identifier: string }, sample: { identifier: string } }[] }>(`/api/projects/${projectId}/tests/oedometer`)
    const plan = DEMO_OEDOMETER_PLAN.find(p => p.point === 'BH-02' && p.stratum === 'EST' && p.ordinal === 3)!
    const sample = plannedOedometerSample(record, plan)!
    const t = list.body.tests.find(x => x.point.identifier === 'BH-02' && x.sample.identifier === sample.identifier)!
    const r = await c.get<Interpretation>(`/api/projects/${projectId}/tests/oedometer/${t.id}/interpretation`)
    expect(r.status).toBe(200)
    const v = r.body.timeCurves.summary.virgin
    // Taylor's method reads 1.5 % high on Terzaghi's curve (see tests/unit/lab/time-curve.test.ts); readings rounded to 1 µm.
    expect(Math.abs(v.cv! / 1.2 - 1)).toBeLessThan(0.06)
    // Cα = 0.04 × 0.85 = 0.034 (Mesri & Godlewski 1977, memory), as the demo readings were made.
    expect(Math.abs(v.calpha! / 0.034 - 1)).toBeLessThan(0.05)
    expect(r.body.ccCheck?.flagged ?? false).toBe(false)
  })

  it('the CPT interpretation of a sounding gives qt, qnet, Rf, Bq and σ\'p per row through the stress model', async () => {
    const pts = await c.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${projectId}/points?kind=cpt`)
    const cpt = pts.body.points.find(p => p.identifier === 'CPT-02')!
    const raw = await c.get<{ areaRatio: number, depth: number[], qc: number[], u2: number[], fs: number[] }>(`/api/projects/${projectId}/points/${cpt.id}/cpt`)
    const r = { body: await read<{ stressModel: { modelId: string | null, source: string }, count: number, rows: Record<string, (number | null)[]>, resampled: SigmaPoint[], coneFactors: { code: string, k: number }[] }>(`/api/projects/${projectId}/points/${cpt.id}/cpt/interpretation?spacing=0.5`) }
    expect(r.body.count).toBe(raw.body.depth.length)
    const i = raw.body.depth.findIndex(d => d >= 8)
    // qt = qc + u2(1 − a) (Campanella et al. 1982); qnet = qt − σv0; Bq = (u2 − u0)/qnet; Rf = fs/qt·100.
    const qt = raw.body.qc[i]! + raw.body.u2[i]! * (1 - raw.body.areaRatio)
    expect(r.body.rows.qt![i]).toBeCloseTo(qt, 1)
    const qnet = qt - r.body.rows.totalStress![i]!
    expect(r.body.rows.qnet![i]).toBeCloseTo(qnet, 0)
    expect(r.body.rows.preconsolidation![i]).toBeCloseTo(0.33 * qnet, 0)
    expect(r.body.rows.porePressureRatio![i]).toBeCloseTo((raw.body.u2[i]! - r.body.rows.porePressure![i]!) / qnet, 2)
    expect(r.body.rows.frictionRatio![i]).toBeCloseTo(raw.body.fs[i]! / qt * 100, 2)
    // One median per 0.5 m over 22 m (44), less the made ground and the model's sand band, where σ'p is not derived from the cone.
    expect(r.body.resampled.length).toBeGreaterThan(28)
    expect(r.body.resampled.length).toBeLessThan(43)
    expect(r.body.resampled.filter(p => p.stratumCode === 'MG' || p.stratumCode === 'SAND')).toEqual([])
    // Ic (Robertson 2009) in the soft clay: n reaches its cap of 1, so Qtn = qnet/σ'v0, Fr = fs/qnet·100 and
    // Ic = √((3.47 − log Qtn)² + (log Fr + 1.22)²) in closed form.
    const sv = r.body.rows.effectiveStress![i]!
    const qtn = qnet / sv
    const fr = raw.body.fs[i]! / qnet * 100
    const ic = Math.sqrt((3.47 - Math.log10(qtn)) ** 2 + (Math.log10(fr) + 1.22) ** 2)
    expect(0.381 * ic + 0.05 * (sv / 101.325) - 0.15).toBeGreaterThanOrEqual(1)
    expect(r.body.rows.ic![i]).toBeCloseTo(ic, 2)
    expect(r.body.coneFactors.every(k => k.k === 0.33)).toBe(true)
    const viewer = await createUser(await signIn(demoEmail('owner')), 'labviewer')
    expect((await viewer.client.get(`/api/projects/${projectId}/points/${cpt.id}/cpt/interpretation`)).status).toBe(404)
  })
})
