/**
 * Replies of the import routes. `Server…` is what a route returns, the plain
 * name what the page reads (a spreadsheet's date cells as ISO strings).
 */
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
  warnings: AgsRowError[]
}

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
