import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { pointLogPageSvg } from '#shared/plots/point-log'
import { LOG_DRAW_HEIGHT, pointLogPages } from '#shared/reports/point-log'
import { depthPerPage, labelsOverlap, LOG_SCALES, paginateLog, placeLabels, ptPerMetre, wrapText } from '#shared/reports/point-log-layout'
import { demoLogData } from '../../helpers/point-log-data'

describe('point log pagination', () => {
  it('draws 1 m of ground as 1000/scale mm of paper', () => {
    // 1 in = 25.4 mm = 72 pt (PDF user space, ISO 32000-1 §8.3.2.3).
    expect(ptPerMetre(100)).toBeCloseTo(28.3465, 3)
    expect(ptPerMetre(50)).toBeCloseTo(56.6929, 3)
    expect(ptPerMetre(200)).toBeCloseTo(14.1732, 3)
  })

  it('puts 10, 20 and 40 m on an A4 page at 1:50, 1:100 and 1:200', () => {
    expect(depthPerPage(50, LOG_DRAW_HEIGHT)).toBe(10)
    expect(depthPerPage(100, LOG_DRAW_HEIGHT)).toBe(20)
    expect(depthPerPage(200, LOG_DRAW_HEIGHT)).toBe(40)
    // Below 5 m a page, whole metres.
    expect(depthPerPage(50, 4.5 * ptPerMetre(50))).toBe(4)
    expect(() => depthPerPage(200, 10)).toThrow(RangeError)
  })

  it('covers the hole from 0 to its final depth in consecutive ranges at each scale', () => {
    expect(paginateLog(24, 50, LOG_DRAW_HEIGHT).map(p => [p.from, p.to])).toEqual([[0, 10], [10, 20], [20, 24]])
    expect(paginateLog(24, 100, LOG_DRAW_HEIGHT).map(p => [p.from, p.to])).toEqual([[0, 20], [20, 24]])
    expect(paginateLog(24, 200, LOG_DRAW_HEIGHT).map(p => [p.from, p.to])).toEqual([[0, 24]])
    expect(paginateLog(20, 100, LOG_DRAW_HEIGHT).map(p => [p.from, p.to])).toEqual([[0, 20]])
    for (const scale of LOG_SCALES) {
      fc.assert(fc.property(fc.double({ min: 0.2, max: 300, noNaN: true }), (depth) => {
        const pages = paginateLog(depth, scale, LOG_DRAW_HEIGHT)
        expect(pages[0]!.from).toBe(0)
        expect(pages.at(-1)!.to).toBe(depth)
        pages.forEach((p, i) => {
          expect(p.to).toBeGreaterThan(p.from)
          if (i) expect(p.from).toBe(pages[i - 1]!.to)
          // Each page's drawing fits the page's drawing height.
          expect((p.to - p.from) * ptPerMetre(scale)).toBeLessThanOrEqual(LOG_DRAW_HEIGHT)
        })
      }), { numRuns: 60 })
    }
  })

  it('draws each page no taller than the body of an A4 sheet', () => {
    const data = demoLogData()
    for (const scale of LOG_SCALES) {
      for (const p of pointLogPages(24, scale)) {
        const { height } = pointLogPageSvg(data, { scale, from: p.from, to: p.to })
        // A4 body: 841.89 pt less the 62 pt and 74 pt margins, less the facts band.
        expect(height).toBeLessThanOrEqual(841.89 - 62 - 74 - 38)
      }
    }
  })
})

describe('label placement', () => {
  it('keeps labels where they want to be when they do not collide', () => {
    const placed = placeLabels([{ id: 'a', want: 10, height: 8 }, { id: 'b', want: 40, height: 8 }], 0, 100)
    expect(placed.map(p => [p.id, p.y])).toEqual([['a', 10], ['b', 40]])
  })

  it('pushes the later of two close labels down and back up from the lane\'s end', () => {
    const placed = placeLabels([{ id: 'a', want: 10, height: 8 }, { id: 'b', want: 12, height: 8 }], 0, 100, 1)
    expect(placed.map(p => [p.id, p.y])).toEqual([['a', 10], ['b', 19]])
    const atEnd = placeLabels([{ id: 'a', want: 95, height: 8 }, { id: 'b', want: 96, height: 8 }], 0, 100, 1)
    expect(atEnd.map(p => [p.id, p.y])).toEqual([['a', 83], ['b', 92]])
  })

  it('never overlaps, whatever the wishes (the water column\'s dates)', () => {
    fc.assert(fc.property(
      fc.array(fc.record({ want: fc.double({ min: -20, max: 620, noNaN: true }), height: fc.double({ min: 4, max: 20, noNaN: true }) }), { maxLength: 40 }),
      (wishes) => {
        const placed = placeLabels(wishes.map((w, i) => ({ id: `w${i}`, ...w })), 0, 600, 0.5)
        expect(placed).toHaveLength(wishes.length)
        expect(labelsOverlap(placed)).toBe(false)
        const total = wishes.reduce((s, w) => s + w.height + 0.5, 0)
        // Inside the lane whenever they can all fit in it.
        if (total <= 600) for (const p of placed) {
          expect(p.y).toBeGreaterThanOrEqual(0)
          expect(p.y + p.height).toBeLessThanOrEqual(600 + 1e-9)
        }
      },
    ), { numRuns: 300 })
  })

  it('places two water strikes 0.1 m apart on consecutive days with both dates legible', () => {
    const data = demoLogData({
      groundwater: [
        { kind: 'strike', depth: 1.6, observedAt: '2026-02-02T10:00:00Z', remarks: '' },
        { kind: 'strike', depth: 1.7, observedAt: '2026-02-03T09:00:00Z', remarks: '' },
        { kind: 'standing', depth: 1.65, observedAt: '2026-02-04T08:00:00Z', remarks: '' },
      ],
    })
    for (const scale of LOG_SCALES) {
      const { svg } = pointLogPageSvg(data, { scale, from: 0, to: 10 })
      const ys = [...svg.matchAll(/<text x="[\d.]+" y="([\d.]+)"[^>]*fill="#246575">(2026-02-0\d)/g)].map(m => Number(m[1]))
      expect(ys).toHaveLength(3)
      ys.sort((a, b) => a - b)
      // 6 pt text: baselines at least a line apart.
      for (let i = 1; i < ys.length; i++) expect(ys[i]! - ys[i - 1]!).toBeGreaterThanOrEqual(6)
    }
  })

  it('wraps descriptions by words into the column', () => {
    expect(wrapText('Very soft grey silty CLAY with shells', 60, 7)).toEqual(['Very soft grey', 'silty CLAY with', 'shells'])
    expect(wrapText('', 60, 7)).toEqual([])
  })
})
