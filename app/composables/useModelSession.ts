import type { SiteModelDefinition } from '#shared/site-model/definition'
import { useModelEditorStore } from '~/stores/modelEditor'
import type { WorkspaceEditor } from '~/composables/useTrendFits'
import { diffDefinitions } from '#shared/site-model/diff'
import type { DefinitionChange, SiteModelRow } from '#shared/types/models'
import { issueMessage } from '~/utils/formNumbers'
import { MODEL_QUANTITIES } from '~/utils/siteModelEdits'

export interface DraftConflict {
  theirs: SiteModelRow
  changes: DefinitionChange[]
  /** Which request met the conflict. */
  during: 'draft' | 'version'
}

/**
 * The editing session of a model page: loads the server's draft into the editor
 * store, saves the draft (PUT with the revision read; a 409 shows theirs against
 * yours), saves a version (the draft first when it has unsaved edits), and binds
 * Ctrl+Z / Ctrl+Shift+Z (Ctrl+Y) to undo and redo.
 */
export function useModelSession(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>, options: { active?: () => boolean } = {}) {
  const store = useModelEditorStore()
  const write = useWriteAction()
  const { error, notice } = write
  /** Which save is under way, for the bar's words. */
  const doing = ref<'draft' | 'version'>('draft')
  const saving = computed(() => (write.busy.value ? doing.value : null))
  const issues = ref<{ path: string, message: string }[]>([])
  const conflict = shallowRef<DraftConflict | null>(null)
  const base = () => modelUrl(toValue(projectId), toValue(modelId))
  const typed = useProjectUnits().typed(MODEL_QUANTITIES)

  function start(model: SiteModelRow) {
    if (store.modelId === model.id && store.draft) return
    store.load(model.id, model.draft, model.version)
  }

  const editor = computed((): WorkspaceEditor | null => (store.draft && !store.recovery
    ? { edit: store.edit, startGesture: store.startGesture, pendingExcluded: () => store.pendingExcluded, current: () => store.draft!, fitChoice: store.fitChoice, setFitChoice: store.setFitChoice }
    : null))

  /**
   * The draft checked against the schema the server validates with, before it is sent. The schema (and zod)
   * is loaded on the first save, not with the page.
   */
  async function check(d: SiteModelDefinition): Promise<boolean> {
    const { SiteModelDefinitionSchema } = await import('#shared/site-model/definition')
    const parsed = SiteModelDefinitionSchema.safeParse(d)
    if (parsed.success) { issues.value = []; return true }
    issues.value = parsed.error.issues.map(i => ({ path: i.path.join('.'), message: issueMessage(i, String(i.path[0] ?? ''), typed) }))
    error.value = 'The draft is not complete yet:'
    return false
  }

  function handleConflict(err: unknown, during: 'draft' | 'version', mine: SiteModelDefinition): boolean {
    const e = err as { statusCode?: number, data?: { data?: { current?: SiteModelRow } } }
    const current = e.data?.data?.current
    if (e.statusCode !== 409 || !current) return false
    conflict.value = { theirs: current, changes: diffDefinitions(current.draft, mine), during }
    return true
  }

  async function saveDraft(): Promise<boolean> {
    const d = store.draft
    if (!d) return false
    write.clear()
    if (!(await check(d))) return false
    doing.value = 'draft'
    return write.run(async () => {
      const { model } = await api<{ model: SiteModelRow }>(`${base()}/draft`, { method: 'PUT', body: { draft: d, version: store.revision } })
      store.markSaved(d, model.version)
    }, {
      done: 'Draft saved.',
      onError: (err) => {
        if (handleConflict(err, 'draft', d)) return true
        issues.value = apiErrorIssues(err)
      },
    })
  }

  /** Saves the draft as the next version; returns its number. */
  async function saveVersion(message: string): Promise<number | null> {
    if (!store.draft) return null
    if (message.trim().length < 3) {
      error.value = 'Say what changed in this version (3 characters or more).'
      return null
    }
    if (store.dirty && !(await saveDraft())) return null
    const mine = store.draft
    if (!mine) return null
    const out: { version?: number } = {}
    doing.value = 'version'
    await write.run(async () => {
      const { version } = await api<{ version: { version: number } }>(`${base()}/versions`, { method: 'POST', body: { message: message.trim(), version: store.revision } })
      // Saving a version bumps the draft's revision on the server; the content is unchanged.
      store.markRevision(store.revision + 1)
      out.version = version.version
      // A saved version of the design model may be the model in force now (until one is approved).
      void refreshNuxtData(modelInForceKey(toValue(projectId)))
      return version.version
    }, {
      done: n => `Version ${n} saved.`,
      onError: err => handleConflict(err, 'version', mine),
    })
    return out.version ?? null
  }

  /** Keeps your draft: their revision becomes the base and yours is saved over it. */
  async function keepMine() {
    const c = conflict.value
    if (!c) return
    conflict.value = null
    store.rebaseOnto(c.theirs.draft, c.theirs.version)
    await saveDraft()
  }

  /** Takes their draft (undo brings yours back). */
  function takeTheirs() {
    const c = conflict.value
    if (!c) return
    conflict.value = null
    store.takeTheirs(c.theirs.draft, c.theirs.version)
    notice.value = 'Their draft is open; Undo brings yours back.'
  }

  function onKey(e: KeyboardEvent) {
    if (!(e.ctrlKey || e.metaKey) || !editor.value || options.active?.() === false) return
    const t = e.target as HTMLElement | null
    // Typing fields keep their own undo.
    if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.isContentEditable)) return
    const k = e.key.toLowerCase()
    if (k === 'z' && !e.shiftKey) { e.preventDefault(); store.undo() }
    else if ((k === 'z' && e.shiftKey) || k === 'y') { e.preventDefault(); store.redo() }
  }
  onMounted(() => window.addEventListener('keydown', onKey))
  onBeforeUnmount(() => window.removeEventListener('keydown', onKey))

  // Leaving with edits that only live on this device: the browser asks first.
  useUnloadWarning(() => store.dirty && !store.lastLocalWrite)

  return { store, editor, start, saving, error, issues, notice, conflict, saveDraft, saveVersion, keepMine, takeTheirs }
}
