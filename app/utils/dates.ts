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
 * The first date formatted in a browser costs tens of milliseconds (the locale's calendar data is loaded),
 * and a page opened from the server would pay it while it comes alive. So the server renders dates in the
 * viewer's zone (the `pastload_tz` cookie, kept by `rememberViewerZone` when a session starts or a page came without it) and sends the texts with
 * the page; while the page hydrates, the browser takes them from there. Without the cookie the server does
 * not know the zone and the browser formats its dates itself.
 *
 * The browser writes its own dates from the date's fields (`dateParts`) in the two cases that need no zone
 * data: a calendar date, and an instant in the browser's own zone (the viewer's). The text is the same as
 * Intl's British English (unit-tested against it); the first Intl formatter a page creates is what loads the
 * locale's data (40–150 ms on a phone), and a page that only shows such dates never creates one.
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

/** `zone`: an IANA time zone for instants shown in the viewer's zone (the server's guess of it), else the runtime's. */
function formatter(style: DateStyle, utc: boolean, zone?: string): Intl.DateTimeFormat {
  const timeZone = utc ? 'UTC' : zone
  const key = `${style}:${timeZone ?? ''}`
  let f = formatters.get(key)
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', timeZone ? { ...STYLES[style], timeZone } : STYLES[style])
    formatters.set(key, f)
  }
  return f
}

// British English month names as Intl gives them (`month: 'short'` says "Sept").
const MONTHS_SHORT = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sept', 'Oct', 'Nov', 'Dec']
const MONTHS_LONG = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

/** The date's fields in UTC or in this runtime's own zone (no Intl, no zone data). */
function dateFields(d: Date, utc: boolean) {
  return utc
    ? { year: d.getUTCFullYear(), month: d.getUTCMonth(), day: d.getUTCDate(), hour: d.getUTCHours(), minute: d.getUTCMinutes() }
    : { year: d.getFullYear(), month: d.getMonth(), day: d.getDate(), hour: d.getHours(), minute: d.getMinutes() }
}

const two = (n: number) => String(n).padStart(2, '0')

/** The text of one style from the date's fields: the same as `formatter(style, utc)` (British English, 24-hour). */
export function dateParts(d: Date, style: DateStyle, utc: boolean): string {
  const f = dateFields(d, utc)
  const time = `${two(f.hour)}:${two(f.minute)}`
  switch (style) {
    case 'date': return `${f.day} ${MONTHS_SHORT[f.month]} ${f.year}`
    case 'dateTime': return `${f.day} ${MONTHS_SHORT[f.month]} ${f.year}, ${time}`
    case 'time': return time
    case 'long': return `${f.day} ${MONTHS_LONG[f.month]} ${f.year}`
    case 'compact': return `${f.day} ${MONTHS_SHORT[f.month]} ${two(f.year % 100)}`
  }
}

/** The cookie that tells the server the viewer's time zone. */
export const VIEWER_ZONE_COOKIE = 'pastload_tz'

/** An IANA zone name as this runtime knows it, else null (bounded: the value comes from a cookie). */
export function validZone(zone: string | null | undefined): string | null {
  if (!zone || zone.length > 64 || !/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(zone)) return null
  try {
    return new Intl.DateTimeFormat('en-GB', { timeZone: zone }).resolvedOptions().timeZone
  }
  catch {
    return null
  }
}

/** Keeps the browser's time zone in a cookie, so pages come from the server with dates in it. */
export function rememberViewerZone(): void {
  if (typeof document === 'undefined') return
  const zone = validZone(Intl.DateTimeFormat().resolvedOptions().timeZone)
  if (zone) document.cookie = `${VIEWER_ZONE_COOKIE}=${encodeURIComponent(zone)}; path=/; max-age=31536000; samesite=lax`
}

/** The page's date texts, where a page is being rendered or hydrated (`app/plugins/date-texts.ts` gives them). */
export interface PageDateTexts {
  /** The zone the server formatted instants in (the viewer's), or null when it did not know it. */
  zone: string | null
  /** Text by `style|u or z|epoch ms`. */
  texts: Record<string, string>
  /** True on the server (texts are written), false in the browser (texts are read). */
  recording: boolean
}
let pageDateTexts: () => PageDateTexts | null = () => null
/** Sets where formatDate finds the page's date texts (once, by the plugin). */
export function providePageDateTexts(provider: () => PageDateTexts | null): void {
  pageDateTexts = provider
}

const CALENDAR_DATE = /^\d{4}-\d{2}-\d{2}$/

/** A date or instant as text in one of Pastload's styles; an unreadable string is shown as given. */
export function formatDate(value: DateInput, style: DateStyle = 'date', options: FormatDateOptions = {}): string {
  if (value === null || value === undefined || value === '') return options.empty ?? ''
  const d = value instanceof Date ? value : new Date(value)
  if (Number.isNaN(d.getTime())) return typeof value === 'string' ? value : options.empty ?? ''
  const utc = options.utc ?? (typeof value === 'string' && CALENDAR_DATE.test(value))
  const page = pageDateTexts()
  // In the browser, the zone is the viewer's own (or UTC): the text is written from the date's fields.
  const own = import.meta.client && d.getFullYear() >= 1000 && d.getFullYear() <= 9999
  const written = () => (own ? dateParts(d, style, utc) : formatter(style, utc).format(d))
  if (!page) return written()
  const key = `${style}|${utc ? 'u' : 'z'}|${d.getTime()}`
  if (!page.recording) return page.texts[key] ?? written()
  const text = formatter(style, utc, page.zone ?? undefined).format(d)
  if (page.zone) page.texts[key] = text
  return text
}
