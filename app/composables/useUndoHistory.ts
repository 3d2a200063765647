import { computed, shallowRef, type ComputedRef, type ShallowRef } from 'vue'

/**
 * Undo and redo over snapshots of some state, for any editor that can copy its
 * state and put a copy back. An entry holds the state before an edit (undo) or
 * after it (redo); edits of one continuing gesture (a drag, typing in a field)
 * can share a token and so one entry. The oldest entries go past `limit`.
 */
export interface HistoryEntry<T> {
  snapshot: T
  /** What the edit did, for an "Undo …" title. */
  label?: string
  /** Edits carrying the same token, one after another, share one entry. */
  gesture?: string
}

export interface UndoHistory<T> {
  past: ShallowRef<HistoryEntry<T>[]>
  future: ShallowRef<HistoryEntry<T>[]>
  canUndo: ComputedRef<boolean>
  canRedo: ComputedRef<boolean>
  undoLabel: ComputedRef<string | null>
  redoLabel: ComputedRef<string | null>
  /** Records `before` as the state an edit started from, and drops the redo branch. */
  record: (before: T, meta?: { label?: string, gesture?: string }) => void
  /** Steps back: keeps `current` for redo and returns the state to restore (undefined with nothing to undo). */
  undo: (current: T) => T | undefined
  /** Steps forward: keeps `current` for undo and returns the state to restore (undefined with nothing to redo). */
  redo: (current: T) => T | undefined
  clear: () => void
}

export function useUndoHistory<T>(limit: number): UndoHistory<T> {
  const past = shallowRef<HistoryEntry<T>[]>([])
  const future = shallowRef<HistoryEntry<T>[]>([])

  function record(before: T, meta: { label?: string, gesture?: string } = {}) {
    const last = past.value[past.value.length - 1]
    const merge = !!meta.gesture && last?.gesture === meta.gesture && future.value.length === 0
    if (!merge) {
      const list = [...past.value, { snapshot: before, ...meta }]
      past.value = list.length > limit ? list.slice(list.length - limit) : list
    }
    future.value = []
  }

  /** Moves the newest entry of `from` back as the state to restore, keeping `current` on `to`. */
  function step(from: ShallowRef<HistoryEntry<T>[]>, to: ShallowRef<HistoryEntry<T>[]>, current: T): T | undefined {
    const entry = from.value[from.value.length - 1]
    if (!entry) return undefined
    to.value = [...to.value, { label: entry.label, snapshot: current }]
    from.value = from.value.slice(0, -1)
    return entry.snapshot
  }

  function clear() {
    past.value = []
    future.value = []
  }

  return {
    past,
    future,
    canUndo: computed(() => past.value.length > 0),
    canRedo: computed(() => future.value.length > 0),
    undoLabel: computed(() => past.value[past.value.length - 1]?.label ?? null),
    redoLabel: computed(() => future.value[future.value.length - 1]?.label ?? null),
    record,
    undo: current => step(past, future, current),
    redo: current => step(future, past, current),
    clear,
  }
}
