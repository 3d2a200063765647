import { describe, expect, it } from 'vitest'
import { useUndoHistory } from '../../../app/composables/useUndoHistory'

// The one undo history of the editors (the site model's session and the log table).

describe('undo history', () => {
  it('walks back and forward over the states edits started from, and a new edit drops the redo branch', () => {
    const h = useUndoHistory<string>(10)
    let state = 'a'
    const edit = (next: string, label: string) => {
      h.record(state, { label })
      state = next
    }
    edit('b', 'to b')
    edit('c', 'to c')
    expect(h.undoLabel.value).toBe('to c')
    state = h.undo(state)!
    expect(state).toBe('b')
    expect(h.redoLabel.value).toBe('to c')
    state = h.undo(state)!
    expect(state).toBe('a')
    expect(h.canUndo.value).toBe(false)
    expect(h.undo(state)).toBeUndefined()
    state = h.redo(state)!
    expect(state).toBe('b')
    edit('d', 'to d')
    expect(h.canRedo.value).toBe(false)
    expect(h.past.value.map(e => e.snapshot)).toEqual(['a', 'b'])
  })

  it('edits of one gesture share an entry, and the oldest entries go past the limit', () => {
    const h = useUndoHistory<number>(3)
    h.record(0, { gesture: 'g1' })
    h.record(1, { gesture: 'g1' })
    h.record(2, { gesture: 'g1' })
    expect(h.past.value.map(e => e.snapshot)).toEqual([0])
    for (const n of [10, 11, 12, 13]) h.record(n)
    expect(h.past.value.map(e => e.snapshot)).toEqual([11, 12, 13])
    h.clear()
    expect([h.canUndo.value, h.canRedo.value]).toEqual([false, false])
  })
})
