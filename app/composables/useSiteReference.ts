import type { ReferenceHole, SiteReference, UnitWeightReading, WaterReading } from '#shared/investigation/reference'
import type { StratumRow } from '#shared/types/investigation'

/**
 * What the logs say for the stress workspace: the project's strata list, and for
 * the reference layers the stratum changes per hole, logged bulk unit weights and
 * every groundwater observation with its date, in two requests. Read in the
 * browser only (the workspace renders client-side).
 */
export function useSiteReference(projectId: MaybeRefOrGetter<string>) {
  const strata = shallowRef<StratumRow[]>([])
  const holes = shallowRef<ReferenceHole[]>([])
  const unitWeights = shallowRef<UnitWeightReading[]>([])
  const water = shallowRef<WaterReading[]>([])
  const loading = ref(false)
  const error = ref('')

  async function load() {
    const id = toValue(projectId)
    if (!id || import.meta.server) return
    loading.value = true
    error.value = ''
    try {
      const base = `/api/projects/${id}`
      const [s, ref] = await Promise.all([
        api<{ strata: StratumRow[] }>(`${base}/strata`),
        api<SiteReference>(`${base}/site-reference`),
      ])
      strata.value = s.strata
      holes.value = ref.holes
      unitWeights.value = ref.unitWeights
      water.value = ref.water
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

  return { strata, holes: computed(() => holes.value), unitWeights: computed(() => unitWeights.value), water: computed(() => water.value), loading, error, refresh: load }
}
