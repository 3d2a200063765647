import { computed, ref, watch } from 'vue'
import type { IntervalRow, LogReply, StratumRow } from '#shared/types/investigation'
import { useUndoHistory } from './useUndoHistory'
import { useWriteAction } from './useWriteAction'
import { useUnloadWarning } from './useUnloadWarning'
import { apiConflictCurrent, apiErrorIssues, apiErrorMessage, apiErrorStatus } from '../utils/apiErrors'
import {
  applyPaste, draftFromInterval, emptyRow, isBlankRow, isMultiCellPaste, LOG_COLUMNS, parseDepth, parseTsv, rowContent, toPayload, validateDraft,
  type DepthUnit, type DraftRow, type LogColumn, type RowErrors,
} from '../utils/logDraft'

/** What the log's draft is made from (the table's props). */
export interface LogDraftSource {
  projectId: string
  pointId: string
  identifier: string
  finalDepth: number
  intervals: IntervalRow[]
  strata: StratumRow[]
  canEdit: boolean
  /** The unit depths are typed and shown in (the project's; metres when not given). */
  lengthUnit?: DepthUnit
}

export interface LogDraftHooks {
  /** The drawing of the draft as it is typed. */
  draft: (value: { intervals: { top: number, bottom: number, uscs: string | null, stratumId: string | null, flagged: boolean }[], gaps: { top: number, bottom: number }[] }) => void
  saved: (intervals: IntervalRow[]) => void
  /** The server knows something newer (a 409 or 422): the page should re-read the point. */
  stale: () => void
  /** Moves the focus to a cell of the table (after the next render). */
  focusCell: (row: number, col: LogColumn) => void
}

/** Snapshots of the rows kept for undo. */
const UNDO_LIMIT = 100
const LEAVE_WARNING = 'The log has unsaved edits. Leave and lose them?'

/**
 * A hole's log being edited as a grid: the rows as text, checked live with the shared
 * schema and interval rules; undo and redo; keys and spreadsheet pastes; the save of the
 * whole log (through `useWriteAction`) and the choice when someone saved a newer one.
 * The table only draws it.
 */
export function useLogDraft(source: LogDraftSource, hooks: LogDraftHooks) {
  const savedById = computed(() => new Map(source.intervals.map(iv => [iv.id, iv])))
  const unit = (): DepthUnit => source.lengthUnit ?? 'm'
  /** Rows from the saved log; an empty log starts with one blank row to type or paste into. */
  function rowsFrom(list: IntervalRow[]): DraftRow[] {
    return list.length || !source.canEdit ? list.map(iv => draftFromInterval(iv, unit())) : [emptyRow()]
  }
  const rows = ref<DraftRow[]>(rowsFrom(source.intervals))
  const baseline = ref<IntervalRow[]>(source.intervals)

  const strataIds = computed(() => new Set(source.strata.map(s => s.id)))
  const strataById = computed(() => new Map(source.strata.map(s => [s.id, s])))
  const check = computed(() => validateDraft(rows.value, source.finalDepth, unit()))
  const serverErrors = ref<Record<string, RowErrors>>({})
  const notes = ref<string[]>([])
  const conflict = ref<{ message: string, current: IntervalRow[] } | null>(null)
  const { busy: saving, error, notice, run } = useWriteAction()

  /** Live problems, then the server's answer to the last save, per row. */
  const errors = computed((): RowErrors[] => rows.value.map((r, i) => {
    const e: RowErrors = { ...check.value.errors[i] }
    if (r.stratumId && !strataIds.value.has(r.stratumId) && !e.stratumId) e.stratumId = 'Stratum is no longer in this project; choose another.'
    return { ...serverErrors.value[r.key], ...e }
  }))
  const problemCount = computed(() => errors.value.reduce((n, e) => n + Object.keys(e).length, 0))

  const dirty = computed(() => {
    const { intervals } = toPayload(rows.value, unit())
    if (intervals.length !== baseline.value.length) return true
    const byId = new Map(baseline.value.map(b => [b.id, b]))
    return intervals.some(iv => !iv.id || !byId.has(iv.id) || rowContent(iv) !== rowContent(byId.get(iv.id)!))
  })

  // The drawing follows the draft as it is typed.
  const graphic = computed(() => {
    const { intervals, rowIndex } = toPayload(rows.value, unit())
    return {
      intervals: intervals.map((iv, i) => ({
        top: iv.top,
        bottom: iv.bottom,
        uscs: iv.uscs,
        stratumId: iv.stratumId && strataIds.value.has(iv.stratumId) ? iv.stratumId : null,
        flagged: Object.keys(errors.value[rowIndex[i]!] ?? {}).length > 0,
      })),
      gaps: check.value.gaps,
    }
  })
  watch(graphic, g => hooks.draft(g), { immediate: true })

  function sameAsRows(list: IntervalRow[]): boolean {
    const { intervals } = toPayload(rows.value, unit())
    return list.length === intervals.length && list.every((iv, i) => intervals[i]?.id === iv.id && intervals[i]?.version === iv.version && rowContent(intervals[i]!) === rowContent(iv))
  }

  // A refreshed point replaces the table only when there is nothing unsaved in it.
  watch(() => source.intervals, (list) => {
    if (dirty.value) return
    baseline.value = list
    if (!sameAsRows(list)) rows.value = rowsFrom(list)
    serverErrors.value = {}
  })

  // ---- undo / redo: snapshots of the rows before each edit ----
  const history = useUndoHistory<DraftRow[]>(UNDO_LIMIT)
  const clone = (list: readonly DraftRow[]) => list.map(r => ({ ...r }))
  // Typing in one cell, from focus to focus, is one edit.
  let focusSnapshot: DraftRow[] = clone(rows.value)
  let focusPushed = false

  function pushUndo(snapshot: DraftRow[] = clone(rows.value)) {
    history.record(snapshot)
  }
  function restartEditSession() {
    focusSnapshot = clone(rows.value)
    focusPushed = false
  }
  function undo() {
    const prev = history.undo(clone(rows.value))
    if (!prev) return
    rows.value = prev
    restartEditSession()
  }
  function redo() {
    const next = history.redo(clone(rows.value))
    if (!next) return
    rows.value = next
    restartEditSession()
  }
  function onCellFocus() {
    restartEditSession()
  }
  function onCellEdit(e?: Event) {
    // A list (select) reports a choice as `input`, then `change`, and v-model listens to `change` only:
    // take the choice from `input`, or the redraw the edit causes in between puts the old choice back.
    const at = e?.type === 'input' ? cellOf(e.target) : null
    const row = at ? rows.value[at.row] : undefined
    if (at && row && e?.target instanceof HTMLSelectElement && row[at.col] !== e.target.value) row[at.col] = e.target.value
    if (!focusPushed) {
      pushUndo(focusSnapshot)
      focusPushed = true
    }
    serverErrors.value = {}
    notice.value = ''
  }

  // ---- rows ----
  function addRow(at = rows.value.length, focus = true) {
    pushUndo()
    const prev = rows.value[at - 1]
    const row = emptyRow()
    // A new row below another starts where that one ends.
    if (prev && !Number.isNaN(parseDepth(prev.bottom))) {
      row.top = prev.bottom.trim()
      // Shown in feet, it starts at that row's exact metres, not at the rounded feet read back.
      if (prev.saved && row.top === prev.saved.bottomText) row.saved = { top: prev.saved.bottom, topText: row.top, bottom: Number.NaN, bottomText: '' }
    }
    rows.value.splice(at, 0, row)
    restartEditSession()
    if (focus) hooks.focusCell(at, row.top ? 'bottom' : 'top')
  }

  function deleteRow(i: number) {
    pushUndo()
    rows.value.splice(i, 1)
    restartEditSession()
    notice.value = `Row ${i + 1} removed (not saved yet).`
  }

  function sortByDepth() {
    pushUndo()
    const blank = rows.value.filter(isBlankRow)
    const filled = rows.value.filter(r => !isBlankRow(r))
    filled.sort((a, b) => (parseDepth(a.top) || 0) - (parseDepth(b.top) || 0))
    rows.value = [...filled, ...blank]
    restartEditSession()
  }

  // ---- keys ----
  function cellOf(target: EventTarget | null): { row: number, col: LogColumn } | null {
    const el = target as HTMLElement | null
    const row = Number(el?.dataset?.row)
    const col = el?.dataset?.col as LogColumn | undefined
    if (!Number.isInteger(row) || !col || !(LOG_COLUMNS as readonly string[]).includes(col)) return null
    return { row, col }
  }

  function onKeydown(e: KeyboardEvent) {
    const at = cellOf(e.target)
    const mod = e.ctrlKey || e.metaKey
    const key = e.key.toLowerCase()
    if (mod && key === 'z' && !e.shiftKey) { e.preventDefault(); undo(); return }
    if (mod && (key === 'y' || (key === 'z' && e.shiftKey))) { e.preventDefault(); redo(); return }
    if (mod && key === 's') { e.preventDefault(); void save(); return }
    if (!at || e.altKey || mod) return
    if (e.key === 'Enter') {
      e.preventDefault()
      if (at.row + 1 >= rows.value.length) {
        if (isBlankRow(rows.value[at.row]!)) return
        addRow(rows.value.length, false)
        hooks.focusCell(at.row + 1, at.col === 'top' && rows.value[at.row + 1]?.top ? 'bottom' : at.col)
      }
      else {
        hooks.focusCell(at.row + 1, at.col)
      }
    }
    else if (e.key === 'ArrowDown' && at.row + 1 < rows.value.length) {
      e.preventDefault()
      hooks.focusCell(at.row + 1, at.col)
    }
    else if (e.key === 'ArrowUp' && at.row > 0) {
      e.preventDefault()
      hooks.focusCell(at.row - 1, at.col)
    }
  }

  // ---- paste from a spreadsheet ----
  function onPaste(e: ClipboardEvent) {
    const at = cellOf(e.target)
    const text = e.clipboardData?.getData('text/plain') ?? ''
    if (!at || !text) return
    const isSelect = e.target instanceof HTMLSelectElement
    if (!isMultiCellPaste(text) && !isSelect) return
    e.preventDefault()
    const grid = parseTsv(text)
    if (!grid.length) return
    pushUndo()
    const result = applyPaste(rows.value, at.row, at.col, grid, source.strata)
    rows.value = result.rows
    restartEditSession()
    notes.value = result.notes
    notice.value = `Pasted ${result.filled} row${result.filled === 1 ? '' : 's'} from row ${at.row + 1}. Check them, then save.`
    serverErrors.value = {}
  }

  // ---- save ----
  function focusFirstProblem() {
    const i = errors.value.findIndex(e => Object.keys(e).length > 0)
    if (i < 0) return
    const col = LOG_COLUMNS.find(c => errors.value[i]?.[c])
    if (col) hooks.focusCell(i, col)
  }

  /** The server's issues on `intervals.<sent row>.<column>`, put on the table rows they came from. */
  function mapServerIssues(err: unknown, rowIndex: number[]) {
    const mapped: Record<string, RowErrors> = {}
    for (const issue of apiErrorIssues(err)) {
      const m = /^intervals\.(\d+)\.(\w+)$/.exec(issue.path)
      const sent = m ? rowIndex[Number(m[1])] : undefined
      const col = m?.[2] as LogColumn | undefined
      const row = sent !== undefined ? rows.value[sent] : undefined
      if (row && col && (LOG_COLUMNS as readonly string[]).includes(col)) (mapped[row.key] ??= {})[col] ??= issue.message
    }
    serverErrors.value = mapped
    if (Object.keys(mapped).length) focusFirstProblem()
  }

  async function save() {
    if (!source.canEdit || saving.value) return
    error.value = ''
    notice.value = ''
    if (check.value.count > 0 || problemCount.value > 0) {
      error.value = `Fix the ${problemCount.value} problem${problemCount.value === 1 ? '' : 's'} marked in the table before saving.`
      focusFirstProblem()
      return
    }
    const { intervals, rowIndex } = toPayload(rows.value, unit())
    let saved: IntervalRow[] = []
    const ok = await run(
      async () => {
        const res = await api<LogReply>(`${pointUrl(source.projectId, source.pointId)}/intervals`, { method: 'PUT', body: { intervals } })
        saved = res.intervals
        conflict.value = null
        notes.value = []
        rows.value = rowsFrom(saved)
        baseline.value = saved
        serverErrors.value = {}
        restartEditSession()
        return res
      },
      {
        done: () => `Saved the log of ${source.identifier}: ${saved.length} interval${saved.length === 1 ? '' : 's'}.`,
        onError: (err) => {
          const status = apiErrorStatus(err)
          if (status === 409 || status === 422) hooks.stale()
          const current = apiConflictCurrent<IntervalRow[]>(err)
          if (Array.isArray(current)) {
            conflict.value = { message: apiErrorMessage(err), current }
            return true
          }
          mapServerIssues(err, rowIndex)
          return false
        },
      },
    )
    if (ok) hooks.saved(saved)
  }

  function useTheirs() {
    if (!conflict.value) return
    pushUndo()
    const current = conflict.value.current
    conflict.value = null
    baseline.value = current
    rows.value = rowsFrom(current)
    restartEditSession()
    notice.value = 'Showing the saved log. Your edits are one undo away.'
  }

  async function keepMine() {
    if (!conflict.value) return
    const byId = new Map(conflict.value.current.map(c => [c.id, c]))
    // Rebase onto the current versions; a row they deleted comes back as a new row.
    rows.value = rows.value.map((r) => {
      if (!r.id) return r
      const now = byId.get(r.id)
      return now ? { ...r, version: now.version } : { ...r, id: undefined, version: undefined }
    })
    baseline.value = conflict.value.current
    conflict.value = null
    await save()
  }

  const mineForCompare = computed(() => toPayload(rows.value, unit()).intervals)
  const mineContent = computed(() => new Set(mineForCompare.value.map(rowContent)))
  const theirsContent = computed(() => new Set((conflict.value?.current ?? []).map(rowContent)))

  // ---- leaving with unsaved edits ----
  const mayLeave = () => !source.canEdit || !dirty.value || window.confirm(LEAVE_WARNING)
  onBeforeRouteLeave(mayLeave)
  onBeforeRouteUpdate((to, from) => (to.name === from.name && to.params.pointId === from.params.pointId) || mayLeave())
  useUnloadWarning(() => source.canEdit && dirty.value, LEAVE_WARNING)

  return {
    rows, check, errors, problemCount, dirty, notes, notice, error, saving, conflict, savedById, strataIds, strataById,
    canUndo: history.canUndo, canRedo: history.canRedo, undo, redo,
    addRow, deleteRow, sortByDepth, onCellFocus, onCellEdit, onKeydown, onPaste,
    save, useTheirs, keepMine, mineForCompare, mineContent, theirsContent,
  }
}
