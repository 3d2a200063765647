// Numbers and point headers as typed in the app's forms, read the way the shared zod schemas expect.
import { describe, expect, it } from 'vitest'
import { PointInputSchema } from '../../../shared/schemas/investigation'
import { fieldIssues, formNumber, formOptionalNumber, pointFormInput } from '../../../app/utils/formNumbers'

describe('form numbers', () => {
  it('reads a decimal point or comma, and blank as NaN (missing) or null (optional)', () => {
    expect(formNumber(' 1.5 ')).toBe(1.5)
    expect(formNumber('1,5')).toBe(1.5)
    expect(formNumber('')).toBeNaN()
    expect(formNumber('abc')).toBeNaN()
    expect(formOptionalNumber('  ')).toBeNull()
    expect(formOptionalNumber('2,25')).toBe(2.25)
  })

  it('turns a typed point header into the schema\'s input, and the schema\'s complaints into one message per field', () => {
    const typed = { identifier: 'BH-07', kind: 'borehole', easting: '412,5', northing: '88.25', groundElevation: '2.4', finalDepth: '', startedOn: '', endedOn: '2026-03-06', method: 'Cable percussion', loggedBy: 'A. Ferreira' }
    const input = pointFormInput(typed)
    expect(input).toMatchObject({ easting: 412.5, northing: 88.25, groundElevation: 2.4, startedOn: null, endedOn: '2026-03-06', method: 'Cable percussion' })
    expect(input.finalDepth).toBeNaN()
    const r = PointInputSchema.safeParse(input)
    expect(r.success).toBe(false)
    const issues = fieldIssues(r.error!, { finalDepth: 'Final depth' })
    expect(Object.keys(issues)).toEqual(['finalDepth'])
    expect(issues.finalDepth).toBe('Final depth must be a number')
    expect(PointInputSchema.safeParse(pointFormInput({ ...typed, finalDepth: '20' })).success).toBe(true)
  })
})
