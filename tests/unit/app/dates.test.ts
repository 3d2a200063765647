import { describe, expect, it } from 'vitest'
import { dateParts, formatDate, providePageDateTexts, validZone, type PageDateTexts } from '../../../app/utils/dates'

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

describe('dates rendered by the server travel with the page', () => {
  const at = '2026-12-02T15:05:00Z'
  const key = `dateTime|z|${Date.parse(at)}`
  function withPage(page: PageDateTexts | null, run: () => void) {
    providePageDateTexts(() => page)
    try {
      run()
    }
    finally {
      providePageDateTexts(() => null)
    }
  }

  it('on the server, formats an instant in the viewer\'s zone and keeps the text for the browser', () => {
    const page: PageDateTexts = { zone: 'Asia/Tokyo', texts: {}, recording: true }
    // 15:05 UTC is 00:05 the next day in Tokyo (UTC+9, no summer time).
    withPage(page, () => expect(formatDate(at, 'dateTime')).toBe('3 Dec 2026, 00:05'))
    expect(page.texts).toEqual({ [key]: '3 Dec 2026, 00:05' })
    // A calendar date is the same day everywhere: shown in UTC and kept under its own key.
    withPage(page, () => expect(formatDate('2026-03-04')).toBe('4 Mar 2026'))
    expect(page.texts[`date|u|${Date.UTC(2026, 2, 4)}`]).toBe('4 Mar 2026')
  })

  it('on the server without the viewer\'s zone, formats as before and keeps nothing', () => {
    const page: PageDateTexts = { zone: null, texts: {}, recording: true }
    withPage(page, () => expect(formatDate(at, 'dateTime', { utc: true })).toBe('2 Dec 2026, 15:05'))
    expect(page.texts).toEqual({})
  })

  it('in the browser while hydrating, reads the server\'s text; a date the server did not write is formatted there', () => {
    const page: PageDateTexts = { zone: 'Asia/Tokyo', texts: { [key]: 'written by the server' }, recording: false }
    withPage(page, () => {
      expect(formatDate(at, 'dateTime')).toBe('written by the server')
      expect(formatDate(at, 'dateTime', { utc: true })).toBe('2 Dec 2026, 15:05')
    })
  })

  it('takes only a real IANA zone from the cookie, bounded', () => {
    expect(validZone('Europe/London')).toBe('Europe/London')
    expect(validZone('UTC')).toBe('UTC')
    expect(validZone('Mars/Olympus_Mons')).toBeNull()
    expect(validZone('Europe/London"><script>')).toBeNull()
    expect(validZone(`Europe/${'x'.repeat(80)}`)).toBeNull()
    expect(validZone('')).toBeNull()
    expect(validZone(undefined)).toBeNull()
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

describe('the browser writes its dates without Intl, as Intl would', () => {
  // Reference: the runtime's Intl.DateTimeFormat in British English (ICU's CLDR data), the formatter the server uses.
  const OPTIONS = {
    date: { day: 'numeric', month: 'short', year: 'numeric' },
    dateTime: { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
    time: { hour: '2-digit', minute: '2-digit' },
    long: { day: 'numeric', month: 'long', year: 'numeric' },
    compact: { day: 'numeric', month: 'short', year: '2-digit' },
  } as const
  const instants = [
    ...Array.from({ length: 12 }, (_, m) => Date.UTC(2026, m, 1 + 2 * m, (5 * m) % 24, (7 * m) % 60)),
    Date.UTC(2026, 2, 29, 0, 30), // the night Europe/London moves to summer time
    Date.UTC(2026, 9, 25, 0, 59), // and back
    Date.UTC(2027, 0, 1, 23, 59),
    Date.UTC(2000, 1, 29, 12, 0),
    Date.UTC(2009, 8, 9, 0, 0), // a two-digit year with a leading zero, September
  ]

  it('in UTC, every style and month', () => {
    for (const t of instants) {
      for (const style of Object.keys(OPTIONS) as (keyof typeof OPTIONS)[]) {
        expect(dateParts(new Date(t), style, true)).toBe(new Intl.DateTimeFormat('en-GB', { ...OPTIONS[style], timeZone: 'UTC' }).format(t))
      }
    }
  })

  it('in the runtime\'s own zone, summer time and a zone ahead of UTC included', () => {
    const before = process.env.TZ
    try {
      for (const zone of ['Europe/London', 'Asia/Tokyo', 'America/Vancouver']) {
        process.env.TZ = zone
        for (const t of instants) {
          for (const style of Object.keys(OPTIONS) as (keyof typeof OPTIONS)[]) {
            expect(dateParts(new Date(t), style, false)).toBe(new Intl.DateTimeFormat('en-GB', { ...OPTIONS[style], timeZone: zone }).format(t))
          }
        }
      }
    }
    finally {
      if (before === undefined) delete process.env.TZ
      else process.env.TZ = before
    }
  })
})
