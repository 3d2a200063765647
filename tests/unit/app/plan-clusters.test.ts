import { describe, expect, it } from 'vitest'
import { clusterMarks, labelAnchor, placeLabels } from '../../../app/utils/planClusters'

// The plan's reach: a label of about 30 px runs right of each mark, 12 px text high.
const REACH = { across: 32, upDown: 14 }

describe('points drawn at the same place on the plan', () => {
  it('gathers a nest of piezometers 2 m apart at 9 px per metre (labels 18 px apart would overlap), and leaves a point 40 m away alone', () => {
    const px = 9
    const marks = [
      { id: 'P-1', x: 111 * px, y: 79 * px },
      { id: 'P-2', x: 113 * px, y: 79 * px },
      { id: 'P-3', x: 115 * px, y: 79 * px },
      { id: 'BH-01', x: 151 * px, y: 79 * px },
    ]
    expect(clusterMarks(marks, REACH)).toEqual([['P-1', 'P-2', 'P-3']])
  })

  it('lets the nest apart once zoomed in far enough (20 px per metre: 40 px between marks)', () => {
    const marks = [{ id: 'P-1', x: 2220, y: 1580 }, { id: 'P-2', x: 2260, y: 1580 }, { id: 'P-3', x: 2300, y: 1580 }]
    expect(clusterMarks(marks, REACH)).toEqual([])
  })

  it('joins a row of marks each within reach of the next into one group, and starts another after a gap', () => {
    // A at 0, B at 30, C at 60 px (each label runs into the next mark); D at 100 px is 40 px on: alone; E and F together.
    const marks = [{ id: 'A', x: 0, y: 0 }, { id: 'C', x: 60, y: 0 }, { id: 'B', x: 30, y: 0 }, { id: 'D', x: 100, y: 0 }, { id: 'E', x: 200, y: 50 }, { id: 'F', x: 180, y: 40 }]
    expect(clusterMarks(marks, REACH)).toEqual([['A', 'C', 'B'], ['E', 'F']])
  })

  it('reaches less up and down than across (labels are wide, not tall)', () => {
    expect(clusterMarks([{ id: 'A', x: 0, y: 0 }, { id: 'B', x: 0, y: 15 }], REACH)).toEqual([])
    expect(clusterMarks([{ id: 'A', x: 0, y: 0 }, { id: 'B', x: 0, y: -14 }], REACH)).toEqual([['A', 'B']])
    expect(clusterMarks([{ id: 'A', x: 0, y: 0 }, { id: 'B', x: -33, y: 0 }], REACH)).toEqual([])
  })
})

// The plan's label geometry: 12 px semibold text 14 px from the mark's centre, 10 px above its baseline and 4 below.
const LABELS = { gap: 14, ascent: 10, descent: 4, markRadius: 8, width: 400 }
/** Each mark's side alone. */
const sidesOf = (marks: Parameters<typeof placeLabels>[0], g = LABELS) => new Map([...placeLabels(marks, g)].map(([id, p]) => [id, p.side]))

describe('labels that cover no other mark or label (common practice in map labelling: a greedy pass over candidate sides)', () => {
  it('writes a label beside its mark, centred on it, or above or below it clear of the mark', () => {
    expect(labelAnchor('right', LABELS)).toEqual({ x: 14, y: 3, anchor: 'start' })
    expect(labelAnchor('left', LABELS)).toEqual({ x: -14, y: 3, anchor: 'end' })
    expect(labelAnchor('above', LABELS)).toEqual({ x: 0, y: -14, anchor: 'middle' })
    expect(labelAnchor('below', LABELS)).toEqual({ x: 0, y: 20, anchor: 'middle' })
    // A group's mark, drawn with a 12 px ring: its labels stand 4 px further off.
    expect(labelAnchor('left', LABELS, 12)).toEqual({ x: -18, y: 3, anchor: 'end' })
    expect(labelAnchor('above', LABELS, 12)).toEqual({ x: 0, y: -18, anchor: 'middle' })
  })

  it('keeps labels off a larger mark\'s ring: a label that clears a usual mark runs into a group\'s', () => {
    // B 58 px right of A: A's 36 px label from 14 px ends at 50, clear of B's 8 px reach (50) but not of a 12 px ring (46).
    expect(sidesOf([{ id: 'A', x: 100, y: 50, width: 36 }, { id: 'B', x: 158, y: 50, width: 36 }]).get('A')).toBe('right')
    expect(sidesOf([{ id: 'A', x: 100, y: 50, width: 36 }, { id: 'B', x: 158, y: 50, width: 36, radius: 12 }]).get('A')).toBe('left')
  })

  it('keeps every label on the right where nothing is in the way', () => {
    const marks = [{ id: 'BH-01', x: 50, y: 50, width: 36 }, { id: 'BH-02', x: 150, y: 50, width: 36 }, { id: 'BH-03', x: 50, y: 100, width: 36 }]
    expect([...sidesOf(marks)]).toEqual([['BH-01', 'right'], ['BH-02', 'right'], ['BH-03', 'right']])
  })

  it('moves a label to the left of its mark when another mark sits where it would run (40 px on, a 36 px label from 14 px)', () => {
    const marks = [{ id: 'BH-01', x: 100, y: 50, width: 36 }, { id: 'VT-02', x: 140, y: 52, width: 36 }]
    expect(sidesOf(marks).get('BH-01')).toBe('left')
    expect(sidesOf(marks).get('VT-02')).toBe('right')
  })

  it('puts a label boxed in on both sides above its mark, then below, and shows none when all four are taken', () => {
    const row = [{ id: 'A', x: 100, y: 50, width: 36 }, { id: 'B', x: 60, y: 50, width: 36 }, { id: 'C', x: 140, y: 50, width: 36 }]
    const sides = sidesOf(row)
    // A's right runs into C, its left into B: above. B's right runs into A; its left is free. C's right is free.
    expect([sides.get('A'), sides.get('B'), sides.get('C')]).toEqual(['above', 'left', 'right'])
    // Marks 20 px above and below A as well: no side is left for A's label.
    const boxed = [...row, { id: 'U', x: 100, y: 30, width: 36 }, { id: 'D', x: 100, y: 70, width: 36 }]
    expect(sidesOf(boxed).get('A')).toBe('none')
  })

  it('lets a later label give way to an earlier one (labels do not cover labels), and keeps labels inside the plan', () => {
    // Two marks one above the other, 10 px apart: B's right label would overlap A's.
    const marks = [{ id: 'A', x: 100, y: 50, width: 40 }, { id: 'B', x: 100, y: 60, width: 40 }]
    const sides = sidesOf(marks, { ...LABELS, markRadius: 4 })
    expect(sides.get('A')).toBe('right')
    expect(sides.get('B')).toBe('left')
    // Near the right edge the label goes left; in a plan narrower than the label it goes nowhere.
    expect(sidesOf([{ id: 'E', x: 380, y: 50, width: 36 }]).get('E')).toBe('left')
    expect(sidesOf([{ id: 'N', x: 20, y: 50, width: 36 }], { ...LABELS, width: 30 }).get('N')).toBe('none')
  })

  it('writes a group\'s short label ("+2") where its whole label ("P-1 +2") finds no place, and says so', () => {
    // A group mark between two marks 50 px either side and marks 24 px above and below: 52 px fits nowhere, 16 px to its right.
    const marks = [
      { id: 'P-1', x: 100, y: 50, width: 52, shortWidth: 16, radius: 12 },
      { id: 'L', x: 50, y: 50, width: 30 }, { id: 'R', x: 150, y: 50, width: 30 },
      { id: 'U', x: 100, y: 26, width: 30 }, { id: 'D', x: 100, y: 74, width: 30 },
    ]
    expect(placeLabels(marks, LABELS).get('P-1')).toEqual({ side: 'right', short: true })
    // With room, the whole label.
    expect(placeLabels([marks[0]!], LABELS).get('P-1')).toEqual({ side: 'right', short: false })
    // A mark with no short form and no room: none.
    expect(placeLabels([{ ...marks[0]!, shortWidth: undefined }, ...marks.slice(1)], LABELS).get('P-1')).toEqual({ side: 'none', short: false })
  })
})
