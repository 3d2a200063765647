// Compressibility depth trends through the API: a draft whose estuarine clay Cc follows
// depth (fitted to the demo's own oedometer tests), its saved version's export as JSON
// (the settlement API's input) and as the XLSX sublayer table, both with Cc at each
// sublayer's mid-depth; and the refusals.
import * as XLSX from 'xlsx-republish'
import { beforeAll, describe, expect, it } from 'vitest'
import { depthTrendCandidates, eligibleTests, type TestCompressibility } from '../../shared/site-model/compressibility'
import { depthTrendAt, stratumBounds, type DepthTrend, type SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, demoEmail, signIn } from '../helpers/http'

interface Model { id: string, version: number, draft: SiteModelDefinition }
interface ListedTest { id: string, stratumCode: string | null, depth: number, e0: number, reading: { qualityClass: string | null, cc: number | null, cr: number | null, cv: number | null, calpha: number | null } }
interface ExportLayer { name: string, thickness: number, compressible: boolean, cc?: number, cr?: number, e0?: number, cv?: number, preconsolidation?: { type: string, value?: number } }

const pop = (v: number) => ({ model: 'pop' as const, logSpace: false, parameters: { pop: v }, n: 6, r2: 0.8, rmse: 6, aic: 20, aicc: 24, includedPointIds: [], excludedPointIds: [] })

describe('compressibility depth trends: draft, version, export', () => {
  let eng: Client
  let base: string
  let ccTrend: DepthTrend
  let draft: SiteModelDefinition
  const estIndex = 2
  let seq = 0

  /** A new model of this file's copy of the demo site (its draft started from the logs). */
  async function newModel(): Promise<Model> {
    seq += 1
    const r = await eng.post<{ model: Model }>(base, { name: `Cc with depth ${Date.now().toString(36)}-${seq}` })
    expect(r.status).toBe(201)
    return r.body.model
  }

  /** A new model whose draft carries the Cc trend, saved as version 1. */
  async function savedWithTrend(): Promise<{ model: Model, put: { status: number, body: { model: Model } }, saved: { status: number } }> {
    const model = await newModel()
    const put = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft, version: model.version })
    expect(put.status, JSON.stringify(put.body).slice(0, 400)).toBe(200)
    const saved = await eng.post<{ version: { version: number } }>(`${base}/${model.id}/versions`, { message: 'EST Cc with depth', version: put.body.model.version })
    return { model, put, saved }
  }

  beforeAll(async () => {
    eng = await signIn(demoEmail('engineer'))
    const projectId = await createDemoCopy('CCT')
    base = `/api/projects/${projectId}/models`
    const model = await newModel()
    // The trend the stratum panel offers: least squares on the estuarine clay's eligible demo tests.
    const list = await eng.get<{ tests: ListedTest[] }>(`/api/projects/${projectId}/tests/oedometer?limit=100`)
    const tests: TestCompressibility[] = list.body.tests.map(t => ({ id: t.id, stratumCode: t.stratumCode, depth: t.depth, qualityClass: t.reading.qualityClass, cc: t.reading.cc, cr: t.reading.cr, e0: t.e0, cv: t.reading.cv, calpha: t.reading.calpha }))
    const fit = depthTrendCandidates(tests, 'EST').cc
    if (!fit.ok) throw new Error(fit.reason)
    ccTrend = fit.trend
    // Every EST test read as better than very poor (seven EST tests in the demo, the disturbed ones very poor).
    const eligible = eligibleTests(tests, 'EST')
    expect(eligible.length).toBeGreaterThanOrEqual(4)
    expect(ccTrend.n).toBe(eligible.length)
    expect(ccTrend.testIds).toEqual(eligible.map(t => t.id))
    expect(model.draft.strata[estIndex]!.code).toBe('EST')
    draft = {
      ...model.draft,
      schemaVersion: 2,
      strata: model.draft.strata.map((s, i) => (i === estIndex
        ? { ...s, compressible: true, trend: pop(25), compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double' as const, source: 'mean' as const, n: 5, trends: { cc: ccTrend } } }
        : s)),
    }
  })

  it('saves the draft with the trend and a version of it; the version export carries Cc at every slice\'s mid-depth', async () => {
    const { model, put, saved } = await savedWithTrend()
    expect(put.body.model.draft.strata[estIndex]!.compressibility!.trends!.cc).toEqual(ccTrend)
    expect(saved.status).toBe(201)

    const exp = await eng.get<{ layers: ExportLayer[], sublayers: { maxThickness: number }, strata: SiteModelDefinition['strata'] }>(`${base}/${model.id}/versions/1/export?maxThickness=0.5`)
    expect(exp.status).toBe(200)
    expect(exp.body.sublayers).toEqual({ maxThickness: 0.5 })
    expect(exp.body.strata[estIndex]!.compressibility!.trends!.cc).toEqual(ccTrend)
    const { top, bottom } = stratumBounds(draft)[estIndex]!
    const slices = exp.body.layers.filter(l => l.name.startsWith('Estuarine clay'))
    expect(slices).toHaveLength(Math.ceil((bottom - top) / 0.5 - 1e-9))
    let z = top
    for (const l of slices) {
      expect(l.thickness).toBeLessThanOrEqual(0.5 + 1e-9)
      expect(l.cc).toBeCloseTo(depthTrendAt(ccTrend, z + l.thickness / 2), 9)
      expect(l.cr).toBe(0.09)
      expect(l.e0).toBe(2.1)
      expect(l.preconsolidation).toEqual({ type: 'pop', value: 25 })
      z += l.thickness
    }
    expect(z).toBeCloseTo(bottom, 9)
    // Cc varies with depth as the trend's gradient says, top slice to bottom slice.
    expect(slices[slices.length - 1]!.cc! - slices[0]!.cc!).toBeCloseTo(ccTrend.gradient * (bottom - top - 0.5 * (slices[0]!.thickness + slices[slices.length - 1]!.thickness)), 9)
    expect(Math.abs(ccTrend.gradient)).toBeGreaterThan(0)

    // The settlement API takes the document as it is; with its `sublayers`, each of its sublayers is one slice.
    const settle = await eng.post<{ sublayers: { layer: string, depth: number, thickness: number, effectiveStress: number, preconsolidation: number, finalEffectiveStress: number, compression: number, case: string }[] }>('/api/calc/settlement', { ...exp.body, load: { type: 'uniform', pressure: 120 } })
    expect(settle.status, JSON.stringify(settle.body).slice(0, 300)).toBe(200)
    const estSubs = settle.body.sublayers.filter(s => s.layer.startsWith('Estuarine clay'))
    expect(estSubs).toHaveLength(slices.length)
    estSubs.forEach((s, k) => {
      const cc = depthTrendAt(ccTrend, s.depth)
      // Domain §3: Δh = [Cr·log(σ'p/σ'v0) + Cc·log(σ'vf/σ'p)]/(1 + e0)·h, σ'p = σ'v0 + 25 kPa, below σ'vf here.
      expect(s.case).toBe('OC-NC')
      const de = 0.09 * Math.log10(s.preconsolidation / s.effectiveStress) + cc * Math.log10(s.finalEffectiveStress / s.preconsolidation)
      expect(s.compression).toBeCloseTo((de / 3.1) * s.thickness, 9)
      expect(s.depth).toBeCloseTo(exp.body.layers.slice(0, exp.body.layers.indexOf(slices[k]!)).reduce((a, l) => a + l.thickness, 0) + slices[k]!.thickness / 2, 6)
    })

    // The XLSX sublayer table: the same Cc at each mid-depth.
    const xlsx = await fetch(`${eng.base}${base}/${model.id}/versions/1/export?format=xlsx&maxThickness=0.5`, { headers: { cookie: eng.cookie } })
    expect(xlsx.status).toBe(200)
    const rows = XLSX.utils.sheet_to_json<Record<string, number | string>>(XLSX.read(Buffer.from(await xlsx.arrayBuffer()), { type: 'buffer' }).Sheets.Sublayers!)
    const est = rows.filter(r => String(r.Layer).startsWith('Estuarine clay'))
    expect(est).toHaveLength(slices.length)
    for (const r of est) {
      expect(Number(r.Cc)).toBeCloseTo(depthTrendAt(ccTrend, Number(r['Mid-depth (m)'])), 9)
      expect(Number(r.Cr)).toBe(0.09)
      expect(Number(r['POP (kPa)'])).toBeCloseTo(25, 9)
    }
  })

  it('a version-1 draft without trends is still taken; with a trend it is refused (400)', async () => {
    const model = await newModel()
    const fresh = (await eng.get<{ model: Model }>(`${base}/${model.id}`)).body.model
    const v1 = { ...draft, schemaVersion: 1, strata: draft.strata.map((s, i) => (i === estIndex ? { ...s, compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double' as const, source: 'mean' as const } } : s)) }
    const ok = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft: v1, version: fresh.version })
    expect(ok.status).toBe(200)
    expect(ok.body.model.draft.schemaVersion).toBe(1)
    const bad = await eng.request<{ data: { issues: { path: string, message: string }[] } }>('PUT', `${base}/${model.id}/draft`, { draft: { ...draft, schemaVersion: 1 }, version: ok.body.model.version })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toContainEqual({ path: 'draft.schemaVersion', message: 'depth trends of compressibility need schemaVersion 2' })
  })

  it('refuses a trend that turns non-positive within the stratum (400, naming the parameter and depth)', async () => {
    const model = await newModel()
    const fresh = (await eng.get<{ model: Model }>(`${base}/${model.id}`)).body.model
    const { bottom } = stratumBounds(draft)[estIndex]!
    // Cr falling to 0 a metre above the clay's base.
    const cr: DepthTrend = { ...ccTrend, value: 0.09, gradient: -0.09 / (bottom - 1 - ccTrend.referenceDepth) }
    const steep = { ...draft, strata: draft.strata.map((s, i) => (i === estIndex ? { ...s, compressibility: { ...s.compressibility!, trends: { cc: ccTrend, cr } } } : s)) }
    const bad = await eng.request<{ data: { issues: { path: string, message: string }[] } }>('PUT', `${base}/${model.id}/draft`, { draft: steep, version: fresh.version })
    expect(bad.status).toBe(400)
    const issue = bad.body.data.issues.find(i => i.path === `draft.strata.${estIndex}.compressibility.trends.cr`)
    expect(issue?.message).toMatch(new RegExp(`^the Cr trend gives -0\\.\\d+ at the base of Estuarine clay \\(${bottom.toFixed(2)} m\\); it must stay above 0`))
  })

  it('refuses an export whose slices would outnumber the settlement API\'s layers (422)', async () => {
    const { model, saved } = await savedWithTrend()
    expect(saved.status).toBe(201)
    const exp = await eng.get<{ message: string, data: { code: string } }>(`${base}/${model.id}/versions/1/export?maxThickness=0.05`)
    expect(exp.status).toBe(422)
    expect(exp.body.message).toMatch(/^At sublayers of 0\.05 m the depth trends of compressibility give \d+ layers; the settlement API takes at most 200/)
    // The XLSX table has no such limit.
    const xlsx = await fetch(`${eng.base}${base}/${model.id}/versions/1/export?format=xlsx&maxThickness=0.05`, { headers: { cookie: eng.cookie } })
    expect(xlsx.status).toBe(200)
  })
})
