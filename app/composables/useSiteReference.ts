import type { ReferenceHole, SiteReference, UnitWeightReading, WaterReading } from '#shared/investigation/reference'
import { useStrata } from '~/composables/useStrata'

export type { LoggedBoundary, ReferenceHole, UnitWeightReading, WaterReading } from '#shared/investigation/reference'

/**
 * What the logs say for the stress workspace: the project's strata list (the one
 * cached list `useStrata` keeps, so an edit of the strata shows here too), and for
 * the reference layers the stratum changes per hole, logged bulk unit weights and
 * every groundwater observation with its date. The reference is read in the
 * browser only (the workspace renders client-side).
 */
export function useSiteReference(projectId: MaybeRefOrGetter<string>) {
  const strataList = useStrata(projectId)
  const strata = computed(() => strataList.data.value.strata)
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
      const ref = await api<SiteReference>(`/api/projects/${id}/site-reference`)
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

  async function refresh() {
    await Promise.all([strataList.refresh(), load()])
  }

  return { strata, holes: computed(() => holes.value), unitWeights: computed(() => unitWeights.value), water: computed(() => water.value), loading, error, refresh }
}
