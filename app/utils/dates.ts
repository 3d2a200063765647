/**
 * How Pastload shows dates and times, in one place (Intl.DateTimeFormat, British English):
 * - `date`      2 Dec 2026 (the usual form everywhere a date is shown)
 * - `dateTime`  2 Dec 2026, 14:05
 * - `time`      14:05
 * - `long`      2 December 2026 (printed sheets)
 * - `compact`   2 Dec 26 (labels inside drawings, where room is short)
 * A calendar date without a time (`2026-12-02`) is the same day in every time zone, so it is shown in UTC;
 * other instants in the viewer's zone unless `utc` is asked for.
 */
export type DateStyle = 'date' | 'dateTime' | 'time' | 'long' | 'compact'

export type DateInput = string | number | Date | null | undefined

export interface FormatDateOptions {
  /** Show the instant in UTC rather than the viewer's zone. */
  utc?: boolean
  /** Text for a missing value (default ''). */
  empty?: string
}

const STYLES: Record<DateStyle, Intl.DateTimeFormatOptions> = {
  date: { day: 'numeric', month: 'short', year: 'numeric' },
  dateTime: { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
  time: { hour: '2-digit', minute: '2-digit' },
  long: { day: 'numeric', month: 'long', year: 'numeric' },
  compact: { day: 'numeric', month: 'short', year: '2-digit' },
}

const formatters = new Map<string, Intl.DateTimeFormat>()

function formatter(style: DateStyle, utc: boolean): Intl.DateTimeFormat {
  const key = `${style}:${utc}`
  let f = formatters.get(key)
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', utc ? { ...STYLES[style], timeZone: 'UTC' } : STYLES[style])
    formatters.set(key, f)
  }
  return f
}

const CALENDAR_DATE = /^\d{4}-\d{2}-\d{2}$/

/** A date or instant as text in one of Pastload's styles; an unreadable string is shown as given. */
export function formatDate(value: DateInput, style: DateStyle = 'date', options: FormatDateOptions = {}): string {
  if (value === null || value === undefined || value === '') return options.empty ?? ''
  const d = value instanceof Date ? value : new Date(value)
  if (Number.isNaN(d.getTime())) return typeof value === 'string' ? value : options.empty ?? ''
  const utc = options.utc ?? (typeof value === 'string' && CALENDAR_DATE.test(value))
  return formatter(style, utc).format(d)
}
