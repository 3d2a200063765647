import * as XLSX from 'xlsx-republish'
import { RESULT_CAUTION } from '#shared/caution'
import { MAX_SETTLEMENT_LAYERS } from '#shared/schemas/calc'
import { ModelIncompleteError } from '#shared/site-model/convert'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { VersionApproval } from '#shared/types/review-lifecycle'
import { sublayerTable } from '#shared/site-model/sublayers'
import type { ProjectRow } from '../utils/guards'
import { unprocessableError } from './http-errors'
import { exportUnits } from '~~/server/services/exports/logs'

export const EXPORT_SCHEMA = 'pastload.site-model-export'
export const EXPORT_SCHEMA_VERSION = 1

interface VersionMeta { version: number, message: string, status: string, createdAt: Date, author: string | null }

function tableOrRefuse(def: SiteModelDefinition, maxThickness: number) {
  try {
    return runEngine(() => sublayerTable(def, maxThickness))
  }
  catch (err) {
    if (err instanceof ModelIncompleteError) throw unprocessableError(err.message, { code: 'model-incomplete' })
    throw err
  }
}

/**
 * The export document (docs/site-model-schema.md): its `layers`, `groundwater`,
 * `surcharge` and `gammaW` are the settlement API's input as they are, so a
 * client adds a `load` and posts it to /api/calc/settlement. Its `sublayers`
 * ({ maxThickness }) is the settlement API's option of the same name, so the
 * engine's sublayers are the slices a compressibility depth trend was cut into.
 */
export function exportDocument(project: ProjectRow, model: { id: string, name: string }, v: VersionMeta & { definition: SiteModelDefinition, approval: VersionApproval | null }, maxThickness: number) {
  const { layers } = tableOrRefuse(v.definition, maxThickness)
  // A stratum with compressibility depth trends comes as slices of maxThickness: thin slices can outnumber what the settlement API takes.
  if (layers.length > MAX_SETTLEMENT_LAYERS) {
    throw unprocessableError(
      `At sublayers of ${maxThickness} m the depth trends of compressibility give ${layers.length} layers; the settlement API takes at most ${MAX_SETTLEMENT_LAYERS}. Ask for a larger maxThickness.`,
      { code: 'too-many-layers' },
    )
  }
  return {
    schema: EXPORT_SCHEMA,
    schemaVersion: EXPORT_SCHEMA_VERSION,
    project: { jobNumber: project.jobNumber, name: project.name, client: project.client },
    model: { id: model.id, name: model.name },
    version: { number: v.version, message: v.message, status: v.status, savedBy: v.author, savedAt: v.createdAt.toISOString() },
    /** Who approved this version, when, and the SHA-256 of its definition's canonical JSON; null unless approved. */
    approval: v.approval,
    units: { length: 'm', stress: 'kPa', unitWeight: 'kN/m³', cv: 'm²/year' },
    caution: RESULT_CAUTION,
    surcharge: v.definition.surcharge,
    gammaW: v.definition.gammaW,
    groundwater: v.definition.groundwater,
    layers,
    sublayers: { maxThickness },
    strata: v.definition.strata,
    flagsInForce: v.definition.flagsInForce,
  }
}

export function exportWorkbook(project: ProjectRow, model: { name: string }, v: VersionMeta & { definition: SiteModelDefinition }, maxThickness: number): Buffer {
  const { rows } = tableOrRefuse(v.definition, maxThickness)
  // In the project's units, labelled in each heading (the JSON export stays SI, as its own `units` says).
  const u = exportUnits(project)
  const cvLabel = u.label('coefficientOfConsolidation')
  const wb = XLSX.utils.book_new()
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([
    ['Project', `${project.jobNumber} ${project.name}`],
    ['Model', `${model.name}, version ${v.version}`],
    ['Saved', `${v.createdAt.toISOString()} by ${v.author ?? 'unknown'}: ${v.message}`],
    ['Status', v.status],
    ['Sublayers', `at most ${u.len(maxThickness)} ${u.label('length')} thick; stresses at mid-depth`],
    ['Units', `${u.label('length')}, ${u.label('stress')}, ${cvLabel}`],
    ['Caution', RESULT_CAUTION],
  ]), 'About')
  const head = ['Layer', u.head('Top', 'length'), u.head('Bottom', 'length'), u.head('Mid-depth', 'length'), u.head("σ'v0", 'stress'), u.head("σ'p", 'stress'), 'OCR', u.head('POP', 'stress'), 'Cc', 'Cr', 'e0', `cv (${cvLabel})`]
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([head, ...rows.map(r => [r.layer, u.len(r.top), u.len(r.bottom), u.len(r.depth), u.stress(r.effectiveStress), u.stress(r.preconsolidation), r.ocr, u.stress(r.pop), r.cc, r.cr, r.e0, u.cv(r.cv)])]), 'Sublayers')
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer
}
