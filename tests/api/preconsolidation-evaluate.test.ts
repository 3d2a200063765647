// σ'p points through a stress model sent by the page (POST …/preconsolidation-points/evaluate):
// the canvas's working copy or a saved version, so CPT σ'p = k·(qt − σv0) (Mayne 1995 form, as
// in shared/geotech/insitu.ts) follow the σv on screen. Checked against the closed form of the
// change: raising a stratum's unit weight by Δγ raises σv at depth z inside it by Δγ·(z − top)
// (statics, common practice), so each CPT row's σ'p falls by k·Δγ·(z − top) and each σ'v0 rises
// by the same Δγ·(z − top) while u is unchanged.
import { beforeAll, describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { signedInDemo } from '../helpers/http'

interface Dense { strata: string[], cpt: { pointId: string, depth: number[], preconsolidation: (number | null)[], effectiveStress: (number | null)[], stratum: number[] }[] }
interface Answer {
  points: { id: string, source: string, depth: number, stratumCode: string | null, preconsolidation: number, effectiveStress: number | null }[]
  dense: Dense
  stressModel: { source: string, description: string }
  caution: string
}

describe('σ\'p points through a given stress model', () => {
  const { designer: c, engineer } = signedInDemo('designer', 'engineer')
  let base: string
  let definition: SiteModelDefinition
  let before: Answer
  let after: Answer
  const DG = 2
  let estTop: number
  let estBottom: number
  let k: number

  beforeAll(async () => {
    // The model it evaluates is made in this file's own copy of the demo site.
    const projectId = await createDemoCopy('EVA')
    base = `/api/projects/${projectId}/preconsolidation-points`
    const m = await engineer.post<{ model: { id: string } }>(`/api/projects/${projectId}/models`, { name: `evaluate check ${Date.now().toString(36)}` })
    const model = await c.get<{ model: { draft: SiteModelDefinition } }>(`/api/projects/${projectId}/models/${m.body.model.id}`)
    definition = model.body.model.draft
    let top = 0
    for (const s of definition.strata) {
      if (s.code === 'EST') {
        estTop = top
        estBottom = top + s.thickness
        k = s.cptFactor
      }
      top += s.thickness
    }
    const heavier: SiteModelDefinition = { ...definition, strata: definition.strata.map(s => (s.code === 'EST' ? { ...s, unitWeight: s.unitWeight + DG, unitWeightSaturated: s.unitWeightSaturated + DG } : s)) }
    const r1 = await c.post<Answer>(`${base}/evaluate`, { definition, dense: true, label: 'the check model' })
    const r2 = await c.post<Answer>(`${base}/evaluate`, { definition: heavier, dense: true })
    expect([r1.status, r2.status]).toEqual([200, 200])
    before = r1.body
    after = r2.body
  })

  it('says it used the model sent, and carries the caution', () => {
    expect(before.stressModel).toMatchObject({ source: 'given', description: 'The stresses of the check model.' })
    expect(after.stressModel.description).toBe('The stresses of the stress model on screen.')
    expect(before.caution).toContain('licensed engineer')
  })

  // The dense layer rounds σ'p and σ'v0 to 0.1 kPa, so a difference of two rounded values is within 0.1 kPa.
  const within = (got: number, want: number) => expect(Math.abs(got - want)).toBeLessThanOrEqual(0.1 + 1e-9)

  it('moves every dense CPT row inside the heavier stratum by −k·Δγ·(z − top), and rows above it not at all', () => {
    expect(estBottom).toBeGreaterThan(estTop)
    let inside = 0
    let above = 0
    for (const [i, s] of before.dense.cpt.entries()) {
      const t = after.dense.cpt[i]!
      expect(t.pointId).toBe(s.pointId)
      const rowAt = new Map(t.depth.map((z, j) => [z, j]))
      for (let j = 0; j < s.depth.length; j++) {
        const z = s.depth[j]!
        const jt = rowAt.get(z)
        const p0 = s.preconsolidation[j]
        const p1 = jt === undefined ? null : t.preconsolidation[jt]
        if (p0 == null || p1 == null) continue
        if (z > estTop + 0.01 && z < estBottom - 0.01) {
          within(p1 - p0, -k * DG * (z - estTop))
          within(t.effectiveStress[jt!]! - s.effectiveStress[j]!, DG * (z - estTop))
          inside++
        }
        else if (z < estTop - 0.01) {
          expect(p1).toBe(p0)
          above++
        }
      }
    }
    expect(inside).toBeGreaterThan(1000)
    expect(above).toBeGreaterThan(100)
  })

  it('moves σ\'v0 of the adopted oedometer values in that stratum, not their σ\'p', () => {
    const oed0 = before.points.filter(p => p.source === 'oedometer' && p.depth > estTop && p.depth < estBottom)
    expect(oed0.length).toBeGreaterThan(3)
    for (const p of oed0) {
      const q = after.points.find(x => x.id === p.id)!
      expect(q.preconsolidation).toBe(p.preconsolidation)
      expect(q.effectiveStress! - p.effectiveStress!).toBeCloseTo(DG * (p.depth - estTop), 6)
    }
  })

  it('refuses a body without a valid model with 400 naming the field', async () => {
    const r = await c.post<{ data: { issues: { path: string }[] } }>(`${base}/evaluate`, { definition: { ...definition, strata: [{ ...definition.strata[0]!, thickness: -1 }] } })
    expect(r.status).toBe(400)
    expect(r.body.data.issues.map(i => i.path)).toContain('definition.strata.0.thickness')
    expect((await c.post(`${base}/evaluate`, {})).status).toBe(400)
  })
})
