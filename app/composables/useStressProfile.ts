import type { SiteModelDefinition } from '#shared/site-model/definition'
import { toStressInput } from '#shared/site-model/convert'
import { stableJson } from '~/utils/siteModelEdits'
import type { StressProfileReply } from '#shared/types/calc'
import type { Readiness } from '~/utils/untilReady'

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
  /** The first request has answered (a profile or an error), or there is nothing to ask. */
  const answered = ref(false)
  /** The stresses the profile on screen was worked out for, and those the error on screen is of. */
  const answeredKey = ref('')
  const errorKey = ref('')

  const input = computed(() => {
    const d = toValue(definition)
    return d ? toStressInput(d) : null
  })
  const key = computed(() => (input.value ? stableJson(input.value) : ''))

  const latest = useLatestRequest(async (signal) => {
    const body = input.value
    if (!body) return
    const asked = key.value
    pending.value = true
    try {
      const res = await api<StressProfileReply>('/api/calc/stress-profile', { method: 'POST', body, signal })
      if (signal.aborted) return
      points.value = res.points
      warnings.value = res.warnings
      error.value = null
      answeredKey.value = asked
      sequence.value++
    }
    catch (err) {
      if (signal.aborted) return
      errorKey.value = asked
      const e = err as { statusCode?: number, data?: { message?: string, data?: { depth?: number, code?: string } } }
      error.value = {
        message: e.data?.message ?? apiErrorMessage(err),
        depth: typeof e.data?.data?.depth === 'number' ? e.data.data.depth : null,
        code: e.data?.data?.code ?? null,
      }
    }
    finally {
      if (!signal.aborted) {
        pending.value = false
        answered.value = true
      }
    }
  }, delay)

  watch(key, (k, old) => {
    if (k) latest.schedule(!old)
  })
  onMounted(() => latest.schedule(true))

  const settled = computed(() => answered.value || !input.value)
  /** The profile on screen is that of the definition's stresses now (`true`), is still to come (`false`), or cannot be (the error). */
  const readiness = computed((): Readiness => {
    if (!key.value || answeredKey.value === key.value) return true
    return error.value && errorKey.value === key.value ? error.value.message : false
  })
  return { points, warnings, error, pending, sequence, settled, readiness, refresh: () => latest.schedule(true) }
}
