import { index, integer, jsonb, pgEnum, pgTable, primaryKey, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { createdAt, moment, ownedRow, timestamps } from './columns'
import { projects } from './projects'
import { namedUser, users } from './users'

export const modelVersionStatus = pgEnum('model_version_status', ['saved', 'submitted', 'approved', 'returned'])

/** A site's stress model: an editable draft plus immutable saved versions. */
export const siteModels = pgTable('site_models', {
  ...ownedRow('projectId', () => projects.id),
  name: text().notNull(),
  description: text().notNull().default(''),
  draft: jsonb().$type<SiteModelDefinition>().notNull(),
  /** The draft's revision: optimistic concurrency of draft edits (not a saved version's number). */
  draftRevision: integer().notNull().default(1),
  /** The saved version the draft started from, if any. */
  basedOn: integer(),
  createdBy: namedUser(),
  ...timestamps,
}, t => [uniqueIndex('site_models_project_name_idx').on(t.projectId, t.name)])

/** An immutable snapshot of a model; a write to it is 409. */
export const siteModelVersions = pgTable('site_model_versions', {
  ...ownedRow('modelId', () => siteModels.id),
  version: integer().notNull(),
  definition: jsonb().$type<SiteModelDefinition>().notNull(),
  message: text().notNull(),
  status: modelVersionStatus().notNull().default('saved'),
  /** The version this one was saved from (a resubmission after a return names the returned version). */
  savedFrom: integer(),
  createdBy: namedUser(),
  createdAt: createdAt(),
  submittedBy: namedUser(),
  submittedAt: moment(),
  decidedBy: namedUser(),
  decidedAt: moment(),
  decisionComment: text(),
  /** Approval only: SHA-256 of the definition's canonical JSON (safe-stable-stringify). */
  approvalHash: text(),
  /** Approval only: the reason given for approving despite open exclude/questionable flags. */
  approvalOverride: text(),
  /** Approval only: the open flags on points the version's fits use, as they stood at approval. */
  approvalFlags: jsonb().$type<ApprovalFlagRecord[]>(),
  /** Set when a newer version of the same model is approved; the approval itself stays. */
  supersededAt: moment(),
  supersededBy: integer(),
}, t => [
  uniqueIndex('site_model_versions_model_version_idx').on(t.modelId, t.version),
  index('site_model_versions_model_idx').on(t.modelId),
  index('site_model_versions_status_idx').on(t.modelId, t.status),
])

/** A flag that stood open on a version's fitted points when it was approved. */
export interface ApprovalFlagRecord {
  flagId: string
  targetType: string
  targetId: string
  verdict: string
  comment: string
}

/** The reviewers a version was submitted to. */
export const siteModelVersionReviewers = pgTable('site_model_version_reviewers', {
  versionId: uuid().notNull().references(() => siteModelVersions.id, { onDelete: 'cascade' }),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  createdAt: createdAt(),
}, t => [
  primaryKey({ name: 'site_model_version_reviewers_pk', columns: [t.versionId, t.userId] }),
  index('site_model_version_reviewers_user_idx').on(t.userId),
])

export const VERSION_EVENT_KINDS = ['submitted', 'returned', 'approved', 'superseded'] as const
export const versionEventKind = pgEnum('version_event_kind', VERSION_EVENT_KINDS)

/** A version's review history, shown as its timeline: who did what, when, with which comment. */
export const siteModelVersionEvents = pgTable('site_model_version_events', {
  ...ownedRow('versionId', () => siteModelVersions.id),
  kind: versionEventKind().notNull(),
  actorId: namedUser(),
  comment: text().notNull().default(''),
  at: moment().notNull().defaultNow(),
}, t => [index('site_model_version_events_version_idx').on(t.versionId, t.at)])
