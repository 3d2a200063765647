import { defineStore } from 'pinia'
import { computed, ref, shallowRef, toRaw } from 'vue'
import type { SiteModelDefinition, StratumTrend } from '#shared/site-model/definition'
import { useUndoHistory } from '../composables/useUndoHistory'
import { stableJson } from '../utils/siteModelEdits'

/**
 * The editing session of one site model's draft: the working definition, undo
 * and redo for every edit, the dirty state against the draft revision last read
 * from or saved to the server, and a copy in localStorage that survives a reload.
 *
 * Besides the definition, a snapshot carries the points the engineer left out of
 * strata that have no fitted trend yet (`pendingExcluded`, by stratum code): they
 * join the trend's `excludedPointIds` at the first fit. Network calls live in
 * useModelSession; this store only holds state.
 */

export interface EditorSnapshot {
  draft: SiteModelDefinition
  pendingExcluded: Record<string, string[]>
}

export interface LocalDraft {
  modelId: string
  /** Draft revision the local copy was made on. */
  revision: number
  savedAt: string
  snapshot: EditorSnapshot
}

export interface EditOptions { gesture?: string }

/** The trend model the engineer chose for a stratum's next fit (`auto`: the best by AICc), and whether on ln σ'p. */
export interface FitChoiceState { model: StratumTrend['model'] | 'auto', logSpace: boolean }

/** Entries kept for undo; the oldest go first. */
export const HISTORY_LIMIT = 300
export const LOCAL_PREFIX = 'pastload.model-draft.v1'

/** The start every local copy of a model's edits has in its key, whatever the revision. */
function localKeyStart(modelId: string): string {
  return `${LOCAL_PREFIX}:${modelId}:`
}

export function localKey(modelId: string, revision: number): string {
  return `${localKeyStart(modelId)}${revision}`
}

/**
 * Whether this device keeps a copy of a model's edits (under any revision): a page that would otherwise start its
 * editing session only when it is used starts it at once, to offer the copy back. Reads the keys only.
 */
export function hasLocalDraft(modelId: string): boolean {
  const ls = storage()
  if (!ls) return false
  const prefix = localKeyStart(modelId)
  for (let i = 0; i < ls.length; i++) {
    if (ls.key(i)?.startsWith(prefix)) return true
  }
  return false
}

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null
  }
  catch {
    // Storage can be switched off by the browser's privacy settings.
    return null
  }
}

function copy<T>(v: T): T {
  return structuredClone(toRaw(v))
}

function isLocalDraft(v: unknown): v is LocalDraft {
  const o = v as Partial<LocalDraft> | null
  return !!o && typeof o.modelId === 'string' && typeof o.revision === 'number' && typeof o.savedAt === 'string'
    && !!o.snapshot && typeof o.snapshot === 'object' && !!o.snapshot.draft && Array.isArray(o.snapshot.draft.strata)
}

let gestureCounter = 0

export const useModelEditorStore = defineStore('modelEditor', () => {
  const modelId = ref<string | null>(null)
  /** The server's draft revision this session is based on (`version` of the model row). */
  const revision = ref(0)
  const draft = shallowRef<SiteModelDefinition | null>(null)
  const pendingExcluded = shallowRef<Record<string, string[]>>({})
  const savedJson = ref('')
  /** Snapshots are the session serialised: before the edit (undo) or after it (redo). */
  const history = useUndoHistory<string>(HISTORY_LIMIT)
  const { past, future, canUndo, canRedo, undoLabel, redoLabel } = history
  /** A local copy found at load that differs from the server's draft, offered back until answered. */
  const recovery = shallowRef<LocalDraft | null>(null)
  const lastLocalWrite = ref<string | null>(null)
  /**
   * The model chosen for each stratum's next fit, by stratum code: a choice belongs
   * to its stratum, so another stratum never fits with it. Not part of the draft
   * (no undo step): it is what the panel offers, not what the model says.
   */
  const fitChoices = ref<Record<string, FitChoiceState>>({})
  function fitChoice(code: string): FitChoiceState | undefined {
    return fitChoices.value[code]
  }
  function setFitChoice(code: string, state: FitChoiceState) {
    fitChoices.value = { ...fitChoices.value, [code]: { ...state } }
  }

  const currentJson = computed(() => (draft.value ? stableJson(draft.value) : ''))
  const dirty = computed(() => !!draft.value && currentJson.value !== savedJson.value)

  function snapshot(): EditorSnapshot {
    if (!draft.value) throw new Error('No model is open.')
    return { draft: draft.value, pendingExcluded: pendingExcluded.value }
  }
  function serialise(): string {
    return JSON.stringify(snapshot())
  }
  function restore(json: string) {
    const s = JSON.parse(json) as EditorSnapshot
    draft.value = s.draft
    pendingExcluded.value = s.pendingExcluded ?? {}
  }

  /** Starts a session on the server's draft at `rev`, and looks for a local copy to offer back. */
  function load(id: string, serverDraft: SiteModelDefinition, rev: number) {
    modelId.value = id
    revision.value = rev
    draft.value = copy(serverDraft)
    pendingExcluded.value = {}
    savedJson.value = stableJson(serverDraft)
    history.clear()
    fitChoices.value = {}
    lastLocalWrite.value = null
    recovery.value = findLocal(id, savedJson.value)
  }

  /** The newest local copy of this model that is not the server's draft; copies equal to it are dropped. */
  function findLocal(id: string, serverJson: string): LocalDraft | null {
    const ls = storage()
    if (!ls) return null
    let best: LocalDraft | null = null
    const prefix = localKeyStart(id)
    for (const key of Object.keys(ls)) {
      if (!key.startsWith(prefix)) continue
      let parsed: unknown = null
      try {
        parsed = JSON.parse(ls.getItem(key) ?? 'null')
      }
      catch {
        parsed = null
      }
      if (!isLocalDraft(parsed) || parsed.modelId !== id) {
        ls.removeItem(key)
        continue
      }
      const same = stableJson(parsed.snapshot.draft) === serverJson && !Object.values(parsed.snapshot.pendingExcluded ?? {}).some(v => v.length)
      if (same) {
        ls.removeItem(key)
        continue
      }
      if (!best || parsed.savedAt > best.savedAt) best = parsed
    }
    return best
  }

  /** Writes the session to localStorage while it differs from the server's draft; removes the copy otherwise. */
  function persistLocal() {
    const ls = storage()
    if (!ls || !modelId.value || !draft.value) return
    const key = localKey(modelId.value, revision.value)
    const hasPending = Object.values(pendingExcluded.value).some(v => v.length)
    if (!dirty.value && !hasPending) {
      ls.removeItem(key)
      return
    }
    const entry: LocalDraft = { modelId: modelId.value, revision: revision.value, savedAt: new Date().toISOString(), snapshot: snapshot() }
    try {
      ls.setItem(key, JSON.stringify(entry))
      lastLocalWrite.value = entry.savedAt
    }
    catch {
      // Quota exceeded: the session still works, it only will not survive a reload.
      lastLocalWrite.value = null
    }
  }

  /** A token for the edits of one gesture; all its edits undo as one. */
  function startGesture(): string {
    gestureCounter += 1
    return `g${gestureCounter}`
  }

  /**
   * Applies an edit: `fn` returns the next definition (and may return new pending
   * exclusions). An edit that changes nothing leaves no history entry.
   */
  function edit(label: string, fn: (d: SiteModelDefinition, pending: Record<string, string[]>) => SiteModelDefinition | EditorSnapshot, opts: EditOptions = {}) {
    if (!draft.value) throw new Error('No model is open.')
    const before = serialise()
    const result = fn(draft.value, pendingExcluded.value)
    const next: EditorSnapshot = 'draft' in result && 'pendingExcluded' in result
      ? result
      : { draft: result as SiteModelDefinition, pendingExcluded: pendingExcluded.value }
    const after = JSON.stringify(next)
    if (after === before) return false
    history.record(before, { label, gesture: opts.gesture })
    draft.value = next.draft
    pendingExcluded.value = next.pendingExcluded
    persistLocal()
    return true
  }

  /** One step back or forward: the history keeps the session as it is and gives the one to restore. */
  function step(move: (current: string) => string | undefined) {
    if (!draft.value) return
    const json = move(serialise())
    if (json === undefined) return
    restore(json)
    persistLocal()
  }
  const undo = () => step(history.undo)
  const redo = () => step(history.redo)

  /** Takes the offered local copy as an edit (so undo returns to the server's draft). */
  function acceptRecovery() {
    const r = recovery.value
    if (!r) return
    recovery.value = null
    removeLocalCopies(r.revision === revision.value ? [] : [r.revision])
    edit('Restore the unsaved local draft', () => copy(r.snapshot))
  }

  function discardRecovery() {
    const r = recovery.value
    if (!r) return
    recovery.value = null
    removeLocalCopies([r.revision])
  }

  function removeLocalCopies(revisions: number[]) {
    const ls = storage()
    if (!ls || !modelId.value) return
    for (const rev of revisions) ls.removeItem(localKey(modelId.value, rev))
  }

  /** The saved base becomes `base` at revision `rev`; the working copy stays and is kept locally under `rev`. */
  function setBase(base: SiteModelDefinition, rev: number) {
    const old = revision.value
    savedJson.value = stableJson(base)
    revision.value = rev
    removeLocalCopies([old])
    persistLocal()
  }

  /**
   * The server accepted `sent` as revision `rev`. Edits made while the request was
   * in flight stay dirty and are kept locally under the new revision.
   */
  function markSaved(sent: SiteModelDefinition, rev: number) {
    setBase(sent, rev)
  }

  /** The server's draft moved to `rev` without a change of content (a saved version bumps the revision). */
  function markRevision(rev: number) {
    const old = revision.value
    revision.value = rev
    if (old !== rev) removeLocalCopies([old])
    persistLocal()
  }

  /** Someone else saved first: their draft becomes the base; yours stays as the working copy (and is dirty). */
  function rebaseOnto(theirs: SiteModelDefinition, rev: number) {
    setBase(theirs, rev)
  }

  /** Takes their draft as the working copy (undo brings yours back). */
  function takeTheirs(theirs: SiteModelDefinition, rev: number) {
    rebaseOnto(theirs, rev)
    edit('Take the saved draft of someone else', () => ({ draft: copy(theirs), pendingExcluded: {} }))
  }

  function close() {
    modelId.value = null
    draft.value = null
    pendingExcluded.value = {}
    savedJson.value = ''
    history.clear()
    fitChoices.value = {}
    recovery.value = null
  }

  return {
    modelId, revision, draft, pendingExcluded, past, future, recovery, lastLocalWrite, fitChoices,
    dirty, canUndo, canRedo, undoLabel, redoLabel,
    fitChoice, setFitChoice, load, edit, undo, redo, startGesture, acceptRecovery, discardRecovery, markSaved, markRevision, rebaseOnto, takeTheirs, close, persistLocal,
  }
})
