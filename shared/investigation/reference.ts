import type { GroundwaterKind, PointKind } from './types'

/**
 * What the logs say for the stress workspace's reference layers: where each
 * hole's log changes stratum (ticks to snap a break to), the logged bulk unit
 * weights, and every groundwater observation with its date. Pure: the server
 * builds it from the project's rows in a few queries.
 */

/** A depth where a hole's log changes stratum. */
export interface LoggedBoundary { depth: number, above: string | null, below: string | null }

export interface ReferenceHole {
  id: string
  identifier: string
  kind: PointKind
  boundaries: LoggedBoundary[]
}

/** A bulk unit weight from an index test, at its sample's mid-depth. */
export interface UnitWeightReading { pointIdentifier: string, sample: string, depth: number, value: number }

/** A groundwater observation as a reference mark: a level (standing, strike) or a piezometer's u at its tip. */
export interface WaterReading {
  id: string
  pointIdentifier: string
  kind: GroundwaterKind
  observedAt: string
  depth: number
  /** kPa at the tip for piezometer readings; null for levels (u = 0 there). */
  pressure: number | null
}

export interface SiteReference {
  holes: ReferenceHole[]
  unitWeights: UnitWeightReading[]
  water: WaterReading[]
}

export interface SiteReferenceInput {
  points: { id: string, identifier: string, kind: PointKind, finalDepth: number }[]
  intervals: { pointId: string, top: number, stratumCode: string | null }[]
  samples: { pointId: string, identifier: string, top: number, bottom: number, bulkUnitWeight: number | null }[]
  groundwater: { id: string, pointId: string, kind: GroundwaterKind, observedAt: string, depth: number | null, pressure: number | null }[]
}

/** Stratum changes down one hole's log (intervals in any order), by stratum code. */
export function loggedBoundaries(intervals: { top: number, stratumCode: string | null }[]): LoggedBoundary[] {
  const sorted = [...intervals].sort((a, b) => a.top - b.top)
  const out: LoggedBoundary[] = []
  let previous: (typeof sorted)[number] | undefined
  for (const iv of sorted) {
    if (previous && previous.stratumCode !== iv.stratumCode) out.push({ depth: iv.top, above: previous.stratumCode, below: iv.stratumCode })
    previous = iv
  }
  return out
}

export function siteReference(input: SiteReferenceInput): SiteReference {
  const byId = new Map(input.points.map(p => [p.id, p]))
  const logs = new Map<string, { top: number, stratumCode: string | null }[]>()
  for (const iv of input.intervals) {
    const list = logs.get(iv.pointId)
    if (list) list.push(iv)
    else logs.set(iv.pointId, [iv])
  }
  const holes: ReferenceHole[] = []
  for (const [pointId, list] of logs) {
    const p = byId.get(pointId)
    if (!p || list.length < 2) continue
    holes.push({ id: p.id, identifier: p.identifier, kind: p.kind, boundaries: loggedBoundaries(list) })
  }
  holes.sort((a, b) => a.identifier.localeCompare(b.identifier))

  const unitWeights: UnitWeightReading[] = []
  for (const s of input.samples) {
    const p = byId.get(s.pointId)
    if (!p || s.bulkUnitWeight === null) continue
    unitWeights.push({ pointIdentifier: p.identifier, sample: s.identifier, depth: 0.5 * (s.top + s.bottom), value: s.bulkUnitWeight })
  }
  unitWeights.sort((a, b) => a.pointIdentifier.localeCompare(b.pointIdentifier) || a.depth - b.depth)

  const water: WaterReading[] = []
  for (const g of input.groundwater) {
    const p = byId.get(g.pointId)
    if (!p) continue
    if (g.kind === 'piezometer') {
      // A piezometer reads u at its tip, the point's final depth.
      if (g.pressure !== null) water.push({ id: g.id, pointIdentifier: p.identifier, kind: g.kind, observedAt: g.observedAt, depth: p.finalDepth, pressure: g.pressure })
    }
    else if (g.depth !== null) {
      water.push({ id: g.id, pointIdentifier: p.identifier, kind: g.kind, observedAt: g.observedAt, depth: g.depth, pressure: null })
    }
  }
  water.sort((a, b) => a.observedAt.localeCompare(b.observedAt) || a.pointIdentifier.localeCompare(b.pointIdentifier))
  return { holes, unitWeights, water }
}
