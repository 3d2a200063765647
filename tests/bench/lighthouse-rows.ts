// One Lighthouse run's figures, and the row a page gets from several runs.

export interface LighthouseRow {
  page: string
  performance: number
  accessibility: number
  lcpMs: number
  tbtMs: number
  cls: number
  /** 1-minute load average just before the run. */
  load: number
  /** Accessibility audits that failed, by id (empty when none). */
  failed: string[]
  /** Lighthouse's own error when the run could not finish (the figures are then missing). */
  error?: string
  /** The lowest and highest performance score of the page's runs (the row is the median run). */
  range?: [number, number]
  /** How many runs the row is the median of. */
  runs?: number
}

/** The run with the median performance score, with the lowest and highest score beside it; runs without a result are set aside. */
export function medianRun(rows: LighthouseRow[]): LighthouseRow {
  const done = rows.filter(r => !r.error).sort((a, b) => a.performance - b.performance)
  if (!done.length) return rows[0]!
  const median = done[Math.floor((done.length - 1) / 2)]!
  return { ...median, range: [done[0]!.performance, done.at(-1)!.performance], runs: done.length }
}
