/**
 * The shapes shared by the AGS4 reader, checker and writer. AGS4 is the
 * Association of Geotechnical and Geoenvironmental Specialists' open format
 * for exchanging ground-investigation data: a file is a list of GROUPs, each
 * with HEADING, UNIT and TYPE rows followed by DATA rows.
 */

export type AgsSeverity = 'error' | 'warning'

/**
 * One finding about a file. `rule` is the number the standard's "Rules for
 * AGS4 format" gives it ('1', '2a', '10c', '19b' …); findings of Pastload's own
 * import step use 'import'. `line` is 1-based; 0 means the finding is about
 * something absent from the file (a missing group), so no line shows it.
 */
export interface AgsIssue {
  rule: string
  line: number
  /** Group the finding belongs to, '' when it belongs to none. */
  group: string
  message: string
  severity: AgsSeverity
}

export interface AgsRow {
  /** 1-based line of the DATA row in the file. */
  line: number
  /** Values by heading; a heading with no value on the row holds ''. */
  values: Record<string, string>
}

export interface AgsGroup {
  name: string
  headings: string[]
  /** Aligned with `headings`; '' where the UNIT row is missing or short. */
  units: string[]
  /** Aligned with `headings`; '' where the TYPE row is missing or short. */
  types: string[]
  rows: AgsRow[]
  /** 1-based line of the GROUP row. */
  line: number
  /** Lines of the HEADING, UNIT and TYPE rows, 0 when the row is missing. */
  headingLine: number
  unitLine: number
  typeLine: number
}

export interface AgsFile {
  groups: AgsGroup[]
  /** Problems found while reading the text (rules 1–6 and the row structure). */
  errors: AgsIssue[]
}

/** A value to write: numbers are formatted to the heading's TYPE, null writes an empty field. */
export type AgsValue = string | number | null

export interface AgsWritableGroup {
  name: string
  headings: readonly string[]
  units: readonly string[]
  types: readonly string[]
  rows: readonly Readonly<Record<string, AgsValue>>[]
}
