import { defineStore } from 'pinia'
import { computed, ref, shallowRef, toRaw } from 'vue'
import {
  draftFromRun, emptyDraft, loadFromBox, newLoad, nextLabel, normalizeDraft, round,
  withVariation,
  type DraftDrains, type DraftLoad, type DraftLoadType, type DraftOptions, type DraftPoint, type DraftProbabilistic, type RunInputs, type SettlementDraft,
} from '#shared/settlement-run/draft'
import { RUN_LIMITS, type RunScatterVariable } from '#shared/schemas/settlement-run-limits'
import type { RunVariation } from '#shared/schemas/settlement-runs'
import { useUndoHistory } from '../composables/useUndoHistory'

/**
 * The run editor's draft (client state only): loads, named points, grid and options of the next
 * settlement run, SI throughout, with undo and redo for every edit and a copy in sessionStorage so
 * a reload of the tab keeps it. Network calls (the model in force, a run to copy, the POST) live in
 * useSettlementDraft; this store only holds state.
 */

export const DRAFT_HISTORY_LIMIT = 200
export const SESSION_PREFIX = 'pastload.settlement-draft.v1'

export function sessionKey(projectId: string): string {
  return `${SESSION_PREFIX}:${projectId}`
}

interface StoredDraft {
  projectId: string
  /** The run the draft was copied from, if any. */
  fromRunId: string | null
  savedAt: string
  draft: SettlementDraft
}

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' && window.sessionStorage ? window.sessionStorage : null
  }
  catch {
    // Storage can be switched off by the browser's privacy settings.
    return null
  }
}

function isStored(v: unknown): v is StoredDraft {
  const o = v as Partial<StoredDraft> | null
  return !!o && typeof o.projectId === 'string' && !!o.draft && Array.isArray(o.draft.loads) && Array.isArray(o.draft.points)
    && typeof o.draft.options === 'object' && typeof o.draft.grid === 'object'
}

let idCounter = 0
function nextId(prefix: string): string {
  idCounter += 1
  return `${prefix}${Date.now().toString(36)}${idCounter}`
}

let gestureCounter = 0

export interface DraftEditOptions { gesture?: string }

export const useSettlementDraftStore = defineStore('settlementDraft', () => {
  const projectId = ref<string | null>(null)
  const fromRunId = ref<string | null>(null)
  const draft = shallowRef<SettlementDraft>(emptyDraft())
  /** The load or point picked on the plan or in the table. */
  const selected = ref<{ kind: 'load' | 'point', id: string } | null>(null)
  const history = useUndoHistory<string>(DRAFT_HISTORY_LIMIT)
  const { past, future, canUndo, canRedo, undoLabel, redoLabel } = history
  /** True when the draft came back from this tab's session copy. */
  const restored = ref(false)

  const loads = computed(() => draft.value.loads)
  const points = computed(() => draft.value.points)
  const selectedLoad = computed(() => {
    const s = selected.value
    return s?.kind === 'load' ? draft.value.loads.find(l => l.id === s.id) ?? null : null
  })
  const selectedPoint = computed(() => {
    const s = selected.value
    return s?.kind === 'point' ? draft.value.points.find(p => p.id === s.id) ?? null : null
  })

  function persist() {
    const ss = storage()
    if (!ss || !projectId.value) return
    const entry: StoredDraft = { projectId: projectId.value, fromRunId: fromRunId.value, savedAt: new Date().toISOString(), draft: toRaw(draft.value) }
    try {
      ss.setItem(sessionKey(projectId.value), JSON.stringify(entry))
    }
    catch {
      // Quota exceeded: the draft still works, it only will not survive a reload.
    }
  }

  function readStored(id: string): StoredDraft | null {
    const ss = storage()
    if (!ss) return null
    try {
      const v: unknown = JSON.parse(ss.getItem(sessionKey(id)) ?? 'null')
      if (isStored(v) && v.projectId === id) return v
    }
    catch {
      // A broken copy is dropped below.
    }
    ss.removeItem(sessionKey(id))
    return null
  }

  /**
   * Opens the project's draft: this tab's session copy when there is one (and it was not copied
   * from another run than `fromRun`), else an empty draft. True when a session copy was taken.
   */
  function open(id: string, options: { fromRun?: string | null } = {}): boolean {
    const wanted = options.fromRun ?? null
    if (projectId.value === id && fromRunId.value === wanted && (draft.value.loads.length || draft.value.points.length || draft.value.name)) return true
    projectId.value = id
    history.clear()
    selected.value = null
    const stored = readStored(id)
    if (stored && (wanted === null || stored.fromRunId === wanted)) {
      fromRunId.value = stored.fromRunId
      draft.value = normalizeDraft(stored.draft)
      restored.value = true
      return true
    }
    fromRunId.value = wanted
    draft.value = emptyDraft()
    restored.value = false
    return false
  }

  /** Takes a run's inputs as the draft (undo returns to what was there). */
  function copyRun(runId: string, run: RunInputs, name?: string) {
    edit('Copy the run’s inputs', () => {
      const d = draftFromRun(run, () => nextId('c'))
      return { ...d, name: name ?? d.name }
    })
    fromRunId.value = runId
    persist()
  }

  /** Empties the draft (undo brings it back). */
  function reset() {
    edit('Start over', () => ({ ...emptyDraft(), model: draft.value.model }))
    selected.value = null
  }

  /** Leaves the draft of this project in the tab (after a run was sent, say). */
  function forget() {
    const ss = storage()
    if (ss && projectId.value) ss.removeItem(sessionKey(projectId.value))
    projectId.value = null
    fromRunId.value = null
    draft.value = emptyDraft()
    history.clear()
    selected.value = null
    restored.value = false
  }

  function startGesture(): string {
    gestureCounter += 1
    return `g${gestureCounter}`
  }

  /** Applies an edit; one that changes nothing leaves no history entry. */
  function edit(label: string, fn: (d: SettlementDraft) => SettlementDraft, opts: DraftEditOptions = {}): boolean {
    const before = JSON.stringify(draft.value)
    const next = fn(structuredClone(toRaw(draft.value)))
    const after = JSON.stringify(next)
    if (after === before) return false
    history.record(before, { label, gesture: opts.gesture })
    draft.value = next
    persist()
    return true
  }

  function step(move: (current: string) => string | undefined) {
    const json = move(JSON.stringify(draft.value))
    if (json === undefined) return
    draft.value = JSON.parse(json) as SettlementDraft
    if (selected.value) {
      const s = selected.value
      const still = s.kind === 'load' ? draft.value.loads.some(l => l.id === s.id) : draft.value.points.some(p => p.id === s.id)
      if (!still) selected.value = null
    }
    persist()
  }
  const undo = () => step(history.undo)
  const redo = () => step(history.redo)

  // Loads

  const canAddLoad = computed(() => draft.value.loads.length < RUN_LIMITS.loads)

  function loadLabel(type: DraftLoadType): string {
    const prefix = type === 'embankment' ? 'E' : type === 'rectangle' ? 'R' : type === 'circle' ? 'C' : 'U'
    return nextLabel(prefix, draft.value.loads.map(l => l.label))
  }

  function pushLoad(what: string, load: DraftLoad): string | null {
    if (!canAddLoad.value) return null
    edit(what, d => ({ ...d, loads: [...d.loads, load] }))
    selected.value = { kind: 'load', id: load.id }
    return load.id
  }

  /** A load of the default size centred at `at` (a click on the plan, or the table's "add"). */
  function addLoad(type: DraftLoadType, at: { x: number, y: number } = { x: 0, y: 0 }): string | null {
    return pushLoad(`Add ${type === 'uniform' ? 'a uniform fill' : `a${type === 'embankment' ? 'n' : ''} ${type}`}`, newLoad(nextId('l'), type, at, loadLabel(type)))
  }

  /** A load whose footprint is the dragged box. */
  function addLoadBox(type: Exclude<DraftLoadType, 'uniform'>, a: { x: number, y: number }, b: { x: number, y: number }): string | null {
    return pushLoad(`Draw a${type === 'embankment' ? 'n' : ''} ${type}`, loadFromBox(nextId('l'), type, a, b, loadLabel(type)))
  }

  /** Changes some fields of a load (SI); the fields of one gesture (a drag, a field) undo as one. */
  function updateLoad(id: string, patch: Partial<Omit<DraftLoad, 'id'>>, opts: DraftEditOptions & { label?: string } = {}): boolean {
    return edit(opts.label ?? 'Edit a load', d => ({ ...d, loads: d.loads.map(l => (l.id === id ? { ...l, ...patch } : l)) }), opts)
  }

  /** Moves a load's centre to (x, y), to the centimetre. */
  function moveLoad(id: string, x: number, y: number, opts: DraftEditOptions = {}): boolean {
    return updateLoad(id, { x: round(x), y: round(y) }, { ...opts, label: 'Move a load' })
  }

  function removeLoad(id: string): boolean {
    if (selected.value?.id === id) selected.value = null
    return edit('Remove a load', d => ({ ...d, loads: d.loads.filter(l => l.id !== id) }))
  }

  // Points

  const canAddPoint = computed(() => draft.value.points.length < RUN_LIMITS.points)

  /** A named point at `at` (a click on the plan, or the list's "add"). */
  function addPoint(at: { x: number, y: number }, label?: string): string | null {
    if (!canAddPoint.value) return null
    const p: DraftPoint = { id: nextId('p'), label: label ?? nextLabel('P', draft.value.points.map(q => q.label)), x: round(at.x), y: round(at.y) }
    edit('Add a point', d => ({ ...d, points: [...d.points, p] }))
    selected.value = { kind: 'point', id: p.id }
    return p.id
  }

  /** An investigation point as a named point (once: picking it again selects it). */
  function addInvestigationPoint(inv: { id: string, identifier: string, easting: number, northing: number }): string | null {
    const have = draft.value.points.find(p => p.pointId === inv.id)
    if (have) {
      selected.value = { kind: 'point', id: have.id }
      return have.id
    }
    if (!canAddPoint.value) return null
    const p: DraftPoint = { id: nextId('p'), label: inv.identifier.slice(0, RUN_LIMITS.label), x: inv.easting, y: inv.northing, pointId: inv.id }
    edit(`Add ${inv.identifier}`, d => ({ ...d, points: [...d.points, p] }))
    selected.value = { kind: 'point', id: p.id }
    return p.id
  }

  /** Changes a point; moving it by hand unlinks it from its investigation point. */
  function updatePoint(id: string, patch: Partial<Pick<DraftPoint, 'label' | 'x' | 'y'>>, opts: DraftEditOptions = {}): boolean {
    return edit('Edit a point', d => ({
      ...d,
      points: d.points.map((p) => {
        if (p.id !== id) return p
        const next = { ...p, ...patch }
        const moved = (patch.x !== undefined && patch.x !== p.x) || (patch.y !== undefined && patch.y !== p.y)
        if (moved) delete next.pointId
        return next
      }),
    }), opts)
  }

  function removePoint(id: string): boolean {
    if (selected.value?.id === id) selected.value = null
    return edit('Remove a point', d => ({ ...d, points: d.points.filter(p => p.id !== id) }))
  }

  // Set-up

  function setName(name: string, opts: DraftEditOptions = {}) {
    edit('Rename the run', d => ({ ...d, name }), opts)
  }

  function setModel(model: { modelId: string, version: number } | null) {
    edit('Choose the model version', d => ({ ...d, model }))
  }

  /** Puts the model in force on a draft that has no model yet (no history entry: it is the default). */
  function defaultModel(model: { modelId: string, version: number }) {
    if (draft.value.model) return
    draft.value = { ...draft.value, model }
    persist()
  }

  function setGrid(patch: Partial<{ gridOn: boolean, spacing: number, margin: number }>) {
    edit(patch.gridOn === undefined ? 'Edit the grid' : patch.gridOn ? 'Ask for a grid' : 'Leave out the grid', d => ({
      ...d,
      gridOn: patch.gridOn ?? d.gridOn,
      grid: { spacing: patch.spacing ?? d.grid.spacing, margin: patch.margin ?? d.grid.margin },
    }))
  }

  function setOptions(patch: Partial<DraftOptions>) {
    edit('Edit the options', d => ({ ...d, options: { ...d.options, ...patch } }))
  }

  /** Changes the drains (SI); switching them on or off is its own step, keeping the values typed. */
  function setDrains(patch: Partial<DraftDrains>, opts: DraftEditOptions & { label?: string } = {}): boolean {
    const label = opts.label ?? (patch.on === undefined ? 'Edit the drains' : patch.on ? 'Add vertical drains' : 'Leave out the drains')
    return edit(label, d => ({ ...d, drains: { ...d.drains, ...patch, strata: [...(patch.strata ?? d.drains.strata)] } }), opts)
  }

  /** Changes the probabilistic inputs (SI); switching them on or off is its own step, keeping the values typed. */
  function setProbabilistic(patch: Partial<Omit<DraftProbabilistic, 'layers'>>, opts: DraftEditOptions & { label?: string } = {}): boolean {
    const label = opts.label ?? (patch.on === undefined ? 'Edit the probability inputs' : patch.on ? 'Ask for the probability of settlement' : 'Leave out the probability')
    return edit(label, d => ({ ...d, probabilistic: { ...d.probabilistic, ...patch } }), opts)
  }

  /** Types (or with null clears) one stratum's COV of a parameter and its correlation length. */
  function setVariation(code: string, variable: RunScatterVariable, v: RunVariation | null, opts: DraftEditOptions = {}): boolean {
    return edit(v ? 'Type a scatter' : 'Use the scatter from the data', d => ({
      ...d,
      probabilistic: { ...d.probabilistic, layers: withVariation(d.probabilistic.layers, code, variable, v) },
    }), opts)
  }

  function select(kind: 'load' | 'point', id: string | null) {
    selected.value = id ? { kind, id } : null
  }

  return {
    projectId, fromRunId, draft, selected, past, future, restored,
    loads, points, selectedLoad, selectedPoint, canUndo, canRedo, undoLabel, redoLabel, canAddLoad, canAddPoint,
    open, copyRun, reset, forget, edit, undo, redo, startGesture,
    addLoad, addLoadBox, updateLoad, moveLoad, removeLoad,
    addPoint, addInvestigationPoint, updatePoint, removePoint,
    setName, setModel, defaultModel, setGrid, setOptions, setDrains, setProbabilistic, setVariation, select,
  }
})
