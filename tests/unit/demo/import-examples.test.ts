import { describe, expect, it } from 'vitest'
import { generateDemoInvestigation } from '../../../shared/demo/generate'
import { DEMO_IMPORT_COLUMNS, DEMO_IMPORT_ERROR_KINDS, demoImportCsv, demoImportErrors, type DemoImportErrorKind } from '../../../shared/demo/import-examples'
import { isUscsGroupSymbol } from '../../../shared/strata/uscs'
import { parseCsv } from './helpers'

const record = generateDemoInvestigation()
const csv = demoImportCsv()
const rows = parseCsv(csv)

/** An independent check of the file, row by row, to compare with the errors the example declares. */
function findErrors(): Array<{ row: number, kind: DemoImportErrorKind }> {
  const found: Array<{ row: number, kind: DemoImportErrorKind }> = []
  const lastBottom = new Map<string, number>()
  rows.slice(1).forEach((cells, k) => {
    const row = k + 2
    const [point, top, bottom, , uscs] = cells as [string, string, string, string, string, string]
    const finalDepth = record.points.find(p => p.identifier === point)!.finalDepth
    const numeric = (s: string): boolean => /^\d+(\.\d+)?$/.test(s)
    if (!numeric(top) || !numeric(bottom)) found.push({ row, kind: 'non-numeric-depth' })
    if (!isUscsGroupSymbol(uscs)) found.push({ row, kind: 'invalid-uscs' })
    if (numeric(bottom) && Number(bottom) > finalDepth + 1e-9) found.push({ row, kind: 'beyond-final-depth' })
    const previous = lastBottom.get(point)
    if (numeric(top) && previous !== undefined && Number(top) < previous - 1e-9) found.push({ row, kind: 'overlapping-interval' })
    if (numeric(bottom)) lastBottom.set(point, Number(bottom))
  })
  return found
}

describe('demo import example (log intervals CSV)', () => {
  it('has the header row and about thirty data rows from the demo boreholes', () => {
    expect(rows[0]).toEqual([...DEMO_IMPORT_COLUMNS])
    expect(rows.length - 1).toBeGreaterThanOrEqual(25)
    expect(rows.length - 1).toBeLessThanOrEqual(36)
    for (const r of rows.slice(1)) {
      expect(r).toHaveLength(6)
      expect(record.points.some(p => p.identifier === r[0] && p.kind === 'borehole')).toBe(true)
    }
    expect(csv.endsWith('\n')).toBe(true)
  })

  it('declares exactly four errors, one of each kind, with distinct rows', () => {
    const errors = demoImportErrors()
    expect(errors.map(e => e.kind).sort()).toEqual([...DEMO_IMPORT_ERROR_KINDS].sort())
    expect(new Set(errors.map(e => e.row)).size).toBe(4)
    for (const e of errors) {
      expect(rows[e.row - 1]![0]).toBe(e.point)
      const column = DEMO_IMPORT_COLUMNS.indexOf(e.column)
      expect(rows[e.row - 1]![column]).toBe(e.value)
      expect(e.description.length).toBeGreaterThan(20)
    }
  })

  it('an independent row-by-row check finds exactly the declared errors and nothing else', () => {
    const declared = demoImportErrors().map(e => ({ row: e.row, kind: e.kind })).sort((a, b) => a.row - b.row)
    expect(findErrors().sort((a, b) => a.row - b.row)).toEqual(declared)
  })

  it('every other row matches the demo borehole log it came from', () => {
    const bad = new Set(demoImportErrors().map(e => e.row))
    rows.slice(1).forEach((r, k) => {
      if (bad.has(k + 2)) return
      const point = record.points.find(p => p.identifier === r[0])!
      const interval = point.intervals.find(iv => iv.top.toFixed(2) === r[1] && iv.bottom.toFixed(2) === r[2])
      expect(interval, `row ${k + 2}`).toBeDefined()
      expect(interval!.description).toBe(r[3])
      expect(interval!.uscs).toBe(r[4])
      expect(interval!.stratumCode).toBe(r[5])
    })
  })

  it('is the same file on every call', () => {
    expect(demoImportCsv()).toBe(csv)
  })
})
