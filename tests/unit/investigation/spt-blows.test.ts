import { describe, expect, it } from 'vitest'
import { parseSptBlows, sptBlowsText, sptFromStored, sptResultText, sptStored, type SptBlows } from '../../../shared/investigation/spt-blows'

/**
 * SPT blows as written on a log. The drives and increments follow BS EN ISO 22476-3:2005
 * (seating drive 150 mm in two 75 mm increments, test drive 300 mm in four; N = blows of
 * the test drive over its 300 mm). The expected values below are summed by hand.
 * The limits that end a drive early (25 blows in the seating drive, 50 in the test drive)
 * are recalled from memory of that standard and only appear in the invented examples.
 */
function read(text: string): SptBlows {
  const r = parseSptBlows(text)
  if (!r.ok) throw new Error(`expected "${text}" to read, got: ${r.error}`)
  return r.value
}
function refused(text: string): string {
  const r = parseSptBlows(text)
  if (r.ok) throw new Error(`expected "${text}" to be refused`)
  return r.error
}
const inc = (blows: number, penetration: number) => ({ blows, penetration })

describe('parseSptBlows', () => {
  it('reads seating and test drives in 75 mm increments: N = 4 + 5 + 6 + 7 = 22', () => {
    const v = read('2 3 / 4 5 6 7')
    expect(v.seating).toEqual([inc(2, 75), inc(3, 75)])
    expect(v.test).toEqual([inc(4, 75), inc(5, 75), inc(6, 75), inc(7, 75)])
    expect(v).toMatchObject({ n: 22, refusal: false, seatingBlows: 5, seatingPenetration: 150, testBlows: 22, testPenetration: 300, totalBlows: 27, totalPenetration: 450 })
  })

  it('reads the same test written without the slash, with commas, and in the reported form with N', () => {
    for (const text of ['2 3 4 5 6 7', '2,3,4,5,6,7', '2, 3 / 4, 5, 6, 7', '2,3/4,5,6,7', '2,3/4,5,6,7 N=22', '2 3/ 4 5 6 7']) {
      const v = read(text)
      expect(v.n, text).toBe(22)
      expect([...v.seating, ...v.test].map(i => i.penetration), text).toEqual([75, 75, 75, 75, 75, 75])
    }
  })

  it('reads counts per 150 mm (one seating count, two test counts): N = 8 + 11 = 19', () => {
    for (const text of ['5 8 11', '5 / 8 11']) {
      const v = read(text)
      expect(v.seating, text).toEqual([inc(5, 150)])
      expect(v.test, text).toEqual([inc(8, 150), inc(11, 150)])
      expect(v.n, text).toBe(19)
    }
  })

  it('reads a refusal given as the test drive alone: 50 blows for 100 mm, no N', () => {
    for (const text of ['50/100mm', '50/100 mm', '50/100', ' 50/100MM ']) {
      const v = read(text)
      expect(v.seating, text).toEqual([])
      expect(v.test, text).toEqual([inc(50, 100)])
      expect(v, text).toMatchObject({ n: null, refusal: true, testBlows: 50, testPenetration: 100, totalBlows: 50, totalPenetration: 100 })
      expect(sptResultText(v)).toBe('50/100 mm')
    }
  })

  it('reads increments stopped short: seating 25 blows for 75 mm, then the test drive 50 blows for 40 mm', () => {
    const v = read('25/75 50/40')
    expect(v.seating).toEqual([inc(25, 75)])
    expect(v.test).toEqual([inc(50, 40)])
    expect(v).toMatchObject({ n: null, refusal: true, seatingBlows: 25, seatingPenetration: 75, testBlows: 50, testPenetration: 40, totalBlows: 75, totalPenetration: 115 })
    expect(sptResultText(v)).toBe('50/40 mm')
  })

  it('reads a test drive that stops in its third increment: 12 + 18 + 20 = 50 blows for 75 + 75 + 35 = 185 mm', () => {
    const v = read('6 9 / 12 18 20/35mm')
    expect(v.test).toEqual([inc(12, 75), inc(18, 75), inc(20, 35)])
    expect(v).toMatchObject({ n: null, refusal: true, testBlows: 50, testPenetration: 185, totalBlows: 65, totalPenetration: 335 })
  })

  it('reads a short seating drive followed by a full test drive: N is still defined (9 + 10 + 11 + 12 = 42)', () => {
    const v = read('25/110 / 9 10 11 12')
    expect(v.seating).toEqual([inc(25, 110)])
    expect(v).toMatchObject({ n: 42, refusal: false, seatingPenetration: 110, totalPenetration: 410 })
  })

  it('reads N alone as a 300 mm test drive without the seating, and a leading slash as the seating not recorded', () => {
    expect(read('23')).toMatchObject({ seating: [], test: [inc(23, 300)], n: 23 })
    expect(read('/ 4 5 6 7')).toMatchObject({ seating: [], n: 22 })
  })

  it.each([
    ['2 3 / 4 5 6', 'The test drive has 3 counts: give one count (300 mm), two (150 mm each) or four (75 mm each), or write the last as blows/mm if it stopped short.'],
    ['2 3 4 5', 'The test drive has 150 mm of its 300 mm: give the remaining counts, or write the last as blows/mm if it stopped short.'],
    ['2 3 4 5 6 7 8', 'There are more counts than the seating and test drives hold.'],
    ['2 3 / 10/40 5 6', 'In the test drive, only the last increment can be written as blows/mm (it stopped short).'],
    ['2 3 / 4 5 50/400mm', 'The test drive adds up to 550 mm, more than its 300 mm.'],
    ['2 3 / 4 5 6 7 N=23', 'N=23 is written, but the test drive\'s blows add up to 22.'],
  ])('refuses “%s” in plain words', (text, reason) => {
    expect(refused(text)).toBe(reason)
  })

  it.each([
    ['', 'Nothing written'],
    ['abc', '“abc” is not a blow count'],
    ['25/75 50/40 N=50', 'N is not defined'],
    ['2 3 /', 'after the slash'],
    ['1 / 2 / 3', 'one slash'],
    ['2 3 / 4 5 6 7000', 'more than 500'],
    ['x'.repeat(200), 'Too long'],
  ])('refuses “%s” with a reason that says so', (text, fragment) => {
    expect(refused(text)).toContain(fragment)
  })
})

describe('written back and stored', () => {
  it('writes each test back to a text that reads to the same increments', () => {
    for (const text of ['2 3 / 4 5 6 7', '5 8 11', '50/100mm', '25/75 50/40', '6 9 / 12 18 20/35mm', '23', '/ 4 5 6 7', '25/110 / 9 10 11 12']) {
      const v = read(text)
      expect(read(sptBlowsText(v)), `${text} → ${sptBlowsText(v)}`).toEqual(v)
    }
    expect(sptBlowsText(read('2 3 4 5 6 7'))).toBe('2 3 / 4 5 6 7')
    expect(sptBlowsText(read('25/75 50/40'))).toBe('25/75mm / 50/40mm')
  })

  it('stores the increments, the seating count, the test drive\'s blows and its penetration when short', () => {
    expect(sptStored(read('2 3 / 4 5 6 7'))).toEqual({ blows: [2, 3, 4, 5, 6, 7], penetrations: [75, 75, 75, 75, 75, 75], seating: 2, n: 22, penetration: null })
    expect(sptStored(read('25/75 50/40'))).toEqual({ blows: [25, 50], penetrations: [75, 40], seating: 1, n: 50, penetration: 40 })
    expect(sptStored(read('50/100mm'))).toEqual({ blows: [50], penetrations: [100], seating: 0, n: 50, penetration: 100 })
  })

  it('reads rows stored with increments back to the same test', () => {
    const v = read('6 9 / 12 18 20/35mm')
    expect(sptFromStored(sptStored(v))).toEqual(v)
  })

  it('reads rows stored before increments were kept as counts per 150 mm', () => {
    expect(sptFromStored({ blows: [6, 14, 17], n: 31, penetration: null })).toMatchObject({ seating: [inc(6, 150)], test: [inc(14, 150), inc(17, 150)], n: 31 })
    // 12 seating blows, then 50 blows for 100 mm of the test drive.
    const short = sptFromStored({ blows: [12, 50, 0], n: 50, penetration: 100 })
    expect(short).toMatchObject({ test: [inc(50, 100)], n: null, refusal: true, testBlows: 50, testPenetration: 100 })
    expect(sptResultText(short)).toBe('50/100 mm')
    expect(sptFromStored({ blows: [10, 30, 20], n: 50, penetration: 200 })).toMatchObject({ test: [inc(30, 150), inc(20, 50)], testPenetration: 200 })
  })
})
