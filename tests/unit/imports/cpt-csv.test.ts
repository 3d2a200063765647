import seedrandom from 'seedrandom'
import { describe, expect, it } from 'vitest'
import { checkCptCsv } from '../../../shared/imports/cpt-csv'
import { validateRows } from '../../../shared/imports/targets'
import { openPlainCsv, readCsvTable, UploadError } from '../../../server/services/imports/files'

const MAPPING = { depth: 'Depth (m)', qc: 'qc (kPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)' }
const HEAD = 'Depth (m),qc (kPa),fs (kPa),u2 (kPa)'

function fast(csv: string, mapping: Record<string, string> = MAPPING, finalDepth = 30) {
  const plain = openPlainCsv(Buffer.from(csv), 'cpt.csv')
  if (!plain) throw new Error('expected a plain CSV')
  return checkCptCsv(plain, mapping, { cptFinalDepth: finalDepth })
}

/** The general path: papaparse's table, then the row check on records. */
function general(csv: string, mapping: Record<string, string> = MAPPING, finalDepth = 30) {
  const table = readCsvTable(Buffer.from(csv), 'cpt.csv')
  const r = validateRows('cpt', table.headers, table.rows, mapping, { points: new Map(), samples: new Set(), strata: new Set(), cptFinalDepth: finalDepth }, table.rowNumbers)
  return { headers: table.headers, rowCount: table.rows.length, errors: r.errors, depth: r.records.map(x => x.depth), qc: r.records.map(x => x.qc), fs: r.records.map(x => x.fs), u2: r.records.map(x => x.u2) }
}

function expectSameAsGeneral(csv: string, mapping: Record<string, string> = MAPPING, finalDepth = 30) {
  const g = general(csv, mapping, finalDepth)
  const f = fast(csv, mapping, finalDepth)
  expect(openPlainCsv(Buffer.from(csv), 'cpt.csv')!.headers).toEqual(g.headers)
  expect(f.rowCount).toBe(g.rowCount)
  expect(f.errors).toEqual(g.errors)
  // Values agree wherever the general path read a number (a bad cell is null there, NaN here).
  const cols = ['depth', 'qc', 'fs', 'u2'] as const
  for (const c of cols) {
    expect(Array.from(f.columns[c], v => (Number.isNaN(v) ? null : v))).toEqual(g[c])
  }
  return f
}

describe('checkCptCsv: the one-pass CPT check of a plain CSV', () => {
  it('reads the columns into typed arrays with exact values', () => {
    const f = expectSameAsGeneral(`${HEAD}\n0.02,301.5,5.01,0.196\n0.04,-12,0,-3.25\n`)
    expect(f.errors).toEqual([])
    expect(f.rowCount).toBe(2)
    expect(f.columns.depth).toBeInstanceOf(Float64Array)
    expect(Array.from(f.columns.depth)).toEqual([0.02, 0.04])
    expect(Array.from(f.columns.qc)).toEqual([301.5, -12])
    expect(Array.from(f.columns.u2)).toEqual([0.196, -3.25])
  })

  it('reports a bad number at its file row, counting blank lines and a header below blank lines', () => {
    const csv = `\n\n${HEAD}\n0.1,300,5,1\n\n0.2,3O0,5,1\n0.3,300,5,1\n`
    const f = expectSameAsGeneral(csv)
    expect(f.errors).toEqual([{ row: 6, column: 'qc (kPa)', message: 'qc (kPa) "3O0" is not a number.' }])
    expect(f.rowCount).toBe(3)
  })

  it('reads a decimal comma (with ; as the delimiter), an exponent, a plus sign and spaces as the general check does', () => {
    const csv = 'Depth (m);qc (kPa);fs (kPa);u2 (kPa)\n0,5;1.5e2;+3; 4.5 \n1,25;2E-1;1 000;-0,5\n'
    const f = expectSameAsGeneral(csv)
    expect(f.errors).toEqual([])
    expect(Array.from(f.columns.depth)).toEqual([0.5, 1.25])
    expect(Array.from(f.columns.qc)).toEqual([150, 0.2])
    expect(Array.from(f.columns.fs)).toEqual([3, 1000])
    expect(Array.from(f.columns.u2)).toEqual([4.5, -0.5])
  })

  it('flags empty and missing cells, and depths that do not increase or pass the final depth, in field order per row', () => {
    const csv = `u2 (kPa),qc (kPa),Depth (m),fs (kPa),extra\n1,300,1.0,5,x\n,,0.5\n2,310,0.5,6\n3,x,31,7\n`
    const f = expectSameAsGeneral(csv)
    expect(f.errors).toEqual([
      { row: 3, column: 'qc (kPa)', message: 'qc (kPa) is empty.' },
      { row: 3, column: 'fs (kPa)', message: 'fs (kPa) is empty.' },
      { row: 3, column: 'u2 (kPa)', message: 'u2 (kPa) is empty.' },
      { row: 3, column: 'Depth (m)', message: 'Depth 0.5 m does not increase from the row above (1 m).' },
      { row: 4, column: 'Depth (m)', message: 'Depth 0.5 m does not increase from the row above (0.5 m).' },
      { row: 5, column: 'qc (kPa)', message: 'qc (kPa) "x" is not a number.' },
      { row: 5, column: 'Depth (m)', message: 'Depth 31 m is below the point\'s final depth (30 m).' },
    ])
  })

  it('takes CRLF and CR line breaks and a tab delimiter as papaparse guesses them', () => {
    expectSameAsGeneral(`${HEAD}\r\n0.1,1,2,3\r\n\r\n0.2,1,2,3\r\n`)
    expectSameAsGeneral(`${HEAD}\r0.1,1,2,3\r0.2,1,2,3`)
    expectSameAsGeneral(`${HEAD.replaceAll(',', '\t')}\n0.1\t1\t2\t3\n0.2\t1\t2\t3\n`)
  })

  it('reads digits past what a double holds exactly as Number() does', () => {
    const f = expectSameAsGeneral(`${HEAD}\n0.1234567890123456789,12345678901234567,0.1,0.30000000000000004\n`)
    expect(f.columns.depth[0]).toBe(Number('0.1234567890123456789'))
    expect(f.columns.qc[0]).toBe(Number('12345678901234567'))
    expect(f.columns.u2[0]).toBe(0.30000000000000004)
  })

  it('leaves a file with quote characters to the general reader, and refuses a header without data rows', () => {
    expect(openPlainCsv(Buffer.from(`"Depth (m)",qc (kPa),fs (kPa),u2 (kPa)\n1,2,3,4\n`), 'q.csv')).toBeNull()
    expect(() => openPlainCsv(Buffer.from(`${HEAD}\n\n  \n`), 'h.csv')).toThrow(UploadError)
    expect(() => openPlainCsv(Buffer.from(`${HEAD}\n`), 'h.csv')).toThrow('h.csv has a header but no data rows.')
    expect(() => openPlainCsv(Buffer.from('a,a\n1,2\n'), 'd.csv')).toThrow('the column header "a" appears twice')
  })

  it('agrees with the general path on random files (delimiters, line breaks, blank lines, bad and odd cells)', () => {
    const rng = seedrandom('cpt-csv')
    const pick = <T>(xs: readonly T[]) => xs[Math.floor(rng() * xs.length)]!
    const cells = ['0', '1', '-1', '12.5', '-0.25', '.5', '5.', '1e3', ' 7 ', '+2', '', ' ', 'abc', '1,5', '0x1f', '-', '.', '00012.50', '99999999999999999', 'Infinity', '3.14159265358979', '-0']
    for (let file = 0; file < 300; file++) {
      const delimiter = pick([',', ';', '\t', '|'])
      const newline = pick(['\n', '\r\n', '\r'])
      const lines = [['Depth (m)', 'qc (kPa)', 'fs (kPa)', 'u2 (kPa)'].join(delimiter)]
      let depth = 0
      const n = 1 + Math.floor(rng() * 25)
      for (let i = 0; i < n; i++) {
        const r = rng()
        if (r < 0.08) {
          lines.push(pick(['', ' ', delimiter.repeat(3)]))
          continue
        }
        depth += rng() < 0.9 ? 0.5 : -0.5
        const row = [rng() < 0.85 ? String(depth) : pick(cells), pick(cells), pick(cells), pick(cells)]
        const width = rng() < 0.1 ? Math.floor(rng() * 4) : 4
        lines.push(row.slice(0, width).join(delimiter))
      }
      const csv = lines.join(newline) + (rng() < 0.5 ? newline : '')
      const g = general(csv)
      if (g.headers.length !== 4) continue
      expectSameAsGeneral(csv, MAPPING, 8)
    }
  })

  it('stops at the row limit without reading past it, blank lines not counted', () => {
    const plain = openPlainCsv(Buffer.from(`${HEAD}\n0.1,1,1,1\n\n0.2,1,1,1\n0.3,1,1,1\n`), 'cpt.csv')!
    const at = checkCptCsv(plain, MAPPING, { cptFinalDepth: 30, maxRows: 3 })
    expect(at.overLimit).toBeUndefined()
    expect(at.rowCount).toBe(3)
    const over = checkCptCsv(plain, MAPPING, { cptFinalDepth: 30, maxRows: 2 })
    expect(over.overLimit).toBe(true)
    expect(Array.from(over.columns.depth)).toEqual([0.1, 0.2])
  })

  it('refuses a CSV over the target\'s row limit before parsing it, with the count', () => {
    const csv = `${HEAD}\n${Array.from({ length: 1001 }, (_, i) => `${i},1,1,1`).join('\n')}\n`
    expect(() => readCsvTable(Buffer.from(csv), 'stages.csv', undefined, 'oedometer-stages')).toThrow('stages.csv has 1 001 data rows; an import of oedometer stages takes at most 1 000. Split the file and import it in parts.')
    expect(readCsvTable(Buffer.from(csv), 'stages.csv', undefined, 'cpt').rows).toHaveLength(1001)
  })
})

describe('a CPT file in US units', () => {
  it('reads depth in ft and the cone in tsf and psf to m and kPa, on both paths alike (1 ft = 0.3048 m, 1 tsf = 95.76052 kPa)', () => {
    const csv = 'Depth (ft),qc (tsf),fs (psf),u2 (psf)\n1,10,200,100\n2,12,250,150\n'
    const mapping = { depth: 'Depth (ft)', qc: 'qc (tsf)', fs: 'fs (psf)', u2: 'u2 (psf)' }
    const units = { depth: 'ft', qc: 'tsf', fs: 'psf', u2: 'psf' }
    const plain = openPlainCsv(Buffer.from(csv), 'cpt.csv')!
    const f = checkCptCsv(plain, mapping, { cptFinalDepth: 30, units })
    expect(f.errors).toEqual([])
    expect(Array.from(f.columns.depth)).toEqual([0.3048, 0.6096])
    expect(f.columns.qc[0]).toBeCloseTo(957.6052, 3)
    expect(f.columns.fs[0]).toBeCloseTo(9.576052, 5)
    const table = readCsvTable(Buffer.from(csv), 'cpt.csv')
    const g = validateRows('cpt', table.headers, table.rows, mapping, { points: new Map(), samples: new Set(), strata: new Set(), cptFinalDepth: 30 }, table.rowNumbers, units)
    expect(g.records.map(r => r.depth)).toEqual([0.3048, 0.6096])
    expect(g.records.map(r => r.qc)).toEqual(Array.from(f.columns.qc))
  })

  it('quotes depths in feet on a US project, on both paths alike', () => {
    const csv = 'Depth (ft),qc (tsf),fs (psf),u2 (psf)\n2,10,200,100\n1,12,250,150\n120,12,250,150\n'
    const mapping = { depth: 'Depth (ft)', qc: 'qc (tsf)', fs: 'fs (psf)', u2: 'u2 (psf)' }
    const units = { depth: 'ft', qc: 'tsf', fs: 'psf', u2: 'psf' }
    const feet = (m: number) => `${(m / 0.3048).toFixed(2)} ft`
    const f = checkCptCsv(openPlainCsv(Buffer.from(csv), 'cpt.csv')!, mapping, { cptFinalDepth: 30, units, depthWords: feet })
    expect(f.errors).toEqual([
      { row: 3, column: 'Depth (ft)', message: 'Depth 1.00 ft does not increase from the row above (2.00 ft).' },
      { row: 4, column: 'Depth (ft)', message: 'Depth 120.00 ft is below the point\'s final depth (98.43 ft).' },
    ])
    const table = readCsvTable(Buffer.from(csv), 'cpt.csv')
    const g = validateRows('cpt', table.headers, table.rows, mapping, { points: new Map(), samples: new Set(), strata: new Set(), cptFinalDepth: 30, depthWords: feet }, table.rowNumbers, units)
    expect(g.errors).toEqual(f.errors)
  })
})
