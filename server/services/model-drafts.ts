import { and, asc, desc, eq, isNull, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import { computeStressProfile } from '#shared/geotech/stress'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { toStressInput } from '#shared/site-model/convert'
import { diffDefinitions } from '#shared/site-model/diff'
import { describeChanges } from '#shared/site-model/change-words'
import type { UnitSystem, UsStressUnit } from '#shared/units'
import type { ServerCompareAnswer, ServerSiteModelRecord, ServerSiteModelRow } from '#shared/types/models'
import { useDb } from '../db/client'
import { anyOf } from '../db/any'
import { projects, siteModels, siteModelVersions } from '../db/schema'
import type { ProjectRow } from '../utils/guards'
import { runEngine } from '../utils/engine'
import { recordAudit } from './audit'
import { exportName } from './exports/logs'
import { conflictOnDuplicate, notFound, versionedUpdate } from './http-errors'
import { exportDocument, exportWorkbook } from './model-export'
import { approvalOf } from './model-review'
import { assertChangedSince, assertDefinitionComputable, assertTrendProblemsAnswered, latestVersion, listVersions, requireModel, requireVersion } from './model-versions'
import { flagsInForce } from './review'
import { definitionFromLogs } from './site-models'

type ModelRow = ServerSiteModelRecord

/**
 * A model as the API shows it: the draft's revision keeps its public name `version`
 * (the field clients send back to save the draft or a version).
 */
export function modelJson({ draftRevision, ...model }: ModelRow): ServerSiteModelRow {
  return { ...model, version: draftRevision }
}

/** The project's site models with their latest saved version. */
export async function listModels(projectId: string) {
  const db = useDb()
  const models = await db.select({ id: siteModels.id, name: siteModels.name, description: siteModels.description, version: siteModels.draftRevision, basedOn: siteModels.basedOn, updatedAt: siteModels.updatedAt })
    .from(siteModels).where(eq(siteModels.projectId, projectId)).orderBy(asc(siteModels.name))
  const versions = models.length
    ? await db.select({ modelId: siteModelVersions.modelId, version: siteModelVersions.version, status: siteModelVersions.status, createdAt: siteModelVersions.createdAt, message: siteModelVersions.message, supersededAt: siteModelVersions.supersededAt, decidedAt: siteModelVersions.decidedAt })
      .from(siteModelVersions).where(anyOf(siteModelVersions.modelId, models.map(m => m.id))).orderBy(desc(siteModelVersions.version))
    : []
  return models.map((m) => {
    const own = versions.filter(v => v.modelId === m.id)
    const latest = own[0]
    const approved = own.find(v => v.status === 'approved' && v.supersededAt === null)
    return {
      ...m,
      latest: latest ? { modelId: latest.modelId, version: latest.version, status: latest.status, createdAt: latest.createdAt, message: latest.message } : null,
      versionCount: own.length,
      approved: approved ? { version: approved.version, decidedAt: approved.decidedAt } : null,
    }
  })
}

/** The model with its draft and the list of saved versions. */
export async function modelDetail(projectId: string, modelId: string) {
  const model = await requireModel(projectId, modelId)
  return { model: modelJson(model), versions: await listVersions(modelId) }
}

/** A new site model: its draft starts from the project's logs, or from a saved version (a taken name is 409). */
export async function createModel(projectId: string, actorId: string, body: { name: string, description: string, from?: { modelId: string, version: number } }) {
  let draft: SiteModelDefinition
  let basedOn: number | null = null
  if (body.from) {
    await requireModel(projectId, body.from.modelId)
    const v = await requireVersion(body.from.modelId, body.from.version)
    draft = v.definition
    basedOn = v.version
  }
  else {
    draft = await definitionFromLogs(projectId)
  }
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const row = returnedRow(await tx.insert(siteModels).values({ projectId, name: body.name, description: body.description, draft, basedOn, createdBy: actorId }).returning())
    // The project's first model (or the first after its design model was deleted) becomes its design model.
    await tx.update(projects).set({ designModelId: row.id }).where(and(eq(projects.id, projectId), isNull(projects.designModelId)))
    await recordAudit({ actorId, projectId, action: 'create', entity: 'site-model', entityId: row.id, after: { name: row.name, basedOn } }, tx)
    return modelJson(row)
  }), `A model named "${body.name}" already exists in this project.`)
}

/** Saves the editable draft (not a version); a stale revision is 409 with the current draft. */
export async function saveDraft(projectId: string, actorId: string, modelId: string, { draft, version }: { draft: SiteModelDefinition, version: number }) {
  assertDefinitionComputable(draft)
  return useDb().transaction(async (tx) => {
    const before = await requireModel(projectId, modelId, tx)
    const model = await versionedUpdate({
      entity: 'Model draft',
      update: async () => (await tx.update(siteModels).set({ draft, draftRevision: sql`${siteModels.draftRevision} + 1` })
        .where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, projectId), eq(siteModels.draftRevision, version))).returning()).map(modelJson),
      current: () => modelJson(before),
    })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-draft', entityId: modelId, before: before.draft, after: draft }, tx)
    return model
  })
}

/** Starts a new draft from a saved version (the old draft is kept in the audit log). */
export async function checkoutVersion(projectId: string, actorId: string, modelId: string, version: number) {
  const v = await requireVersion(modelId, version)
  return useDb().transaction(async (tx) => {
    const before = await requireModel(projectId, modelId, tx)
    const row = returnedRow(await tx.update(siteModels).set({ draft: { ...v.definition, flagsInForce: [] }, basedOn: version, draftRevision: sql`${siteModels.draftRevision} + 1` })
      .where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, projectId))).returning())
    await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-draft', entityId: modelId, before: before.draft, after: { checkedOut: version } }, tx)
    return modelJson(row)
  })
}

/**
 * Saves the current draft as the next immutable version, with the reviewer flags in force at that
 * moment. `draftRevision` is the revision the client has seen, so it never saves a draft it has not
 * looked at (409 otherwise).
 */
export async function saveVersion(projectId: string, actorId: string, modelId: string, { message, draftRevision }: { message: string, draftRevision: number }) {
  return useDb().transaction(async (tx) => {
    const [model] = await tx.select().from(siteModels).where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, projectId))).for('update')
    if (!model) notFound('Model')
    if (model.draftRevision !== draftRevision) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'The draft changed since you opened it; review it before saving a version.', data: { current: modelJson(model) } })
    }
    const definition = { ...model.draft, flagsInForce: await flagsInForce(projectId) }
    assertDefinitionComputable(definition)
    assertTrendProblemsAnswered(definition)
    const previous = await latestVersion(tx, modelId)
    assertChangedSince(previous, definition)
    const number = (previous?.version ?? 0) + 1
    // savedFrom: the version the draft started from (a returned version is resubmitted as a new version saved from it).
    const row = returnedRow(await tx.insert(siteModelVersions).values({ modelId, version: number, definition, message, savedFrom: model.basedOn, createdBy: actorId }).returning())
    await tx.update(siteModels).set({ basedOn: number, draftRevision: sql`${siteModels.draftRevision} + 1` }).where(eq(siteModels.id, modelId))
    await recordAudit({ actorId, projectId, action: 'create', entity: 'site-model-version', entityId: row.id, after: { modelId, version: number, message } }, tx)
    return row
  })
}

/** One saved version of a project's model, with the model's name. */
export async function projectVersion(projectId: string, modelId: string, version: number) {
  const model = await requireModel(projectId, modelId)
  return { model, version: await requireVersion(modelId, version) }
}

/** Saved versions are immutable: a write to one (that exists) is 409, pointing at a new draft from it. */
export async function refuseVersionWrite(projectId: string, modelId: string, version: number): Promise<never> {
  await projectVersion(projectId, modelId, version)
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Version ${version} is saved and cannot be changed. Start a new draft from it and save a new version.` })
}

/** What changed between two saved versions, and both stress profiles to overlay. */
export async function compareVersions(projectId: string, modelId: string, a: number, b: number, units: UnitSystem = 'SI', usStress: UsStressUnit = 'psf'): Promise<ServerCompareAnswer> {
  await requireModel(projectId, modelId)
  const [va, vb] = await Promise.all([requireVersion(modelId, a), requireVersion(modelId, b)])
  const profile = (def: SiteModelDefinition) => runEngine(() => computeStressProfile(toStressInput(def))).points
  return {
    a: { version: a, message: va.message, savedAt: va.createdAt, author: va.author },
    b: { version: b, message: vb.message, savedAt: vb.createdAt, author: vb.author },
    changes: diffDefinitions(va.definition, vb.definition).filter(c => !c.path.startsWith('flagsInForce')),
    summary: describeChanges(va.definition, vb.definition, { units, convert: { usStress } }),
    flagsChanged: diffDefinitions(va.definition.flagsInForce, vb.definition.flagsInForce).length > 0,
    profiles: { a: profile(va.definition), b: profile(vb.definition) },
  }
}

/** A saved version for other tools: the JSON export document, or the XLSX sublayer table with its file name. */
export async function exportVersion(project: ProjectRow, modelId: string, version: number, { format, maxThickness }: { format: 'json' | 'xlsx', maxThickness: number }) {
  const { model, version: v } = await projectVersion(project.id, modelId, version)
  const approval = await approvalOf(v)
  if (format === 'xlsx') {
    return { format, filename: exportName(project, `${model.name}-v${version}-sublayers`, 'xlsx'), workbook: exportWorkbook(project, model, v, maxThickness) } as const
  }
  return { format, document: exportDocument(project, model, { ...v, approval }, maxThickness) } as const
}
