/**
 * Rules of one hole's log (common practice): intervals never overlap and never
 * pass the hole's final depth; gaps are allowed and reported. Shared by the log
 * table (inline errors), the importers and the server (the authority).
 */

export interface IntervalLike {
  top: number
  bottom: number
}

export interface IntervalIssue {
  /** Index into the list as given. */
  index: number
  field: 'top' | 'bottom'
  message: string
}

export interface Gap {
  top: number
  bottom: number
}

/** Depths closer than this are the same depth (0.1 mm): avoids false overlaps from decimal rounding. */
export const DEPTH_TOLERANCE = 1e-4

/** How the messages write a depth given in metres: the number and its unit (default "1.2" and "m"; a US project's pages and server pass feet). */
export interface IntervalWords { number?: (metres: number) => string, unit?: string }

export function checkIntervals(intervals: readonly IntervalLike[], finalDepth: number, words: IntervalWords = {}): { issues: IntervalIssue[], gaps: Gap[] } {
  const n = words.number ?? fmt
  const d = (v: number) => `${n(v)} ${words.unit ?? 'm'}`
  const issues: IntervalIssue[] = []
  intervals.forEach((iv, index) => {
    if (!Number.isFinite(iv.top) || iv.top < 0) issues.push({ index, field: 'top', message: `Top must be a depth of ${d(0)} or more.` })
    if (!Number.isFinite(iv.bottom)) issues.push({ index, field: 'bottom', message: 'Bottom must be a number.' })
    else if (iv.bottom <= iv.top) issues.push({ index, field: 'bottom', message: `Bottom (${d(iv.bottom)}) must be below the top (${d(iv.top)}).` })
    if (Number.isFinite(iv.bottom) && iv.bottom > finalDepth + DEPTH_TOLERANCE) {
      issues.push({ index, field: 'bottom', message: `Bottom (${d(iv.bottom)}) is below the hole's final depth (${d(finalDepth)}).` })
    }
  })
  const order = intervals
    .map((iv, index) => ({ ...iv, index }))
    .filter(iv => Number.isFinite(iv.top) && iv.top >= 0 && Number.isFinite(iv.bottom) && iv.bottom > iv.top)
    .sort((a, b) => a.top - b.top || a.bottom - b.bottom)
  const gaps: Gap[] = []
  let reach = 0
  let reachIndex = -1
  let reachTop = 0
  for (const iv of order) {
    if (iv.top < reach - DEPTH_TOLERANCE) {
      issues.push({ index: iv.index, field: 'top', message: `Overlaps the interval ${n(reachTop)}–${d(reach)} (row ${reachIndex + 1}).` })
    }
    else if (iv.top > reach + DEPTH_TOLERANCE) {
      gaps.push({ top: reach, bottom: iv.top })
    }
    if (iv.bottom > reach) {
      reach = iv.bottom
      reachIndex = iv.index
      reachTop = iv.top
    }
  }
  if (order.length && reach < finalDepth - DEPTH_TOLERANCE) gaps.push({ top: reach, bottom: finalDepth })
  issues.sort((a, b) => a.index - b.index)
  return { issues, gaps }
}

/** A depth and a span of depths in these words, for messages beyond the interval checks ("4.45 m", "1.2–3.4 m"; ft on a US project). */
export interface DepthPhrases {
  depth: (metres: number) => string
  span: (top: number, bottom: number) => string
}
export function depthPhrases(words: IntervalWords = {}): DepthPhrases {
  const n = words.number ?? fmt
  const unit = words.unit ?? 'm'
  return { depth: m => `${n(m)} ${unit}`, span: (top, bottom) => `${n(top)}–${n(bottom)} ${unit}` }
}

function fmt(v: number): string {
  return Number(v.toFixed(3)).toString()
}
