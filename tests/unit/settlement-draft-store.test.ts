// @vitest-environment happy-dom
import { createPinia, setActivePinia } from 'pinia'
import { describe, expect, it } from 'vitest'
import { sessionKey, useSettlementDraftStore } from '../../app/stores/settlementDraft'
import { CreateSettlementRunSchema, MAX_GRID_POINTS, RUN_OPTION_DEFAULTS } from '../../shared/schemas/settlement-runs'
import { draftOutlines, gridPointCount, requestOf, siFromTyped, type RunInputs } from '../../shared/settlement-run/draft'
import { useFreshStores } from '../helpers/stores'

const PROJECT = '3c1f9a52-7d7e-4b0e-9f57-1a2b3c4d5e6f'
const MODEL = { modelId: '7a1e2c9b-4d1f-4a55-9a0e-2f6c1b3d8e10', version: 1 }

function openStore() {
  const s = useSettlementDraftStore()
  s.open(PROJECT)
  return s
}

describe('the settlement run draft', () => {
  useFreshStores()

  it('draws an embankment from a dragged box: the toe is the box, the crest two slope widths inside it', () => {
    const s = openStore()
    const id = s.addLoadBox('embankment', { x: 10, y: 20 }, { x: 110, y: 100 })!
    const e = s.loads.find(l => l.id === id)!
    // Default 6 m high at 2:1: each side's slope is 12 m wide, so the crest is 100 − 24 by 80 − 24.
    expect([e.type, e.label, e.x, e.y, e.crestWidth, e.crestLength, e.height, e.sideSlope]).toEqual(['embankment', 'E1', 60, 60, 76, 56, 6, 2])
    const o = draftOutlines(e)!
    expect(Math.min(...o.toe.map(p => p.x))).toBeCloseTo(10, 9)
    expect(Math.max(...o.toe.map(p => p.y))).toBeCloseTo(100, 9)
    expect(Math.min(...o.crest!.map(p => p.x))).toBeCloseTo(22, 9)
    expect(s.selected).toEqual({ kind: 'load', id })
  })

  it('places, moves and edits loads, each step undone and redone', () => {
    const s = openStore()
    const r = s.addLoad('rectangle', { x: 5.123, y: -7.456 })!
    expect(s.loads[0]).toMatchObject({ label: 'R1', x: 5.12, y: -7.46, width: 20, length: 30, pressure: 50 })
    const c = s.addLoad('circle', { x: 0, y: 0 })!
    expect(s.loads.map(l => l.label)).toEqual(['R1', 'C1'])

    // A drag: many moves in one gesture, one undo step.
    const g = s.startGesture()
    s.moveLoad(r, 6, -7, { gesture: g })
    s.moveLoad(r, 8.004, -3, { gesture: g })
    expect(s.loads[0]).toMatchObject({ x: 8, y: -3 })
    s.updateLoad(c, { radius: 12.5 })
    expect(s.past.length).toBe(4)

    s.undo()
    expect(s.loads[1]!.radius).toBe(10)
    s.undo()
    expect(s.loads[0]).toMatchObject({ x: 5.12, y: -7.46 })
    s.redo()
    expect(s.loads[0]).toMatchObject({ x: 8, y: -3 })
    s.undo()
    s.undo()
    s.undo()
    expect(s.loads).toEqual([])
    expect(s.canUndo).toBe(false)
    s.redo()
    expect(s.loads.map(l => l.label)).toEqual(['R1'])
    // An edit that changes nothing leaves no entry.
    expect(s.updateLoad(r, { width: 20 })).toBe(false)
  })

  it('a uniform fill has no footprint, and a fill thickness × unit weight is sent as a fill', () => {
    const s = openStore()
    const u = s.addLoad('uniform')!
    s.updateLoad(u, { loading: 'fill', fillThickness: 1.5, fillUnitWeight: 19 })
    expect(draftOutlines(s.loads[0]!)).toBeNull()
    s.addPoint({ x: 0, y: 0 })
    s.setModel(MODEL)
    s.setName('Uniform fill')
    const parsed = CreateSettlementRunSchema.parse(requestOf(s.draft))
    expect(parsed.loads).toEqual([{ type: 'uniform', label: 'U1', fill: { thickness: 1.5, unitWeight: 19 } }])
    expect(parsed.options).toEqual(RUN_OPTION_DEFAULTS)
  })

  it('names points, takes investigation points once, and unlinks a point moved by hand', () => {
    const s = openStore()
    s.addPoint({ x: 1, y: 2 })
    s.addPoint({ x: 3, y: 4 })
    const bh = { id: 'c0a8e1f2-1111-4222-8333-944455556666', identifier: 'BH-01', easting: 61.4, northing: 51.8 }
    const id = s.addInvestigationPoint(bh)!
    expect(s.addInvestigationPoint(bh)).toBe(id)
    expect(s.points.map(p => [p.label, p.x, p.y, p.pointId ?? null])).toEqual([['P1', 1, 2, null], ['P2', 3, 4, null], ['BH-01', 61.4, 51.8, bh.id]])
    s.updatePoint(id, { label: 'BH-01 centre' })
    expect(s.points[2]!.pointId).toBe(bh.id)
    s.updatePoint(id, { x: 62 })
    expect(s.points[2]!.pointId).toBeUndefined()
    s.undo()
    expect(s.points[2]!.pointId).toBe(bh.id)
    s.removePoint(s.points[0]!.id)
    expect(s.points.map(p => p.label)).toEqual(['P2', 'BH-01 centre'])
    // The next free label fills the gap.
    s.addPoint({ x: 0, y: 0 })
    expect(s.points[2]!.label).toBe('P1')
  })

  it('copies a run’s inputs for a run again with changes, undoable, and the request is the same run', () => {
    const s = openStore()
    s.addPoint({ x: 9, y: 9 })
    const run: RunInputs = {
      name: 'Yard embankment, stage 1',
      model: MODEL,
      loads: [
        { type: 'embankment', label: 'Yard', x: 60, y: 40, crestWidth: 96, crestLength: 56, height: 6, sideSlope: 2, unitWeight: 20, rotation: 15 },
        { type: 'circle', x: 0, y: 0, radius: 4, pressure: 30 },
        { type: 'rectangle', x: 10, y: 10, width: 5, length: 6, rotation: 0, fill: { thickness: 2, unitWeight: 18 } },
      ],
      points: [{ label: 'Centre', x: 60, y: 40 }, { label: 'BH-01', x: 61.4, y: 51.8, pointId: 'c0a8e1f2-1111-4222-8333-944455556666' }],
      grid: { spacing: 10, margin: 5 },
      options: { maxSublayerThickness: 0.5, years: [1, 10], designLife: 30, angularDistortionLimit: 1 / 300 },
    }
    s.copyRun('run-1', run, 'Yard embankment, stage 1 (changed)')
    expect(s.fromRunId).toBe('run-1')
    const body = CreateSettlementRunSchema.parse(requestOf(s.draft))
    expect(body).toEqual({ ...run, name: 'Yard embankment, stage 1 (changed)' })
    s.undo()
    expect(s.points.map(p => p.label)).toEqual(['P1'])
  })

  it('keeps the draft in the tab’s session: a reload of the page opens it again', () => {
    const s = openStore()
    s.addLoad('circle', { x: 1, y: 1 })
    s.setName('Kept')
    expect(JSON.parse(sessionStorage.getItem(sessionKey(PROJECT))!).draft.name).toBe('Kept')

    setActivePinia(createPinia())
    const again = useSettlementDraftStore()
    expect(again.open(PROJECT)).toBe(true)
    expect(again.restored).toBe(true)
    expect([again.draft.name, again.loads.length]).toEqual(['Kept', 1])
    // A broken copy is dropped, and the draft starts empty.
    sessionStorage.setItem(sessionKey(PROJECT), '{"projectId":')
    setActivePinia(createPinia())
    const fresh = useSettlementDraftStore()
    expect(fresh.open(PROJECT)).toBe(false)
    expect(fresh.loads).toEqual([])
    expect(sessionStorage.getItem(sessionKey(PROJECT))).toBeNull()
  })

  it('reads values typed in US units into SI, and SI as typed', () => {
    const s = openStore()
    const e = s.addLoad('embankment', { x: 0, y: 0 })!
    // 1 ft = 0.3048 m exactly; 1 pcf = 0.157087… kN/m³; 1 psf = 0.0478803 kPa (NIST SP 811, 2008, App. B.8).
    s.updateLoad(e, { height: siFromTyped('20', 'length', 'US')!, unitWeight: siFromTyped('125', 'unitWeight', 'US')! })
    expect(s.loads[0]!.height).toBeCloseTo(6.096, 9)
    expect(s.loads[0]!.unitWeight).toBeCloseTo(19.6358, 3)
    expect(siFromTyped('2000', 'stress', 'US')).toBeCloseTo(95.7605, 3)
    expect(siFromTyped('1,5', 'length', 'SI')).toBe(1.5)
    expect(siFromTyped('2', null, 'US')).toBe(2)
    expect(siFromTyped('abc', 'length', 'SI')).toBeNull()
    expect(siFromTyped(' ', 'length', 'SI')).toBeNull()
  })

  it('counts the grid points from the loads’ footprints and the margin', () => {
    const s = openStore()
    s.addLoadBox('rectangle', { x: 0, y: 0 }, { x: 100, y: 50 })
    // 0–100 widened by 10 each way at 5 m: 25 columns; −10–60: 15 rows.
    expect(gridPointCount(s.loads, { spacing: 5, margin: 10 })).toBe(25 * 15)
    expect(gridPointCount(s.loads, { spacing: 1, margin: 0 })).toBe(101 * 51)
    expect(gridPointCount(s.loads, { spacing: 0.5, margin: 0 })).toBeGreaterThan(MAX_GRID_POINTS)
    expect(gridPointCount([], { spacing: 5, margin: 10 })).toBe(0)
  })
})
