import { roleCan, type Capability, type ProjectRole } from '#shared/auth/roles'

export interface ProjectDetail {
  id: string
  jobNumber: string
  name: string
  client: string
  unitSystem: 'SI' | 'US'
  description: string
  createdAt: string
  updatedAt: string
}

/** One project and the caller's role in it, keyed by the route's project id. */
export function useProject() {
  const route = useRoute()
  const projectId = computed(() => String(route.params.projectId ?? ''))
  const res = useFetch<{ project: ProjectDetail, role: ProjectRole }>(() => `/api/projects/${projectId.value}`, {
    key: () => `project-${projectId.value}`,
  })
  const can = (capability: Capability) => roleCan(res.data.value?.role, capability)
  return { projectId, ...res, can }
}
