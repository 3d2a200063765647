// Server messages in the project's units: one set of words per project (server/services/project-units.ts),
// used by the CPT check, the AGS4 log rules and the oedometer adoption.
import { createError } from 'h3'
import { describe, expect, it, vi } from 'vitest'
import { investigationToAgs } from '../../../shared/ags4/investigation'
import type { InvestigationRecord } from '../../../shared/investigation/types'
import { assertCptValid } from '../../../server/services/cpt'
import { analyseAgs } from '../../../server/services/imports/ags'
import { unitWords } from '../../../server/services/project-units'

const record: InvestigationRecord = {
  project: { jobNumber: 'PL-0001', name: 'Words', client: 'Demo' },
  strata: [],
  points: [{
    identifier: 'BH-09', kind: 'borehole', easting: 1000, northing: 2000, groundElevation: 2.5, finalDepth: 6,
    startedOn: '2026-03-02', endedOn: '2026-03-03', method: 'Rotary', loggedBy: 'Demo logger', remarks: '',
    intervals: [
      { top: 0, bottom: 3.05, description: 'Soft grey clay', uscs: 'CH', stratumCode: null, moisture: null, consistency: null },
      { top: 2.9, bottom: 6, description: 'Firm clay', uscs: 'CL', stratumCode: null, moisture: null, consistency: null },
    ],
    samples: [{ identifier: 'U1', top: 6, bottom: 6.45, type: 'thin-walled-tube', recovery: 95, remarks: '', index: null, oedometer: null }],
    spt: [], groundwater: [], cpt: null, vane: [],
  }],
}

// The server's 422 helper uses Nitro's auto-imported createError.
vi.stubGlobal('createError', createError)

describe('a project\'s words for server messages', () => {
  it('writes depths as stored on an SI project and in feet on a US one; stresses in kPa, psf or tsf', () => {
    expect(unitWords('SI').depth(12)).toBe('12 m')
    expect(unitWords('US').depth(30)).toBe('98.43 ft')
    expect(unitWords('SI').stress(120)).toBe('120.0 kPa')
    // 1 psf = 0.04788026 kPa, 1 tsf = 2000 psf (NIST SP 811 definitions).
    expect(unitWords('US').stress(120)).toBe('2506 psf')
    expect(unitWords('US', 'tsf').stress(120)).toBe('1.25 tsf')
  })

  it('quotes the CPT depth checks in the project\'s units', () => {
    const c = { areaRatio: 0.8, depth: [0.3048, 0.3048], qc: [1, 1], fs: [1, 1], u2: [0, 0] }
    expect(() => assertCptValid(c, 10, unitWords('US').depth)).toThrow('CPT row 2: depth 1.00 ft does not increase from 1.00 ft.')
    expect(() => assertCptValid({ ...c, depth: [1, 12] }, 10, unitWords('US').depth)).toThrow('The sounding reaches 39.37 ft, below the point\'s final depth (32.81 ft).')
    expect(() => assertCptValid({ ...c, depth: [-0.3048, 1] }, 10, unitWords('US').depth)).toThrow('CPT depths must not be negative (the first is -1.00 ft).')
    expect(() => assertCptValid({ ...c, depth: [1, 12] }, 10)).toThrow('The sounding reaches 12 m, below the point\'s final depth (10 m).')
  })

  it('writes the AGS4 log rules (overlap, sample below the hole) in feet on a US project', () => {
    const file = Buffer.from(investigationToAgs(record))
    const us = analyseAgs(file, unitWords('US').intervals).errors.filter(e => e.rule === 'pastload').map(e => e.message)
    expect(us).toEqual([
      'BH-09 9.51–19.69 ft: Overlaps the interval 0.00–10.01 ft.',
      'BH-09 sample U1: bottom (21.16 ft) is below the hole\'s final depth (19.69 ft).',
    ])
    const si = analyseAgs(file).errors.filter(e => e.rule === 'pastload').map(e => e.message)
    expect(si[1]).toBe('BH-09 sample U1: bottom (6.45 m) is below the hole\'s final depth (6 m).')
  })
})
