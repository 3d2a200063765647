import { IC_BOUNDARIES, behaviourBand } from '../geotech/behaviour-index'

/**
 * Pastload's colour scale for the CPT behaviour index Ic, from the product's own tokens: ochre for
 * sand-like behaviour (darker the coarser), tide for clay-like, a dark silt for organic soils. Each band
 * is labelled by its Ic range; the words are Pastload's.
 */
export interface BehaviourBandStyle {
  /** 0 (lowest Ic) … 5. */
  band: number
  /** The Ic range as printed, e.g. "1.31–2.05". */
  range: string
  /** What the cone says, in a few words. */
  words: string
  colour: string
  /** Whether the band reads as clay-like (for a sentence or a screen reader). */
  clayLike: boolean
}

const fmt = (v: number) => v.toFixed(2)
const WORDS = [
  'very sand-like: gravelly to dense sand',
  'sand-like',
  'mostly sand-like: silty sand, sandy silt',
  'mostly clay-like: clayey silt, silty clay',
  'clay-like',
  'organic, peat-like',
] as const
const COLOURS = ['#ab621c', '#dc9c38', '#efd394', '#acd8de', '#317d8c', '#564e44'] as const

export const BEHAVIOUR_BANDS: readonly BehaviourBandStyle[] = WORDS.map((words, band) => {
  const lo = IC_BOUNDARIES[band - 1]
  const hi = IC_BOUNDARIES[band]
  const range = lo === undefined ? `< ${fmt(hi ?? Number.NaN)}` : hi === undefined ? `> ${fmt(lo)}` : `${fmt(lo)}–${fmt(hi)}`
  return { band, range, words, colour: COLOURS[band] ?? COLOURS[0], clayLike: band >= 3 }
})

/** The band style of an Ic value; null for NaN. */
export function behaviourStyle(ic: number): BehaviourBandStyle | null {
  const b = behaviourBand(ic)
  return b < 0 ? null : BEHAVIOUR_BANDS[b] ?? null
}

/** Runs of equal band along depth (sorted depths), so a track draws a few rectangles, not one per row. */
export interface BehaviourRun { top: number, bottom: number, band: number }

/**
 * Joins consecutive rows of the same band into runs. Each row stands for the depth halfway to its
 * neighbours; a gap in the rows (NaN, or more than `maxGap` m between rows) ends a run.
 */
export function behaviourRuns(depth: ArrayLike<number>, ic: ArrayLike<number | null>, maxGap = 0.5): BehaviourRun[] {
  const runs: BehaviourRun[] = []
  const n = depth.length
  for (let i = 0; i < n; i++) {
    const v = ic[i]
    const band = v === null || v === undefined ? -1 : behaviourBand(v)
    if (band < 0) continue
    const z = depth[i] ?? Number.NaN
    const prev = i > 0 ? depth[i - 1] ?? Number.NaN : Number.NaN
    const next = i < n - 1 ? depth[i + 1] ?? Number.NaN : Number.NaN
    const top = Number.isFinite(prev) && z - prev <= maxGap ? (prev + z) / 2 : z
    const bottom = Number.isFinite(next) && next - z <= maxGap ? (z + next) / 2 : z
    const last = runs[runs.length - 1]
    if (last && last.band === band && Math.abs(last.bottom - top) < 1e-9) last.bottom = bottom
    else runs.push({ top, bottom, band })
  }
  return runs.filter(r => r.bottom > r.top)
}
