import type { ReferenceHole, SiteReference, UnitWeightReading, WaterReading } from '#shared/investigation/reference'
import { useStrata } from '~/composables/useStrata'

export type { LoggedBoundary, ReferenceHole, UnitWeightReading, WaterReading } from '#shared/investigation/reference'

/**
 * What the logs say for the stress workspace: the project's strata list (the one
 * cached list `useStrata` keeps, so an edit of the strata shows here too), and for the reference
 * layers the stratum changes per hole, logged bulk unit weights and every
 * groundwater observation with its date, in two keyed requests.
 */
export function useSiteReference(projectId: MaybeRefOrGetter<string>) {
  const strataRes = useStrata(projectId)
  const reference = useApi<SiteReference | null>(() => `site-reference-${toValue(projectId)}`, () => `/api/projects/${toValue(projectId)}/site-reference`, () => null)
  const loading = computed(() => strataRes.status.value === 'pending' || reference.status.value === 'pending')
  const error = computed(() => {
    const e = strataRes.error.value ?? reference.error.value
    return e ? apiErrorMessage(e) : ''
  })
  async function refresh() {
    await Promise.all([strataRes.refresh(), reference.refresh()])
  }
  return {
    strata: computed(() => strataRes.data.value.strata),
    holes: computed((): ReferenceHole[] => reference.data.value?.holes ?? []),
    unitWeights: computed((): UnitWeightReading[] => reference.data.value?.unitWeights ?? []),
    water: computed((): WaterReading[] => reference.data.value?.water ?? []),
    loading,
    /** The reference layers have answered (or failed). */
    settled: computed(() => reference.data.value !== null || !!reference.error.value),
    error,
    refresh,
  }
}
