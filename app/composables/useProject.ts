import type { ProjectReply } from '#shared/types/projects'
import { roleCan, type Capability } from '#shared/auth/roles'

/** One project and the caller's role in it, keyed by the route's project id. */
export function useProject() {
  const route = useRoute()
  const projectId = computed(() => String(route.params.projectId ?? ''))
  const res = useFetch<ProjectReply>(() => `/api/projects/${projectId.value}`, {
    key: () => `project-${projectId.value}`,
  })
  const can = (capability: Capability) => roleCan(res.data.value?.role, capability)
  return { projectId, ...res, can }
}
