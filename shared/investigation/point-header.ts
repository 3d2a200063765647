import type { PointRecord } from './types'

/** The header of an investigation point: where and how it was made, without what is logged in it. */
export type PointHeader = Pick<PointRecord, 'identifier' | 'kind' | 'easting' | 'northing' | 'groundElevation' | 'finalDepth' | 'startedOn' | 'endedOn' | 'method' | 'loggedBy' | 'remarks'>

/** Only the header fields of a point (a stored row or an imported record). */
export function pointHeader(p: PointHeader): PointHeader {
  return {
    identifier: p.identifier,
    kind: p.kind,
    easting: p.easting,
    northing: p.northing,
    groundElevation: p.groundElevation,
    finalDepth: p.finalDepth,
    startedOn: p.startedOn,
    endedOn: p.endedOn,
    method: p.method,
    loggedBy: p.loggedBy,
    remarks: p.remarks,
  }
}
