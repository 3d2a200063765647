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
