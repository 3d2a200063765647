import { formatCount } from '~/utils/counts'
import { CreateSettlementRunSchema, MAX_GRID_POINTS } from '#shared/schemas/settlement-runs'
import { gridPointCount, requestOf } from '#shared/settlement-run/draft'
import { messageInUnits } from '#shared/units/bounds'
import type { SettlementRun } from '#shared/types/settlement-runs'
import type { ModelVersionReply } from '#shared/types/models'
import { useSettlementDraftStore } from '~/stores/settlementDraft'

/** Field messages by path (`name`, `loads.0.height`, `grid.spacing`, …), from the schema or the server. */
export type DraftIssues = Record<string, string>

/**
 * The run editor's network side around the draft store: opens the project's draft (or copies a
 * run's inputs for `?from=`), puts the model in force on a draft without a model, reads the chosen
 * version's review status, checks the draft with the request schema and posts it, and binds
 * Ctrl+Z / Ctrl+Shift+Z (Ctrl+Y) to undo and redo.
 */
export function useSettlementDraft(projectId: MaybeRefOrGetter<string>) {
  const store = useSettlementDraftStore()
  const write = useWriteAction()
  const issues = ref<DraftIssues>({})
  const { data: inForce } = useModelInForce()
  const units = useProjectUnits()
  const base = () => `/api/projects/${toValue(projectId)}/settlement-runs`

  /** The chosen version with its review (who approved it and when). */
  const versionKey = computed(() => (store.draft.model ? `model-version:${store.draft.model.modelId}:${store.draft.model.version}` : 'model-version:none'))
  const version = useAsyncData<ModelVersionReply | null>(
    () => versionKey.value,
    async (_app, { signal }) => {
      const m = store.draft.model
      if (!m) return null
      return apiRead<ModelVersionReply>(`${modelUrl(toValue(projectId), m.modelId)}/versions/${m.version}`, signal)
    },
    { server: false, default: () => null },
  )

  const loadingRun = ref(false)
  const runError = ref('')

  /** Opens the draft for the page; with `fromRun`, the run's inputs unless this tab already holds them. */
  async function open(fromRun: string | null) {
    const restored = store.open(toValue(projectId), { fromRun })
    if (fromRun && !restored) {
      loadingRun.value = true
      runError.value = ''
      try {
        const { run } = await api<{ run: SettlementRun }>(`${base()}/${fromRun}`)
        store.copyRun(fromRun, run, `${run.name} (changed)`.slice(0, 120))
      }
      catch (err) {
        runError.value = `The run to copy could not be read: ${apiErrorMessage(err)}`
      }
      finally {
        loadingRun.value = false
      }
    }
    applyModelInForce()
  }

  function applyModelInForce() {
    const f = inForce.value
    if (f && f.modelId !== null) store.defaultModel({ modelId: f.modelId, version: f.version })
  }
  watch(inForce, applyModelInForce)

  const gridCount = computed(() => (store.draft.gridOn ? gridPointCount(store.draft.loads, store.draft.grid) : 0))
  const gridTooBig = computed(() => gridCount.value > MAX_GRID_POINTS)

  /** The draft checked against the schema the server validates with (and the grid's size). */
  function check() {
    const parsed = CreateSettlementRunSchema.safeParse(requestOf(store.draft))
    const out: DraftIssues = {}
    if (!parsed.success) {
      for (const i of parsed.error.issues) {
        const path = i.path.map(String).join('.')
        // Bounds in the units typed (ft, psf, pcf); the drain's diameter and discharge are typed in their own (mm or in, m³/yr or ft³/yr).
        const ownUnit = /(diameter|dischargeCapacity)$/.test(path)
        const msg = /expected number, received NaN|received NaN/i.test(i.message) ? 'must be a number' : ownUnit ? i.message : messageInUnits(i, units.system.value, { usStress: units.stressUnit.value })
        out[path || 'form'] ??= path === 'model' || path.startsWith('model.') ? 'choose a saved model version' : msg
      }
    }
    if (gridTooBig.value) out['grid.spacing'] ??= `gives ${formatCount(gridCount.value)} grid points; at most ${formatCount(MAX_GRID_POINTS)}: widen the spacing or narrow the margin`
    issues.value = out
    return parsed.success && !gridTooBig.value ? parsed.data : null
  }

  /** Sends the run; on success, the run's page. */
  async function submit(): Promise<string | null> {
    write.clear()
    const body = check()
    if (!body) {
      write.error.value = 'The run is not ready yet: see the marked fields.'
      return null
    }
    let runId: string | null = null
    await write.run(async () => {
      const { run } = await api<{ run: { id: string, status: string } }>(base(), { method: 'POST', body })
      runId = run.id
    }, {
      onError: (err) => {
        const out: DraftIssues = {}
        for (const i of apiErrorIssues(err)) out[i.path || 'form'] ??= i.message
        const path = (err as { data?: { data?: { path?: unknown } } })?.data?.data?.path
        if (Array.isArray(path)) out[path.map(String).join('.')] ??= apiErrorMessage(err)
        issues.value = out
      },
    })
    if (runId) {
      store.forget()
      await navigateTo(`/projects/${toValue(projectId)}/settlement/${runId}`)
    }
    return runId
  }

  function onKey(e: KeyboardEvent) {
    if (!(e.ctrlKey || e.metaKey)) return
    const t = e.target as HTMLElement | null
    // Typing fields keep their own undo.
    if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.isContentEditable)) return
    const k = e.key.toLowerCase()
    if (k === 'z' && !e.shiftKey) { e.preventDefault(); store.undo() }
    else if ((k === 'z' && e.shiftKey) || k === 'y') { e.preventDefault(); store.redo() }
  }
  onMounted(() => window.addEventListener('keydown', onKey))
  onBeforeUnmount(() => window.removeEventListener('keydown', onKey))

  return {
    store, inForce, version, issues, gridCount, gridTooBig, loadingRun, runError,
    busy: write.busy, error: write.error, open, check, submit,
  }
}
