// "Derive σ'p from CPT and vane" per stratum. σ'p = k·qnet (Mayne 1995) and su,FV/0.22 (Mesri 1975)
// are correlations for fine-grained soils: in the demo's made ground (logged GW/SW) a cone reading
// turned into σ'p gave thousands of kPa. The default follows the logged USCS symbols (ASTM D2487
// major divisions); the switch overrides it per stratum and the σ'p list follows.
import { beforeAll, describe, expect, it } from 'vitest'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, demoEmail, demoProjectId, signIn } from '../helpers/http'

interface Derivation { stratumId: string, code: string, default: { on: boolean, reason: string, symbols: string[] }, override: boolean | null, on: boolean }
interface Strata { strata: { id: string, code: string, version: number, cptDerivation: boolean | null }[], cptDerivation: Derivation[] }
interface Point { id: string, source: string, pointIdentifier: string, depth: number, stratumCode: string | null, preconsolidation: number }
interface Points { points: Point[], counts: Record<string, number>, notDerivedIn: string[], dense?: { strata: string[], cpt: { pointIdentifier: string, stratum: number[] }[] } }

const bySource = (r: Points, source: string, code?: string) => r.points.filter(p => p.source === source && (code === undefined || p.stratumCode === code))

describe('the seeded demo: CPT σ\'p only in fine-grained strata', () => {
  let reply: Points
  let strata: Strata

  beforeAll(async () => {
    const c = await signIn(demoEmail('reviewer'))
    const id = await demoProjectId(c)
    const [p, s] = await Promise.all([c.get<Points>(`/api/projects/${id}/preconsolidation-points`), c.get<Strata>(`/api/projects/${id}/strata`)])
    expect([p.status, s.status]).toEqual([200, 200])
    reply = p.body
    strata = s.body
  })

  it('defaults each stratum from its logged symbols: fill and sand off, the clays on', () => {
    const on = Object.fromEntries(strata.cptDerivation.map(d => [d.code, d.on]))
    expect(on).toEqual({ MG: false, CRUST: true, EST: true, GLAC: true, SAND: false })
    const mg = strata.cptDerivation.find(d => d.code === 'MG')!
    expect(mg).toMatchObject({ override: null, default: { on: false, reason: 'coarse-grained' } })
    expect(mg.default.symbols.every(s => s === 'GW' || s === 'SW')).toBe(true)
    expect(strata.strata.every(s => s.cptDerivation === null)).toBe(true)
  })

  it('lists no CPT-01 point in the made ground, and keeps its clay points', () => {
    const cpt01 = reply.points.filter(p => p.source === 'cpt' && p.pointIdentifier === 'CPT-01')
    expect(cpt01.length).toBeGreaterThan(20)
    expect(cpt01.filter(p => p.stratumCode === 'MG' || p.stratumCode === 'SAND')).toEqual([])
    expect(new Set(cpt01.map(p => p.stratumCode))).toEqual(new Set(['CRUST', 'EST', 'GLAC']))
    // The shallow fill reading that gave thousands of kPa is gone.
    expect(cpt01.filter(p => p.depth < 0.5)).toEqual([])
    expect(reply.notDerivedIn).toEqual(['MG', 'SAND'])
    expect(reply.counts.cpt).toBe(bySource(reply, 'cpt').length)
  })
})

describe('switching a stratum on and off', () => {
  let c: Client
  let base: string

  const strataNow = async () => (await c.get<Strata>(`${base}/strata`)).body
  const pointsNow = async (dense = false) => {
    const r = await c.get<Points>(`${base}/preconsolidation-points${dense ? '?dense=true' : ''}`)
    expect(r.status).toBe(200)
    return r.body
  }
  async function setSwitch(code: string, value: boolean | null) {
    const row = (await strataNow()).strata.find(s => s.code === code)!
    const r = await c.request<{ stratum: { cptDerivation: boolean | null } }>('PUT', `${base}/strata/${row.id}/cpt-derivation`, { cptDerivation: value, version: row.version })
    expect(r.status).toBe(200)
    expect(r.body.stratum.cptDerivation).toBe(value)
  }

  beforeAll(async () => {
    const projectId = await createDemoCopy('CSW')
    base = `/api/projects/${projectId}`
    c = await signIn(demoEmail('engineer'))
  })

  it('made ground switched on brings CPT-01\'s fill points back; null returns to the default', async () => {
    const before = await pointsNow()
    expect(bySource(before, 'cpt', 'MG')).toEqual([])
    const clayBefore = bySource(before, 'cpt', 'EST').length
    expect(clayBefore).toBeGreaterThan(0)

    await setSwitch('MG', true)
    const on = await pointsNow()
    const fill = bySource(on, 'cpt', 'MG').filter(p => p.pointIdentifier === 'CPT-01')
    expect(fill.length).toBeGreaterThan(0)
    expect(Math.min(...fill.map(p => p.depth))).toBeLessThan(0.5)
    expect(bySource(on, 'cpt', 'EST').length).toBe(clayBefore)
    expect(on.notDerivedIn).toEqual(['SAND'])
    const mg = (await strataNow()).cptDerivation.find(d => d.code === 'MG')!
    expect(mg).toMatchObject({ override: true, on: true, default: { on: false } })

    await setSwitch('MG', null)
    expect(bySource(await pointsNow(), 'cpt', 'MG')).toEqual([])
  })

  it('clay switched off drops its CPT and vane points, dense rows included, and keeps the oedometer values', async () => {
    const before = await pointsNow(true)
    const oedometerEst = bySource(before, 'oedometer', 'EST').length
    expect(bySource(before, 'vane', 'EST').length).toBeGreaterThan(0)
    expect(oedometerEst).toBeGreaterThan(0)

    await setSwitch('EST', false)
    const off = await pointsNow(true)
    expect(bySource(off, 'cpt', 'EST')).toEqual([])
    expect(bySource(off, 'vane', 'EST')).toEqual([])
    expect(bySource(off, 'oedometer', 'EST').length).toBe(oedometerEst)
    expect(bySource(off, 'cpt', 'CRUST').length).toBeGreaterThan(0)
    expect(off.notDerivedIn).toEqual(['MG', 'EST', 'SAND'])
    const est = off.dense!.strata.indexOf('EST')
    for (const s of off.dense!.cpt) expect(s.stratum.filter(i => i === est && est !== -1)).toEqual([])
    await setSwitch('EST', null)
  })

  it('refuses a switch that is not true, false or null (400) and a stale version (409)', async () => {
    const row = (await strataNow()).strata[0]!
    expect((await c.request('PUT', `${base}/strata/${row.id}/cpt-derivation`, { cptDerivation: 'yes', version: row.version })).status).toBe(400)
    expect((await c.request('PUT', `${base}/strata/${row.id}/cpt-derivation`, { version: row.version })).status).toBe(400)
    expect((await c.request('PUT', `${base}/strata/${row.id}/cpt-derivation`, { cptDerivation: true, version: row.version + 5 })).status).toBe(409)
  })

  it('is the engineer\'s choice: the field geologist, who logs the strata, gets 403', async () => {
    const geologist = await signIn(demoEmail('geologist'))
    const row = (await strataNow()).strata[0]!
    expect((await geologist.request('PUT', `${base}/strata/${row.id}/cpt-derivation`, { cptDerivation: true, version: row.version })).status).toBe(403)
    // A stratum edit by the geologist leaves the switch alone.
    const r = await geologist.patch<{ stratum: { cptDerivation: boolean | null } }>(`${base}/strata/${row.id}`, { description: 'Checked on site.', cptDerivation: true, version: row.version })
    expect(r.status).toBe(200)
    expect(r.body.stratum.cptDerivation).toBeNull()
  })
})
