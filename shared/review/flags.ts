/**
 * What a reviewer can flag and what a flag says. Derived σ'p points (from CPT or
 * vane profiles) have no row of their own, so they are named by a stable
 * composite id: `cpt:<pointId>:<depth in mm>` or `vane:<vaneReadingId>`.
 */
export const FLAG_TARGETS = ['preconsolidation-point', 'oedometer-test', 'log-interval', 'cpt-point', 'vane-reading'] as const
export type FlagTarget = (typeof FLAG_TARGETS)[number]

export const FLAG_VERDICTS = ['questionable', 'exclude', 'accepted'] as const
export type FlagVerdict = (typeof FLAG_VERDICTS)[number]

export const VERDICT_LABELS: Record<FlagVerdict, string> = {
  questionable: 'Questionable',
  exclude: 'Exclude from fits',
  accepted: 'Accepted',
}

export function cptPointId(pointId: string, depth: number): string {
  return `cpt:${pointId}:${Math.round(depth * 1000)}`
}
