import type { ProjectRole } from '#shared/auth/roles'

export interface ProjectSummary {
  id: string
  jobNumber: string
  name: string
  client: string
  unitSystem: 'SI' | 'US'
  updatedAt: string
  role: ProjectRole
}

/** The caller's projects (server state, keyed; refresh after creating one). */
export function useProjects() {
  return useFetch<{ projects: ProjectSummary[] }>('/api/projects', {
    key: 'projects',
    default: () => ({ projects: [] }),
  })
}
