import type { ProjectList } from '#shared/types/projects'

/** The caller's projects (server state, keyed; refresh after creating one). */
export function useProjects() {
  return useFetch<ProjectList>('/api/projects', {
    key: 'projects',
    default: () => ({ projects: [] }),
  })
}
