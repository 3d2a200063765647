import type { SiteModelDefinition } from '#shared/site-model/definition'
import { toStressInput } from '#shared/site-model/convert'
import { stableJson } from '~/utils/siteModelEdits'
import type { StressProfileReply } from '#shared/types/calc'

export interface ProfileError {
  message: string
  /** Depth the engine named (e.g. where σ'v0 falls to zero), m. */
  depth: number | null
  code: string | null
}

/**
 * σv, u and σ'v0 of a definition from POST /api/calc/stress-profile, asked again
 * on every change of what the stresses depend on (strata, unit weights, water,
 * surcharge), debounced. The last good profile stays on screen until the next
 * one arrives; a 422 is kept beside it with the depth it names.
 */
export function useStressProfile(definition: MaybeRefOrGetter<SiteModelDefinition | null | undefined>, options: { delay?: number } = {}) {
  // Short enough that an edit shows within ~150 ms on loopback; older requests are aborted, so a drag does not pile up.
  const delay = options.delay ?? 60
  const points = shallowRef<StressProfileReply['points']>([])
  const warnings = ref<string[]>([])
  const error = ref<ProfileError | null>(null)
  const pending = ref(false)
  /** Counts the profiles received (a new curve on screen). */
  const sequence = ref(0)
  let timer: ReturnType<typeof setTimeout> | null = null
  let controller: AbortController | null = null
  let asked = 0

  const input = computed(() => {
    const d = toValue(definition)
    return d ? toStressInput(d) : null
  })
  const key = computed(() => (input.value ? stableJson(input.value) : ''))

  async function run(body: NonNullable<typeof input.value>) {
    controller?.abort()
    const mine = new AbortController()
    controller = mine
    const n = ++asked
    pending.value = true
    try {
      const res = await api<StressProfileReply>('/api/calc/stress-profile', { method: 'POST', body, signal: mine.signal })
      if (n !== asked) return
      points.value = res.points
      warnings.value = res.warnings
      error.value = null
      sequence.value++
    }
    catch (err) {
      if (mine.signal.aborted || n !== asked) return
      const e = err as { statusCode?: number, data?: { message?: string, data?: { depth?: number, code?: string } } }
      error.value = {
        message: e.data?.message ?? apiErrorMessage(err),
        depth: typeof e.data?.data?.depth === 'number' ? e.data.data.depth : null,
        code: e.data?.data?.code ?? null,
      }
    }
    finally {
      if (n === asked) pending.value = false
    }
  }

  function schedule(immediate = false) {
    if (import.meta.server) return
    const body = input.value
    if (!body) return
    if (timer) clearTimeout(timer)
    if (immediate) {
      void run(body)
      return
    }
    timer = setTimeout(() => {
      timer = null
      void run(body)
    }, delay)
  }

  watch(key, (k, old) => {
    if (k) schedule(!old)
  })
  onMounted(() => schedule(true))
  onBeforeUnmount(() => {
    if (timer) clearTimeout(timer)
    controller?.abort()
  })

  return { points, warnings, error, pending, sequence, refresh: () => schedule(true) }
}
