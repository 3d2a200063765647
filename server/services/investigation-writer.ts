import type { InvestigationRecord } from '#shared/investigation/types'
import { pointHeader } from '#shared/investigation/point-header'
import { float8ArrayParam } from '../db/binary'
import { cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, oedometerTests, samples, sptResults, strata, vaneReadings } from '../db/schema'
import type { Tx } from '../db/client'
import { knownEntry, present } from '../db/rows'
import { sptFromStored, sptStored } from '#shared/investigation/spt-blows'

const CHUNK = 1000

async function inChunks<T>(rows: T[], insert: (chunk: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += CHUNK) await insert(rows.slice(i, i + CHUNK))
}

/**
 * Writes a whole investigation (strata, points and everything logged at them)
 * into a project inside the caller's transaction: used by the demo seed and the
 * AGS4 import. Strata already in the project with the same code are reused.
 * Oedometer tests on samples are written too (stages as void ratios), unless
 * `oedometer: false` (the demo seed writes its own, with time readings).
 * Returns the ids it created, by identifier, for callers that add more.
 * Points named in `options.existingPoints` (identifier → id) are not created: their rows are added
 * to the stored point (an import that merges into holes already in the project).
 */
export async function writeInvestigation(tx: Tx, projectId: string, data: InvestigationRecord, existingStrata: Map<string, string> = new Map(), options: { oedometer?: boolean, existingPoints?: ReadonlyMap<string, string> } = {}) {
  const strataIds = new Map(existingStrata)
  const newStrata = data.strata.filter(s => !strataIds.has(s.code))
  if (newStrata.length) {
    const rows = await tx.insert(strata).values(newStrata.map(s => ({ ...s, projectId }))).returning({ id: strata.id, code: strata.code })
    for (const r of rows) strataIds.set(r.code, r.id)
  }
  const pointIds = new Map<string, string>()
  const sampleIds = new Map<string, string>()
  if (data.points.length === 0) return { strataIds, pointIds, sampleIds }
  const newPoints = data.points.filter(p => !options.existingPoints?.has(p.identifier))
  for (const p of data.points) {
    const id = options.existingPoints?.get(p.identifier)
    if (id) pointIds.set(p.identifier, id)
  }
  const pointRows = newPoints.length
    ? await tx.insert(investigationPoints).values(newPoints.map(p => ({
      projectId,
      ...pointHeader(p),
    }))).returning({ id: investigationPoints.id, identifier: investigationPoints.identifier })
    : []
  for (const r of pointRows) pointIds.set(r.identifier, r.id)

  const intervals = data.points.flatMap(p => p.intervals.map(i => ({ ...i, stratumCode: undefined, pointId: knownEntry(pointIds, p.identifier), stratumId: i.stratumCode ? strataIds.get(i.stratumCode) ?? null : null })))
  await inChunks(intervals.map(({ stratumCode: _c, ...rest }) => rest), c => tx.insert(logIntervals).values(c))

  const sampleList = data.points.flatMap(p => p.samples.map(s => ({ p, s })))
  if (sampleList.length) {
    const rows = await tx.insert(samples).values(sampleList.map(({ p, s }) => ({
      pointId: knownEntry(pointIds, p.identifier), identifier: s.identifier, top: s.top, bottom: s.bottom, type: s.type, recovery: s.recovery, remarks: s.remarks,
    }))).returning({ id: samples.id })
    // RETURNING gives the rows back in the order of the VALUES list.
    sampleList.forEach(({ p, s }, i) => sampleIds.set(`${p.identifier}/${s.identifier}`, present(rows[i], 'An inserted sample').id))
    const idx = sampleList.flatMap(({ p, s }) => (s.index ? [{ ...s.index, sampleId: knownEntry(sampleIds, `${p.identifier}/${s.identifier}`) }] : []))
    await inChunks(idx, c => tx.insert(indexTests).values(c))
    if (options.oedometer ?? true) {
      const tests = sampleList.flatMap(({ p, s }) => (s.oedometer
        ? [{
            sampleId: knownEntry(sampleIds, `${p.identifier}/${s.identifier}`),
            label: `${s.identifier} oedometer`,
            testType: s.oedometer.testType,
            // The interchange model gives the height in m; tests store mm.
            specimenHeight: Math.round(s.oedometer.specimenHeight * 1000 * 1000) / 1000,
            initialWaterContent: s.oedometer.initialWaterContent,
            specificGravity: s.oedometer.specificGravity,
            e0: s.oedometer.e0,
            convention: 'void-ratio' as const,
            stages: s.oedometer.stages.map(st => ({ stress: st.stress, entered: st.voidRatio, voidRatio: st.voidRatio })),
            remarks: s.oedometer.remarks,
          }]
        : []))
      await inChunks(tests, c => tx.insert(oedometerTests).values(c))
    }
  }
  await inChunks(data.points.flatMap(p => p.spt.map(s => ({ pointId: knownEntry(pointIds, p.identifier), depth: s.depth, ...sptStored(sptFromStored(s)) }))), c => tx.insert(sptResults).values(c))
  await inChunks(data.points.flatMap(p => p.groundwater.map(g => ({ ...g, pointId: knownEntry(pointIds, p.identifier) }))), c => tx.insert(groundwaterObservations).values(c))
  await inChunks(data.points.flatMap(p => p.vane.map(v => ({ ...v, pointId: knownEntry(pointIds, p.identifier) }))), c => tx.insert(vaneReadings).values(c))
  for (const p of data.points) {
    if (!p.cpt) continue
    await tx.insert(cptSoundings).values({ pointId: knownEntry(pointIds, p.identifier), areaRatio: p.cpt.areaRatio, count: p.cpt.depth.length, depth: float8ArrayParam(p.cpt.depth), qc: float8ArrayParam(p.cpt.qc), fs: float8ArrayParam(p.cpt.fs), u2: float8ArrayParam(p.cpt.u2) })
  }
  return { strataIds, pointIds, sampleIds }
}
