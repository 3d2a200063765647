import { ocrAxis, popAxis, stressAxis } from '#shared/plots/model-tracks'
import type { FlagVerdict } from '#shared/review/flags'
import type { ModelWorkspace } from '~/composables/useModelWorkspace'
import { strongestVerdict } from '#shared/review/flags'
import { modelBase } from '~/utils/siteModelEdits'
import { engineerExcluded, sampleTrend, stressAt, type PointState, type TrendSample } from '~/utils/stressHistory'
import type { PreconsolidationPointRow } from '#shared/types/lab'

/** A σ'p point where the stress track draws it (px in the track's own x, the drawing's y). */
export interface PointMark { p: PreconsolidationPointRow, px: number, py: number, state: PointState, band: number, verdict: FlagVerdict | null }

/** A point's OCR or POP, in the ratio tracks' own x. */
export interface RatioMark { ocr: number, pop: number, cy: number, ocrX: number, popX: number }

/**
 * The x scales of the value tracks and where every σ'p point sits on them, for
 * the canvas that draws the points, the stress track's hit testing and the
 * exported drawing. Computed once per change of zoom, data or draft.
 */
export function usePointMarks(ws: ModelWorkspace, widths: () => { stress: number, ocr: number, pop: number }, stressMax: () => number | null) {
  /** Stress axis: automatic from σv at the base and the bulk of the σ'p points, or the engineer's maximum. */
  const stressScale = computed(() => stressAxis({ profile: ws.profile.value, preconsolidation: ws.points.value, base: modelBase(ws.definition.value), width: widths().stress, max: stressMax() }))

  /** Each stratum's trend sampled within it, with OCR and POP (shared by the ratio tracks). */
  const trendSamples = computed((): { band: number, samples: TrendSample[] }[] => ws.definition.value.strata
    .map((_s, i) => ({ band: i, samples: sampleTrend(ws.definition.value, i, ws.profile.value) }))
    .filter(l => l.samples.length))

  const ocrScale = computed(() => ocrAxis(trendSamples.value, widths().ocr))
  const popScale = computed(() => popAxis(trendSamples.value, widths().pop))

  /** Per point: its state and verdict, independent of the zoom. */
  const states = computed(() => {
    const def = ws.definition.value
    const pending = ws.editor.value?.pendingExcluded() ?? {}
    const bands = ws.fits.bands.value
    const flaggedOut = ws.fits.flaggedOut.value
    const flags = ws.flags.value
    const excludedByBand = def.strata.map(s => engineerExcluded(s, pending))
    return ws.points.value.map((p, k) => {
      const band = bands[k] ?? -1
      const verdict = strongestVerdict(flags.get(p.id)?.map(f => f.verdict) ?? [])
      let state: PointState
      if (band < 0 || !def.strata[band]) state = 'unassigned'
      else if (flaggedOut.has(p.id)) state = 'flagged-out'
      else state = excludedByBand[band]!.has(p.id) ? 'excluded' : 'included'
      return { band, state, verdict }
    })
  })

  /** σ'v0 at each point in the current profile (null outside it). */
  const effective = computed(() => ws.points.value.map(p => stressAt(ws.profile.value, p.depth)?.effectiveStress ?? null))

  const marks = computed((): PointMark[] => {
    const y = ws.y.value
    const x = stressScale.value
    const lo = ws.plot.value.top - 10
    const hi = ws.plot.value.bottom + 10
    const st = states.value
    const out: PointMark[] = []
    ws.points.value.forEach((p, k) => {
      const py = y(p.depth)
      if (py < lo || py > hi) return
      const s = st[k]!
      out.push({ p, px: x(p.preconsolidation), py, state: s.state, band: s.band, verdict: s.verdict })
    })
    return out
  })

  const ratioMarks = computed((): RatioMark[] => {
    const y = ws.y.value
    const ox = ocrScale.value
    const px = popScale.value
    const lo = ws.plot.value.top
    const hi = ws.plot.value.bottom
    const out: RatioMark[] = []
    ws.points.value.forEach((p, k) => {
      const e = effective.value[k]
      if (e === null || e === undefined || !(e > 0)) return
      const cy = y(p.depth)
      if (cy < lo || cy > hi) return
      const ocr = p.preconsolidation / e
      const pop = p.preconsolidation - e
      out.push({ ocr, pop, cy, ocrX: ox(ocr), popX: px(pop) })
    })
    return out
  })

  /** Counts per state, for the drawing's summary (and tests). */
  const counts = computed(() => {
    const c: Record<PointState, number> = { 'included': 0, 'excluded': 0, 'flagged-out': 0, 'unassigned': 0 }
    for (const s of states.value) c[s.state]++
    return c
  })

  return { stressScale, ocrScale, popScale, trendSamples, marks, ratioMarks, counts }
}

export type PointMarks = ReturnType<typeof usePointMarks>
