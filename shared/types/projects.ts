/**
 * Replies of the project routes. `Server…` is what the route returns, the plain
 * name what the page reads (dates as ISO strings).
 */
import type { ProjectRole } from '#shared/auth/roles'
import type { projects } from '~~/server/db/schema'
import type { Serialize } from './serialize'

export type ServerProjectRow = typeof projects.$inferSelect

/** One of the caller's projects, with the caller's role in it (GET /api/projects). */
export type ServerProjectSummary = Pick<ServerProjectRow, 'id' | 'jobNumber' | 'name' | 'client' | 'unitSystem' | 'updatedAt'> & { role: ProjectRole }
export type ProjectSummary = Serialize<ServerProjectSummary>

export interface ServerProjectList { projects: ServerProjectSummary[] }
export type ProjectList = Serialize<ServerProjectList>

/** GET /api/projects/:projectId */
export interface ServerProjectReply { project: ServerProjectRow, role: ProjectRole }
export type ProjectReply = Serialize<ServerProjectReply>
export type ProjectDetail = ProjectReply['project']

/** A member of a project (GET …/members). */
export interface ServerProjectMember { userId: string, email: string, displayName: string, role: ProjectRole, since: Date }
export type ProjectMember = Serialize<ServerProjectMember>

export interface ServerMemberList { members: ServerProjectMember[] }
export type MemberList = Serialize<ServerMemberList>
