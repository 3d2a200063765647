// POST /api/calc/settlement: the `sublayers` query (rows left out, answer otherwise the same)
// and drainage groups over HTTP (a sliced stratum consolidates as one layer).
import { beforeAll, describe, expect, it } from 'vitest'
import type { Client} from '../helpers/http';
import { demoEmail, signIn } from '../helpers/http'

const clay = { unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.85, cr: 0.09, e0: 2.1, preconsolidation: { type: 'pop', value: 25 }, cv: 1.2, drainage: 'double', calpha: 0.03 }
const BODY = {
  layers: [
    { name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
    { name: 'Clay', thickness: 8, ...clay },
  ],
  groundwater: { waterTableDepth: 1 },
  load: { type: 'rectangle', width: 30, length: 40, pressure: 80 },
  time: { years: [1, 5] },
  designLife: 50,
}

interface Answer { settlement: number, sublayers?: unknown[], layers: unknown[], time: unknown[], times: { t50: number, t90: number }, secondary: unknown, convergence: unknown, warnings: string[], caution: string }

describe('POST /api/calc/settlement options', () => {
  let designer: Client
  beforeAll(async () => { designer = await signIn(demoEmail('designer')) })

  it('?sublayers=false (and 0) leaves the rows out and changes nothing else; the default keeps them', async () => {
    const full = await designer.post<Answer>('/api/calc/settlement', BODY)
    expect(full.status).toBe(200)
    expect(full.body.sublayers).toHaveLength(32) // 8 m / 0.25 m
    for (const q of ['false', '0']) {
      const lean = await designer.post<Answer>(`/api/calc/settlement?sublayers=${q}`, BODY)
      expect(lean.status).toBe(200)
      expect('sublayers' in lean.body).toBe(false)
      const { sublayers: _rows, ...rest } = full.body
      expect(lean.body).toEqual(rest)
    }
    const explicit = await designer.post<Answer>('/api/calc/settlement?sublayers=true', BODY)
    expect(explicit.body).toEqual(full.body)
  })

  it('refuses a sublayers query that is not a flag (400)', async () => {
    const r = await designer.post<{ statusCode: number }>('/api/calc/settlement?sublayers=maybe', BODY)
    expect(r.status).toBe(400)
  })

  it('a clay cut into two slices of one drainage group gives the unsliced t50/t90 (Terzaghi 1925: Hdr of the whole layer)', async () => {
    const whole = await designer.post<Answer>('/api/calc/settlement?sublayers=false', BODY)
    const sliced = await designer.post<Answer>('/api/calc/settlement?sublayers=false', {
      ...BODY,
      layers: [BODY.layers[0], { name: 'Clay (1/2)', thickness: 3, ...clay, drainageGroup: 'CLAY' }, { name: 'Clay (2/2)', thickness: 5, ...clay, drainageGroup: 'CLAY' }],
    })
    expect(sliced.status).toBe(200)
    expect(Math.abs(sliced.body.settlement - whole.body.settlement) / whole.body.settlement).toBeLessThan(1e-9)
    expect(Math.abs(sliced.body.times.t90 - whole.body.times.t90) / whole.body.times.t90).toBeLessThan(1e-9)
    expect(Math.abs(sliced.body.times.t50 - whole.body.times.t50) / whole.body.times.t50).toBeLessThan(1e-9)
  })
})
