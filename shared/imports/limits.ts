import type { ImportTarget } from './targets'
import { groupThousands } from '../text/count'

/**
 * What one upload or one project may hold. The upload size itself is limited
 * where the body is read (25 MB); these bound the work a file can cause once it
 * is in: a workbook's unpacked size, the rows one import takes, and the points a
 * project holds. docs/api.md states the same figures.
 */

/** Points one project may hold; an import that would pass it writes nothing. */
export const PROJECT_POINT_LIMIT = 20_000

/** The sum of a workbook's unpacked parts (sheet XML, shared strings, styles…), read from its ZIP directory before unpacking. */
export const WORKBOOK_UNPACKED_LIMIT = 50 * 1024 * 1024

/** Data rows one import of each target takes (blank rows not counted). */
export const IMPORT_ROW_LIMITS: Record<ImportTarget, number> = {
  'points': PROJECT_POINT_LIMIT,
  'intervals': 200_000,
  'samples': 100_000,
  'index-tests': 100_000,
  'groundwater': 100_000,
  // One sounding at 1 cm over 250 m; benchmarks import 200 000 rows.
  'cpt': 250_000,
  'oedometer-stages': 1_000,
  'vane': 100_000,
}

/** Rows any uploaded table may hold (the largest target's limit): checked at upload, before a target is chosen. */
export const UPLOAD_ROW_LIMIT = Math.max(...Object.values(IMPORT_ROW_LIMITS))

/** Lines an AGS4 file may hold (all groups, headings and units included). */
export const AGS_LINE_LIMIT = 1_000_000

const TARGET_WORDS: Record<ImportTarget, string> = {
  'points': 'points',
  'intervals': 'log intervals',
  'samples': 'samples',
  'index-tests': 'index tests',
  'groundwater': 'groundwater observations',
  'cpt': 'a CPT sounding',
  'oedometer-stages': 'oedometer stages',
  'vane': 'vane readings',
}

/** A file that is over one of these limits: the server answers 422 with the message. */
export class ImportLimitError extends Error {
  constructor(message: string, readonly code: 'workbook-too-large' | 'too-many-rows' | 'too-many-points') {
    super(message)
  }
}


function megabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024)
  return mb >= 10 ? mb.toFixed(0) : mb.toFixed(1)
}

export function workbookTooLarge(filename: string, unpacked: number): ImportLimitError {
  return new ImportLimitError(`${filename} unpacks to ${megabytes(unpacked)} MB; the limit for a workbook is ${megabytes(WORKBOOK_UNPACKED_LIMIT)} MB. Split it or save the sheet you need as CSV.`, 'workbook-too-large')
}

/** `rows` is the count found, `atLeast` when reading stopped at the limit and the rest was not counted. */
export function tooManyRows(filename: string, rows: number, target: ImportTarget | null, atLeast = false): ImportLimitError {
  const limit = target ? IMPORT_ROW_LIMITS[target] : UPLOAD_ROW_LIMIT
  const found = atLeast ? `more than ${groupThousands(limit)}` : groupThousands(rows)
  const what = target ? `an import of ${TARGET_WORDS[target]} takes at most ${groupThousands(limit)}` : `an import takes at most ${groupThousands(limit)}`
  return new ImportLimitError(`${filename} has ${found} data rows; ${what}. Split the file and import it in parts.`, 'too-many-rows')
}

export function tooManyAgsLines(filename: string, lines: number): ImportLimitError {
  return new ImportLimitError(`${filename} has ${groupThousands(lines)} lines; an AGS4 import takes at most ${groupThousands(AGS_LINE_LIMIT)}. Split the file and import it in parts.`, 'too-many-rows')
}

/** Refuses an import that would bring the project past its point limit. */
export function checkPointLimit(existing: number, adding: number): void {
  if (adding > 0 && existing + adding > PROJECT_POINT_LIMIT) {
    throw new ImportLimitError(`This import adds ${groupThousands(adding)} ${adding === 1 ? 'point' : 'points'} to the project's ${groupThousands(existing)}; a project holds at most ${groupThousands(PROJECT_POINT_LIMIT)} points. Nothing was imported.`, 'too-many-points')
  }
}
