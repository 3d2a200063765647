import type { PointLogData } from '#shared/plots/point-log'

/** An invented 24 m borehole on the demo site's ground model: fill, soft clay, sand, glacial clay. */
export function demoLogData(over: Partial<PointLogData> = {}): PointLogData {
  const profile = Array.from({ length: 25 }, (_, i) => ({ depth: i, effectiveStress: i <= 1.5 ? 18 * i : 27 + 7.5 * (i - 1.5) }))
  const sv = (d: number) => (d <= 1.5 ? 18 * d : 27 + 7.5 * (d - 1.5))
  const trendRun = Array.from({ length: 13 }, (_, i) => {
    const depth = 1.8 + i
    return { depth, preconsolidation: sv(depth) + 35, effectiveStress: sv(depth) }
  })
  return {
    project: { name: 'Trent Wharf yard', jobNumber: 'TRN-0417', client: 'Harbour Board' },
    units: 'SI',
    point: {
      identifier: 'BH-07', kind: 'borehole', easting: 412.5, northing: 238.25, groundElevation: 3.2, finalDepth: 24,
      startedOn: '2026-03-10', endedOn: '2026-03-12', method: 'Rotary with casing; tubes pushed in the clay', loggedBy: 'Demo Logger',
      remarks: 'Casing to 14 m. Hole backfilled with grout.',
    },
    intervals: [
      { top: 0, bottom: 1.8, description: 'Made ground: brown sandy gravel with brick fragments', uscs: 'GW', consistency: null, moisture: 'moist', stratum: { code: 'F', name: 'Fill', colour: 'fill-ochre', pattern: 'made-ground' } },
      { top: 1.8, bottom: 14.5, description: 'Very soft to soft grey silty CLAY with shell fragments and thin silt partings', uscs: 'CH', consistency: 'soft', moisture: 'wet', stratum: { code: 'C1', name: 'Estuarine clay', colour: 'estuary-slate', pattern: 'clay' } },
      { top: 14.5, bottom: 15, description: 'Peat lens', uscs: 'PT', consistency: null, moisture: null, stratum: null },
      { top: 15.5, bottom: 21, description: 'Dense grey fine to medium SAND', uscs: 'SP', consistency: 'dense', moisture: 'wet', stratum: { code: 'S', name: 'Sand', colour: 'sand-straw', pattern: 'sand' } },
      { top: 21, bottom: 24, description: 'Very stiff brown gravelly CLAY (till)', uscs: 'CL', consistency: 'very stiff', moisture: null, stratum: { code: 'G', name: 'Glacial clay', colour: 'glacial-umber', pattern: 'gravelly-clay' } },
    ],
    gaps: [{ top: 15, bottom: 15.5 }],
    samples: [
      { identifier: 'U1', type: 'thin-walled-tube', top: 2.5, bottom: 3.0, recovery: 0.95 },
      { identifier: 'P2', type: 'piston', top: 5.0, bottom: 5.8, recovery: 1 },
      { identifier: 'B3', type: 'bulk', top: 0.5, bottom: 1.0, recovery: null },
      { identifier: 'U4', type: 'thin-walled-tube', top: 8.0, bottom: 8.45, recovery: 0.9 },
      { identifier: 'S5', type: 'spt-split-spoon', top: 16.0, bottom: 16.45, recovery: null },
      { identifier: 'S6', type: 'spt-split-spoon', top: 19.0, bottom: 19.3, recovery: null },
      { identifier: 'C7', type: 'core', top: 22.0, bottom: 23.5, recovery: 0.8 },
    ],
    spt: [
      { depth: 16.0, blows: [6, 14, 17], n: 31, penetration: null },
      { depth: 19.0, blows: [12, 50, 0], n: 50, penetration: 100 },
    ],
    groundwater: [
      { kind: 'strike', depth: 1.6, observedAt: '2026-03-10T09:30:00Z', remarks: '' },
      { kind: 'standing', depth: 1.4, observedAt: '2026-03-11T08:00:00Z', remarks: '' },
    ],
    stress: {
      available: true,
      model: 'Yard model version 1, approved',
      profile,
      trend: [trendRun],
      points: [
        { depth: 2.75, preconsolidation: 70, effectiveStress: sv(2.75), source: 'oedometer', qualityClass: '2', },
        { depth: 8.2, preconsolidation: 88, effectiveStress: sv(8.2), source: 'oedometer', qualityClass: '4' },
        { depth: 5.4, preconsolidation: 75, effectiveStress: sv(5.4), source: 'vane', qualityClass: null },
      ],
    },
    ...over,
  }
}
