import type { z } from 'zod'
import type { Quantity } from '#shared/units'
import type { BoundIssue } from '#shared/units/bounds'

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

/**
 * The fields a form read in the project's units, and how a range message names their bounds in those
 * units (`useProjectUnits().bound`): the schemas check SI values, the person typed ft, psf or pcf.
 */
export interface TypedUnits {
  quantities: Partial<Record<string, Quantity>>
  bound: (issue: BoundIssue, quantity: Quantity) => string
}

/** One issue's message, with a range bound in the units the field was typed in. */
export function issueMessage(issue: z.ZodError['issues'][number], key: string, units?: TypedUnits): string {
  if (/expected number, received NaN/.test(issue.message)) return 'must be a number'
  // A nested field (a stage's stress) is named by its own key, a top-level one by the form's.
  const own = issue.path.at(-1)
  const quantity = (typeof own === 'string' ? units?.quantities[own] : undefined) ?? units?.quantities[key]
  return quantity && units ? units.bound(issue as BoundIssue, quantity) : issue.message
}

/** zod issues as one message per top-level field, prefixed with the field's label; bounds in the typed units when `units` says which fields were typed in which quantity. */
export function fieldIssues(error: z.ZodError, labels: Record<string, string>, units?: TypedUnits): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? '')
    const label = labels[key] ?? key
    const msg = issueMessage(issue, key, units)
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
