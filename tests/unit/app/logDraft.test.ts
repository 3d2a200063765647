import { describe, expect, it } from 'vitest'
import { applyPaste, depthText, depthToMetres, draftFromInterval, emptyRow, isMultiCellPaste, logColumnLabels, parseDepth, parseTsv, toPayload, validateDraft, type DraftRow } from '../../../app/utils/logDraft'

// The log table's editing rules: spreadsheet pastes (tab-separated text, as a spreadsheet puts
// on the clipboard, with double-quoted cells holding tabs, line breaks and doubled quotes) and
// the live check against the interval rules.

const STRATA = [
  { id: 's-mg', code: 'MG', name: 'Made ground' },
  { id: 's-ec', code: 'EC', name: 'Estuarine clay' },
]

function row(top: string, bottom: string, description = ''): DraftRow {
  return { ...emptyRow(), top, bottom, description }
}

describe('reading a spreadsheet paste', () => {
  it('splits rows by line break and cells by tab, dropping the last line break', () => {
    expect(parseTsv('0\t1.2\tFILL\r\n1.2\t3.4\tCLAY\r\n')).toEqual([['0', '1.2', 'FILL'], ['1.2', '3.4', 'CLAY']])
    expect(parseTsv('a\tb\n')).toEqual([['a', 'b']])
    expect(parseTsv('a\n\nb')).toEqual([['a'], [''], ['b']])
    expect(parseTsv('a\t\tc')).toEqual([['a', '', 'c']])
    expect(parseTsv('')).toEqual([])
  })

  it('keeps tabs, line breaks and doubled quotes inside a quoted cell', () => {
    expect(parseTsv('0\t"Soft grey\nCLAY, ""shelly"""\tCH\n')).toEqual([['0', 'Soft grey\nCLAY, "shelly"', 'CH']])
    expect(parseTsv('"a\tb"\tc')).toEqual([['a\tb', 'c']])
    // A quote inside a cell that did not start with one is text.
    expect(parseTsv('5" pipe\tx')).toEqual([['5" pipe', 'x']])
  })

  it('spreads a paste over cells only when it has a tab or a line break inside', () => {
    expect(isMultiCellPaste('soft\n')).toBe(false)
    expect(isMultiCellPaste('soft\tCH')).toBe(true)
    expect(isMultiCellPaste('0\n1.2')).toBe(true)
  })
})

describe('filling the table from a paste', () => {
  it('fills from the cell pasted into, adds rows, skips a header and names strata by code or name', () => {
    const grid = parseTsv('Top\tBottom\tDescription\tUSCS\tStratum\n0\t1.2\tFILL\tgw\tMG\n1.2\t3.4\tCLAY\tch\tEstuarine clay\n3.4\t5\tSAND\tsp\tXX\n')
    const out = applyPaste([emptyRow()], 0, 'top', grid, STRATA)
    expect(out.filled).toBe(3)
    expect(out.rows.map(r => [r.top, r.bottom, r.description, r.uscs, r.stratumId])).toEqual([
      ['0', '1.2', 'FILL', 'GW', 's-mg'],
      ['1.2', '3.4', 'CLAY', 'CH', 's-ec'],
      ['3.4', '5', 'SAND', 'SP', ''],
    ])
    expect(out.notes).toEqual(['Skipped the first pasted line as a header.', 'Row 3: no stratum called “XX” in this project; left unassigned.'])
  })
})

describe('checking the draft', () => {
  it('marks an overlap on the later row and reports the gaps; blank rows are not sent', () => {
    const rows = [row('0', '1.2', 'FILL'), row('1', '3', 'CLAY'), emptyRow()]
    const check = validateDraft(rows, 5)
    expect(check.count).toBe(1)
    expect(check.errors[1]!.top).toContain('Overlaps the interval 0–1.2 m (row 1)')
    expect(check.gaps).toEqual([{ top: 3, bottom: 5 }])
    expect(toPayload(rows).rowIndex).toEqual([0, 1])
  })
})

// A US project's log is typed in feet and saved in metres (1 ft = 0.3048 m exactly, NIST SP 811, 2008, App. B.8).
describe('a log typed in feet', () => {
  const saved = { id: 'i1', version: 1, top: 1.2, bottom: 30, description: 'Soft grey CLAY', uscs: 'CH', stratumId: null, moisture: null, consistency: null }

  it('shows saved metres as feet and reads them back to the same metres, so an untouched row is unchanged', () => {
    const r = draftFromInterval(saved, 'ft')
    expect(r.bottom).toBe('98.43')
    expect(r.top).toBe('3.94')
    const back = toPayload([r], 'ft').intervals[0]!
    expect(back.top).toBe(1.2)
    expect(back.bottom).toBe(30)
    // A depth typed anew is read from its feet (3.95 ft = 1.20396 m, to 0.1 mm).
    expect(toPayload([{ ...r, top: '3.95' }], 'ft').intervals[0]!.top).toBe(1.204)
    expect(depthText(30, 'ft')).toBe('98.43')
    expect(depthText(1.23456, 'm')).toBe('1.2346')
    expect(depthToMetres(10, 'ft')).toBe(3.048)
    expect(depthToMetres(10, 'm')).toBe(10)
  })

  it('takes a pasted depth with its unit, heads the columns in feet and words the checks in feet', () => {
    expect(parseDepth('3.9 ft')).toBe(3.9)
    expect(parseDepth('1.20 m')).toBe(1.2)
    expect(logColumnLabels('ft').top).toBe('Top (ft)')
    expect(logColumnLabels('m').bottom).toBe('Bottom (m)')
    // 0–10 ft, then 5–20 ft overlaps; the hole ends at 6 m (19.685 ft).
    const check = validateDraft([row('0', '10'), row('5', '20')], 6, 'ft')
    expect(check.errors[1]!.top).toBe('Overlaps the interval 0–10 ft (row 1).')
    expect(check.errors[1]!.bottom).toBe("Bottom (20 ft) is below the hole's final depth (19.69 ft).")
  })
})
