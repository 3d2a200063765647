import type { PointLogData } from '#shared/plots/point-log'

/** GET …/points/:pointId/stress-log: what the stress-history log draws (plain values; SI). */
export interface PointLogReply { log: PointLogData }
