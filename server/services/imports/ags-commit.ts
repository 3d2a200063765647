import { and, eq, sql } from 'drizzle-orm'
import { type ExistingHole, holePlanIssues, type HoleImportMode, type HolePlan, planHoleImport, previewHole } from '#shared/imports/hole-plan'
import { checkPointLimit } from '#shared/imports/limits'
import { pointHeader } from '#shared/investigation/point-header'
import type { PointRecord } from '#shared/investigation/types'
import type { ServerAgsCommitReply } from '#shared/types/imports'
import { useDb, type Tx } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { attachments, cptSoundings, groundwaterObservations, importFiles, indexTests, investigationPoints, logIntervals, samples, sptResults, strata, vaneReadings } from '~~/server/db/schema'
import { recordAudit } from '../audit'
import { loadInvestigationRows } from '../exports/logs'
import { unprocessableError } from '../http-errors'
import { writeInvestigation } from '../investigation-writer'
import { agsLineOf, analyseAgsOrThrow, asRowErrors } from './ags'
import { projectDepthWords } from '../project-units'
import { holdPointLimit } from './commit'
import { asUploadRefusal, loadImportFile } from './preview'

const MAX_REPORTED = 500

/** The holes of the file that are already in the project, with their rows' ids and what depends on their samples. */
async function existingHoles(projectId: string, identifiers: readonly string[]): Promise<Map<string, ExistingHole>> {
  const wanted = new Set(identifiers)
  const out = new Map<string, ExistingHole>()
  if (!wanted.size) return out
  const rows = await loadInvestigationRows(projectId)
  const matching = rows.points.filter(p => wanted.has(p.record.identifier))
  const sampleIds = matching.flatMap(p => p.sampleIds)
  const attached = new Map<string, number>()
  if (sampleIds.length) {
    const found = await useDb().select({ ownerId: attachments.ownerId }).from(attachments)
      .where(and(eq(attachments.projectId, projectId), eq(attachments.ownerType, 'sample'), anyOf(attachments.ownerId, sampleIds)))
    for (const a of found) if (a.ownerId) attached.set(a.ownerId, (attached.get(a.ownerId) ?? 0) + 1)
  }
  for (const p of matching) {
    out.set(p.record.identifier, {
      id: p.id,
      point: p.record,
      intervalIds: p.intervalIds,
      sampleIds: p.sampleIds,
      sampleTies: p.sampleIds.map((id, i) => ({ oedometerTests: p.sampleTestCounts[i] ?? 0, attachments: attached.get(id) ?? 0 })),
      sptIds: p.sptIds,
      groundwaterIds: p.groundwaterIds,
      vaneIds: p.vaneIds,
    })
  }
  return out
}

/** What the writer adds for a hole: everything for a new one, the added and changed rows (and a new CPT) for a matching one. */
function rowsToWrite(plan: HolePlan): PointRecord | null {
  if (plan.action === 'skip') return null
  if (plan.action === 'add') return plan.incoming
  return {
    ...plan.incoming,
    intervals: [...plan.intervals.changed.map(c => c.after), ...plan.intervals.added],
    samples: plan.samples.added,
    spt: [...plan.spt.changed.map(c => c.after), ...plan.spt.added],
    groundwater: [...plan.groundwater.changed.map(c => c.after), ...plan.groundwater.added],
    vane: [...plan.vane.changed.map(c => c.after), ...plan.vane.added],
    cpt: plan.cpt === 'add' || plan.cpt === 'change' ? plan.incoming.cpt : null,
  }
}

const idsOf = <T>(d: { changed: { id: string }[], removed: { id: string, row: T }[] }) => [...d.changed.map(c => c.id), ...d.removed.map(r => r.id)]

/** Changes a matching hole in place: header, rows that change or go, samples by reference. Rows to add are written after. */
async function applyInPlace(tx: Tx, plan: HolePlan, replace: boolean) {
  const pointId = plan.pointId!
  if (plan.header.length) {
    await tx.update(investigationPoints).set({ ...pointHeader(plan.incoming), version: sql`${investigationPoints.version} + 1`, updatedAt: new Date() }).where(eq(investigationPoints.id, pointId))
  }
  // Changed rows go and come back as the file has them (their natural key is what identifies them).
  const gone = { intervals: idsOf(plan.intervals), spt: idsOf(plan.spt), groundwater: idsOf(plan.groundwater), vane: idsOf(plan.vane) }
  if (gone.intervals.length) await tx.delete(logIntervals).where(anyOf(logIntervals.id, gone.intervals))
  if (gone.spt.length) await tx.delete(sptResults).where(anyOf(sptResults.id, gone.spt))
  if (gone.groundwater.length) await tx.delete(groundwaterObservations).where(anyOf(groundwaterObservations.id, gone.groundwater))
  if (gone.vane.length) await tx.delete(vaneReadings).where(anyOf(vaneReadings.id, gone.vane))
  if (plan.samples.removed.length) await tx.delete(samples).where(anyOf(samples.id, plan.samples.removed.map(r => r.id)))
  // A sample keeps its id (and its tests and attachments): its fields and index tests change in place.
  for (const c of plan.samples.changed) {
    const s = c.after
    await tx.update(samples).set({ top: s.top, bottom: s.bottom, type: s.type, recovery: s.recovery, remarks: s.remarks, version: sql`${samples.version} + 1`, updatedAt: new Date() }).where(eq(samples.id, c.id))
    if (s.index) {
      await tx.insert(indexTests).values({ ...s.index, sampleId: c.id })
        .onConflictDoUpdate({ target: indexTests.sampleId, set: { ...s.index, version: sql`${indexTests.version} + 1`, updatedAt: new Date() } })
    }
    else if (replace && c.before.index) await tx.delete(indexTests).where(eq(indexTests.sampleId, c.id))
  }
  if (plan.cpt === 'change' || plan.cpt === 'remove') await tx.delete(cptSoundings).where(eq(cptSoundings.pointId, pointId))
}

/**
 * Imports an uploaded AGS4 file in one transaction. Holes new to the project are added; holes already
 * there are skipped, merged or replaced as `mode` says (shared/imports/hole-plan.ts). Every problem is
 * reported at its file line (422, nothing written), Pastload's log rules checked on each hole as it
 * would be after the import. A replace that would remove a sample with oedometer tests or attachments
 * is refused (409) with the reason; the dry run answers the same plan, per hole, without writing.
 */
export async function commitAgsImport(args: { projectId: string, actorId: string, importId: string, dryRun: boolean, mode: HoleImportMode }): Promise<ServerAgsCommitReply> {
  const { projectId, actorId, mode } = args
  const file = await loadImportFile(projectId, args.importId)
  if (file.format !== 'ags4') throw unprocessableError(`${file.filename} is not an AGS4 file; map its columns instead.`)
  const words = (await projectDepthWords(projectId)).intervals
  const a = analyseAgsOrThrow(file.content, file.filename, words)
  const existing = await existingHoles(projectId, a.data.points.map(p => p.identifier))
  const plans = planHoleImport(a.data.points, existing, mode)
  // Pastload's own log rules are checked on the holes as they would be after the import, not on the file alone.
  const errors = asRowErrors(a.errors.filter(i => i.rule !== 'pastload'))
  for (const issue of holePlanIssues(plans, existing, words)) {
    const group = issue.kind === 'interval' ? 'GEOL' : 'SAMP'
    const line = issue.fromFile ? agsLineOf(a.file, group, issue.identifier, issue.kind === 'interval' ? 'GEOL_TOP' : 'SAMP_TOP', issue.top) : agsLineOf(a.file, 'LOCA', issue.identifier)
    errors.push({ row: line, column: issue.fromFile ? group : 'LOCA', message: issue.message, rule: 'pastload' })
  }
  errors.sort((x, y) => x.row - y.row)
  if (errors.length) {
    const first = errors[0]!
    throw unprocessableError(
      `${errors.length} problem(s) in ${file.filename}; nothing was imported. First: ${first.row ? `line ${first.row}` : 'the whole file'}, ${first.column}: ${first.message}`,
      { errors: errors.slice(0, MAX_REPORTED), errorCount: errors.length, unknownGroups: a.unknownGroups },
    )
  }
  const adding = plans.filter(p => p.action === 'add').length
  try {
    checkPointLimit(await countPoints(projectId), adding)
  }
  catch (err) {
    throw asUploadRefusal(err)
  }
  const holes = plans.map(previewHole)
  const count = (action: HolePlan['action']) => plans.filter(p => p.action === action).length
  const blockers = plans.flatMap(p => p.blockers)
  const reply: ServerAgsCommitReply = {
    dryRun: args.dryRun,
    mode,
    summary: a.summary,
    unknownGroups: a.unknownGroups,
    warnings: asRowErrors(a.warnings).slice(0, MAX_REPORTED),
    holes,
    holeCounts: { add: adding, skip: count('skip'), update: count('update'), replace: count('replace') },
    refusal: blockers.length ? blockers.join(' ') : null,
  }
  if (args.dryRun) return reply
  if (blockers.length) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: blockers.join(' '), data: { blockers, holes } })
  }
  const existingPoints = new Map(plans.filter(p => p.pointId && p.action !== 'skip').map(p => [p.identifier, p.pointId!]))
  await useDb().transaction(async (tx) => {
    await holdPointLimit(tx, projectId, adding)
    for (const plan of plans) if (plan.action === 'update' || plan.action === 'replace') await applyInPlace(tx, plan, plan.action === 'replace')
    const existingStrata = new Map((await tx.select({ id: strata.id, code: strata.code }).from(strata).where(eq(strata.projectId, projectId))).map(s => [s.code, s.id]))
    const points = plans.map(rowsToWrite).filter((p): p is PointRecord => p !== null)
    await writeInvestigation(tx, projectId, { ...a.data, points }, existingStrata, { existingPoints })
    await recordAudit({
      actorId, projectId, action: 'import', entity: 'ags4',
      after: { filename: file.filename, mode, ...a.summary, unknownGroups: a.unknownGroups, holes: reply.holeCounts, changes: holes.slice(0, 200).map(h => h.summary) },
    }, tx)
    await tx.delete(importFiles).where(eq(importFiles.id, file.id))
  }).catch((err: unknown) => {
    throw asUploadRefusal(err)
  })
  return reply
}

async function countPoints(projectId: string): Promise<number> {
  const [row] = await useDb().select({ n: sql<number>`count(*)::int` }).from(investigationPoints).where(eq(investigationPoints.projectId, projectId))
  return row?.n ?? 0
}
