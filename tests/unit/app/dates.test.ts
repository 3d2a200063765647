import { describe, expect, it } from 'vitest'
import { DATE_STYLES, formatDate, formatDateIntl } from '../../../app/utils/dates'

describe('formatDate: one way of showing dates and times', () => {
  it('shows a calendar date as the same day in every time zone', () => {
    expect(formatDate('2026-03-04')).toBe('4 Mar 2026')
    expect(formatDate('2026-03-04', 'long')).toBe('4 March 2026')
    expect(formatDate('2026-03-04', 'compact')).toBe('4 Mar 26')
  })

  it('shows an instant in UTC when asked, with a 24-hour time', () => {
    expect(formatDate('2026-12-02T15:05:00Z', 'dateTime', { utc: true })).toBe('2 Dec 2026, 15:05')
    expect(formatDate(new Date(Date.UTC(2026, 11, 2, 9, 7)), 'time', { utc: true })).toBe('09:07')
  })

  it('gives the empty text for a missing value and an unreadable string as given', () => {
    expect(formatDate(null)).toBe('')
    expect(formatDate(undefined, 'date', { empty: '—' })).toBe('—')
    expect(formatDate('not a date')).toBe('not a date')
  })
})

describe('one date helper across the pages', () => {
  it('no page, component or helper formats a date itself (only app/utils/dates.ts uses Intl.DateTimeFormat)', async () => {
    const { readdirSync, readFileSync } = await import('node:fs')
    const { join, relative, resolve } = await import('node:path')
    const root = resolve(import.meta.dirname, '../../../app')
    const files: string[] = []
    const walk = (dir: string) => {
      for (const e of readdirSync(dir, { withFileTypes: true })) {
        const p = join(dir, e.name)
        if (e.isDirectory()) walk(p)
        else if (/\.(vue|ts)$/.test(e.name)) files.push(p)
      }
    }
    walk(root)
    const own: string[] = []
    for (const f of files) {
      const rel = relative(root, f)
      if (rel === join('utils', 'dates.ts')) continue
      const text = readFileSync(f, 'utf8')
      // Locale-dependent dates ("02/12/2026, 07:49:05") come from these; a number's toLocaleString('en-GB') is fine.
      if (/toLocale(Date|Time)String\(|Intl\.DateTimeFormat|\bDate\([^)]*\)\.toLocaleString\(/.test(text)) own.push(rel)
    }
    expect(own).toEqual([])
  })
})

describe('formatDate writes the same words as Intl.DateTimeFormat (en-GB) without loading it', () => {
  const STYLES = ['date', 'dateTime', 'time', 'long', 'compact'] as const
  const zone = process.env.TZ

  // Instants over every month, hour and a spread of days and minutes, across the years a project meets.
  const instants: Date[] = []
  for (let year = 1999; year <= 2031; year += 4) {
    for (let month = 0; month < 12; month++) {
      for (let hour = 0; hour < 24; hour += 5) instants.push(new Date(Date.UTC(year, month, 1 + ((month * 7 + hour) % 28), hour, (hour * 13 + month) % 60)))
    }
  }
  // Around the clock changes of the zones below (last Sundays of March and October, second Sunday of March).
  for (const iso of ['2026-03-29T00:59:00Z', '2026-03-29T01:00:00Z', '2026-10-25T00:59:00Z', '2026-10-25T01:00:00Z', '2026-03-08T07:59:00Z', '2026-03-08T08:00:00Z', '2026-12-31T23:59:00Z']) instants.push(new Date(iso))

  for (const tz of ['UTC', 'Europe/London', 'America/Chicago', 'Asia/Kolkata']) {
    it(`in ${tz}, for every style, local and UTC`, () => {
      process.env.TZ = tz
      try {
        // The zone really is the process's local zone for the Date fields (Chicago is 6 h behind UTC in January).
        if (tz === 'America/Chicago') expect(new Date(Date.UTC(2026, 0, 5, 12)).getHours()).toBe(6)
        const intl = new Map(STYLES.flatMap(style => [false, true].map(utc => [`${style}:${utc}`, new Intl.DateTimeFormat('en-GB', { ...DATE_STYLES[style], timeZone: utc ? 'UTC' : tz })] as const)))
        const differ: string[] = []
        for (const d of instants) {
          for (const style of STYLES) {
            for (const utc of [false, true]) {
              const want = intl.get(`${style}:${utc}`)!.format(d)
              const got = formatDate(d, style, { utc })
              if (got !== want) differ.push(`${d.toISOString()} ${style} utc=${utc}: ${got} ≠ ${want}`)
            }
          }
        }
        expect(differ).toEqual([])
      }
      finally {
        if (zone === undefined) delete process.env.TZ
        else process.env.TZ = zone
      }
    })
  }

  it('years outside 1000–9999 go through Intl', () => {
    const d = new Date(Date.UTC(12000, 0, 5))
    expect(formatDate(d, 'date', { utc: true })).toBe(formatDateIntl(d, 'date', true))
  })
})
