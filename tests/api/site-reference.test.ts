// The stress workspace's reference marks for the demo project in one request,
// checked against the same facts read point by point from the point pages' API.
import { beforeAll, describe, expect, it } from 'vitest'
import { type Client, demoEmail, demoProjectId, signIn } from '../helpers/http'

interface Detail {
  point: { id: string, identifier: string, kind: string, finalDepth: number }
  intervals: { top: number, stratumId: string | null }[]
  samples: { identifier: string, top: number, bottom: number, index: { bulkUnitWeight: number | null } | null }[]
  groundwater: { id: string, kind: string, depth: number | null, pressure: number | null }[]
}
interface Reference {
  holes: { id: string, identifier: string, boundaries: { depth: number, above: string | null, below: string | null }[] }[]
  unitWeights: { pointIdentifier: string, sample: string, depth: number, value: number }[]
  water: { id: string, pointIdentifier: string, kind: string, depth: number, pressure: number | null }[]
}

describe('site reference', () => {
  let viewer: Client
  let base: string
  let details: Detail[]
  let ref: Reference
  let codeOf: Map<string, string>

  beforeAll(async () => {
    viewer = await signIn(demoEmail('designer'))
    const projectId = await demoProjectId(viewer)
    base = `/api/projects/${projectId}`
    const pts = await viewer.get<{ points: { id: string }[] }>(`${base}/points?limit=500`)
    details = await Promise.all(pts.body.points.map(async p => (await viewer.get<Detail>(`${base}/points/${p.id}`)).body))
    codeOf = new Map((await viewer.get<{ strata: { id: string, code: string }[] }>(`${base}/strata`)).body.strata.map(s => [s.id, s.code]))
    const r = await viewer.get<Reference>(`${base}/site-reference`)
    expect(r.status).toBe(200)
    ref = r.body
  })

  it('gives every logged hole its stratum changes, as read from its log', () => {
    const logged = details.filter(d => d.intervals.length > 1)
    expect(ref.holes.map(h => h.identifier)).toEqual(logged.map(d => d.point.identifier).sort())
    for (const d of logged) {
      const ivs = [...d.intervals].sort((a, b) => a.top - b.top)
      const expected = ivs.slice(1).flatMap((iv, i) => {
        const above = ivs[i]!.stratumId ? codeOf.get(ivs[i]!.stratumId!)! : null
        const below = iv.stratumId ? codeOf.get(iv.stratumId)! : null
        return above === below ? [] : [{ depth: iv.top, above, below }]
      })
      expect(ref.holes.find(h => h.id === d.point.id)!.boundaries).toEqual(expected)
    }
    // The demo's boreholes log the crust over the estuarine clay (docs/demo.md).
    expect(ref.holes.find(h => h.identifier === 'BH-02')!.boundaries.length).toBeGreaterThanOrEqual(2)
  })

  it('gives every logged bulk unit weight at its sample\'s mid-depth', () => {
    const expected = details.flatMap(d => d.samples.filter(s => s.index?.bulkUnitWeight != null)
      .map(s => ({ pointIdentifier: d.point.identifier, sample: s.identifier, depth: 0.5 * (s.top + s.bottom), value: s.index!.bulkUnitWeight! })))
    expect(ref.unitWeights.length).toBe(expected.length)
    expect(expected.length).toBeGreaterThan(0)
    expect([...ref.unitWeights].sort((a, b) => `${a.pointIdentifier}${a.sample}`.localeCompare(`${b.pointIdentifier}${b.sample}`)))
      .toEqual([...expected].sort((a, b) => `${a.pointIdentifier}${a.sample}`.localeCompare(`${b.pointIdentifier}${b.sample}`)))
  })

  it('gives every groundwater observation, a piezometer\'s at its tip', () => {
    const all = details.flatMap(d => d.groundwater.map(g => ({ d, g })))
    expect(ref.water.length).toBe(all.filter(({ g }) => (g.kind === 'piezometer' ? g.pressure !== null : g.depth !== null)).length)
    for (const w of ref.water) {
      const { d, g } = all.find(x => x.g.id === w.id)!
      expect(w.pointIdentifier).toBe(d.point.identifier)
      expect(w.depth).toBe(g.kind === 'piezometer' ? d.point.finalDepth : g.depth)
      expect(w.pressure).toBe(g.kind === 'piezometer' ? g.pressure : null)
    }
    expect(ref.water.some(w => w.kind === 'piezometer')).toBe(true)
  })
})
