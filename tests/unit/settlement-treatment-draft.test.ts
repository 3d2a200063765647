// @vitest-environment happy-dom
// The run editor's schedule and drains (draft ⇄ request) and the drain spacing aid's pure helpers.
import { describe, expect, it } from 'vitest'
import { useSettlementDraftStore } from '../../app/stores/settlementDraft'
import { degreeWithDrains } from '../../shared/geotech/radial-consolidation'
import { settlementTimeScene, settlementTimeSvg } from '../../shared/plots/settlement-time'
import { CreateSettlementRunSchema, RUN_DRAIN_DEFAULTS } from '../../shared/schemas/settlement-runs'
import { aidSpacing, aidSpacings, aidStrataOf } from '../../shared/settlement-run/drain-aid'
import {
  addStage, dischargeFactor, draftFromRun, drainDiameterFactor, emptyDraft, instantStages, isInstant, newLoad, normalizeDraft,
  removeStage, requestOf, scheduleEnd, stagesComplete, stagesTotal, updateStage, type SettlementDraft,
} from '../../shared/settlement-run/draft'
import { scenarioDefinition } from '../helpers/scenario-definition'
import { useFreshStores } from '../helpers/stores'

const PROJECT = '3c1f9a52-7d7e-4b0e-9f57-1a2b3c4d5e6f'
const MODEL = { modelId: '7a1e2c9b-4d1f-4a55-9a0e-2f6c1b3d8e10', version: 1 }

/** A two-stage 4.5 m embankment, a 1.5 m surcharge on it taken off at 9 months, drains at 1.5 m through the estuarine clay. */
function treatedDraft(): SettlementDraft {
  const d = emptyDraft()
  const embankment = { ...newLoad('a', 'embankment', { x: 0, y: 0 }, 'E1'), height: 4.5, stages: [{ start: 0, duration: 2 / 12, fraction: 0.5 }, { start: 4 / 12, duration: 2 / 12, fraction: 0.5 }] }
  const surcharge = { ...newLoad('b', 'embankment', { x: 0, y: 0 }, 'S1'), height: 1.5, crestWidth: 30, crestLength: 50, stages: [{ start: 6 / 12, duration: 1 / 12, fraction: 1 }], removeAt: 0.75 }
  return {
    ...d,
    name: 'Yard, staged with surcharge and drains',
    model: MODEL,
    loads: [embankment, surcharge],
    points: [{ id: 'p', label: 'Centre', x: 0, y: 0 }],
    drains: { ...d.drains, on: true, strata: ['EST'], pattern: 'triangular', spacing: 1.5 },
  }
}

describe('construction schedules in the run draft', () => {
  it('starts every load at once at time zero, and leaves that default out of the request', () => {
    const l = newLoad('x', 'rectangle', { x: 0, y: 0 }, 'R1')
    expect(l.stages).toEqual([{ start: 0, duration: 0, fraction: 1 }])
    expect(l.removeAt).toBeNull()
    expect(isInstant(l.stages)).toBe(true)
    const body = requestOf({ ...emptyDraft(), name: 'n', model: MODEL, loads: [l], points: [{ id: 'p', label: 'P', x: 0, y: 0 }] })
    expect(body.loads[0]).not.toHaveProperty('stages')
    expect(body.loads[0]).not.toHaveProperty('removeAt')
    expect(body.options).not.toHaveProperty('drains')
    expect(CreateSettlementRunSchema.safeParse(body).success).toBe(true)
  })

  it('adds a stage after the last, sharing its share, so the total stays; removing the last stage gives back the default', () => {
    const two = addStage(instantStages())
    // A month after the instant stage, lasting a month, half each.
    expect(two).toEqual([{ start: 0, duration: 0, fraction: 0.5 }, { start: 1 / 12, duration: 1 / 12, fraction: 0.5 }])
    expect(stagesTotal(two)).toBe(1)
    const three = addStage(updateStage(two, 1, { duration: 3 / 12 }))
    expect(three[2]).toEqual({ start: 1 / 12 + 3 / 12 + 1 / 12, duration: 3 / 12, fraction: 0.25 })
    expect(stagesComplete(three)).toBe(true)
    expect(scheduleEnd(three)).toBeCloseTo(8 / 12, 12)
    // A share changed by hand: the total no longer is the whole load.
    const short = updateStage(three, 0, { fraction: 0.25 })
    expect(stagesTotal(short)).toBeCloseTo(0.75, 12)
    expect(stagesComplete(short)).toBe(false)
    expect(removeStage(removeStage(two, 0), 0)).toEqual(instantStages())
  })

  it('sends the schedule, the removal and the drains, which the request schema takes, and reads them back from the run', () => {
    const d = treatedDraft()
    const body = requestOf(d)
    expect(body.loads[0]).toMatchObject({ type: 'embankment', height: 4.5, stages: [{ start: 0, duration: 2 / 12, fraction: 0.5 }, { start: 4 / 12, duration: 2 / 12, fraction: 0.5 }] })
    expect(body.loads[0]).not.toHaveProperty('removeAt')
    expect(body.loads[1]).toMatchObject({ height: 1.5, removeAt: 0.75, stages: [{ start: 0.5, duration: 1 / 12, fraction: 1 }] })
    expect(body.options.drains).toEqual({
      strata: ['EST'], pattern: 'triangular', spacing: 1.5,
      diameter: RUN_DRAIN_DEFAULTS.diameter, smearRatio: 3, permeabilityRatio: 3, chRatio: 1,
    })
    const parsed = CreateSettlementRunSchema.parse(body)
    let n = 0
    const back = draftFromRun({ ...parsed, grid: parsed.grid ?? null }, () => `id${++n}`)
    expect(back.loads.map(l => [l.label, l.stages, l.removeAt])).toEqual(d.loads.map(l => [l.label, l.stages, l.removeAt]))
    expect(back.drains).toEqual(d.drains)
    expect(back.options).not.toHaveProperty('drains')
    // Switched off, the drains keep their values but are not sent.
    expect(requestOf({ ...d, drains: { ...d.drains, on: false } }).options).not.toHaveProperty('drains')
    // A discharge capacity is sent when given.
    expect(requestOf({ ...d, drains: { ...d.drains, dischargeCapacity: 150 } }).options.drains).toMatchObject({ dischargeCapacity: 150 })
  })

  it('brings a draft kept by an earlier version of the editor up to date: loads at once, drains off', () => {
    const old = treatedDraft() as Partial<SettlementDraft>
    const loads = old.loads!.map(({ stages: _s, removeAt: _r, ...rest }) => rest)
    const { drains: _d, ...rest } = old
    const d = normalizeDraft({ ...rest, loads: loads as SettlementDraft['loads'] })
    expect(d.loads.map(l => [l.stages, l.removeAt])).toEqual([[instantStages(), null], [instantStages(), null]])
    expect(d.drains.on).toBe(false)
    expect(d.drains.diameter).toBe(RUN_DRAIN_DEFAULTS.diameter)
  })

  it('shows a drain diameter in mm or inches and a discharge capacity in m³ or ft³ a year', () => {
    // 1 in = 0.0254 m and 1 ft = 0.3048 m exactly (NIST SP 811, 2008, App. B.8).
    expect(drainDiameterFactor('SI')).toBe(1000)
    expect(drainDiameterFactor('US')).toBeCloseTo(1 / 0.0254, 9)
    expect(dischargeFactor('SI')).toBe(1)
    expect(dischargeFactor('US')).toBeCloseTo(1 / 0.3048 ** 3, 9)
  })
})

describe('the draft store with schedules and drains', () => {
  useFreshStores()

  it('edits a schedule and the drains, each an undoable step kept in the tab', () => {
    const s = useSettlementDraftStore()
    s.open(PROJECT)
    const id = s.addLoad('embankment', { x: 0, y: 0 })!
    s.updateLoad(id, { stages: addStage(s.loads[0]!.stages) })
    s.updateLoad(id, { removeAt: 0.75 })
    expect(s.loads[0]!.stages).toHaveLength(2)
    s.setDrains({ on: true })
    s.setDrains({ strata: ['EST'], spacing: 1.2 })
    expect(s.draft.drains).toMatchObject({ on: true, strata: ['EST'], spacing: 1.2 })
    expect(s.undoLabel).toBe('Edit the drains')
    s.undo()
    expect(s.draft.drains).toMatchObject({ on: true, strata: [], spacing: 1.5 })
    s.undo()
    expect(s.draft.drains.on).toBe(false)
    s.undo()
    expect(s.loads[0]!.removeAt).toBeNull()
    // The tab's copy reopens with the schedule.
    const kept = JSON.parse(sessionStorage.getItem(`pastload.settlement-draft.v1:${PROJECT}`)!) as { draft: SettlementDraft }
    expect(kept.draft.loads[0]!.stages).toHaveLength(2)
  })
})

describe('the drain spacing aid', () => {
  it('takes the drained strata of a model version: cv, ch = cv × ch/cv, half the thickness when draining both ways', () => {
    // The scenario's estuarine clay: 11.6 m thick, cv 1.2 m²/yr, double drainage.
    const st = aidStrataOf(scenarioDefinition(), ['EST', 'MG'], 2)
    expect(st).toEqual([{ name: 'Estuarine clay', cv: 1.2, ch: 2.4, drainagePath: 5.8 }])
    expect(aidStrataOf(scenarioDefinition(), [], 1)).toEqual([])
  })

  it('gives the widest spacing that reaches the target in every drained stratum: the slowest governs', () => {
    const strata = aidStrataOf(scenarioDefinition(), ['CRUST', 'EST', 'GLA'], 1)
    const drain = { diameter: RUN_DRAIN_DEFAULTS.diameter, smearRatio: 3, permeabilityRatio: 3 }
    const target = { degree: 0.9, years: 0.5 }
    const tri = aidSpacing('triangular', target, strata, drain)
    // The estuarine clay has the lowest cv and the longest drainage path: it sets the spacing.
    expect(tri.governing).toBe('Estuarine clay')
    expect(tri.spacing).not.toBeNull()
    const s = tri.spacing!
    // At the spacing found the clay reaches 90 % by 6 months; 0.05 m wider it does not (Hansbo 1981 with
    // Carrillo 1942, as `degreeWithDrains` computes them).
    const est = strata.find(x => x.name === 'Estuarine clay')!
    const at = (spacing: number) => degreeWithDrains({ pattern: 'triangular', spacing, years: 0.5, ch: est.ch, cv: est.cv, drainagePath: est.drainagePath, ...drain })
    expect(at(s)).toBeGreaterThanOrEqual(0.9)
    expect(at(s + 0.05)).toBeLessThan(0.9)
    // A square grid serves a bigger cylinder per drain spacing (1.128 s against 1.05 s): its spacing is closer.
    const [t, sq] = aidSpacings(target, strata, drain)
    expect(t).toEqual(tri)
    expect(sq!.spacing!).toBeLessThan(s)
    expect(sq!.spacing! / s).toBeCloseTo(1.05 / 1.128, 1)
  })

  it('says when no spacing reaches the target, and which stratum stops it', () => {
    const strata = aidStrataOf(scenarioDefinition(), ['EST'], 1)
    const a = aidSpacing('triangular', { degree: 0.99, years: 0.01 }, strata, { diameter: 0.052, smearRatio: 3, permeabilityRatio: 3 })
    expect(a).toEqual({ pattern: 'triangular', spacing: null, atWidest: false, governing: 'Estuarine clay' })
  })
})

describe('the time plot of a treated run', () => {
  const years = [0.01, 0.1, 0.5, 0.75, 1, 5, 20, 50]
  const curve = {
    years,
    primary: [0, 0.05, 0.2, 0.25, 0.22, 0.3, 0.32, 0.32],
    secondary: years.map(() => 0),
    total: [0, 0.05, 0.2, 0.25, 0.22, 0.3, 0.32, 0.32],
    layers: [],
    withoutDrains: [0, 0.01, 0.03, 0.04, 0.045, 0.1, 0.25, 0.32],
    surfaceLoad: [45, 90, 120, 120, 90, 90, 90, 90],
  }
  const point = { label: 'Centre', curve, time: [], t50: 0.3, t90: 0.9, t90WithoutDrains: 22, removedAt: 0.75, rebound: 0.012 }

  it('draws the load in a band above the settlement axes, the no-drain curve and the removal mark', () => {
    const s = settlementTimeScene({ series: [{ name: 'r', point }], years: [1], unitSystem: 'SI', width: 600, height: 320 })
    expect(s.load).not.toBeNull()
    expect(s.load!.label).toBe('Load (kPa)')
    expect(s.height).toBeGreaterThan(320)
    expect(s.plotTop).toBeGreaterThan(s.load!.bottom)
    expect(s.yTicks[0]!.at).toBe(s.plotTop)
    expect(s.lines.map(l => l.label)).toEqual(['total, with drains', 'primary, without drains', 'primary'])
    expect(s.marks.map(m => m.label)).toEqual(['t50', 'taken off', 't90', 't90 no drains'])
    // "taken off" at 0.75 yr and t90 at 0.9 yr are close on a log axis: their labels go on different rows.
    const off = s.marks.find(m => m.label === 'taken off')!
    const t90 = s.marks.find(m => m.label === 't90')!
    expect(off.row).not.toBe(t90.row)
    expect(settlementTimeSvg(s, { legend: true })).toContain('Load (kPa)')
    // On a phone's width the last label would run past the right edge: it sits left of its line.
    const narrow = settlementTimeScene({ series: [{ name: 'r', point }], years: [1], unitSystem: 'SI', width: 330 })
    const last = narrow.marks.find(m => m.label === 't90 no drains')!
    expect(last.anchor).toBe('end')
    expect(last.at + 3 + last.label.length * 5.5).toBeGreaterThan(330 - narrow.margin.right)
    // In US units with tsf the band reads tsf (1 tsf = 2000 lbf/ft²).
    expect(settlementTimeScene({ series: [{ name: 'r', point }], years: [1], unitSystem: 'US', width: 600, usStress: 'tsf' }).load!.label).toBe('Load (tsf)')
  })

  it('keeps the plain plot for a load placed at once without drains', () => {
    const plain = { ...point, t90WithoutDrains: undefined, removedAt: undefined, curve: { ...curve, withoutDrains: undefined, surfaceLoad: years.map(() => 120) } }
    const s = settlementTimeScene({ series: [{ name: 'r', point: plain }], years: [1], unitSystem: 'SI', width: 600, height: 320 })
    expect(s.load).toBeNull()
    expect(s.height).toBe(320)
    expect(s.plotTop).toBe(s.margin.top)
    expect(s.lines.map(l => l.label)).toEqual(['total', 'primary'])
  })
})
