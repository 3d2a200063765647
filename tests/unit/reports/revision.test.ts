// Revision letters of issued reports (lettered like spreadsheet columns: common practice).
import { describe, expect, it } from 'vitest'
import { reportSourceKey, revisionIndex, revisionLetter } from '../../../shared/reports/revision'

describe('revision letters', () => {
  it('runs A … Z, then AA, AB …, and reads back', () => {
    expect([0, 1, 25, 26, 27, 51, 52, 701, 702].map(revisionLetter)).toEqual(['A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA'])
    for (let i = 0; i < 800; i++) expect(revisionIndex(revisionLetter(i))).toBe(i)
    expect(revisionIndex('a')).toBe(-1)
    expect(revisionIndex('')).toBe(-1)
    expect(revisionIndex('A1')).toBe(-1)
  })

  it('counts a model version as its own record, a run or point by its id', () => {
    expect(reportSourceKey({ id: 'm', version: 3 })).toBe('m@v3')
    expect(reportSourceKey({ id: 'r', version: null })).toBe('r')
    expect(reportSourceKey({ id: 'p' })).toBe('p')
  })
})
