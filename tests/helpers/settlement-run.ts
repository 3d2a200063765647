// Settlement runs in API tests: a model version from the demo scenario's ground model, and run bodies.
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import type { Client } from './http'
import { must } from './project'
import { scenarioDefinition } from './scenario-definition'

/** A site model of the project with version 1 saved from `definition` (the scenario's ground model by default). */
export async function createRunModel(c: Client, projectId: string, definition: SiteModelDefinition = scenarioDefinition(), name = 'Run model'): Promise<{ modelId: string, version: number, url: string }> {
  const created = await must(`creating model ${name}`, c.post<{ model: { id: string, version: number } }>(`/api/projects/${projectId}/models`, { name }), 201)
  const url = `/api/projects/${projectId}/models/${created.model.id}`
  const put = await must(`saving the draft of ${name}`, c.request<{ model: { version: number } }>('PUT', `${url}/draft`, { draft: definition, version: created.model.version }))
  await must(`saving version 1 of ${name}`, c.post(`${url}/versions`, { message: 'From the scenario ground model', version: put.model.version }), 201)
  return { modelId: created.model.id, version: 1, url }
}

/** A run body: a 40 m × 30 m, 100 kPa rectangle at the origin and three points (small enough to be computed in the request). */
export function smallRunBody(model: { modelId: string, version: number }, extra: Record<string, unknown> = {}) {
  return {
    name: 'Small slab',
    model: { modelId: model.modelId, version: model.version },
    loads: [{ type: 'rectangle', label: 'Slab', x: 0, y: 0, width: 40, length: 30, pressure: 100 }],
    points: [{ label: 'Centre', x: 0, y: 0 }, { label: 'Corner', x: 20, y: 15 }, { label: 'Outside', x: 40, y: 0 }],
    ...extra,
  }
}

/** Version 1 of a model sent by the engineer to the project's reviewer and approved by them: the model in force for runs. */
export async function approveFirstVersion(people: { owner: Client, engineer: Client, reviewer: Client }, projectBase: string, modelUrl: string, message: string): Promise<void> {
  const members = await must('members', people.owner.get<{ members: { userId: string, role: string }[] }>(`${projectBase}/members`))
  const reviewerId = members.members.find(m => m.role === 'reviewer')!.userId
  await must('submitting version 1', people.engineer.post(`${modelUrl}/versions/1/submit`, { message, reviewerIds: [reviewerId] }))
  await must('approving version 1', people.reviewer.post(`${modelUrl}/versions/1/decision`, { decision: 'approve', comment: 'Agreed.' }))
}

/**
 * A model of the project from the scenario's ground model, its version 1 saved by the engineer and approved by the
 * reviewer (`message` goes with the submission): the model in force for runs.
 */
export async function createApprovedRunModel(people: { owner: Client, engineer: Client, reviewer: Client }, projectId: string, message: string, name = 'Yard model'): Promise<{ modelId: string, version: number, url: string }> {
  const model = await createRunModel(people.engineer, projectId, undefined, name)
  await approveFirstVersion(people, `/api/projects/${projectId}`, model.url, message)
  return model
}
