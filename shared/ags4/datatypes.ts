/**
 * AGS4 data TYPEs: checking a value against its declared TYPE and UNIT (rule 8)
 * and formatting a number to a TYPE for writing. The TYPE codes are those of
 * the standard dictionary's TYPE group (nDP, nSF, nSCI, U, MC, DT, T, DMS, YN …).
 */
import type { AgsSeverity } from './types'

export interface ValueProblem {
  message: string
  severity: AgsSeverity
}

const NUMBER = /^-?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/

/** True when the text is a plain decimal or scientific number. */
export function isAgsNumber(text: string): boolean {
  return NUMBER.test(text)
}

/** Checks one value; null means it conforms. An empty value is always allowed (rule 12). */
export function checkValue(type: string, unit: string, value: string): ValueProblem | null {
  if (value === '') return null
  const decimals = /^(\d+)DP$/.exec(type)
  if (decimals) {
    const n = Number(decimals[1])
    const pattern = n === 0 ? /^-?\d+$/ : new RegExp(`^-?\\d+\\.\\d{${n}}$`)
    return pattern.test(value) ? null : error(`${JSON.stringify(value)} is not a number with ${n} decimal place${n === 1 ? '' : 's'} (${type})`)
  }
  const figures = /^(\d+)SF$/.exec(type)
  if (figures) {
    const n = Number(figures[1])
    return hasSignificantFigures(value, n) ? null : error(`${JSON.stringify(value)} is not a number with ${n} significant figure${n === 1 ? '' : 's'} (${type})`)
  }
  const scientific = /^(\d+)SCI$/.exec(type)
  if (scientific) {
    const n = Number(scientific[1])
    const pattern = n === 0 ? /^-?\d[eE][+-]?\d+$/ : new RegExp(`^-?\\d\\.\\d{${n}}[eE][+-]?\\d+$`)
    return pattern.test(value) ? null : error(`${JSON.stringify(value)} is not in scientific notation with ${n} decimal place${n === 1 ? '' : 's'} (${type})`)
  }
  switch (type) {
    case 'U':
      return isAgsNumber(value) ? null : error(`${JSON.stringify(value)} is not a number (U)`)
    case 'MC':
      return checkMoistureContent(value)
    case 'DT':
      return checkDateTime(unit, value)
    case 'T':
      return checkElapsedTime(unit, value)
    case 'DMS':
      return /^-?\d{1,3}:[0-5]?\d:[0-5]?\d(?:\.\d+)?[NSEW]?$/.test(value) ? null : error(`${JSON.stringify(value)} is not degrees:minutes:seconds (DMS)`)
    case 'YN':
      return /^(?:Y|N|YES|NO)$/i.test(value) ? null : error(`${JSON.stringify(value)} is not Y or N (YN)`)
    default:
      // ID, X, XN, PA, PT, PU and RL hold text; rules 10, 11, 15, 16 and 17 check what they refer to.
      return null
  }
}

/** Significant figures of a written number; an integer's trailing zeros may or may not count. */
function hasSignificantFigures(value: string, n: number): boolean {
  const match = /^-?(\d*)(?:\.(\d*))?$/.exec(value)
  if (!match || value === '-' || value === '.' || value === '') return false
  const whole = match[1] ?? ''
  const fraction = match[2]
  const digits = (whole + (fraction ?? '')).replace(/^0+/, '')
  if (digits === '') return true // zero has no significant figures to count
  if (fraction !== undefined) return digits.length === n
  const core = digits.replace(/0+$/, '')
  return core.length <= n && digits.length >= n
}

/**
 * MC is moisture content reported as BS 1377-2 asks: two significant figures,
 * three from 100 % up *(memory)*. A number in another precision is only a warning.
 */
function checkMoistureContent(value: string): ValueProblem | null {
  if (!isAgsNumber(value)) return error(`${JSON.stringify(value)} is not a number (MC)`)
  const figures = Math.abs(Number(value)) >= 100 ? 3 : 2
  if (hasSignificantFigures(value, figures)) return null
  return { severity: 'warning', message: `${JSON.stringify(value)} is not given to ${figures} significant figures as MC (BS 1377) expects` }
}

type DateField = 'year' | 'month' | 'day' | 'hour' | 'minute' | 'second' | 'fraction' | 'offset'

interface DatePattern {
  regex: RegExp
  fields: DateField[]
}

const patternCache = new Map<string, DatePattern | null>()

/**
 * Turns a date UNIT such as `yyyy-mm-ddThh:mm:ss` or `dd/mm/yyyy` into a regular
 * expression. `mm` is the month after a year or day and the minute after an
 * hour; a trailing `Z`, `+hh:mm` or `Z(+hh:mm)` means an ISO 8601 offset.
 */
export function datePattern(unit: string): DatePattern | null {
  const cached = patternCache.get(unit)
  if (cached !== undefined) return cached
  let source = ''
  const fields: DateField[] = []
  let rest = unit
  let offset = false
  const offsetSuffix = /(?:Z\(\+hh:mm\)|Z|[+-]hh:?mm)$/.exec(rest)
  if (offsetSuffix && /[hd]/.test(rest.slice(0, offsetSuffix.index))) {
    rest = rest.slice(0, offsetSuffix.index)
    offset = true
  }
  let previous: DateField | null = null
  let valid = rest.length > 0
  while (rest.length > 0 && valid) {
    const run = /^(y+|m+|d+|h+|s+)/.exec(rest)
    if (run) {
      const token = run[1] ?? ''
      const letter = token[0]
      let field: DateField
      if (letter === 'y') field = 'year'
      else if (letter === 'd') field = 'day'
      else if (letter === 'h') field = 'hour'
      else if (letter === 's') field = previous === 'second' ? 'fraction' : 'second'
      else field = previous === 'hour' ? 'minute' : 'month'
      source += field === 'fraction' ? '(\\d+)' : `(\\d{${token.length}})`
      fields.push(field)
      previous = field
      rest = rest.slice(token.length)
      continue
    }
    const char = rest[0] ?? ''
    if (/[A-Za-z]/.test(char) && char !== 'T') valid = false
    source += char.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')
    rest = rest.slice(1)
  }
  if (offset) {
    source += '(Z|[+-]\\d{2}:?\\d{2})'
    fields.push('offset')
  }
  const datelike = fields.includes('year') || fields.includes('day') || fields.includes('hour')
  const pattern = valid && datelike ? { regex: new RegExp(`^${source}$`), fields } : null
  patternCache.set(unit, pattern)
  return pattern
}

const ISO_ANY = /^(\d{4})(?:-(\d{2})(?:-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?)?)?)?$/

function checkDateTime(unit: string, value: string): ValueProblem | null {
  if (unit === '') {
    const match = ISO_ANY.exec(value) ?? /^()()()(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value)
    if (!match) return error(`${JSON.stringify(value)} is not an ISO 8601 date or time (DT)`)
    const [, y, mo, d, h, mi, s] = match
    return rangeProblem(value, { year: y, month: mo, day: d, hour: h, minute: mi, second: s })
  }
  const pattern = datePattern(unit)
  if (!pattern) return error(`the unit ${JSON.stringify(unit)} is not a date or time format, so ${JSON.stringify(value)} cannot be checked (DT)`)
  const match = pattern.regex.exec(value)
  if (!match) return error(`${JSON.stringify(value)} does not follow the date format ${unit} (DT)`)
  const parts: Partial<Record<DateField, string>> = {}
  pattern.fields.forEach((field, i) => {
    parts[field] = match[i + 1]
  })
  return rangeProblem(value, parts)
}

function rangeProblem(value: string, parts: Partial<Record<DateField, string | undefined>>): ValueProblem | null {
  const num = (text: string | undefined): number | null => (text === undefined || text === '' ? null : Number(text))
  const year = num(parts.year)
  const month = num(parts.month)
  const day = num(parts.day)
  const hour = num(parts.hour)
  const minute = num(parts.minute)
  const second = num(parts.second)
  if (month !== null && (month < 1 || month > 12)) return error(`${JSON.stringify(value)} has month ${month} (DT)`)
  if (day !== null) {
    const last = month === null ? 31 : daysInMonth(year ?? 2000, month)
    if (day < 1 || day > last) return error(`${JSON.stringify(value)} has day ${day}, not a day of that month (DT)`)
  }
  if (hour !== null && hour > 24) return error(`${JSON.stringify(value)} has hour ${hour} (DT)`)
  if (minute !== null && minute > 59) return error(`${JSON.stringify(value)} has minute ${minute} (DT)`)
  if (second !== null && second > 60) return error(`${JSON.stringify(value)} has second ${second} (DT)`)
  return null
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate()
}

/** Elapsed time follows its unit (hh:mm:ss, hh:mm, mm:ss); the leading field may exceed two digits. */
function checkElapsedTime(unit: string, value: string): ValueProblem | null {
  const format = unit === '' ? 'hh:mm:ss' : unit
  if (!/^[hms]+(?::[hms]+)*$/.test(format)) {
    return isAgsNumber(value) ? null : error(`${JSON.stringify(value)} is not an elapsed time in ${format} (T)`)
  }
  const fields = format.split(':')
  const values = value.split(':')
  if (values.length !== fields.length) return error(`${JSON.stringify(value)} does not follow the elapsed time format ${format} (T)`)
  for (let i = 0; i < values.length; i++) {
    const part = values[i] ?? ''
    const pattern = i === values.length - 1 && (fields[i] ?? '').startsWith('s') ? /^\d+(?:\.\d+)?$/ : /^\d+$/
    if (!pattern.test(part) || (i > 0 && Number(part) >= 60)) return error(`${JSON.stringify(value)} does not follow the elapsed time format ${format} (T)`)
  }
  return null
}

function error(message: string): ValueProblem {
  return { message, severity: 'error' }
}

/**
 * Writes a number as its TYPE asks: nDP fixed decimals, nSF significant
 * figures, nSCI scientific notation, MC as BS 1377 reports moisture content;
 * other types get the shortest text that reads back as the same number.
 */
export function formatNumber(type: string, value: number): string {
  if (!Number.isFinite(value)) return ''
  const decimals = /^(\d+)DP$/.exec(type)
  if (decimals) return cleanNegativeZero(value.toFixed(Number(decimals[1])))
  const figures = /^(\d+)SF$/.exec(type)
  if (figures) return toSignificant(value, Number(figures[1]))
  const scientific = /^(\d+)SCI$/.exec(type)
  if (scientific) return value.toExponential(Number(scientific[1])).replace('e', 'E')
  if (type === 'MC') return toSignificant(value, Math.abs(value) >= 100 ? 3 : 2)
  return String(value)
}

function toSignificant(value: number, n: number): string {
  // Round first: 9.96 to two figures is 10, whose magnitude differs from 9.96's.
  const rounded = Number(value.toPrecision(n))
  if (rounded === 0) return '0'
  const decimals = n - 1 - Math.floor(Math.log10(Math.abs(rounded)))
  if (decimals >= 0) return cleanNegativeZero(rounded.toFixed(Math.min(decimals, 100)))
  return cleanNegativeZero(String(rounded))
}

function cleanNegativeZero(text: string): string {
  return /^-0(?:\.0*)?$/.test(text) ? text.slice(1) : text
}
