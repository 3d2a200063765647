// Site models over real HTTP: drafts with optimistic concurrency, immutable
// versions, checkout, compare, and the export that the settlement API accepts
// as it is.
import * as XLSX from 'xlsx-republish'
import { beforeAll, describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, createUser, demoEmail, signIn } from '../helpers/http'

interface Model { id: string, version: number, draft: SiteModelDefinition, basedOn: number | null }

/** A model of the demo site with fitted-style trends and adopted compressibility (values of the scenario's ground model). */
function demoDefinition(base: SiteModelDefinition): SiteModelDefinition {
  const byCode: Record<string, Partial<SiteModelDefinition['strata'][number]>> = {
    CRUST: { compressible: true, compressibility: { cc: 0.35, cr: 0.04, e0: 1.1, cv: 3, drainage: 'double', source: 'manual' }, trend: { model: 'linear', logSpace: false, parameters: { intercept: 210 + 1.2 * (115 / 2.2), gradient: -115 / 2.2 }, n: 8, r2: 0.9, rmse: 10, aic: 30, aicc: 32, includedPointIds: [], excludedPointIds: [] } },
    EST: { compressible: true, compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double', source: 'manual' }, trend: { model: 'pop', logSpace: false, parameters: { pop: 25 }, n: 6, r2: 0.8, rmse: 6, aic: 20, aicc: 24, includedPointIds: ['a'], excludedPointIds: ['b'] } },
    GLAC: { compressible: true, compressibility: { cc: 0.22, cr: 0.03, e0: 0.65, cv: 6, drainage: 'double', source: 'manual' }, trend: { model: 'ocr', logSpace: false, parameters: { ocr: 2.4 }, n: 4, r2: 0.7, rmse: 12, aic: 18, aicc: 30, includedPointIds: [], excludedPointIds: [] } },
  }
  return { ...base, groundwater: { waterTableDepth: 1.6, piezometers: [{ depth: 12, porePressure: 102 }, { depth: 21.5, porePressure: 166.8 }] }, strata: base.strata.map(s => ({ ...s, ...(byCode[s.code] ?? {}) })) }
}

describe('site models', () => {
  let eng: Client
  let projectId: string
  let base: string
  let seq = 0

  /** A new model of this file's copy of the demo site, its draft started from the logs. */
  async function freshModel(): Promise<Model> {
    seq += 1
    const r = await eng.post<{ model: Model }>(base, { name: `Embankment study ${Date.now().toString(36)}-${seq}`, description: 'Working model of the yard' })
    expect(r.status).toBe(201)
    return r.body.model
  }

  /** A new model whose draft is the demo definition, saved as version 1. */
  async function savedModel(): Promise<Model> {
    const m = await freshModel()
    const put = await eng.request<{ model: Model }>('PUT', `${base}/${m.id}/draft`, { draft: demoDefinition(m.draft), version: m.version })
    expect(put.status).toBe(200)
    const v1 = await eng.post<{ version: { version: number } }>(`${base}/${m.id}/versions`, { message: 'First interpretation', version: put.body.model.version })
    expect(v1.status).toBe(201)
    return (await eng.get<{ model: Model }>(`${base}/${m.id}`)).body.model
  }

  beforeAll(async () => {
    eng = await signIn(demoEmail('engineer'))
    projectId = await createDemoCopy('MOD')
    base = `/api/projects/${projectId}/models`
  })

  it('starts a draft from the logs: the demo strata in order with their logged thicknesses and the standing water level', async () => {
    const model = await freshModel()
    expect(model.draft.strata.map(s => s.code)).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])
    // Scenario: made ground 1.2 m, crust 2.2 m, estuarine clay 11.6 m (±0.5 m between holes).
    expect(model.draft.strata[0]!.thickness).toBeGreaterThan(0.8)
    expect(model.draft.strata[0]!.thickness).toBeLessThan(1.7)
    expect(model.draft.strata[2]!.thickness).toBeGreaterThan(10.5)
    expect(model.draft.strata[2]!.thickness).toBeLessThan(12.7)
    expect(model.draft.groundwater.waterTableDepth).toBeGreaterThan(1.2)
    expect(model.draft.groundwater.waterTableDepth).toBeLessThan(2.0)
  })

  it('saves the draft with its revision, refuses a stale revision (409) and an impossible model (422)', async () => {
    const model = await freshModel()
    const draft = demoDefinition(model.draft)
    const ok = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft, version: model.version })
    expect(ok.status).toBe(200)
    expect(ok.body.model.version).toBe(model.version + 1)
    const stale = await eng.request<{ data: { current: Model } }>('PUT', `${base}/${model.id}/draft`, { draft, version: model.version })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.version).toBe(model.version + 1)
    // Artesian pressure above the overburden at 15 m: σ'v0 ≤ 0.
    const uplift = { ...draft, groundwater: { waterTableDepth: 0, piezometers: [{ depth: 15, porePressure: 400 }] } }
    const bad = await eng.request<{ message: string }>('PUT', `${base}/${model.id}/draft`, { draft: uplift, version: ok.body.model.version })
    expect(bad.status).toBe(422)
    expect(bad.body.message).toMatch(/effective stress/i)
  })

  it('saves immutable versions: any write to a saved version is 409; checkout starts a new draft from it', async () => {
    const started = await freshModel()
    const put1 = await eng.request<{ model: Model }>('PUT', `${base}/${started.id}/draft`, { draft: demoDefinition(started.draft), version: started.version })
    expect(put1.status).toBe(200)
    const model = put1.body.model
    const v1 = await eng.post<{ version: { version: number } }>(`${base}/${model.id}/versions`, { message: 'First interpretation', version: model.version })
    expect(v1.status).toBe(201)
    expect(v1.body.version.version).toBe(1)
    for (const method of ['PUT', 'PATCH', 'DELETE'] as const) {
      const w = await eng.request(method, `${base}/${model.id}/versions/1`, method === 'DELETE' ? undefined : { message: 'edit' })
      expect(w.status).toBe(409)
    }
    const fresh = await eng.get<{ model: Model, versions: { version: number, message: string }[] }>(`${base}/${model.id}`)
    expect(fresh.body.versions.map(v => [v.version, v.message])).toEqual([[1, 'First interpretation']])
    // Change the draft and save version 2.
    const d2 = { ...fresh.body.model.draft, surcharge: 10 }
    const put = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft: d2, version: fresh.body.model.version })
    const v2 = await eng.post<{ version: { version: number } }>(`${base}/${model.id}/versions`, { message: 'Old fill load in place', version: put.body.model.version })
    expect(v2.body.version.version).toBe(2)
    const read1 = await eng.get<{ version: { definition: SiteModelDefinition } }>(`${base}/${model.id}/versions/1`)
    expect(read1.body.version.definition.surcharge).toBe(0)

    const cmp = await eng.get<{ changes: { path: string, a: unknown, b: unknown }[], profiles: { a: { depth: number, totalStress: number }[], b: { depth: number, totalStress: number }[] } }>(`${base}/${model.id}/compare?a=1&b=2`)
    expect(cmp.body.changes).toEqual([{ path: 'surcharge', a: 0, b: 10 }])
    const last = (ps: { depth: number, totalStress: number }[]) => ps[ps.length - 1]!.totalStress
    expect(last(cmp.body.profiles.b) - last(cmp.body.profiles.a)).toBeCloseTo(10, 9)

    const co = await eng.post<{ model: Model }>(`${base}/${model.id}/versions/1/checkout`, {})
    expect(co.status).toBe(200)
    expect(co.body.model.basedOn).toBe(1)
    expect(co.body.model.draft.surcharge).toBe(0)
  })

  it('exports a version that the settlement API takes as it is, with the same σ\'v0 and σ\'p at the same depths', async () => {
    const model = await savedModel()
    const exp = await eng.get<Record<string, unknown> & { layers: { name: string }[], schema: string, version: { number: number } }>(`${base}/${model.id}/versions/1/export`)
    expect(exp.status).toBe(200)
    expect(exp.body.schema).toBe('pastload.site-model-export')
    expect(exp.body.version.number).toBe(1)
    const settle = await eng.post<{ sublayers: { depth: number, effectiveStress: number, preconsolidation: number, layer: string }[], warnings: string[] }>('/api/calc/settlement', { ...exp.body, load: { type: 'uniform', pressure: 120 } })
    expect(settle.status, JSON.stringify(settle.body).slice(0, 300)).toBe(200)

    const xlsx = await fetch(`${eng.base}${base}/${model.id}/versions/1/export?format=xlsx`, { headers: { cookie: eng.cookie } })
    expect(xlsx.status).toBe(200)
    const wb = XLSX.read(Buffer.from(await xlsx.arrayBuffer()), { type: 'buffer' })
    const rows = XLSX.utils.sheet_to_json<Record<string, number | string>>(wb.Sheets.Sublayers!)
    expect(rows.length).toBe(settle.body.sublayers.length)
    for (let i = 0; i < rows.length; i += 7) {
      const r = rows[i]!
      const s = settle.body.sublayers[i]!
      expect(r['Mid-depth (m)']).toBeCloseTo(s.depth, 9)
      expect(r["σ'v0 (kPa)"]).toBeCloseTo(s.effectiveStress, 9)
      // The settlement engine raises σ'p below σ'v0 to σ'v0; the table shows the trend itself.
      expect(Math.max(Number(r["σ'p (kPa)"]), s.effectiveStress)).toBeCloseTo(s.preconsolidation, 9)
    }
    // Estuarine clay: POP 25 kPa everywhere in the stratum.
    const est = rows.filter(r => r.Layer === 'Estuarine clay')
    expect(est.length).toBeGreaterThan(30)
    for (const r of est) expect(Number(r['POP (kPa)'])).toBeCloseTo(25, 9)
  })

  it('a viewer cannot save, a reviewer cannot edit the model, a non-member gets 404', async () => {
    const model = await savedModel()
    const owner = await signIn(demoEmail('owner'))
    const viewer = await createUser(owner, 'modelviewer')
    await owner.post(`/api/projects/${projectId}/members`, { email: viewer.email, role: 'viewer' })
    const fresh = await eng.get<{ model: Model }>(`${base}/${model.id}`)
    const body = { draft: fresh.body.model.draft, version: fresh.body.model.version }
    expect((await viewer.client.request('PUT', `${base}/${model.id}/draft`, body)).status).toBe(403)
    expect((await viewer.client.post(`${base}/${model.id}/versions`, { message: 'x', version: 1 })).status).toBe(403)
    const reviewer = await signIn(demoEmail('reviewer'))
    expect((await reviewer.request('PUT', `${base}/${model.id}/draft`, body)).status).toBe(403)
    expect((await reviewer.get(`${base}/${model.id}`)).status).toBe(200)
    const stranger = await createUser(owner, 'stranger')
    expect((await stranger.client.get(`${base}/${model.id}/versions/1/export`)).status).toBe(404)
  })
})
