import type { GroundwaterKind, PointKind } from '#shared/investigation/types'
import type { PointDetail } from '~/composables/usePoint'
import type { StratumRow } from '~/composables/useStrata'

/** A depth where a hole's log changes stratum (a tick to snap a break to). */
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

const CONCURRENCY = 6
/** The points API's largest page (PointListQuerySchema). */
const PAGE = 500

/** Stratum changes down one hole's log, by stratum code. */
export function loggedBoundaries(intervals: PointDetail['intervals'], codeOf: (id: string | null) => string | null): LoggedBoundary[] {
  const sorted = [...intervals].sort((a, b) => a.top - b.top)
  const out: LoggedBoundary[] = []
  for (let i = 1; i < sorted.length; i++) {
    const a = sorted[i - 1]!
    const b = sorted[i]!
    const above = codeOf(a.stratumId)
    const below = codeOf(b.stratumId)
    if (above !== below) out.push({ depth: b.top, above, below })
  }
  return out
}

/**
 * What the logs say for the stress workspace: the project's strata list, and for
 * the reference layers the stratum changes per hole, logged bulk unit weights and
 * every groundwater observation with its date. Read in the browser only (the
 * workspace renders client-side), point by point a few requests at a time.
 */
export function useSiteReference(projectId: MaybeRefOrGetter<string>) {
  const strata = shallowRef<StratumRow[]>([])
  const details = shallowRef<PointDetail[]>([])
  const loading = ref(false)
  const error = ref('')

  async function load() {
    const id = toValue(projectId)
    if (!id || import.meta.server) return
    loading.value = true
    error.value = ''
    try {
      const base = `/api/projects/${id}`
      const [s, pts] = await Promise.all([
        api<{ strata: StratumRow[] }>(`${base}/strata`),
        (async () => {
          const all: { id: string }[] = []
          for (let offset = 0; ; offset += PAGE) {
            const page = await api<{ points: { id: string }[], total: number }>(`${base}/points?limit=${PAGE}&offset=${offset}`)
            all.push(...page.points)
            if (page.points.length < PAGE || all.length >= page.total) break
          }
          return all
        })(),
      ])
      strata.value = s.strata
      const out: PointDetail[] = []
      for (let i = 0; i < pts.length; i += CONCURRENCY) {
        const batch = await Promise.all(pts.slice(i, i + CONCURRENCY).map(p => api<PointDetail>(pointUrl(id, p.id))))
        out.push(...batch)
      }
      details.value = out
    }
    catch (err) {
      error.value = apiErrorMessage(err)
    }
    finally {
      loading.value = false
    }
  }
  onMounted(load)
  watch(() => toValue(projectId), () => void load())

  const codeOf = computed(() => {
    const m = new Map(strata.value.map(s => [s.id, s.code]))
    return (sid: string | null) => (sid ? m.get(sid) ?? null : null)
  })

  const holes = computed((): ReferenceHole[] => details.value
    .filter(d => d.intervals.length > 1)
    .map(d => ({ id: d.point.id, identifier: d.point.identifier, kind: d.point.kind, boundaries: loggedBoundaries(d.intervals, codeOf.value) }))
    .sort((a, b) => a.identifier.localeCompare(b.identifier)))

  const unitWeights = computed((): UnitWeightReading[] => details.value.flatMap(d => d.samples
    .filter(s => s.index?.bulkUnitWeight !== null && s.index?.bulkUnitWeight !== undefined)
    .map(s => ({ pointIdentifier: d.point.identifier, sample: s.identifier, depth: 0.5 * (s.top + s.bottom), value: s.index!.bulkUnitWeight! }))))

  const water = computed((): WaterReading[] => details.value.flatMap(d => d.groundwater.flatMap((g): WaterReading[] => {
    if (g.kind === 'piezometer') {
      // A piezometer reads u at its tip, the point's final depth.
      if (g.pressure === null) return []
      return [{ id: g.id, pointIdentifier: d.point.identifier, kind: g.kind, observedAt: g.observedAt, depth: d.point.finalDepth, pressure: g.pressure }]
    }
    if (g.depth === null) return []
    return [{ id: g.id, pointIdentifier: d.point.identifier, kind: g.kind, observedAt: g.observedAt, depth: g.depth, pressure: null }]
  })).sort((a, b) => a.observedAt.localeCompare(b.observedAt)))

  return { strata, holes, unitWeights, water, loading, error, refresh: load }
}
