import type { ProjectRole } from '#shared/auth/roles'
import type { GroundwaterKind, PointKind, SampleType } from '#shared/investigation/types'

/** Rows of the logging API as they arrive in JSON (dates as strings). */
export interface PointRow {
  id: string
  projectId: string
  identifier: string
  kind: PointKind
  easting: number
  northing: number
  groundElevation: number
  finalDepth: number
  startedOn: string | null
  endedOn: string | null
  method: string
  loggedBy: string
  remarks: string
  version: number
  createdAt: string
  updatedAt: string
}

export interface IntervalRow {
  id: string
  pointId: string
  top: number
  bottom: number
  description: string
  uscs: string | null
  stratumId: string | null
  moisture: string | null
  consistency: string | null
  version: number
}

export interface IndexTestRow {
  id: string
  sampleId: string
  waterContent: number | null
  liquidLimit: number | null
  plasticLimit: number | null
  bulkUnitWeight: number | null
  version: number
}

export interface SampleRow {
  id: string
  pointId: string
  identifier: string
  top: number
  bottom: number
  type: SampleType
  recovery: number | null
  remarks: string
  version: number
  index: IndexTestRow | null
}

export interface SptRow {
  id: string
  pointId: string
  depth: number
  blows: number[]
  n: number
  version: number
}

export interface GroundwaterRow {
  id: string
  pointId: string
  kind: GroundwaterKind
  observedAt: string
  depth: number | null
  pressure: number | null
  remarks: string
  version: number
}

export interface VaneRow {
  id: string
  pointId: string
  depth: number
  peak: number
  remoulded: number | null
  version: number
}

export interface DepthRange { top: number, bottom: number }

export interface PointDetail {
  point: PointRow
  intervals: IntervalRow[]
  gaps: DepthRange[]
  samples: SampleRow[]
  spt: SptRow[]
  groundwater: GroundwaterRow[]
  vane: VaneRow[]
  cpt: { id: string, areaRatio: number, count: number, version: number } | null
  role: ProjectRole
}

export interface CptSounding {
  areaRatio: number
  count: number
  depth: number[]
  qc: number[]
  fs: number[]
  u2: number[]
  version: number
}

export function pointUrl(projectId: string, pointId: string): string {
  return `/api/projects/${projectId}/points/${pointId}`
}

/** One point with everything logged at it, keyed by project and point (refresh after a write). */
export function usePoint(projectId: MaybeRefOrGetter<string>, pointId: MaybeRefOrGetter<string>) {
  return useApi<PointDetail | null>(
    () => `point-${toValue(projectId)}-${toValue(pointId)}`,
    () => pointUrl(toValue(projectId), toValue(pointId)),
    () => null,
  )
}

/** The CPT sounding's arrays; fetched in the browser only, and only when the point has one. */
export function useCptSounding(projectId: MaybeRefOrGetter<string>, pointId: MaybeRefOrGetter<string>, hasSounding: MaybeRefOrGetter<boolean>) {
  return useAsyncData<CptSounding | null>(
    () => `cpt-${toValue(projectId)}-${toValue(pointId)}`,
    async () => (toValue(hasSounding) ? api<CptSounding>(`${pointUrl(toValue(projectId), toValue(pointId))}/cpt`) : null),
    { server: false, default: () => null, watch: [() => toValue(hasSounding)] },
  )
}
