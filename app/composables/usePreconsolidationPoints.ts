import type { FlagVerdict } from '#shared/review/flags'
import { flaggedUnadoptedTests, type FlaggedTest, type ListedTest, type PointFlag, type SigmaPoint } from '~/utils/stressHistory'

interface DenseCpt {
  pointId: string
  pointIdentifier: string
  depth: number[]
  preconsolidation: number[]
  effectiveStress: (number | null)[]
  stratum: number[]
}

interface PointsAnswer {
  points: SigmaPoint[]
  counts: Record<string, number>
  warnings: string[]
  spacing: number
  stressModel: { source: 'draft' | 'logs', modelId: string | null, modelName: string | null, description: string }
  dense?: { strata: string[], cpt: DenseCpt[] }
}

interface FlagRow { id: string, targetType: string, targetId: string, verdict: FlagVerdict, comment: string, status: 'open' | 'resolved', author: string | null }

/** Every CPT row's σ'p for the dense layer, merged and sorted by depth (display only, never fitted). */
export interface DenseLayer {
  depth: Float32Array
  preconsolidation: Float32Array
  count: number
  soundings: number
  synthetic: number
}

const EMPTY_DENSE: DenseLayer = { depth: new Float32Array(0), preconsolidation: new Float32Array(0), count: 0, soundings: 0, synthetic: 0 }

/** A small seeded generator (mulberry32), so benchmark points are the same on every run. */
function seeded(seed: number) {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/**
 * Synthetic CPT-like σ'p rows for the canvas benchmark only (`?bench=N`): σ'p rising
 * with depth with log-normal scatter, over the model's depth. Never sent anywhere.
 */
function syntheticRows(n: number, maxDepth: number): { depth: number[], value: number[] } {
  const rnd = seeded(417)
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

function mergeDense(cpt: DenseCpt[], extra: { depth: number[], value: number[] } | null): DenseLayer {
  let n = extra?.depth.length ?? 0
  for (const c of cpt) n += c.depth.length
  if (!n) return EMPTY_DENSE
  const order = new Uint32Array(n)
  const z = new Float32Array(n)
  const v = new Float32Array(n)
  let k = 0
  for (const c of cpt) {
    for (let i = 0; i < c.depth.length; i++) { z[k] = c.depth[i]!; v[k] = c.preconsolidation[i]!; k++ }
  }
  if (extra) for (let i = 0; i < extra.depth.length; i++) { z[k] = extra.depth[i]!; v[k] = extra.value[i]!; k++ }
  for (let i = 0; i < n; i++) order[i] = i
  order.sort((a, b) => z[a]! - z[b]!)
  const depth = new Float32Array(n)
  const preconsolidation = new Float32Array(n)
  for (let i = 0; i < n; i++) { depth[i] = z[order[i]!]!; preconsolidation[i] = v[order[i]!]! }
  return { depth, preconsolidation, count: n, soundings: cpt.length, synthetic: extra?.depth.length ?? 0 }
}

/**
 * The project's σ'p points from all sources, the open reviewer flags that bear on
 * them, the flagged tests that have no σ'p, and the dense CPT layer; fetched in
 * the browser only. `bench` adds that
 * many synthetic dense rows (benchmarks only).
 */
export function usePreconsolidationPoints(projectId: MaybeRefOrGetter<string>, options: { bench?: MaybeRefOrGetter<number>, maxDepth?: MaybeRefOrGetter<number> } = {}) {
  const points = shallowRef<SigmaPoint[]>([])
  const flags = shallowRef<Map<string, PointFlag[]>>(new Map())
  const flaggedTests = shallowRef<FlaggedTest[]>([])
  const dense = shallowRef<DenseLayer>(EMPTY_DENSE)
  const warnings = ref<string[]>([])
  const stressModel = ref<PointsAnswer['stressModel'] | null>(null)
  const loading = ref(false)
  const error = ref('')

  async function load() {
    const id = toValue(projectId)
    if (!id || import.meta.server) return
    loading.value = true
    error.value = ''
    try {
      const base = `/api/projects/${id}`
      const [pts, flagList, tests] = await Promise.all([
        api<PointsAnswer>(`${base}/preconsolidation-points?dense=1`),
        api<{ flags: FlagRow[] }>(`${base}/flags?status=open&limit=500`),
        api<{ tests: ListedTest[] }>(`${base}/tests/oedometer?limit=500`).catch(() => ({ tests: [] as ListedTest[] })),
      ])
      // A flag on an oedometer test bears on the σ'p adopted from it.
      const adoptionOfTest = new Map(tests.tests.filter(t => t.adoption).map(t => [t.id, t.adoption!.id]))
      const map = new Map<string, PointFlag[]>()
      for (const f of flagList.flags) {
        if (f.status !== 'open') continue
        const target = f.targetType === 'oedometer-test' ? adoptionOfTest.get(f.targetId) : f.targetId
        if (!target) continue
        map.set(target, [...(map.get(target) ?? []), { id: f.id, verdict: f.verdict, comment: f.comment, author: f.author, targetType: f.targetType }])
      }
      const n = Math.max(0, Math.min(2_000_000, Math.round(toValue(options.bench) ?? 0)))
      points.value = pts.points
      flags.value = map
      // A flag on a test with no adopted σ'p has no point to ring: the canvas marks the test at its depth.
      flaggedTests.value = flaggedUnadoptedTests(tests.tests, flagList.flags)
      dense.value = mergeDense(pts.dense?.cpt ?? [], n ? syntheticRows(n, toValue(options.maxDepth) ?? 22) : null)
      warnings.value = pts.warnings
      stressModel.value = pts.stressModel
    }
    catch (err) {
      error.value = apiErrorMessage(err)
    }
    finally {
      loading.value = false
    }
  }

  onMounted(load)
  watch(() => toValue(projectId), () => void load())
  return { points, flags, flaggedTests, dense, warnings, stressModel, loading, error, refresh: load }
}
