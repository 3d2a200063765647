import { relations } from 'drizzle-orm'
import { auditEvents } from './audit'
import { projectMembers, projects } from './projects'
import { apiTokens, sessions, users } from './users'

export const usersRelations = relations(users, ({ many }) => ({
  memberships: many(projectMembers),
  sessions: many(sessions),
  apiTokens: many(apiTokens),
}))

export const projectsRelations = relations(projects, ({ one, many }) => ({
  creator: one(users, { fields: [projects.createdBy], references: [users.id] }),
  members: many(projectMembers),
  auditEvents: many(auditEvents),
}))

export const projectMembersRelations = relations(projectMembers, ({ one }) => ({
  project: one(projects, { fields: [projectMembers.projectId], references: [projects.id] }),
  user: one(users, { fields: [projectMembers.userId], references: [users.id] }),
}))

export const sessionsRelations = relations(sessions, ({ one }) => ({
  user: one(users, { fields: [sessions.userId], references: [users.id] }),
}))

export const apiTokensRelations = relations(apiTokens, ({ one }) => ({
  user: one(users, { fields: [apiTokens.userId], references: [users.id] }),
}))

export const auditEventsRelations = relations(auditEvents, ({ one }) => ({
  actor: one(users, { fields: [auditEvents.actorId], references: [users.id] }),
  project: one(projects, { fields: [auditEvents.projectId], references: [projects.id] }),
}))
