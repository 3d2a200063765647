// Every example in docs/api.md runs against the server and succeeds, so the
// documentation cannot drift from the API.
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { demoEmail, signIn } from '../helpers/http'

const doc = readFileSync(resolve(import.meta.dirname, '../../docs/api.md'), 'utf8')
const examples = [...doc.matchAll(/<!-- example: (\S+) -->\s*```sh\n[\s\S]*?<<'JSON'\n([\s\S]*?)\nJSON\n```/g)].map(m => ({ route: m[1]!, body: m[2]! }))

describe('docs/api.md examples', () => {
  it('has one example per compute route', () => {
    expect(examples.map(e => e.route).sort()).toEqual(['/api/calc/preconsolidation', '/api/calc/settlement', '/api/calc/stress-profile', '/api/calc/trend-fit'])
  })

  for (const ex of examples) {
    it(`${ex.route} example answers 200`, async () => {
      const c = await signIn(demoEmail('designer'))
      const r = await c.post(ex.route, JSON.parse(ex.body))
      expect(r.status, JSON.stringify(r.body).slice(0, 400)).toBe(200)
    })
  }

  it('the stress-profile answer quoted in the text matches the server', async () => {
    const c = await signIn(demoEmail('designer'))
    const ex = examples.find(e => e.route === '/api/calc/stress-profile')!
    const r = await c.post<{ points: { depth: number, totalStress: number, porePressure: number, effectiveStress: number }[] }>(ex.route, JSON.parse(ex.body))
    const at10 = r.body.points.find(p => p.depth === 10)!
    const quoted = doc.match(/"depth": 10, "layer": "Estuarine clay", "totalStress": ([\d.]+), "porePressure": ([\d.]+), "effectiveStress": ([\d.]+)/)!
    expect(at10.totalStress).toBeCloseTo(Number(quoted[1]), 1)
    expect(at10.porePressure).toBeCloseTo(Number(quoted[2]), 1)
    expect(at10.effectiveStress).toBeCloseTo(Number(quoted[3]), 1)
  })
})
