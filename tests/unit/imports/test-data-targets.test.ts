import { describe, expect, it } from 'vitest'
import { checkMapping, stageConventionOf, suggestMapping, validateRows, type ImportContext } from '../../../shared/imports/targets'

// A specimen of the demo scenario's estuarine clay: e0 = 2.10 (demo ground model), H0 = 20 mm.
const basis = { e0: 2.1, specimenHeight: 20 }
const ctx = (): ImportContext => ({ points: new Map([['BH-01', { finalDepth: 20 }]]), samples: new Set(), strata: new Set(), oedometerBasis: basis, vaneDepths: new Set(['BH-01@5000']) })
const rows = (csv: string) => csv.trim().split('\n').map(l => l.split(','))

describe('oedometer-stages mapping', () => {
  it('suggests the stage, stress and value columns and reads the convention from the mapped value column', () => {
    const m = suggestMapping('oedometer-stages', ['Stage', 'Effective stress (kPa)', 'Strain (%)'])
    expect(m).toEqual({ stage: 'Stage', stress: 'Effective stress (kPa)', strain: 'Strain (%)' })
    expect(stageConventionOf(m)).toBe('strain')
    expect(stageConventionOf({ stress: 's', voidRatio: 'e' })).toBe('void-ratio')
    expect(stageConventionOf({ stress: 's', dial: 'd' })).toBe('dial')
    expect(stageConventionOf({ stress: 's' })).toBeNull()
    expect(stageConventionOf({ stress: 's', voidRatio: 'e', dial: 'd' })).toBeNull()
  })

  it('asks for exactly one value column', () => {
    expect(checkMapping('oedometer-stages', ['s'], { stress: 's' })).toEqual(['Choose the column of the stage values: one of Void ratio e, Strain ε (%), Compression Δh (mm).'])
    expect(checkMapping('oedometer-stages', ['s', 'e', 'd'], { stress: 's', voidRatio: 'e', dial: 'd' })).toEqual(['Map only one of Void ratio e, Strain ε (%), Compression Δh (mm): it sets how the stages are read.'])
    expect(checkMapping('oedometer-stages', ['e'], { voidRatio: 'e' })).toEqual(['Effective stress σ\' (kPa) is required: choose the column that holds it.'])
  })
})

describe('oedometer-stages rows', () => {
  const mapping = { stage: 'stage', stress: 'stress', voidRatio: 'e' }

  it('accepts an unload–reload loop and keeps the values as read', () => {
    const r = validateRows('oedometer-stages', ['stage', 'stress', 'e'], rows('1,10,2.05\n2,40,1.98\n3,10,2.00\n4,40,1.97\n5,160,1.60'), mapping, ctx())
    expect(r.errors).toEqual([])
    expect(r.records.map(x => [x.stage, x.stress, x.voidRatio])).toEqual([[1, 10, 2.05], [2, 40, 1.98], [3, 10, 2], [4, 40, 1.97], [5, 160, 1.6]])
  })

  it('reports every bad row with its file row, column and the lab conversion\'s own message', () => {
    const csv = [
      '1,10,2.05', // row 2: fine
      '2,abc,2.0', // 3: not a number
      '3,-5,1.98', // 4: σ' not positive
      '4,40,', // 5: no value
      '5,80,0', // 6: e = 0
      '4,160,1.5', // 7: stage out of order
      '7,320,x', // 8: value not a number (reported once)
      '8,200000,1.2', // 9: beyond the form's bound
      '2.5,400,1.1', // 10: not a whole stage number
    ].join('\n')
    const r = validateRows('oedometer-stages', ['stage', 'stress', 'e'], rows(csv), mapping, ctx())
    expect(r.errors).toEqual([
      { row: 3, column: 'stress', message: 'Effective stress σ\' (kPa) "abc" is not a number.' },
      { row: 4, column: 'stress', message: 'Stage 3: the effective stress must be a positive number (got -5 kPa).' },
      { row: 5, column: 'e', message: 'Void ratio e is empty.' },
      { row: 6, column: 'e', message: 'Stage 5: the void ratio 0 is not positive; the void ratio must stay above 0.' },
      { row: 7, column: 'stage', message: 'Stage 4 does not follow stage 5 (file row 6): list the stages in test order.' },
      { row: 8, column: 'e', message: 'Void ratio e "x" is not a number.' },
      { row: 9, column: 'stress', message: 'Stage 8: σ\' must be at most 100 000 kPa.' },
      { row: 10, column: 'stage', message: 'Stage 2.5 is not a whole number from 1 up.' },
    ])
  })

  it('converts strain in % and compression in mm with the test\'s e0 and height, numbering stages by file order without a stage column', () => {
    // ε = 70 %: e = 2.1 − 3.1 × 0.70 = −0.07; Δh = 25 mm of 20 mm: e = 2.1 − 3.1 × 25/20 = −1.775.
    const strain = validateRows('oedometer-stages', ['s', 'eps'], rows('10,1.5\n20,70\n40,-1500'), { stress: 's', strain: 'eps' }, ctx(), [2, 3, 5])
    expect(strain.errors).toEqual([
      { row: 3, column: 'eps', message: 'Stage 2: a strain of 70 % leaves a void ratio of -0.07; the void ratio must stay above 0.' },
      { row: 5, column: 'eps', message: 'Stage 3: Strain ε (%) must be at least −1000.' },
    ])
    const dial = validateRows('oedometer-stages', ['s', 'dh'], rows('10,0.2\n20,25'), { stress: 's', dial: 'dh' }, ctx())
    expect(dial.errors).toEqual([{ row: 3, column: 'dh', message: 'Stage 2: a compression of 25 mm of a 20 mm specimen leaves a void ratio of -1.775; the void ratio must stay above 0.' }])
  })

  it('refuses a file with more stages than a test holds', () => {
    const many = Array.from({ length: 301 }, (_, i) => [String(10 + i), '1.5'])
    const r = validateRows('oedometer-stages', ['s', 'e'], many, { stress: 's', voidRatio: 'e' }, ctx())
    expect(r.errors).toEqual([{ row: 302, column: 's', message: 'A test holds at most 300 stages; this file has 301.' }])
  })
})

describe('vane rows', () => {
  const headers = ['hole', 'depth', 'su', 'sur']
  const mapping = { point: 'hole', depth: 'depth', peak: 'su', remoulded: 'sur' }

  it('suggests the vane columns from their usual headers', () => {
    expect(suggestMapping('vane', ['Point', 'Depth (m)', 'Peak su (kPa)', 'Remoulded su (kPa)'])).toEqual({ point: 'Point', depth: 'Depth (m)', peak: 'Peak su (kPa)', remoulded: 'Remoulded su (kPa)' })
  })

  it('reads a profile, remoulded strength optional', () => {
    const r = validateRows('vane', headers, [['BH-01', '4', '18.5', '4.2'], ['BH-01', '6', '21', '']], mapping, ctx())
    expect(r.errors).toEqual([])
    expect(r.records).toEqual([{ point: 'BH-01', depth: 4, peak: 18.5, remoulded: 4.2 }, { point: 'BH-01', depth: 6, peak: 21, remoulded: null }])
  })

  it('reports unknown points, bounds, depths below the hole and readings already there, by file row', () => {
    const csv = [
      'BH-01,4,18.5,4.2', // 2: fine
      'BH-07,4,20,', // 3: unknown point
      'BH-01,-1,20,', // 4: negative depth
      'BH-01,6,0,1', // 5: peak not positive
      'BH-01,25,20,', // 6: below the hole
      'BH-01,4,19,', // 7: twice in the file
      'BH-01,5,19,-2', // 8: remoulded negative, and a reading already at 5 m
      'BH-01,7,,3', // 9: no peak
    ].join('\n')
    const r = validateRows('vane', headers, rows(csv), mapping, ctx())
    expect(r.errors).toEqual([
      { row: 3, column: 'hole', message: 'Point BH-07 is not in this project.' },
      { row: 4, column: 'depth', message: 'Depth must be 0 m or deeper.' },
      { row: 5, column: 'su', message: 'Peak su (kPa) must be above 0 kPa.' },
      { row: 6, column: 'depth', message: 'Depth (25 m) is below the hole\'s final depth (20 m).' },
      { row: 7, column: 'depth', message: 'BH-01 at 4 m appears twice in the file (first on row 2).' },
      { row: 8, column: 'sur', message: 'Remoulded su (kPa) must be 0 kPa or more.' },
      { row: 8, column: 'depth', message: 'BH-01 already has a vane reading at 5 m.' },
      { row: 9, column: 'su', message: 'Peak su (kPa) is empty.' },
    ])
  })
})
