import seedrandom from 'seedrandom'
import type { CptBehaviourTrace, DenseCpt, PreconsolidationPointRow, PreconsolidationPointsReply } from '#shared/types/lab'
import type { ReviewFlag } from '#shared/types/review'
import { toStressInput } from '#shared/site-model/convert'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { stableJson } from '~/utils/siteModelEdits'
import { flaggedUnadoptedTests, type FlaggedTest, type ListedTest, type PointFlag } from '~/utils/stressHistory'
import { pageReader } from '~/utils/api'
import { cutNote, readAllPages } from '~/utils/listPages'
import type { Readiness } from '~/utils/untilReady'

/** Every CPT row's σ'p for the dense layer, merged and sorted by depth (display only, never fitted). */
export interface DenseLayer {
  depth: Float32Array
  preconsolidation: Float32Array
  count: number
  soundings: number
  synthetic: number
}

const EMPTY_DENSE: DenseLayer = { depth: new Float32Array(0), preconsolidation: new Float32Array(0), count: 0, soundings: 0, synthetic: 0 }

/**
 * Synthetic CPT-like σ'p rows for the canvas benchmark only (`?bench=N`): σ'p rising
 * with depth with log-normal scatter, over the model's depth. Never sent anywhere.
 */
function syntheticRows(n: number, maxDepth: number): { depth: number[], value: number[] } {
  const rnd = seedrandom('417') // seeded: benchmark points are the same on every run
  const depth: number[] = new Array(n)
  const value: number[] = new Array(n)
  for (let i = 0; i < n; i++) {
    const z = rnd() * maxDepth
    const u = Math.max(1e-9, rnd())
    const g = Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rnd())
    depth[i] = z
    value[i] = (35 + 8.5 * z) * Math.exp(0.18 * g)
  }
  return { depth, value }
}

/** Rows sorted by depth (depth and value as parallel arrays). */
interface SortedRows { depth: Float32Array, value: Float32Array }

function sortRows(depth: ArrayLike<number>, value: ArrayLike<number>): SortedRows {
  const n = depth.length
  const order = new Uint32Array(n)
  for (let i = 0; i < n; i++) order[i] = i
  order.sort((a, b) => depth[a]! - depth[b]!)
  const z = new Float32Array(n)
  const v = new Float32Array(n)
  for (let i = 0; i < n; i++) { z[i] = depth[order[i]!]!; v[i] = value[order[i]!]! }
  return { depth: z, value: v }
}

/**
 * The soundings' rows and the (already sorted) synthetic rows merged by depth in
 * one pass: only the few thousand real rows are sorted again when the points are
 * asked again after an edit.
 */
function mergeDense(cpt: DenseCpt[], extra: SortedRows | null): DenseLayer {
  let m = 0
  for (const c of cpt) m += c.depth.length
  const extraN = extra?.depth.length ?? 0
  const n = m + extraN
  if (!n) return EMPTY_DENSE
  const rz = new Float64Array(m)
  const rv = new Float64Array(m)
  let k = 0
  for (const c of cpt) {
    for (let i = 0; i < c.depth.length; i++) { rz[k] = c.depth[i]!; rv[k] = c.preconsolidation[i]!; k++ }
  }
  const real = sortRows(rz, rv)
  const depth = new Float32Array(n)
  const preconsolidation = new Float32Array(n)
  let i = 0
  let j = 0
  for (let o = 0; o < n; o++) {
    if (j >= extraN || (i < m && real.depth[i]! <= extra!.depth[j]!)) { depth[o] = real.depth[i]!; preconsolidation[o] = real.value[i]!; i++ }
    else { depth[o] = extra!.depth[j]!; preconsolidation[o] = extra!.value[j]!; j++ }
  }
  return { depth, preconsolidation, count: n, soundings: cpt.length, synthetic: extraN }
}

/**
 * What CPT σ'p depend on in a definition: the stresses (strata, unit weights,
 * water, surcharge) and each band's stratum code and cone factor. Trends and
 * compressibility do not move them, so editing those asks nothing again.
 */
function stressKey(def: SiteModelDefinition): string {
  try {
    return stableJson({ stress: toStressInput(def), k: def.strata.map(s => [s.code, s.cptFactor]) })
  }
  catch {
    return ''
  }
}

/**
 * The project's σ'p points from all sources, the open reviewer flags that bear on
 * them, the flagged tests that have no σ'p, and the dense CPT layer; fetched in
 * the browser only. `bench` adds that
 * many synthetic dense rows (benchmarks only).
 *
 * With `definition`, the points are computed through that model (POST
 * …/preconsolidation-points/evaluate): the canvas passes the definition on screen,
 * so CPT σ'p follow unsaved edits of the stresses (asked again after `delay` ms,
 * the previous points kept until the new ones arrive) and a saved version shows
 * its own. Without it, the project's stress model in force is used.
 */
export function usePreconsolidationPoints(projectId: MaybeRefOrGetter<string>, options: { bench?: MaybeRefOrGetter<number>, maxDepth?: MaybeRefOrGetter<number>, definition?: MaybeRefOrGetter<SiteModelDefinition | null | undefined>, label?: MaybeRefOrGetter<string>, delay?: number } = {}) {
  const base = () => `/api/projects/${toValue(projectId)}`
  const through = () => (toValue(options.definition) ? 'given' : 'in-force')
  const read = pageReader()

  // The open flags and the oedometer tests (whose flags bear on the σ'p adopted from them), every page.
  const context = useAsyncData(
    () => `sigma-context-${toValue(projectId)}`,
    async (_nuxtApp, { signal }) => {
      const [flagList, tests] = await Promise.all([
        readAllPages(read, `${base()}/flags?status=open`, (r: { flags: ReviewFlag[] }) => r.flags, { signal }),
        readAllPages(read, `${base()}/tests/oedometer`, (r: { tests: ListedTest[] }) => r.tests, { signal }),
      ])
      return { flags: flagList, tests }
    },
    { server: false, default: () => null },
  )

  // The points, through the given definition when there is one; asked again (debounced) when its stresses change.
  // Each answer carries the stresses it was worked out for (`key`; '' for the stress model in force).
  const key = computed(() => {
    const def = toValue(options.definition)
    return def ? stressKey(def) : ''
  })
  let askedKey = ''
  const answer = useAsyncData(
    () => `sigma-points-${through()}-${toValue(projectId)}`,
    async (_nuxtApp, { signal }) => {
      const def = toValue(options.definition)
      const asked = key.value
      askedKey = asked
      const reply = def
        ? await api<PreconsolidationPointsReply>(`${base()}/preconsolidation-points/evaluate`, { method: 'POST', body: { definition: def, dense: true, label: toValue(options.label) || undefined }, signal })
        : await api<PreconsolidationPointsReply>(`${base()}/preconsolidation-points?dense=1`, { signal })
      return { key: asked, reply }
    },
    { server: false, default: () => null },
  )
  const latest = useLatestRequest(signal => answer.refresh({ signal }), options.delay ?? 350)
  watch(key, (k) => {
    if (k) latest.schedule()
  })

  const points = shallowRef<PreconsolidationPointRow[]>([])
  const flags = shallowRef<Map<string, PointFlag[]>>(new Map())
  const flaggedTests = shallowRef<FlaggedTest[]>([])
  const dense = shallowRef<DenseLayer>(EMPTY_DENSE)
  const behaviour = shallowRef<CptBehaviourTrace[]>([])
  const warnings = ref<string[]>([])
  const stressModel = ref<PreconsolidationPointsReply['stressModel'] | null>(null)
  /** Whether points are on screen: an edit whose points cannot be computed keeps the last ones beside the error. */
  const shown = ref(false)

  let synthetic: { key: string, rows: SortedRows } | null = null
  function syntheticSorted(): SortedRows | null {
    const n = Math.max(0, Math.min(2_000_000, Math.round(toValue(options.bench) ?? 0)))
    if (!n) return null
    const maxDepth = toValue(options.maxDepth) ?? 22
    const key = `${n}:${maxDepth}`
    if (synthetic?.key !== key) {
      const r = syntheticRows(n, maxDepth)
      synthetic = { key, rows: sortRows(r.depth, r.value) }
    }
    return synthetic.rows
  }
  watch(answer.data, (a) => {
    if (!a) return
    const pts = a.reply
    points.value = pts.points
    dense.value = mergeDense(pts.dense?.cpt ?? [], syntheticSorted())
    behaviour.value = pts.behaviour ?? []
    warnings.value = pts.warnings
    stressModel.value = pts.stressModel
    shown.value = true
  }, { immediate: true })

  watch(context.data, (c) => {
    if (!c) return
    // A flag on an oedometer test bears on the σ'p adopted from it.
    const adoptionOfTest = new Map(c.tests.rows.filter(t => t.adoption).map(t => [t.id, t.adoption!.id]))
    const map = new Map<string, PointFlag[]>()
    for (const f of c.flags.rows) {
      if (f.status !== 'open') continue
      const target = f.targetType === 'oedometer-test' ? adoptionOfTest.get(f.targetId) : f.targetId
      if (!target) continue
      map.set(target, [...(map.get(target) ?? []), { id: f.id, verdict: f.verdict, comment: f.comment, author: f.author, targetType: f.targetType }])
    }
    flags.value = map
    // A flag on a test with no adopted σ'p has no point to ring: the canvas marks the test at its depth.
    flaggedTests.value = flaggedUnadoptedTests(c.tests.rows, c.flags.rows)
  }, { immediate: true })

  const loading = computed(() => context.status.value === 'pending' || (answer.status.value === 'pending' && !shown.value))
  const error = computed(() => {
    const e = context.error.value ?? answer.error.value
    return e ? apiErrorMessage(e) : ''
  })
  /** The points on screen are those of the definition's stresses now (`true`), are still to come (`false`), or cannot be (the error). */
  const readiness = computed((): Readiness => {
    if (answer.data.value?.key === key.value) return true
    const e = answer.status.value === 'error' && askedKey === key.value ? answer.error.value : null
    return e ? apiErrorMessage(e) : false
  })
  /** The first answers are in (points and flags, or an error): the drawing can be built once, with them. */
  const settled = computed(() => (shown.value || !!answer.error.value) && (context.data.value !== null || !!context.error.value))
  const listNote = computed(() => {
    const c = context.data.value
    return c ? [cutNote(c.flags, 'open flags'), cutNote(c.tests, 'oedometer tests')].filter(Boolean).join(' ') : ''
  })

  async function refresh() {
    latest.cancel()
    await Promise.all([context.refresh(), answer.refresh()])
  }
  return { points, flags, flaggedTests, dense, behaviour, warnings, stressModel, loading, settled, readiness, error, listNote, refresh }
}
