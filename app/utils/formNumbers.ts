import type { z } from 'zod'

/** A typed number ("1.5", "1,5"); NaN when blank, so the schema reports it as missing. */
export function formNumber(text: string): number {
  const t = text.trim()
  return t === '' ? Number.NaN : Number(t.replace(',', '.'))
}

/** A typed number that may be left blank (null). */
export function formOptionalNumber(text: string): number | null {
  return text.trim() === '' ? null : formNumber(text)
}

/** A number for an input's value: blank for null. */
export function numberText(v: number | null | undefined): string {
  return v === null || v === undefined ? '' : String(v)
}

/** zod issues as one message per top-level field, prefixed with the field's label. */
export function fieldIssues(error: z.ZodError, labels: Record<string, string>): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? '')
    const label = labels[key] ?? key
    const msg = /expected number, received NaN/.test(issue.message) ? 'must be a number' : issue.message
    out[key] ??= msg.startsWith(label) ? msg : `${label} ${msg}`
  }
  return out
}

/** Shown where a value is missing in a results table. */
export function fmtNumber(v: number | null | undefined, digits = 1): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits)
}

/** A point's header as typed (numbers and dates as text), the way PointInputSchema reads it. */
export interface PointFormText {
  identifier: string
  kind: string
  easting: string
  northing: string
  groundElevation: string
  finalDepth: string
  startedOn: string
  endedOn: string
  method: string
  loggedBy: string
  remarks?: string
}

/** The typed header as the point schema's input: numbers read, blank dates as null. */
export function pointFormInput(form: PointFormText) {
  return {
    ...form,
    easting: formNumber(form.easting),
    northing: formNumber(form.northing),
    groundElevation: formNumber(form.groundElevation),
    finalDepth: formNumber(form.finalDepth),
    startedOn: form.startedOn || null,
    endedOn: form.endedOn || null,
  }
}
