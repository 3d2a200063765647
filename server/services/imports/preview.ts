import { and, eq } from 'drizzle-orm'
import { type ImportTarget, suggestMapping } from '#shared/imports/targets'
import type { PlainCsvText } from '#shared/imports/cpt-csv'
import type { ServerImportPreview } from '#shared/types/imports'
import { useDb } from '~~/server/db/client'
import { importFiles, importMappings } from '~~/server/db/schema'
import { notFound, unprocessableError } from '../http-errors'
import { ImportLimitError } from '#shared/imports/limits'
import { openPlainCsv, readTable, UploadError, type UploadFormat } from './files'
import { WorkbookRefusal } from './workbook'

export const PREVIEW_ROWS = 20

export async function loadImportFile(projectId: string, importId: string) {
  const [file] = await useDb().select({ id: importFiles.id, filename: importFiles.filename, format: importFiles.format, content: importFiles.content }).from(importFiles).where(and(eq(importFiles.id, importId), eq(importFiles.projectId, projectId)))
  if (!file) notFound('Upload')
  return file
}

/** A refusal of the file as the JSON error it answers (422, or 503 while the workbook readers are all busy); anything else as it is. */
export function asUploadRefusal(err: unknown): unknown {
  if (err instanceof UploadError || err instanceof ImportLimitError) return unprocessableError(err.message, { code: err.code })
  if (err instanceof WorkbookRefusal) {
    return err.status === 503
      ? createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: err.message, data: { code: err.code } })
      : unprocessableError(err.message, { code: err.code })
  }
  return err
}

export async function tableOrThrow(content: Buffer, format: UploadFormat, filename: string, sheet?: string, previewRows?: number, target?: ImportTarget) {
  if (format === 'ags4') throw unprocessableError('An AGS4 file is imported whole; it has no columns to map.')
  try {
    return await readTable(content, format, filename, sheet, previewRows, target)
  }
  catch (err) {
    throw asUploadRefusal(err)
  }
}

/** A plain CSV (no quotes) for the one-pass CPT check, or null when the general reader must read it. */
export function plainCsvOrThrow(content: Buffer, filename: string): PlainCsvText | null {
  try {
    return openPlainCsv(content, filename)
  }
  catch (err) {
    throw asUploadRefusal(err)
  }
}

/** Headers, the first rows, and a mapping: the saved one for this target (with its columns' units) when its columns are all present, else a suggestion. */
export async function previewTable(projectId: string, file: { content: Buffer, format: string, filename: string }, target?: ImportTarget, sheet?: string): Promise<ServerImportPreview> {
  const table = await tableOrThrow(file.content, file.format as UploadFormat, file.filename, sheet, PREVIEW_ROWS)
  let mapping: Record<string, string> | null = null
  let mappingSource: 'saved' | 'suggested' | null = null
  let units: Record<string, string> | null = null
  if (target) {
    const [saved] = await useDb().select().from(importMappings).where(and(eq(importMappings.projectId, projectId), eq(importMappings.target, target)))
    if (saved && Object.values(saved.mapping).every(h => table.headers.includes(h))) {
      mapping = saved.mapping
      mappingSource = 'saved'
      units = saved.units ?? null
    }
    else {
      mapping = suggestMapping(target, table.headers)
      mappingSource = 'suggested'
    }
  }
  return {
    sheets: table.sheets,
    sheet: table.sheet,
    headers: table.headers,
    rowCount: table.rowCount,
    preview: table.rows.slice(0, PREVIEW_ROWS),
    mapping,
    mappingSource,
    units,
  }
}
