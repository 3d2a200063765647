import { convert, displayDigits, QUANTITIES, UNIT_LABELS, unitLabel, type ConvertOptions, type Quantity, type UnitSystem } from './index'

/**
 * A range message of the schemas ("Top must be at most 500 m") in the units the user typed in
 * ("Top must be at most 1640.41 ft"). The schemas check SI values and quote SI bounds; the edge
 * that read the typed value in the project's units rewrites the bound here, so a person never
 * reads a bound in a unit they did not type.
 */

/** The parts of a zod issue this needs (zod 4: `too_big` carries `maximum`, `too_small` `minimum`, both `inclusive`). */
export interface BoundIssue {
  code: string
  message: string
  maximum?: unknown
  minimum?: unknown
  inclusive?: boolean
}

/** A number as a message writes it: the unit's display decimals without trailing zeros ("1640.41", "0"). */
function plain(value: number, digits: number): string {
  const text = value.toFixed(digits)
  return digits > 0 ? text.replace(/\.?0+$/, '') : text
}

/**
 * An SI bound in a system's unit, rounded inwards so that the number quoted is itself allowed:
 * an upper bound rounds down and a lower bound up (500 m is 1640.4199… ft: "at most 1640.41 ft").
 */
export function boundText(si: number, quantity: Quantity, system: UnitSystem, upper: boolean, options: ConvertOptions = {}): string {
  const digits = displayDigits(quantity, system, options)
  const scale = 10 ** digits
  const shown = convert(si, quantity, 'SI', system, options) * scale
  // A bound that converts exactly (0 m, or any SI bound in SI) is kept as it is, not nudged by a rounding error.
  const near = Math.round(shown)
  const whole = Math.abs(shown - near) < 1e-9 * Math.max(1, Math.abs(shown)) ? near : upper ? Math.floor(shown) : Math.ceil(shown)
  const value = whole / scale
  return `${plain(Object.is(value, -0) ? 0 : value, digits).replace(/^-/, '−')} ${unitLabel(quantity, system, options)}`
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')

/** A number followed by the quantity's SI label in a message ("500 m", "−100 000 000 m", "30 kN/m³"), not "2 mm". */
function siPattern(quantity: Quantity): RegExp {
  return new RegExp(`[−-]?\\d[\\d  ]*(?:\\.\\d+)?\\s?${escape(UNIT_LABELS.SI[quantity])}(?![\\p{L}\\d²³/])`, 'u')
}

/**
 * The message of a schema issue with its bound in `system`'s units. A range issue whose message quotes
 * the SI bound has that bound rewritten; one that quotes no unit (zod's own "Too big: …") is written
 * afresh ("must be at most 1640.41 ft"); any other issue (one with a unit of its own, "2 mm") keeps its message.
 */
export function boundMessage(issue: BoundIssue, quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}): string {
  const upper = issue.code === 'too_big'
  if (!upper && issue.code !== 'too_small') return issue.message
  const raw = upper ? issue.maximum : issue.minimum
  const bound = typeof raw === 'bigint' ? Number(raw) : raw
  if (typeof bound !== 'number' || !Number.isFinite(bound)) return issue.message
  const text = boundText(bound, quantity, system, upper, options)
  const pattern = siPattern(quantity)
  if (pattern.test(issue.message)) return system === 'SI' ? issue.message : issue.message.replace(pattern, text)
  if (!/^Too (big|small)/.test(issue.message)) return issue.message
  const inclusive = issue.inclusive !== false
  const words = upper ? (inclusive ? 'at most' : 'below') : (inclusive ? 'at least' : 'above')
  return `must be ${words} ${text}`
}

/**
 * The same for a form whose messages name their own SI unit (the run editor's "must be at most 5000 m",
 * "must be greater than 0 m"): the quantity is read from the unit the message quotes. A range bound is
 * rewritten as above; a zero (a custom "greater than 0 m") is zero in any unit and only changes its label.
 */
export function messageInUnits(issue: BoundIssue, system: UnitSystem, options: ConvertOptions = {}): string {
  if (system === 'SI') return issue.message
  for (const quantity of QUANTITIES) {
    const pattern = siPattern(quantity)
    const found = pattern.exec(issue.message)
    if (!found) continue
    if (issue.code === 'too_big' || issue.code === 'too_small') return boundMessage(issue, quantity, system, options)
    if (/^[−-]?0(?:\.0+)?\s?\D/u.test(found[0])) return issue.message.replace(pattern, `0 ${unitLabel(quantity, system, options)}`)
    return issue.message
  }
  return issue.message
}
