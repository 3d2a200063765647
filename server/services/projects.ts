import { and, eq } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import type { CreateProjectSchema, UpdateProjectSchema } from '#shared/schemas/projects'
import { useDb } from '../db/client'
import { projectMembers, projects, siteModels } from '../db/schema'
import type { ProjectRow } from '../utils/guards'
import { recordAudit } from './audit'
import { conflictOnDuplicate, unprocessableError } from './http-errors'

/** A site admin creates a project and becomes its first owner (a job number already used: 409). */
export async function createProject(actorId: string, body: z.infer<typeof CreateProjectSchema>) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const row = returnedRow(await tx.insert(projects).values({ ...body, createdBy: actorId }).returning())
    await tx.insert(projectMembers).values({ projectId: row.id, userId: actorId, role: 'owner' })
    await recordAudit({ actorId, projectId: row.id, action: 'create', entity: 'project', entityId: row.id, after: row }, tx)
    return row
  }), `Job number ${body.jobNumber} is already used by another project.`)
}

/**
 * Edits the project's details (a job number already used: 409) or names its design model, which
 * must be a model of this project (422 otherwise).
 */
export async function updateProject(project: ProjectRow, actorId: string, body: z.infer<typeof UpdateProjectSchema>) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    if (body.designModelId !== undefined) {
      const [model] = await tx.select({ id: siteModels.id }).from(siteModels).where(and(eq(siteModels.id, body.designModelId), eq(siteModels.projectId, project.id)))
      if (!model) throw unprocessableError('The design model must be one of this project\'s site models: no such model here.', { code: 'unknown-model', issues: [{ path: 'designModelId', message: 'is not a model of this project' }] })
    }
    const row = returnedRow(await tx.update(projects).set(body).where(eq(projects.id, project.id)).returning())
    await recordAudit({ actorId, projectId: project.id, action: 'update', entity: 'project', entityId: project.id, before: project, after: row }, tx)
    return row
  }), 'That job number is already used by another project.')
}
