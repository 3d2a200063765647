/**
 * Replies of the import routes. `Server…` is what a route returns, the plain
 * name what the page reads (a spreadsheet's date cells as ISO strings).
 */
import type { HoleImportMode, HolePreview } from '#shared/imports/hole-plan'
import type { RowError } from '#shared/imports/targets'
import type { Serialize } from './serialize'

/** What the upload route recognises a file as. */
export type ImportFormat = 'csv' | 'xlsx' | 'ags4'

/** A cell of a read table. */
export type ServerImportCell = string | number | boolean | Date | null

/** The first rows of a CSV or XLSX file with the mapping to start from (`previewTable`). */
export interface ServerImportPreview {
  sheets: string[]
  sheet: string | null
  headers: string[]
  rowCount: number
  preview: ServerImportCell[][]
  mapping: Record<string, string> | null
  mappingSource: 'saved' | 'suggested' | null
  /** The unit of each numeric column saved with the mapping (`{ qc: 'MPa' }`); null when none was saved. */
  units: Record<string, string> | null
}
export type ImportPreview = Serialize<ServerImportPreview>

/** An AGS4 finding as a row of the report. */
export interface AgsRowError extends RowError { rule: string }

/** What an AGS4 file holds and what its check found. */
export interface AgsPreview {
  groups: { name: string, rows: number, line: number }[]
  unknownGroups: string[]
  /** Codes used by the log with no GEOL definition, with the name the file gives them. */
  undefinedStrata: { code: string, name: string }[]
  summary: Record<string, number>
  errors: AgsRowError[]
  /** All errors found, also when `errors` lists only the first 500. */
  errorCount: number
  warnings: AgsRowError[]
}

/** POST …/imports/:importId/commit-ags: the plan per hole (a dry run) or what was written. */
export interface ServerAgsCommitReply {
  dryRun: boolean
  mode: HoleImportMode
  summary: Record<string, number>
  unknownGroups: string[]
  warnings: AgsRowError[]
  holes: HolePreview[]
  holeCounts: { add: number, skip: number, update: number, replace: number }
  /** Why a commit in this mode would be refused (409), in plain words; null when it can go ahead. */
  refusal: string | null
}
export type AgsCommitReply = Serialize<ServerAgsCommitReply>

/** A log interval import's effect on one point: its stored intervals are replaced by the file's. */
export interface LogReplacement { point: string, before: number, after: number }

/** POST …/imports/:importId/commit with `dryRun`: the rows checked and, for intervals, the logs each point loses. */
export interface ImportDryRunReply { dryRun: true, rowCount: number, errors: [], replaces?: LogReplacement[] }

/** POST …/imports (201): the stored upload with its preview. */
export interface ServerImportUpload {
  importId: string
  filename: string
  format: ImportFormat
  size: number
  preview: ServerImportPreview | null
  ags: AgsPreview | null
}
export type ImportUpload = Serialize<ServerImportUpload>

/** GET …/imports/:importId: the preview again, for another sheet or target. */
export interface ServerImportPreviewReply { importId: string, filename: string, format: string, preview: ServerImportPreview }
export type ImportPreviewReply = Serialize<ServerImportPreviewReply>
