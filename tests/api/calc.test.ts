// The public compute API over real HTTP: contract field names, values against
// hand calculations (common practice), error statuses, and personal API tokens.
import { beforeAll, describe, expect, it } from 'vitest'
import { Client, demoEmail, signIn } from '../helpers/http'

const PROFILE = {
  layers: [
    { name: 'Sand', thickness: 2, unitWeight: 18, unitWeightSaturated: 20 },
    { name: 'Clay', thickness: 4, unitWeight: 17, unitWeightSaturated: 17 },
  ],
  groundwater: { waterTableDepth: 1 },
  depths: [4],
}

interface Point { depth: number, layer: string, totalStress: number, porePressure: number, effectiveStress: number }

describe('compute API', () => {
  let designer: Client
  beforeAll(async () => { designer = await signIn(demoEmail('designer')) })

  it('POST /api/calc/stress-profile: breakpoints and requested depths, by hand (common practice)', async () => {
    const r = await designer.post<{ points: Point[], warnings: string[] }>('/api/calc/stress-profile', PROFILE)
    expect(r.status).toBe(200)
    const depths = r.body.points.map(p => p.depth)
    expect(depths).toEqual([0, 1, 2, 4, 6])
    const at = (z: number) => r.body.points.find(p => p.depth === z)!
    // z = 1 m: 1 × 18 = 18 kPa, dry.
    expect(at(1).totalStress).toBeCloseTo(18, 9)
    expect(at(1).porePressure).toBe(0)
    // z = 2 m: 18 + 1 × 20 = 38; u = 9.81 × 1.
    expect(at(2).totalStress).toBeCloseTo(38, 9)
    expect(at(2).porePressure).toBeCloseTo(9.81, 9)
    expect(at(2).effectiveStress).toBeCloseTo(28.19, 9)
    // z = 4 m in the clay: 38 + 2 × 17 = 72; u = 3 × 9.81 = 29.43.
    expect(at(4).layer).toBe('Clay')
    expect(at(4).effectiveStress).toBeCloseTo(72 - 29.43, 9)
    // z = 6 m: 38 + 4 × 17 = 106; u = 49.05.
    expect(at(6).effectiveStress).toBeCloseTo(106 - 49.05, 9)
    expect(Object.keys(at(6)).sort()).toEqual(['depth', 'effectiveStress', 'layer', 'porePressure', 'totalStress'])
  })

  it('POST /api/calc/settlement: one NC sublayer by hand (Terzaghi & Peck; common practice)', async () => {
    const body = {
      layers: [{ name: 'Soft clay', thickness: 4, unitWeight: 18, unitWeightSaturated: 18, compressible: true, cc: 0.5, cr: 0.05, e0: 1.2, preconsolidation: { type: 'pop', value: 0 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: 50 },
      sublayers: { count: 1 },
    }
    const r = await designer.post<{ settlement: number, sublayers: Record<string, number | string>[], caution: string, convergence: { halved: number, relativeChange: number } }>('/api/calc/settlement', body)
    expect(r.status).toBe(200)
    // σ'v0 at 2 m = 2 × (18 − 9.81) = 16.38 kPa; Δe = 0.5 log10(66.38 / 16.38); Δh = Δe / 2.2 × 4.
    const s0 = 2 * (18 - 9.81)
    const expected = 0.5 * Math.log10((s0 + 50) / s0) / 2.2 * 4
    expect(r.body.settlement).toBeCloseTo(expected, 9)
    expect(r.body.sublayers[0]!.case).toBe('NC')
    expect(r.body.sublayers[0]!.effectiveStress).toBeCloseTo(s0, 9)
    // Halved: two sublayers at 1 m and 3 m depth (σ'v0 = 8.19 and 24.57 kPa).
    const halved = 0.5 * (Math.log10((s0 / 2 + 50) / (s0 / 2)) + Math.log10((1.5 * s0 + 50) / (1.5 * s0))) / 2.2 * 2
    expect(r.body.convergence.halved).toBeCloseTo(halved, 9)
    expect(r.body.convergence.relativeChange).toBeCloseTo(Math.abs(halved - expected) / expected, 9)
    expect(r.body.caution).toMatch(/licensed engineer/)
  })

  it('POST /api/calc/preconsolidation: σ\'p of a sharp synthetic curve', async () => {
    // e = e0 − Cr·log(σ'/10) to σ'p = 100 kPa, then Cc beyond (synthetic; known answer).
    const e0 = 1.5
    const cr = 0.05
    const cc = 0.6
    const stresses = [10, 20, 40, 70, 100, 150, 200, 400, 800, 1600]
    const points = stresses.map(s => ({ stress: s, voidRatio: s <= 100 ? e0 - cr * Math.log10(s / 10) : e0 - cr - cc * Math.log10(s / 100) }))
    const r = await designer.post<{ results: { method: string, preconsolidation: number }[], cc: number }>('/api/calc/preconsolidation', { points, e0 })
    expect(r.status).toBe(200)
    expect(r.body.results.map(x => x.method).sort()).toEqual(['bilinear', 'casagrande', 'pachecoSilva', 'work'])
    expect(r.body.cc).toBeCloseTo(cc, 6)
    for (const m of r.body.results) {
      expect(m.preconsolidation, m.method).toBeGreaterThan(70)
      expect(m.preconsolidation, m.method).toBeLessThan(140)
    }
  })

  it('400 with zod issues (path and message) for a shape error', async () => {
    const r = await designer.post<{ data: { issues: { path: string, message: string }[] } }>('/api/calc/stress-profile', { layers: [{ name: 'A', thickness: 'two' }], groundwater: {} })
    expect(r.status).toBe(400)
    const paths = r.body.data.issues.map(i => i.path)
    expect(paths).toEqual(expect.arrayContaining(['layers.0.thickness', 'layers.0.unitWeight', 'groundwater.waterTableDepth']))
  })

  it('400 for a compressible layer without Cc, Cr, e0 and σ\'p', async () => {
    const r = await designer.post<{ data: { issues: { path: string }[] } }>('/api/calc/settlement', {
      layers: [{ name: 'Clay', thickness: 3, unitWeight: 17, unitWeightSaturated: 17, compressible: true }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: 10 },
    })
    expect(r.status).toBe(400)
    expect(r.body.data.issues.map(i => i.path).sort()).toEqual(['layers.0.cc', 'layers.0.cr', 'layers.0.e0', 'layers.0.preconsolidation'])
  })

  it('422 with a plain message for physically impossible input', async () => {
    const zero = await designer.post<{ message: string }>('/api/calc/stress-profile', { ...PROFILE, layers: [{ ...PROFILE.layers[0]!, thickness: 0 }] })
    expect(zero.status).toBe(422)
    expect(zero.body.message).toMatch(/thickness/i)

    // Artesian pressure lifting the base: σ'v0 ≤ 0 at depth.
    const uplift = await designer.post<{ message: string, data: { depth: number } }>('/api/calc/stress-profile', {
      layers: [{ name: 'Clay', thickness: 5, unitWeight: 18, unitWeightSaturated: 18 }],
      groundwater: { waterTableDepth: 0, piezometers: [{ depth: 5, porePressure: 200 }] },
    })
    expect(uplift.status).toBe(422)
    expect(uplift.body.message).toMatch(/effective stress/i)

    const e0 = await designer.post<{ message: string }>('/api/calc/settlement', {
      layers: [{ name: 'Clay', thickness: 3, unitWeight: 17, unitWeightSaturated: 17, compressible: true, cc: 0.3, cr: 0.03, e0: 0, preconsolidation: { type: 'ocr', value: 1 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: 10 },
    })
    expect(e0.status).toBe(422)
    expect(e0.body.message).toMatch(/e0/)

    const many = await designer.post<{ data: { code: string } }>('/api/calc/settlement', {
      layers: [{ name: 'Clay', thickness: 30, unitWeight: 17, unitWeightSaturated: 17, compressible: true, cc: 0.3, cr: 0.03, e0: 1, preconsolidation: { type: 'ocr', value: 1 } }],
      groundwater: { waterTableDepth: 0 },
      load: { type: 'uniform', pressure: 10 },
      sublayers: { maxThickness: 0.00001 },
    })
    expect(many.status).toBe(422)
    expect(many.body.data.code).toBe('too-many-sublayers')

    const flat = await designer.post<{ message: string }>('/api/calc/preconsolidation', {
      points: [10, 20, 40, 80, 160, 320].map((s, i) => ({ stress: s, voidRatio: 1.2 - 0.1 * i })),
    })
    expect(flat.status).toBe(422)
  })

  it('413 for a body over 1 MB, 400 for a body that is not JSON', async () => {
    const big = JSON.stringify({ ...PROFILE, depths: Array.from({ length: 200_000 }, (_, i) => i / 100_000) })
    expect(big.length).toBeGreaterThan(1_048_576)
    const r = await designer.request('POST', '/api/calc/stress-profile', big)
    expect(r.status).toBe(413)
    const bad = await designer.request('POST', '/api/calc/stress-profile', '{"layers": [', { 'content-type': 'application/json' })
    expect(bad.status).toBe(400)
  })

  it('401 without a session or token', async () => {
    expect((await new Client().post('/api/calc/stress-profile', PROFILE)).status).toBe(401)
  })

  it('GET /api/openapi.json serves the 3.1 document', async () => {
    const r = await new Client().get<{ openapi: string, paths: Record<string, unknown> }>('/api/openapi.json')
    expect(r.status).toBe(200)
    expect(r.body.openapi).toBe('3.1.0')
    expect(Object.keys(r.body.paths)).toContain('/api/calc/settlement')
  })
})

describe('personal API tokens', () => {
  it('creates a token shown once, authenticates with it, and refuses it at once after revoking', async () => {
    const session = await signIn(demoEmail('designer'))
    const created = await session.post<{ token: { id: string, token: string, prefix: string } }>('/api/account/tokens', { name: 'settlement notebook' })
    expect(created.status).toBe(201)
    const secret = created.body.token.token
    expect(secret.startsWith(created.body.token.prefix)).toBe(true)

    const list = await session.get<{ tokens: Record<string, unknown>[] }>('/api/account/tokens')
    const row = list.body.tokens.find(t => t.id === created.body.token.id)!
    expect(row.name).toBe('settlement notebook')
    // The list never carries the secret or its hash.
    expect(JSON.stringify(list.body)).not.toContain(secret)
    expect(Object.keys(row)).not.toContain('tokenHash')

    const script = new Client()
    script.origin = null
    script.bearer = secret
    const me = await script.get<{ user: { email: string }, authVia: string }>('/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(demoEmail('designer'))
    expect(me.body.authVia).toBe('token')
    expect((await script.post('/api/calc/stress-profile', PROFILE)).status).toBe(200)
    // A token cannot mint further tokens.
    expect((await script.post('/api/account/tokens', { name: 'child' })).status).toBe(403)

    expect((await session.delete(`/api/account/tokens/${created.body.token.id}`)).status).toBe(200)
    const after = await script.post<{ message: string }>('/api/calc/stress-profile', PROFILE)
    expect(after.status).toBe(401)
    expect(after.body.message).toMatch(/revoked/)
  })

  it('refuses a made-up token with 401', async () => {
    const c = new Client()
    c.origin = null
    c.bearer = 'plt_not-a-real-token'
    expect((await c.get('/api/auth/me')).status).toBe(401)
  })
})

describe('POST /api/calc/trend-fit', () => {
  it('fits constant POP to points built as σ\'v0 + 25 kPa and auto picks a model with a reason', async () => {
    const c = await signIn(demoEmail('engineer'))
    // Synthetic: σ'v0 = 8 z, σ'p = σ'v0 + 25 with ±2 kPa alternating scatter (known answer POP = 25).
    const points = Array.from({ length: 12 }, (_, i) => {
      const depth = 4 + i
      const effectiveStress = 8 * depth
      return { depth, effectiveStress, preconsolidation: effectiveStress + 25 + (i % 2 ? 2 : -2) }
    })
    const r = await c.post<{ model: string, parameters: Record<string, number>, n: number, band: unknown[] }>('/api/calc/trend-fit', { model: 'pop', points })
    expect(r.status).toBe(200)
    expect(r.body.model).toBe('pop')
    expect(r.body.parameters.pop).toBeCloseTo(25, 6)
    expect(r.body.n).toBe(12)
    expect(r.body.band.length).toBeGreaterThan(2)
    const auto = await c.post<{ reason: string }>('/api/calc/trend-fit', { model: 'auto', points })
    expect(auto.status).toBe(200)
    expect(auto.body.reason).toMatch(/AICc/)
  })

  it('422 when the model needs σ\'v0 and the points have none', async () => {
    const c = await signIn(demoEmail('engineer'))
    const r = await c.post('/api/calc/trend-fit', { model: 'ocr', points: [{ depth: 1, preconsolidation: 50 }, { depth: 2, preconsolidation: 60 }, { depth: 3, preconsolidation: 70 }] })
    expect(r.status).toBe(422)
  })
})
