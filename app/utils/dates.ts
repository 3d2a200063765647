/**
 * How Pastload shows dates and times, in one place (Intl.DateTimeFormat, British English):
 * - `date`      2 Dec 2026 (the usual form everywhere a date is shown)
 * - `dateTime`  2 Dec 2026, 14:05
 * - `time`      14:05
 * - `long`      2 December 2026 (printed sheets)
 * - `compact`   2 Dec 26 (labels inside drawings, where room is short)
 * A calendar date without a time (`2026-12-02`) is the same day in every time zone, so it is shown in UTC;
 * other instants in the viewer's zone unless `utc` is asked for.
 *
 * The styles are defined by their Intl options (`DATE_STYLES`). The browser's first Intl.DateTimeFormat
 * loads its locale data, about 30 ms of main thread while a page hydrates, so years 1000–9999 are written
 * from the date's own fields in the same words; tests/unit/app/dates.test.ts checks them against
 * Intl.DateTimeFormat for every style, month and hour, in several time zones. Other years go through Intl.
 */
export type DateStyle = 'date' | 'dateTime' | 'time' | 'long' | 'compact'

export type DateInput = string | number | Date | null | undefined

export interface FormatDateOptions {
  /** Show the instant in UTC rather than the viewer's zone. */
  utc?: boolean
  /** Text for a missing value (default ''). */
  empty?: string
}

export const DATE_STYLES: Record<DateStyle, Intl.DateTimeFormatOptions> = {
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
    f = new Intl.DateTimeFormat('en-GB', utc ? { ...DATE_STYLES[style], timeZone: 'UTC' } : DATE_STYLES[style])
    formatters.set(key, f)
  }
  return f
}

const CALENDAR_DATE = /^\d{4}-\d{2}-\d{2}$/

// British English month names as Intl gives them for en-GB ("Sept" in the short form).
const MONTHS_SHORT = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sept', 'Oct', 'Nov', 'Dec']
const MONTHS_LONG = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']
const two = (n: number) => (n < 10 ? `0${n}` : String(n))

/** The style written from the date's fields (what Intl gives for en-GB), or null outside years 1000–9999. */
function written(d: Date, style: DateStyle, utc: boolean): string | null {
  const year = utc ? d.getUTCFullYear() : d.getFullYear()
  if (year < 1000 || year > 9999) return null
  const month = utc ? d.getUTCMonth() : d.getMonth()
  const day = utc ? d.getUTCDate() : d.getDate()
  const time = () => `${two(utc ? d.getUTCHours() : d.getHours())}:${two(utc ? d.getUTCMinutes() : d.getMinutes())}`
  switch (style) {
    case 'date': return `${day} ${MONTHS_SHORT[month]} ${year}`
    case 'dateTime': return `${day} ${MONTHS_SHORT[month]} ${year}, ${time()}`
    case 'time': return time()
    case 'long': return `${day} ${MONTHS_LONG[month]} ${year}`
    case 'compact': return `${day} ${MONTHS_SHORT[month]} ${two(year % 100)}`
  }
}

/** A date or instant as text in one of Pastload's styles; an unreadable string is shown as given. */
export function formatDate(value: DateInput, style: DateStyle = 'date', options: FormatDateOptions = {}): string {
  if (value === null || value === undefined || value === '') return options.empty ?? ''
  const d = value instanceof Date ? value : new Date(value)
  if (Number.isNaN(d.getTime())) return typeof value === 'string' ? value : options.empty ?? ''
  const utc = options.utc ?? (typeof value === 'string' && CALENDAR_DATE.test(value))
  return written(d, style, utc) ?? formatter(style, utc).format(d)
}

/** The same through Intl.DateTimeFormat alone (the definition the written form is checked against). */
export function formatDateIntl(d: Date, style: DateStyle, utc: boolean): string {
  return formatter(style, utc).format(d)
}
