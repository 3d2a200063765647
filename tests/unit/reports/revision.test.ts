// Revision letters of issued reports (lettered like spreadsheet columns: common practice).
import { describe, expect, it } from 'vitest'
import { issueRequestOf } from '../../../shared/reports/issue-request'
import { nextRevisionOf, reportSourceKey, revisionIndex, revisionLetter } from '../../../shared/reports/revision'

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

  it('gives the next letter past the highest held, and a failed latest letter again (none skipped, none twice)', () => {
    expect(nextRevisionOf([])).toEqual({ revision: 'A', retry: false })
    expect(nextRevisionOf([{ revision: 'A', status: 'issued' }, { revision: 'B', status: 'queued' }])).toEqual({ revision: 'C', retry: false })
    expect(nextRevisionOf([{ revision: 'A', status: 'issued' }, { revision: 'B', status: 'failed' }])).toEqual({ revision: 'B', retry: true })
    // A failed letter below the latest stays as it is: the next issue goes past the latest.
    expect(nextRevisionOf([{ revision: 'A', status: 'failed' }, { revision: 'B', status: 'issued' }])).toEqual({ revision: 'C', retry: false })
    expect(nextRevisionOf([{ revision: 'Z', status: 'running' }])).toEqual({ revision: 'AA', retry: false })
  })

  it('reads an issue request back from an issued report\'s source', () => {
    expect(issueRequestOf('settlement-run', { id: 'r', version: null, options: {} })).toEqual({ kind: 'settlement-run', runId: 'r' })
    expect(issueRequestOf('model-version', { id: 'm', version: 2, options: {} })).toEqual({ kind: 'model-version', modelId: 'm', version: 2 })
    expect(issueRequestOf('model-version', { id: 'm', version: null, options: {} })).toBeNull()
    expect(issueRequestOf('point-log', { id: 'p', version: null, options: { scale: 200 } })).toEqual({ kind: 'point-log', pointId: 'p', scale: 200 })
    expect(issueRequestOf('point-log', { id: 'p', version: null, options: { scale: 75 } })).toBeNull()
  })
})
