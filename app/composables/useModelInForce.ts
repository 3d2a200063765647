import type { ModelInForce } from '#shared/types/model-in-force'

/**
 * The project's model in force (the design model's version whose σ'v0 every page uses), keyed
 * `model-in-force:<projectId>` so a live update or a save can refresh it with `refreshNuxtData`.
 * The project page loads it once; its pages read the same cached answer.
 */
export function useModelInForce() {
  const route = useRoute()
  const projectId = computed(() => String(route.params.projectId ?? ''))
  return useFetch<ModelInForce>(() => `/api/projects/${projectId.value}/model-in-force`, {
    key: () => modelInForceKey(projectId.value),
  })
}

/** The key the model in force is cached under. */
export function modelInForceKey(projectId: string): string {
  return `model-in-force:${projectId}`
}
