// Projects and points of a test's own, made through the public API.
import { beforeAll, beforeEach } from 'vitest'
import type { ProjectRole } from '../../shared/auth/roles'
import type { PointKind } from '../../shared/investigation/types'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { type Client, demoEmail, type Reply } from './http'

let seq = 0

/** A job number no other test (or earlier run against the same database) uses. */
export function uniqueJobNumber(tag: string): string {
  seq += 1
  return `${tag}-${Date.now().toString(36)}${seq}`.slice(0, 40)
}

/** Throws with the reply when the status is not the expected one (set-up steps, not the behaviour under test). */
export async function must<T>(what: string, pending: Promise<Reply<T>>, status = 200): Promise<T> {
  const r = await pending
  if (r.status !== status) throw new Error(`${what}: expected ${status}, got ${r.status} ${JSON.stringify(r.body).slice(0, 400)}`)
  return r.body
}

/** A member to add: a demo role (the demo person holding it) or an explicit account. */
export type MemberSpec = ProjectRole | { email: string, role: ProjectRole }

export interface TestProject {
  id: string
  /** `/api/projects/{id}` */
  base: string
}

/**
 * Creates a project owned by `owner` with the given members.
 * `tag` starts the job number (unique per call); `name` is the project's name.
 */
export async function createProject(owner: Client, tag: string, name: string, members: MemberSpec[] = [], extra: Record<string, unknown> = {}): Promise<TestProject> {
  const created = await must(`creating project ${tag}`, owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: uniqueJobNumber(tag), name, ...extra }), 201)
  const project = { id: created.project.id, base: `/api/projects/${created.project.id}` }
  for (const m of members) await addMember(owner, project.id, m)
  return project
}

/**
 * A project of the describe block's own, like `useDemoCopy`: made by `owner` with `members` (a function, so
 * that accounts the block's own hooks create can be named) in a `beforeAll`, or anew before each test with
 * `{ each: true }`. `project.id` and `project.base` are set once the tests run.
 */
export function useTestProject(owner: Client, tag: string, name: string, members: () => MemberSpec[] = () => [], options: { each?: boolean } = {}): Readonly<TestProject> {
  const project: TestProject = { id: '', base: '' }
  const make = async () => {
    Object.assign(project, await createProject(owner, tag, name, members()))
  }
  if (options.each) beforeEach(make)
  else beforeAll(make)
  return project
}

/** Creates the strata in the order given (display order 10, 20, …); their ids by code. */
export async function createStrata(c: Client, projectId: string, strata: readonly ({ code: string } & Record<string, unknown>)[]): Promise<Record<string, string>> {
  const ids: Record<string, string> = {}
  for (const [i, s] of strata.entries()) {
    const r = await must(`creating stratum ${s.code}`, c.post<{ stratum: { id: string } }>(`/api/projects/${projectId}/strata`, { ...s, displayOrder: (i + 1) * 10 }), 201)
    ids[s.code] = r.stratum.id
  }
  return ids
}

export async function addMember(owner: Client, projectId: string, member: MemberSpec): Promise<void> {
  const body = typeof member === 'string' ? { email: demoEmail(member), role: member } : member
  await must(`adding ${body.email} as ${body.role}`, owner.post(`/api/projects/${projectId}/members`, body), 201)
}

export interface PointSpec {
  identifier: string
  kind?: PointKind
  easting?: number
  northing?: number
  groundElevation?: number
  finalDepth?: number
  [field: string]: unknown
}

/** Creates an investigation point (a borehole unless `kind` says otherwise) and returns its id. */
export async function createPoint(c: Client, projectId: string, point: PointSpec): Promise<string> {
  const body = { kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 20, ...point }
  const created = await must(`creating point ${point.identifier}`, c.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, body), 201)
  return created.point.id
}

/**
 * A site model started from the project's logs with version 1 saved: the project's first model is
 * its design model, so that version is the model in force (saved, not yet approved). Returns the
 * model's id and URL.
 */
export async function createSavedModel(c: Client, projectId: string, name = 'Design model'): Promise<{ id: string, url: string }> {
  const created = await must(`creating model ${name}`, c.post<{ model: { id: string, version: number } }>(`/api/projects/${projectId}/models`, { name }), 201)
  const url = `/api/projects/${projectId}/models/${created.model.id}`
  await must(`saving version 1 of ${name}`, c.post(`${url}/versions`, { message: 'Started from the logs', version: created.model.version }), 201)
  return { id: created.model.id, url }
}

type StratumTrend = NonNullable<SiteModelDefinition['strata'][number]['trend']>

/**
 * A new site model in the project whose models live at `modelsUrl`, made by `c` and saved as version 1
 * with the estuarine stratum's (EST) σ'p trend set: POP 25 kPa unless `trend` says otherwise (its fit
 * figures null, no points). Returns the model as created and its versions URL.
 */
export async function createTrendVersion<M extends { id: string, version: number, draft: SiteModelDefinition }>(c: Client, modelsUrl: string, name: string, trend: Partial<StratumTrend> = {}, message = 'Estuarine trend fitted'): Promise<{ model: M, url: string }> {
  const { model } = await must(`creating model ${name}`, c.post<{ model: M }>(modelsUrl, { name }), 201)
  const estuarine: StratumTrend = { model: 'pop', logSpace: false, parameters: { pop: 25 }, n: 0, r2: null, rmse: null, aic: null, aicc: null, includedPointIds: [], excludedPointIds: [], ...trend }
  const draft: SiteModelDefinition = { ...model.draft, strata: model.draft.strata.map(s => (s.code === 'EST' ? { ...s, trend: estuarine } : s)) }
  const put = await must(`saving the draft of ${name}`, c.request<{ model: M }>('PUT', `${modelsUrl}/${model.id}/draft`, { draft, version: model.version }))
  await must(`saving version 1 of ${name}`, c.post(`${modelsUrl}/${model.id}/versions`, { message, version: put.model.version }), 201)
  return { model, url: `${modelsUrl}/${model.id}/versions` }
}
