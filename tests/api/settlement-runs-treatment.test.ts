// Settlement runs with a treatment over real HTTP: construction stages, a surcharge taken off and
// vertical drains (the contract's added fields, the export's schedule and drain design), the 422
// refusals of schedules and drains the run cannot take, and 400 shapes.
import * as XLSX from 'xlsx-republish'
import { beforeAll, describe, expect, it } from 'vitest'
import { RUN_DRAIN_DEFAULTS } from '../../shared/schemas/settlement-runs'
import type { RunDrainDesign, RunPointDetail, SettlementRun, SettlementRunList } from '../../shared/types/settlement-runs'
import { demoProjectId, signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { createRunModel } from '../helpers/settlement-run'

interface Created { run: { id: string, status: string } }
interface Refusal { message: string, data: { code: string, path?: (string | number)[] } }

const yard = { x: 0, y: 0, crestWidth: 80, crestLength: 120, sideSlope: 2, unitWeight: 20, rotation: 0 }
const drains = { strata: ['EST'], pattern: 'triangular', spacing: 1.5 }

function treatedBody(model: { modelId: string, version: number }, over: { loads?: unknown[], drains?: unknown } = {}) {
  return {
    name: 'Staged yard with surcharge',
    model: { modelId: model.modelId, version: model.version },
    loads: over.loads ?? [
      { type: 'embankment', label: 'Embankment', ...yard, height: 3, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] },
      { type: 'embankment', label: 'Surcharge', ...yard, height: 1.5, stages: [{ start: 0.35, duration: 0.05, fraction: 1 }], removeAt: 0.75 },
    ],
    points: [{ label: 'Centre', x: 0, y: 0 }],
    options: { years: [0.5, 0.75, 1, 5, 20], drains: over.drains === undefined ? drains : over.drains },
  }
}

describe('settlement runs with stages, a surcharge and drains', () => {
  const { owner, engineer, designer, reviewer } = signedInDemo('owner', 'engineer', 'designer', 'reviewer')
  let base: string
  let model: { modelId: string, version: number }
  let runId: string

  beforeAll(async () => {
    base = (await createProject(owner, 'TR', 'Treated runs site', ['engineer', 'designer', 'reviewer'])).base
    model = await createRunModel(engineer, base.split('/').pop()!)
    const r = await designer.post<Created>(`${base}/settlement-runs`, treatedBody(model))
    expect(r.status, JSON.stringify(r.body)).toBe(201)
    expect(r.body.run.status).toBe('finished')
    runId = r.body.run.id
  })

  it('stores the schedule and the drains (defaults filled in) and answers the treatment fields', async () => {
    const { run } = await must('run', reviewer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${runId}`))
    expect(run.loads[0]).toMatchObject({ stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] })
    expect(run.loads[1]).toMatchObject({ removeAt: 0.75 })
    expect(run.options.drains).toEqual({ strata: ['EST'], pattern: 'triangular', spacing: 1.5, diameter: RUN_DRAIN_DEFAULTS.diameter, smearRatio: RUN_DRAIN_DEFAULTS.smearRatio, permeabilityRatio: RUN_DRAIN_DEFAULTS.permeabilityRatio, chRatio: 1 })
    expect(RUN_DRAIN_DEFAULTS.diameter).toBeCloseTo(0.052, 12)
    const d = run.results!.drains as RunDrainDesign
    // De = 1.05 s (Barron 1948) for a triangular pattern.
    expect(d).toMatchObject({ pattern: 'triangular', spacing: 1.5, diameter: 0.052 })
    expect(d.influenceDiameter).toBeCloseTo(1.575, 12)
    expect(d.strata).toEqual([{ name: 'Estuarine clay', cv: 1.2, ch: 1.2, drainagePath: expect.closeTo(5.8, 9) }])
    const p = run.results!.points[0]!
    expect(p.t90).not.toBeNull()
    expect(p.t90WithoutDrains!).toBeGreaterThan(p.t90! * 5)
    expect(p.removedAt).toBe(0.75)
    expect(p.rebound).toBeGreaterThanOrEqual(0)
    expect(p.residualAfterRemoval).toBeGreaterThan(0)
    expect(p.time.map(t => Object.keys(t).sort())).toEqual(p.time.map(() => ['degree', 'settlement', 'years']))
    expect(p.time.map(t => t.years)).toEqual([0.5, 0.75, 1, 5, 20])
    expect(p.time[4]!.degree).toBeCloseTo(1, 2)
    const c = p.curve!
    expect(c.withoutDrains).toHaveLength(c.years.length)
    expect(c.surfaceLoad).toHaveLength(c.years.length)
    expect(Math.max(...c.surfaceLoad!)).toBeCloseTo(90, 6)
    expect(c.surfaceLoad![c.surfaceLoad!.length - 1]).toBeCloseTo(60, 6)
    const detail = await must('point', reviewer.get<{ point: RunPointDetail }>(`${base}/settlement-runs/${runId}/points/0`))
    expect(detail.point.t90WithoutDrains).toBe(p.t90WithoutDrains)
    expect(detail.point.sublayers.length).toBeGreaterThan(0)
  })

  it('exports the schedule and the drain design: a Treatment sheet and a treatment block', async () => {
    const x = await fetch(`${designer.base}${base}/settlement-runs/${runId}/export?format=xlsx`, { headers: { cookie: designer.cookie } })
    expect(x.status).toBe(200)
    const wb = XLSX.read(Buffer.from(await x.arrayBuffer()), { type: 'buffer' })
    expect(wb.SheetNames).toEqual(['Inputs', 'Points', 'Sublayers', 'Time curves', 'Grid', 'Treatment'])
    const rows = XLSX.utils.sheet_to_json<(string | number)[]>(wb.Sheets.Treatment!, { header: 1 })
    expect(rows.filter(r => r[0] === 'Embankment').map(r => r.slice(1, 5))).toEqual([[1, 0, 0.1, 0.5], [2, 0.25, 0.1, 0.5]])
    expect(rows.find(r => r[0] === 'Surcharge')?.[5]).toBe(0.75)
    expect(rows.find(r => r[0] === 'Spacing (m)')?.[1]).toBe(1.5)
    const j = await reviewer.get<{ treatment: { schedule: { load: string, removeAt: number | null }[], drains: RunDrainDesign } }>(`${base}/settlement-runs/${runId}/export?format=json`)
    expect(j.status).toBe(200)
    expect(j.body.treatment.schedule.map(s => s.load)).toEqual(['Embankment', 'Embankment', 'Surcharge'])
    expect(j.body.treatment.drains.influenceDiameter).toBeCloseTo(1.575, 12)
  })

  it('a US project\'s workbook is in its units, labelled (ft, tsf); the JSON stays SI and says so', async () => {
    await must('US units', owner.patch(base, { unitSystem: 'US', usStressUnit: 'tsf' }))
    try {
      const x = await fetch(`${designer.base}${base}/settlement-runs/${runId}/export?format=xlsx`, { headers: { cookie: designer.cookie } })
      expect(x.status).toBe(200)
      const wb = XLSX.read(Buffer.from(await x.arrayBuffer()), { type: 'buffer' })
      const sheet = (name: string) => XLSX.utils.sheet_to_json<(string | number | null)[]>(wb.Sheets[name]!, { header: 1 })
      expect(sheet('Inputs').find(r => r[0] === 'Units')?.[1]).toBe('ft, tsf, pcf, years')
      // 1.5 m = 4.9213 ft (1 ft = 0.3048 m exactly, NIST SP 811).
      expect(sheet('Treatment').find(r => r[0] === 'Spacing (ft)')?.[1]).toBe(4.9213)
      const points = sheet('Points')
      expect(points[0]).toContain('Settlement (ft)')
      expect(points[0]).toContain('Δσ at surface (tsf)')
      const j = await reviewer.get<{ units: { length: string }, run: { results: { points: { settlement: number }[] } } }>(`${base}/settlement-runs/${runId}/export?format=json`)
      expect(j.body.units.length).toBe('m')
      const settlementFt = points[1]![points[0]!.indexOf('Settlement (ft)')] as number
      expect(settlementFt).toBeCloseTo(j.body.run.results.points[0]!.settlement / 0.3048, 3)
      const sublayers = sheet('Sublayers')
      expect(sublayers[0]).toContain("σ'v0 (tsf)")
    }
    finally {
      await must('SI units again', owner.patch(base, { unitSystem: 'SI' }))
    }
  })

  it('refuses schedules and drains the run cannot take with 422 and the plain reason', async () => {
    const post = (body: unknown) => designer.post<Refusal>(`${base}/settlement-runs`, body)
    const fractions = await post(treatedBody(model, { loads: [{ type: 'embankment', ...yard, height: 3, stages: [{ start: 0, duration: 0, fraction: 0.5 }, { start: 1, duration: 0, fraction: 0.3 }] }] }))
    expect(fractions.status).toBe(422)
    expect(fractions.body.data.code).toBe('stage-fractions')
    expect(fractions.body.message).toBe('The stages of load 1 add 80 % of the load; their fractions must sum to 100 %.')

    const late = await post(treatedBody(model, { loads: [{ type: 'embankment', ...yard, height: 1.5, stages: [{ start: 1, duration: 0, fraction: 1 }], removeAt: 0.75 }] }))
    expect(late.status).toBe(422)
    expect(late.body.data.code).toBe('stage-after-removal')
    expect(late.body.message).toBe('Stage 1 of load 1 starts at 1 years (12 months), after the load is removed at 0.75 years (9 months).')

    const close = await post(treatedBody(model, { drains: { ...drains, spacing: 0.3, diameter: 0.35 } }))
    expect(close.status).toBe(422)
    expect(close.body.data.code).toBe('drain-spacing-too-small')
    expect(close.body.message).toBe('The drain spacing (0.3 m) must be larger than the drain diameter (0.35 m).')

    const unknown = await post(treatedBody(model, { drains: { ...drains, strata: ['PEAT'] } }))
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.code).toBe('drain-stratum-unknown')
    expect(unknown.body.message).toMatch(/^The drains pass through stratum PEAT, which is not in this version\. Strata there: MG, CRUST, EST, GLA, SAND\.$/)
  })

  it('answers 400 for malformed schedules and drains', async () => {
    const post = (body: unknown) => designer.post(`${base}/settlement-runs`, body)
    const stage = { start: 0, duration: 0, fraction: 1 / 13 }
    expect((await post(treatedBody(model, { loads: [{ type: 'uniform', pressure: 20, stages: Array.from({ length: 13 }, () => stage) }] }))).status).toBe(400)
    expect((await post(treatedBody(model, { loads: [{ type: 'uniform', pressure: 20, stages: [{ start: 0, duration: 0, fraction: 0 }] }] }))).status).toBe(400)
    expect((await post(treatedBody(model, { loads: [{ type: 'uniform', pressure: 20, removeAt: -1 }] }))).status).toBe(400)
    expect((await post(treatedBody(model, { drains: { ...drains, pattern: 'hexagonal' } }))).status).toBe(400)
    expect((await post(treatedBody(model, { drains: { ...drains, strata: [] } }))).status).toBe(400)
    expect((await post(treatedBody(model, { drains: { ...drains, spacing: 50 } }))).status).toBe(400)
  })
})

describe('the demo\'s treated run', () => {
  const { designer } = signedInDemo('designer')

  it('is seeded finished on the approved Yard model version 1: two lifts, a 1.5 m surcharge off at 9 months, 1.5 m triangular drains through the estuarine clay', async () => {
    const projectId = await demoProjectId(designer)
    const list = await must('list', designer.get<SettlementRunList>(`/api/projects/${projectId}/settlement-runs`))
    const seeded = list.runs.find(r => r.name === 'Yard embankment in two lifts, surcharge and drains')
    expect(seeded?.status).toBe('finished')
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${seeded!.id}`))
    expect(run.model).toMatchObject({ modelName: 'Yard model', version: 1, status: 'approved' })
    expect(run.loads.map(l => l.label)).toEqual(['Yard embankment, two lifts', 'Surcharge'])
    expect(run.loads[0]).toMatchObject({ height: 6, crestWidth: 96, crestLength: 56, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] })
    // The surcharge sits on the crest (96 m × 56 m) with 2:1 slopes: its crest is 6 m narrower each way.
    expect(run.loads[1]).toMatchObject({ height: 1.5, crestWidth: 90, crestLength: 50, removeAt: 0.75 })
    expect(run.options.drains).toMatchObject({ strata: ['EST'], pattern: 'triangular', spacing: 1.5 })
    expect(run.grid).toBeNull()
    const centre = run.results!.points[0]!
    expect(centre.label).toBe('Yard centre')
    expect(centre.t90!).toBeLessThan(centre.t90WithoutDrains!)
    expect(centre.removedAt).toBe(0.75)
    expect(centre.residualAfterRemoval).toBeGreaterThan(0)
    expect(run.results!.drains!.strata.map(s => s.name)).toEqual(['Estuarine clay'])
  })
})
