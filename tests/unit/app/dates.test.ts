import { describe, expect, it } from 'vitest'
import { formatDate } from '../../../app/utils/dates'

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
