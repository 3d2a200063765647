import { computed, nextTick, reactive, ref, type Ref } from 'vue'
import type { ZodType } from 'zod'
import type { ConflictField } from '../components/point/PointConflictNotice.vue'
import { apiConflictCurrent, apiErrorMessage } from '../utils/apiErrors'
import { fieldIssues, type TypedUnits } from '../utils/formNumbers'
import { useWriteAction } from './useWriteAction'

/** The rows of a point's tab that are edited one at a time through the form below the table. */
export type PointRowKind = 'spt' | 'vane' | 'groundwater'

export interface SavedPointRow { id: string, version: number }

export type RowForm = Record<string, string>

/** One input of the row form: how it shows a saved row as text, and how it is laid out. */
export interface RowField<R> {
  key: string
  /** The input's element id (`spt-depth`). */
  id: string
  label: string
  /** The row's value as the input holds it. */
  text: (row: R) => string
  /** The blank form's value ('' when not given). */
  initial?: string
  /** The form error that marks this input invalid (its own key when not given; null: never marked). */
  error?: string | null
  /** Wrapper width class. */
  width: string
  type?: 'text' | 'datetime-local' | 'select'
  inputmode?: 'decimal' | 'numeric'
  placeholder?: string
  options?: readonly { value: string, label: string }[]
}

export interface RowEditorOptions<R> {
  /** The point's API address (`pointUrl(projectId, pointId)`). */
  point: () => string
  /** The typed form as the schema's input. */
  input: (form: RowForm) => unknown
  /** Field labels for the schema's messages ("Depth must be …"). */
  issueLabels: Record<string, string>
  /** The fields typed in the project's units (`units.typed({ depth: 'length' })`): their range messages quote bounds in those units. */
  issueUnits?: TypedUnits
  messages: {
    saved: (data: Record<string, unknown>, updated: boolean) => string
    confirmDelete: (row: R) => string
    deleted: (row: R) => string
  }
  onChanged: () => void
}

/** The state a shown conflict carries: the server's message and its row as saved now. */
export interface RowConflict<R> { message: string, current: R }

/**
 * The add / edit / delete cycle of one kind of point row: the form as text, checked
 * with the route's zod schema; a stale save (409) merges the newer row into the
 * fields the user did not touch and shows the clashes, to keep mine or use theirs.
 * Writes go through `useWriteAction`.
 */
export function usePointRowEditor<R extends SavedPointRow>(kind: PointRowKind, schema: ZodType, fields: readonly RowField<R>[], options: RowEditorOptions<R>) {
  const blank = (): RowForm => Object.fromEntries(fields.map(f => [f.key, f.initial ?? '']))
  const textOf = (r: R): RowForm => Object.fromEntries(fields.map(f => [f.key, f.text(r)]))
  const form = reactive<RowForm>(blank())
  const editing = ref(null) as Ref<R | null>
  const errors = ref<Record<string, string>>({})
  const conflict = ref(null) as Ref<RowConflict<R> | null>
  const { busy, error, notice, clear, run } = useWriteAction()
  const base = computed(() => `${options.point()}/${kind}`)

  function edit(r: R) {
    editing.value = r
    conflict.value = null
    Object.assign(form, textOf(r))
    errors.value = {}
    const first = fields[0]?.id
    if (first) void nextTick(() => document.getElementById(first)?.focus())
  }

  function reset() {
    editing.value = null
    conflict.value = null
    Object.assign(form, blank())
    errors.value = {}
  }

  /** Fields the user did not touch take the newer values; only real clashes remain. */
  function merge(opened: R, current: R) {
    const was = textOf(opened)
    const now = textOf(current)
    for (const f of fields) if (form[f.key] === was[f.key]) form[f.key] = now[f.key]!
  }

  async function submit() {
    clear()
    const parsed = schema.safeParse(options.input(form))
    errors.value = parsed.success ? {} : fieldIssues(parsed.error, options.issueLabels, options.issueUnits)
    if (!parsed.success) return
    const data = parsed.data as Record<string, unknown>
    const target = editing.value
    const saved = await run(
      () => (target
        ? api(`${base.value}/${target.id}`, { method: 'PATCH', body: { ...data, version: target.version } })
        : api(base.value, { method: 'POST', body: data })),
      {
        done: options.messages.saved(data, !!target),
        onError: (err) => {
          const current = apiConflictCurrent<R>(err)
          if (!current || !target) return false
          merge(target, current)
          conflict.value = { message: apiErrorMessage(err), current }
          return true
        },
      },
    )
    if (!saved) return
    reset()
    options.onChanged()
  }

  const conflictFields = computed((): ConflictField[] => {
    const c = conflict.value?.current
    if (!c) return []
    return fields.map((f) => {
      const shown = (v: string) => f.options?.find(o => o.value === v)?.label ?? v
      return { label: f.label, mine: shown(form[f.key]!.trim()), theirs: shown(f.text(c)) }
    })
  })

  function useTheirs() {
    const c = conflict.value?.current
    if (!c) return
    edit(c)
    options.onChanged()
  }

  async function keepMine() {
    const c = conflict.value?.current
    if (!c) return
    editing.value = c
    conflict.value = null
    await submit()
  }

  async function remove(r: R) {
    if (!window.confirm(options.messages.confirmDelete(r))) return
    if (!await run(() => api(`${base.value}/${r.id}`, { method: 'DELETE' }), { done: options.messages.deleted(r) })) return
    if (editing.value?.id === r.id) reset()
    options.onChanged()
  }

  return { form, editing, errors, conflict, conflictFields, busy, error, notice, edit, reset, submit, remove, useTheirs, keepMine }
}

/** A column of the rows' table: its heading and the row's value as shown. */
export interface RowColumn<R> {
  key: string
  label: string
  /** Numbers: heading and cells set right. */
  numeric?: boolean
  /** The cells' classes (numeric columns get `text-right tabular-nums` when not given). */
  cellClass?: string
  /** Words people wrote themselves (remarks): marked so, their units are theirs. */
  userText?: boolean
  value: (row: R) => string | number
}

/** Everything that makes one kind of point row: its inputs, its table, and its words. */
export interface PointRowDefinition<R> extends Omit<RowEditorOptions<R>, 'point' | 'onChanged'> {
  kind: PointRowKind
  schema: ZodType
  fields: readonly RowField<R>[]
  columns: readonly RowColumn<R>[]
  testId: string
  /** The table's width class. */
  width: string
  empty: string
  addLabel: string
  formLabel: { add: string, edit: string }
  /** The row as its Edit and Delete buttons name it ("SPT at 4.5 m"). */
  what: (row: R) => string
}
