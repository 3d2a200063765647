import { relations } from 'drizzle-orm'
import { attachments } from './attachments'
import { auditEvents } from './audit'
import { oedometerTests, preconsolidationAdoptions } from './lab'
import { siteModels, siteModelVersions } from './models'
import { reviewFlags, reviewReplies } from './review'
import { cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, samples, sptResults, strata, vaneReadings } from './investigation'
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
  strata: many(strata),
  points: many(investigationPoints),
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

export const strataRelations = relations(strata, ({ one, many }) => ({
  project: one(projects, { fields: [strata.projectId], references: [projects.id] }),
  intervals: many(logIntervals),
}))

export const investigationPointsRelations = relations(investigationPoints, ({ one, many }) => ({
  project: one(projects, { fields: [investigationPoints.projectId], references: [projects.id] }),
  intervals: many(logIntervals),
  samples: many(samples),
  spt: many(sptResults),
  groundwater: many(groundwaterObservations),
  cpt: one(cptSoundings),
  vane: many(vaneReadings),
}))

export const logIntervalsRelations = relations(logIntervals, ({ one }) => ({
  point: one(investigationPoints, { fields: [logIntervals.pointId], references: [investigationPoints.id] }),
  stratum: one(strata, { fields: [logIntervals.stratumId], references: [strata.id] }),
}))

export const samplesRelations = relations(samples, ({ one, many }) => ({
  point: one(investigationPoints, { fields: [samples.pointId], references: [investigationPoints.id] }),
  index: one(indexTests),
  oedometerTests: many(oedometerTests),
}))

export const indexTestsRelations = relations(indexTests, ({ one }) => ({
  sample: one(samples, { fields: [indexTests.sampleId], references: [samples.id] }),
}))

export const sptResultsRelations = relations(sptResults, ({ one }) => ({
  point: one(investigationPoints, { fields: [sptResults.pointId], references: [investigationPoints.id] }),
}))

export const groundwaterObservationsRelations = relations(groundwaterObservations, ({ one }) => ({
  point: one(investigationPoints, { fields: [groundwaterObservations.pointId], references: [investigationPoints.id] }),
}))

export const cptSoundingsRelations = relations(cptSoundings, ({ one }) => ({
  point: one(investigationPoints, { fields: [cptSoundings.pointId], references: [investigationPoints.id] }),
}))

export const vaneReadingsRelations = relations(vaneReadings, ({ one }) => ({
  point: one(investigationPoints, { fields: [vaneReadings.pointId], references: [investigationPoints.id] }),
}))

export const oedometerTestsRelations = relations(oedometerTests, ({ one, many }) => ({
  sample: one(samples, { fields: [oedometerTests.sampleId], references: [samples.id] }),
  adoptions: many(preconsolidationAdoptions),
}))

export const preconsolidationAdoptionsRelations = relations(preconsolidationAdoptions, ({ one }) => ({
  test: one(oedometerTests, { fields: [preconsolidationAdoptions.oedometerTestId], references: [oedometerTests.id] }),
  project: one(projects, { fields: [preconsolidationAdoptions.projectId], references: [projects.id] }),
  adopter: one(users, { fields: [preconsolidationAdoptions.adoptedBy], references: [users.id] }),
}))

export const attachmentsRelations = relations(attachments, ({ one }) => ({
  project: one(projects, { fields: [attachments.projectId], references: [projects.id] }),
}))

export const siteModelsRelations = relations(siteModels, ({ one, many }) => ({
  project: one(projects, { fields: [siteModels.projectId], references: [projects.id] }),
  versions: many(siteModelVersions),
}))

export const siteModelVersionsRelations = relations(siteModelVersions, ({ one }) => ({
  model: one(siteModels, { fields: [siteModelVersions.modelId], references: [siteModels.id] }),
  author: one(users, { fields: [siteModelVersions.createdBy], references: [users.id] }),
}))

export const reviewFlagsRelations = relations(reviewFlags, ({ one, many }) => ({
  project: one(projects, { fields: [reviewFlags.projectId], references: [projects.id] }),
  replies: many(reviewReplies),
}))

export const reviewRepliesRelations = relations(reviewReplies, ({ one }) => ({
  flag: one(reviewFlags, { fields: [reviewReplies.flagId], references: [reviewFlags.id] }),
}))
