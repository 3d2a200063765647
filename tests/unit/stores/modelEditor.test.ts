// @vitest-environment happy-dom
import { createPinia, setActivePinia } from 'pinia'
import { describe, expect, it } from 'vitest'
import { SITE_MODEL_SCHEMA_VERSION, SiteModelDefinitionSchema, stratumBounds, type SiteModelDefinition } from '../../../shared/site-model/definition'
import { computeStressProfile } from '../../../shared/geotech/stress'
import { toStressInput } from '../../../shared/site-model/convert'
import { depthTrendCandidates, type TestCompressibility } from '../../../shared/site-model/compressibility'
import { diffDefinitions } from '../../../shared/site-model/diff'
import { HISTORY_LIMIT, hasLocalDraft, localKey, useModelEditorStore } from '../../../app/stores/modelEditor'
import { useFreshStores } from '../../helpers/stores'
import {
  addPiezometer, modelBase, moveBoundary, movePiezometer, removeBoundary, setBandStratum, setCompressibility,
  setCompressibilityTrend, setTrend, setUnitWeight, setWaterTable, splitBand, stableJson,
} from '../../../app/utils/siteModelEdits'

/** The Saltmarsh Lane profile as a model built from the demo logs starts it (mean logged thicknesses). */
function saltmarsh(): SiteModelDefinition {
  return SiteModelDefinitionSchema.parse({
    schemaVersion: SITE_MODEL_SCHEMA_VERSION,
    surcharge: 0,
    gammaW: 9.81,
    groundwater: { waterTableDepth: 1.57, piezometers: [] },
    strata: [
      { code: 'MG', name: 'Made ground', thickness: 1.22, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
      { code: 'CRUST', name: 'Desiccated crust', thickness: 2.22, unitWeight: 18, unitWeightSaturated: 18.5, compressible: false },
      { code: 'EST', name: 'Estuarine clay', thickness: 11.59, unitWeight: 16, unitWeightSaturated: 16, compressible: false },
      { code: 'GLAC', name: 'Glacial clay', thickness: 2.54, unitWeight: 20.5, unitWeightSaturated: 20.5, compressible: false },
      { code: 'SAND', name: 'Dense sand', thickness: 5.87, unitWeight: 20, unitWeightSaturated: 20, compressible: false },
    ],
    flagsInForce: [],
  })
}

const MODEL = '7a1e2c9b-4d1f-4a55-9a0e-2f6c1b3d8e10'

function effectiveAt(def: SiteModelDefinition, depth: number): number {
  const p = computeStressProfile({ ...toStressInput(def), depths: [depth] }).points.find(q => Math.abs(q.depth - depth) < 1e-9)
  if (!p) throw new Error(`no point at ${depth}`)
  return p.effectiveStress
}

describe('site-model edits', () => {
  it('moving a break keeps the base of the band below and both thicknesses positive', () => {
    const d = moveBoundary(saltmarsh(), 1, 3.9)
    expect(d.strata[1]!.thickness).toBe(2.68) // 3.90 − 1.22
    expect(d.strata[2]!.thickness).toBe(11.13) // 15.03 − 3.90
    expect(modelBase(d)).toBe(23.44)
    // Dragged past the band below: stops 0.05 m above its base.
    const far = moveBoundary(saltmarsh(), 1, 40)
    expect(stratumBounds(far)[1]!.bottom).toBe(14.98)
    expect(far.strata[2]!.thickness).toBe(0.05)
  })

  it('splits a band in two of the same stratum and joins them again', () => {
    const split = splitBand(saltmarsh(), 2, 9)
    expect(split.strata.map(s => [s.code, s.thickness])).toEqual([['MG', 1.22], ['CRUST', 2.22], ['EST', 5.56], ['EST', 6.03], ['GLAC', 2.54], ['SAND', 5.87]])
    const joined = removeBoundary(split, 2)
    expect(joined.strata.map(s => s.thickness)).toEqual([1.22, 2.22, 11.59, 2.54, 5.87])
  })

  it('picking another stratum takes its unit weights and drops the old trend', () => {
    const withTrend = setTrend(saltmarsh(), 2, { model: 'pop', logSpace: false, parameters: { pop: 25 }, n: 3, r2: 0.9, rmse: 4, aic: 10, aicc: 12, includedPointIds: ['a', 'b', 'c'], excludedPointIds: [] })
    const d = setBandStratum(withTrend, 2, { code: 'GLAC', name: 'Glacial clay', unitWeight: 20.5, unitWeightSaturated: 20.5 })
    expect(d.strata[2]).toMatchObject({ code: 'GLAC', name: 'Glacial clay', unitWeight: 20.5, unitWeightSaturated: 20.5 })
    expect(d.strata[2]!.trend).toBeUndefined()
    expect(withTrend.strata[2]!.trend?.parameters.pop).toBe(25)
  })

  it('clamps unit weights to the schema range and keeps compressibility complete', () => {
    expect(setUnitWeight(saltmarsh(), 0, 'unitWeight', 42).strata[0]!.unitWeight).toBe(30)
    const c = setCompressibility(saltmarsh(), 2, { cc: 0.85 })
    expect(c.strata[2]!.compressibility).toEqual({ cc: 0.85, cr: 0, e0: 1, drainage: 'double', source: 'manual' })
    const c2 = setCompressibility(c, 2, { cr: 0.09, e0: 2.1, cv: 1.2 })
    expect(SiteModelDefinitionSchema.safeParse(c2).success).toBe(true)
    expect(setCompressibility(c2, 2, { cv: undefined }).strata[2]!.compressibility).not.toHaveProperty('cv')
  })

  it('sorts object keys so a draft read back from the database compares equal', () => {
    expect(stableJson({ b: 1, a: { d: [1, { y: 2, x: 1 }], c: 3 } })).toBe('{"a":{"c":3,"d":[1,{"x":1,"y":2}]},"b":1}')
    expect(diffDefinitions(saltmarsh(), setWaterTable(saltmarsh(), 2.4))).toEqual([{ path: 'groundwater.waterTableDepth', a: 1.57, b: 2.4 }])
  })
})

/** The store with the Saltmarsh Lane profile loaded as draft revision `revision` of MODEL. */
function editing(revision: number) {
  const s = useModelEditorStore()
  s.load(MODEL, saltmarsh(), revision)
  return s
}

describe('the model editing session', () => {
  useFreshStores()

  it('an edit changes the draft and σ\'v0 follows it; undo and redo walk the history', () => {
    const s = editing(3)
    expect(s.dirty).toBe(false)
    // σ'v0 at 10 m, water table at 1.57 m: 1.22·19 + 0.35·18 + 1.87·18.5 + 6.56·16 − 9.81·8.43 = 169.04 − 82.70 = 86.34 kPa.
    expect(effectiveAt(s.draft!, 10)).toBeCloseTo(86.34, 1)

    s.edit('Move the water table', d => setWaterTable(d, 3.4))
    expect(s.draft!.groundwater.waterTableDepth).toBe(3.4)
    expect(s.dirty).toBe(true)
    // Lower table: 1.22·19 + 2.18·18 + 0.04·18.5 + 6.56·16 − 9.81·6.6 = 168.12 − 64.75 = 103.37 kPa.
    expect(effectiveAt(s.draft!, 10)).toBeCloseTo(103.37, 1)

    s.edit('Change the unit weight', d => setUnitWeight(d, 2, 'unitWeightSaturated', 16.4))
    expect(s.past.map(e => e.label)).toEqual(['Move the water table', 'Change the unit weight'])
    expect(s.undoLabel).toBe('Change the unit weight')

    s.undo()
    expect(s.draft!.strata[2]!.unitWeightSaturated).toBe(16)
    expect(s.draft!.groundwater.waterTableDepth).toBe(3.4)
    s.undo()
    expect(s.draft!.groundwater.waterTableDepth).toBe(1.57)
    expect(s.dirty).toBe(false)
    expect(s.canUndo).toBe(false)

    s.redo()
    expect(s.draft!.groundwater.waterTableDepth).toBe(3.4)
    expect(s.redoLabel).toBe('Change the unit weight')
    s.redo()
    expect(s.draft!.strata[2]!.unitWeightSaturated).toBe(16.4)
    expect(s.canRedo).toBe(false)
  })

  it('a new edit after an undo drops the redo branch', () => {
    const s = editing(1)
    s.edit('Table', d => setWaterTable(d, 2))
    s.undo()
    expect(s.canRedo).toBe(true)
    s.edit('Piezometer', d => addPiezometer(d, { depth: 12, porePressure: 102 }))
    expect(s.canRedo).toBe(false)
    expect(s.draft!.groundwater).toEqual({ waterTableDepth: 1.57, piezometers: [{ depth: 12, porePressure: 102 }] })
  })

  it('the moves of one drag undo as one step, and an edit that changes nothing leaves no entry', () => {
    const s = editing(1)
    s.edit('Add a control point', d => addPiezometer(d, { depth: 12, porePressure: 102 }))
    const g = s.startGesture()
    for (const u of [98, 94.5, 90.04]) s.edit('Drag the control point', d => movePiezometer(d, 0, { depth: 12, porePressure: u }), { gesture: g })
    expect(s.draft!.groundwater.piezometers[0]!.porePressure).toBe(90)
    expect(s.past).toHaveLength(2)
    expect(s.edit('Same again', d => movePiezometer(d, 0, { depth: 12, porePressure: 90 }))).toBe(false)
    expect(s.past).toHaveLength(2)
    s.undo()
    expect(s.draft!.groundwater.piezometers[0]!.porePressure).toBe(102)
    // A second drag is a new entry even with the same label.
    const g2 = s.startGesture()
    s.edit('Drag the control point', d => movePiezometer(d, 0, { depth: 13.5, porePressure: 110 }), { gesture: g2 })
    s.edit('Drag the control point', d => movePiezometer(d, 0, { depth: 14, porePressure: 113 }), { gesture: g2 })
    expect(s.past).toHaveLength(2)
    expect(s.draft!.groundwater.piezometers[0]).toEqual({ depth: 14, porePressure: 113 })
  })

  it('keeps at most the history limit', () => {
    const s = editing(1)
    for (let i = 1; i <= HISTORY_LIMIT + 20; i++) s.edit('Table', d => setWaterTable(d, 1 + i / 1000))
    expect(s.past).toHaveLength(HISTORY_LIMIT)
    for (let i = 0; i < HISTORY_LIMIT; i++) s.undo()
    // The 20 oldest steps are gone: undo stops at the 20th edit's result.
    expect(s.draft!.groundwater.waterTableDepth).toBe(1.02)
  })

  it('pending exclusions of a stratum without a trend are part of the session and its history', () => {
    const s = editing(1)
    s.edit('Leave out a point', (d, p) => ({ draft: d, pendingExcluded: { ...p, EST: ['cpt:x:4500'] } }))
    expect(s.pendingExcluded).toEqual({ EST: ['cpt:x:4500'] })
    expect(s.dirty).toBe(false)
    expect(JSON.parse(localStorage.getItem(localKey(MODEL, 1))!).snapshot.pendingExcluded).toEqual({ EST: ['cpt:x:4500'] })
    s.undo()
    expect(s.pendingExcluded).toEqual({})
    expect(localStorage.getItem(localKey(MODEL, 1))).toBeNull()
  })

  it('a reload offers the unsaved local draft back, and restoring it is an undoable edit', () => {
    const first = useModelEditorStore()
    first.load(MODEL, saltmarsh(), 4)
    first.edit('Move the break', d => moveBoundary(d, 1, 3.9))
    first.edit('Move the water table', d => setWaterTable(d, 2.1))
    const stored = JSON.parse(localStorage.getItem(localKey(MODEL, 4))!)
    expect(stored.revision).toBe(4)
    expect(stored.snapshot.draft.groundwater.waterTableDepth).toBe(2.1)

    // A new page: a fresh store reads the same server draft.
    setActivePinia(createPinia())
    const s = editing(4)
    expect(s.draft!.groundwater.waterTableDepth).toBe(1.57)
    expect(s.recovery?.revision).toBe(4)
    expect(s.recovery?.snapshot.draft.strata[1]!.thickness).toBe(2.68)
    s.acceptRecovery()
    expect(s.recovery).toBeNull()
    expect(s.draft!.groundwater.waterTableDepth).toBe(2.1)
    expect(s.draft!.strata[2]!.thickness).toBe(11.13)
    expect(s.dirty).toBe(true)
    s.undo()
    expect(s.draft!.groundwater.waterTableDepth).toBe(1.57)
    expect(s.dirty).toBe(false)
  })

  it('tells whether this device keeps a copy of a model\'s edits, under any revision, without reading the copies', () => {
    const OTHER = '0b5d7f1e-9c2a-4e3b-8a6d-1f2e3c4d5a6b'
    expect(hasLocalDraft(MODEL)).toBe(false)
    const first = useModelEditorStore()
    first.load(MODEL, saltmarsh(), 3)
    first.edit('Table', d => setWaterTable(d, 1.9))
    expect(hasLocalDraft(MODEL)).toBe(true)
    expect(hasLocalDraft(OTHER)).toBe(false)
    // Another model whose id this one's starts with is not taken for it.
    localStorage.setItem(localKey(`${MODEL}0`, 1), '{}')
    first.undo()
    expect(localStorage.getItem(localKey(MODEL, 3))).toBeNull()
    expect(hasLocalDraft(MODEL)).toBe(false)
  })

  it('a local copy made on an older revision is offered as such; discarding it removes it', () => {
    const first = useModelEditorStore()
    first.load(MODEL, saltmarsh(), 2)
    first.edit('Table', d => setWaterTable(d, 1.9))
    setActivePinia(createPinia())
    const s = useModelEditorStore()
    s.load(MODEL, setWaterTable(saltmarsh(), 1.7), 3)
    expect(s.recovery?.revision).toBe(2)
    s.discardRecovery()
    expect(localStorage.getItem(localKey(MODEL, 2))).toBeNull()
    setActivePinia(createPinia())
    const again = useModelEditorStore()
    again.load(MODEL, setWaterTable(saltmarsh(), 1.7), 3)
    expect(again.recovery).toBeNull()
  })

  it('a local copy equal to the server draft is not offered, and a corrupt one is dropped', () => {
    localStorage.setItem(localKey(MODEL, 5), JSON.stringify({ modelId: MODEL, revision: 5, savedAt: '2026-01-01T00:00:00Z', snapshot: { draft: JSON.parse(stableJson(saltmarsh())), pendingExcluded: {} } }))
    localStorage.setItem(localKey(MODEL, 6), '{not json')
    const s = editing(5)
    expect(s.recovery).toBeNull()
    expect(localStorage.getItem(localKey(MODEL, 5))).toBeNull()
    expect(localStorage.getItem(localKey(MODEL, 6))).toBeNull()
  })

  it('saving clears the dirty flag and the local copy; edits made during the save stay dirty under the new revision', () => {
    const s = editing(7)
    s.edit('Table', d => setWaterTable(d, 2.5))
    const sent = s.draft!
    s.edit('Unit weight', d => setUnitWeight(d, 0, 'unitWeight', 19.5))
    s.markSaved(sent, 8)
    expect(s.revision).toBe(8)
    expect(s.dirty).toBe(true)
    expect(localStorage.getItem(localKey(MODEL, 7))).toBeNull()
    expect(JSON.parse(localStorage.getItem(localKey(MODEL, 8))!).snapshot.draft.strata[0].unitWeight).toBe(19.5)
    s.markSaved(s.draft!, 9)
    expect(s.dirty).toBe(false)
    expect(localStorage.getItem(localKey(MODEL, 9))).toBeNull()
    // Undo still reaches edits from before the save; the session is then dirty against revision 9.
    s.undo()
    expect(s.draft!.strata[0]!.unitWeight).toBe(19)
    expect(s.dirty).toBe(true)
  })

  it('after a conflict, taking their draft can be undone back to yours', () => {
    const s = editing(2)
    s.edit('Table', d => setWaterTable(d, 2.2))
    const theirs = setUnitWeight(saltmarsh(), 2, 'unitWeightSaturated', 15.8)
    s.takeTheirs(theirs, 3)
    expect(s.revision).toBe(3)
    expect(s.dirty).toBe(false)
    expect(s.draft!.strata[2]!.unitWeightSaturated).toBe(15.8)
    expect(s.draft!.groundwater.waterTableDepth).toBe(1.57)
    s.undo()
    expect(s.draft!.groundwater.waterTableDepth).toBe(2.2)
    expect(s.draft!.strata[2]!.unitWeightSaturated).toBe(16)
    expect(s.dirty).toBe(true)
  })

  it('keeping yours after a conflict rebases onto their revision and stays dirty', () => {
    const s = editing(2)
    s.edit('Table', d => setWaterTable(d, 2.2))
    s.rebaseOnto(setWaterTable(saltmarsh(), 1.9), 3)
    expect(s.revision).toBe(3)
    expect(s.dirty).toBe(true)
    expect(s.draft!.groundwater.waterTableDepth).toBe(2.2)
    expect(localStorage.getItem(localKey(MODEL, 2))).toBeNull()
    expect(JSON.parse(localStorage.getItem(localKey(MODEL, 3))!).snapshot.draft.groundwater.waterTableDepth).toBe(2.2)
  })

  it('choosing a depth trend for Cc is one undoable edit that moves the draft to schema 2; constant and back walk the history', () => {
    const s = useModelEditorStore()
    const v1 = setCompressibility({ ...saltmarsh(), schemaVersion: 1 }, 2, { cc: 0.84, cr: 0.09, e0: 2.1, cv: 1.2, source: 'mean', n: 4 })
    s.load(MODEL, v1, 4)
    // Invented tests in the clay: Cc rising about 0.03 per metre.
    const tests: TestCompressibility[] = [[4.5, 0.72], [6.8, 0.8], [9.6, 0.86], [12.9, 0.98]].map(([z, cc], k) => ({ id: `t${k}`, stratumCode: 'EST', depth: z!, qualityClass: 'good-to-fair', cc: cc!, cr: 0.09, e0: 2.1, cv: 1.2, calpha: null }))
    const fit = depthTrendCandidates(tests, 'EST').cc
    if (!fit.ok) throw new Error(fit.reason)
    s.edit('Make Cc of EST follow depth', d => setCompressibilityTrend(d, 2, 'cc', fit.trend))
    expect(s.draft!.schemaVersion).toBe(2)
    expect(s.draft!.strata[2]!.compressibility!.trends!.cc).toEqual(fit.trend)
    expect(s.draft!.strata[2]!.compressibility!.cc).toBe(0.84)
    expect(SiteModelDefinitionSchema.safeParse(s.draft).success).toBe(true)
    s.edit('Make Cc of EST constant', d => setCompressibilityTrend(d, 2, 'cc', null))
    expect(s.draft!.strata[2]!.compressibility).not.toHaveProperty('trends')
    expect(s.past.map(e => e.label)).toEqual(['Make Cc of EST follow depth', 'Make Cc of EST constant'])

    s.undo()
    expect(s.draft!.strata[2]!.compressibility!.trends!.cc!.gradient).toBe(fit.trend.gradient)
    s.undo()
    expect(s.draft!.strata[2]!.compressibility).not.toHaveProperty('trends')
    expect(s.draft!.schemaVersion).toBe(1)
    expect(s.dirty).toBe(false)
    s.redo()
    expect(s.draft!.strata[2]!.compressibility!.trends!.cc).toEqual(fit.trend)
    expect(s.draft!.schemaVersion).toBe(2)
    // Another stratum for the band drops the trend (it was fitted to the old stratum's tests), keeping the constants.
    const other = setBandStratum(s.draft!, 2, { code: 'GLAC', name: 'Glacial clay', unitWeight: 20.5, unitWeightSaturated: 20.5 })
    expect(other.strata[2]!.compressibility).toEqual({ cc: 0.84, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double', source: 'mean', n: 4 })
  })
})

describe('the trend model chosen per stratum', () => {
  useFreshStores()

  it('keeps each stratum\'s choice apart, outside the undo history, and forgets them all when another model loads', () => {
    const store = useModelEditorStore()
    store.load(MODEL, saltmarsh(), 1)
    expect(store.fitChoice('EST')).toBeUndefined()
    store.setFitChoice('EST', { model: 'pop', logSpace: false })
    expect(store.fitChoice('EST')).toEqual({ model: 'pop', logSpace: false })
    // Another stratum has no choice of its own: the panel then offers the best by AICc.
    expect(store.fitChoice('CRUST')).toBeUndefined()
    store.setFitChoice('CRUST', { model: 'auto', logSpace: true })
    expect(store.fitChoice('EST')).toEqual({ model: 'pop', logSpace: false })
    // A choice is not an edit of the model.
    expect(store.canUndo).toBe(false)
    expect(store.dirty).toBe(false)
    store.load(MODEL, saltmarsh(), 2)
    expect(store.fitChoice('EST')).toBeUndefined()
    expect(store.fitChoice('CRUST')).toBeUndefined()
  })
})
