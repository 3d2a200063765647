/**
 * What a reviewer can flag and what a flag says. Derived σ'p points (from CPT or
 * vane profiles) have no row of their own, so they are named by a stable
 * composite id: `cpt:<pointId>:<depth in mm>` or `vane:<vaneReadingId>`.
 */
export const FLAG_TARGETS = ['preconsolidation-point', 'oedometer-test', 'log-interval', 'cpt-point', 'vane-reading'] as const
export type FlagTarget = (typeof FLAG_TARGETS)[number]

export const FLAG_VERDICTS = ['questionable', 'exclude', 'accepted'] as const
export type FlagVerdict = (typeof FLAG_VERDICTS)[number]

export function isVerdict(v: unknown): v is FlagVerdict {
  return typeof v === 'string' && (FLAG_VERDICTS as readonly string[]).includes(v)
}

/** Strength for markers: an exclusion outranks a question, which outranks an acceptance. */
const VERDICT_RANK: Record<FlagVerdict, number> = { exclude: 3, questionable: 2, accepted: 1 }

/** The verdict a point's marker shows for several flags on it (null for none). */
export function strongestVerdict(verdicts: readonly FlagVerdict[]): FlagVerdict | null {
  let best: FlagVerdict | null = null
  for (const v of verdicts) if (!best || VERDICT_RANK[v] > VERDICT_RANK[best]) best = v
  return best
}

export const VERDICT_LABELS: Record<FlagVerdict, string> = {
  questionable: 'Questionable',
  exclude: 'Exclude from fits',
  accepted: 'Accepted',
}

export function cptPointId(pointId: string, depth: number): string {
  return `cpt:${pointId}:${Math.round(depth * 1000)}`
}

const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}'
const UUID_ONLY = new RegExp(`^${UUID}$`, 'i')
const CPT_TARGET = new RegExp(`^cpt:(${UUID}):(\\d{1,6})$`, 'i')
const VANE_TARGET = new RegExp(`^vane:(${UUID})$`, 'i')
/** A CPT point's depth in mm: at most 500 m (the deepest point a log may have). */
const MAX_DEPTH_MM = 500_000

/**
 * What a flag's `targetId` names, read strictly: a row id for stored records,
 * `cpt:<pointId>:<depth mm>` for a CPT-derived point and `vane:<readingId>` for a
 * vane-derived one. Anything else (a wrong shape, an id that is not a uuid, a depth
 * beyond 500 m) is null, so it is refused before any query.
 */
export function parseFlagTarget(type: FlagTarget, targetId: string): { id: string, depthMm?: number } | null {
  if (type === 'cpt-point') {
    const m = CPT_TARGET.exec(targetId)
    const depthMm = m ? Number(m[2]) : Number.NaN
    const id = m?.[1]
    return id && depthMm <= MAX_DEPTH_MM ? { id: id.toLowerCase(), depthMm } : null
  }
  if (type === 'vane-reading') {
    const m = VANE_TARGET.exec(targetId)
    const id = m?.[1]
    return id ? { id: id.toLowerCase() } : null
  }
  return UUID_ONLY.test(targetId) ? { id: targetId.toLowerCase() } : null
}
