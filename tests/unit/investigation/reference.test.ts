// The stress workspace's reference marks built from a project's rows. The rules
// are the trade's reading of a log (common practice): a boundary is where the
// logged stratum changes between consecutive intervals; a sample's test sits at
// its mid-depth; a piezometer reads pore pressure at its tip.
import { describe, expect, it } from 'vitest'
import { loggedBoundaries, siteReference } from '../../../shared/investigation/reference'

const points = [
  { id: 'p1', identifier: 'BH-02', kind: 'borehole' as const, finalDepth: 20 },
  { id: 'p2', identifier: 'BH-01', kind: 'borehole' as const, finalDepth: 15 },
  { id: 'p3', identifier: 'PZ-01', kind: 'piezometer' as const, finalDepth: 9.5 },
]

describe('logged boundaries', () => {
  it('finds each change of stratum down the log, whatever the row order, and ignores repeats of the same stratum', () => {
    const b = loggedBoundaries([
      { top: 6.9, stratumCode: 'EST' },
      { top: 0, stratumCode: 'FILL' },
      { top: 1.2, stratumCode: 'CRUST' },
      { top: 3.25, stratumCode: 'EST' },
      { top: 14, stratumCode: 'GLAC' },
    ])
    expect(b).toEqual([
      { depth: 1.2, above: 'FILL', below: 'CRUST' },
      { depth: 3.25, above: 'CRUST', below: 'EST' },
      { depth: 14, above: 'EST', below: 'GLAC' },
    ])
  })

  it('counts an interval with no stratum as a change (null on one side)', () => {
    expect(loggedBoundaries([{ top: 0, stratumCode: 'FILL' }, { top: 2, stratumCode: null }, { top: 3, stratumCode: 'EST' }]))
      .toEqual([{ depth: 2, above: 'FILL', below: null }, { depth: 3, above: null, below: 'EST' }])
  })
})

describe('site reference', () => {
  const ref = siteReference({
    points,
    intervals: [
      { pointId: 'p1', top: 0, stratumCode: 'CRUST' },
      { pointId: 'p1', top: 1.5, stratumCode: 'EST' },
      { pointId: 'p2', top: 0, stratumCode: 'CRUST' },
      { pointId: 'p2', top: 1.8, stratumCode: 'EST' },
      { pointId: 'p3', top: 0, stratumCode: 'EST' },
      { pointId: 'gone', top: 0, stratumCode: 'EST' },
      { pointId: 'gone', top: 1, stratumCode: 'GLAC' },
    ],
    samples: [
      { pointId: 'p1', identifier: 'U2', top: 6, bottom: 6.45, bulkUnitWeight: 15.6 },
      { pointId: 'p1', identifier: 'U1', top: 3, bottom: 3.45, bulkUnitWeight: 15.1 },
      { pointId: 'p2', identifier: 'B1', top: 1, bottom: 1.5, bulkUnitWeight: null },
    ],
    groundwater: [
      { id: 'g1', pointId: 'p1', kind: 'standing', observedAt: '2026-03-05 09:00:00+00', depth: 1.4, pressure: null },
      { id: 'g2', pointId: 'p3', kind: 'piezometer', observedAt: '2026-02-01 09:00:00+00', depth: null, pressure: 78.5 },
      { id: 'g3', pointId: 'p3', kind: 'piezometer', observedAt: '2026-02-02 09:00:00+00', depth: 2, pressure: null },
      { id: 'g4', pointId: 'p2', kind: 'strike', observedAt: '2026-01-20 11:30:00+00', depth: null, pressure: 12 },
    ],
  })

  it('lists the holes with more than one interval, by identifier, and leaves out rows of unknown points', () => {
    expect(ref.holes).toEqual([
      { id: 'p2', identifier: 'BH-01', kind: 'borehole', boundaries: [{ depth: 1.8, above: 'CRUST', below: 'EST' }] },
      { id: 'p1', identifier: 'BH-02', kind: 'borehole', boundaries: [{ depth: 1.5, above: 'CRUST', below: 'EST' }] },
    ])
  })

  it('puts each bulk unit weight at its sample\'s mid-depth and skips samples without one', () => {
    expect(ref.unitWeights).toEqual([
      { pointIdentifier: 'BH-02', sample: 'U1', depth: 3.225, value: 15.1 },
      { pointIdentifier: 'BH-02', sample: 'U2', depth: 6.225, value: 15.6 },
    ])
  })

  it('puts a piezometer\'s pressure at its tip and a level at its depth, oldest first; a row with neither is left out', () => {
    expect(ref.water).toEqual([
      { id: 'g2', pointIdentifier: 'PZ-01', kind: 'piezometer', observedAt: '2026-02-01 09:00:00+00', depth: 9.5, pressure: 78.5 },
      { id: 'g1', pointIdentifier: 'BH-02', kind: 'standing', observedAt: '2026-03-05 09:00:00+00', depth: 1.4, pressure: null },
    ])
  })
})
