import type { GraphicInterval } from '~/components/log/GraphicLogColumn.vue'
import type { IntervalRow, PointDetail } from '#shared/types/investigation'

/** A saved log's intervals as the graphic log column draws them. */
export function savedGraphic(list: IntervalRow[]): GraphicInterval[] {
  return list.map(iv => ({ top: iv.top, bottom: iv.bottom, uscs: iv.uscs, stratumId: iv.stratumId }))
}

/**
 * What the graphic log column draws of one point: its intervals and gaps (the
 * saved log unless `log` gives others, such as the editor's draft), the hole and
 * the samples, SPT and water levels logged in it.
 */
export function graphicLogProps(detail: PointDetail, log: { intervals: GraphicInterval[], gaps: { top: number, bottom: number }[] } = { intervals: savedGraphic(detail.intervals), gaps: detail.gaps }) {
  return {
    intervals: log.intervals,
    gaps: log.gaps,
    finalDepth: detail.point.finalDepth,
    groundElevation: detail.point.groundElevation,
    samples: detail.samples,
    spt: detail.spt,
    groundwater: detail.groundwater,
  }
}
