import { describe, expect, it } from 'vitest'
import { clusterMarks } from '../../../app/utils/planClusters'

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
