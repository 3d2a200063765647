import type { PreconsolidationSource as PointSource } from '../schemas/lab'

/**
 * Pastload's marks for the stress-history drawings (the model canvas and the reports), written as SVG presentation values
 * (not CSS classes) so an exported drawing looks like the screen. Colours come
 * from the tailwind tokens: tide for stresses and structure, ochre for σ'p and
 * its trend, silt for neutrals.
 */
export const INK = {
  frame: '#ada18b',
  grid: '#efede7',
  axis: '#48423a',
  muted: '#7f7360',
  totalStress: '#7f7360',
  porePressure: '#317d8c',
  hydrostatic: '#7bbcc6',
  effectiveStress: '#1f5261',
  trend: '#c98024',
  trendBand: '#efd394',
  dense: [138, 72, 26] as const,
  water: '#246575',
  handle: '#183a44',
  selected: '#dc9c38',
  error: '#c0392b',
  left: '#978a72',
} as const

export const SOURCE_LABELS: Record<PointSource, string> = {
  oedometer: 'Oedometer',
  cpt: 'CPT (resampled)',
  vane: 'Field vane',
}

/** Colour of a source's symbols (oedometer symbols are shaded by sample quality instead). */
export const SOURCE_INK: Record<PointSource, string> = {
  oedometer: '#1c4450',
  cpt: '#ab621c',
  vane: '#216641',
}

/** Sample-quality classes (Lunne, Berre & Strandvik 1997) from best to worst, with their shading. */
export interface QualityShade { key: string, label: string, fill: string, stroke: string, dash?: string }

export const QUALITY_SHADES: QualityShade[] = [
  { key: 'very-good-to-excellent', label: 'Very good to excellent', fill: '#1c4450', stroke: '#0c242b' },
  { key: 'good-to-fair', label: 'Good to fair', fill: '#4d9aa8', stroke: '#1c4450' },
  { key: 'poor', label: 'Poor', fill: '#d5ecef', stroke: '#1c4450' },
  { key: 'very-poor', label: 'Very poor', fill: '#ffffff', stroke: '#1c4450', dash: '2 1.5' },
]
const UNKNOWN_QUALITY: QualityShade = { key: 'unknown', label: 'Not classed', fill: '#c9c1b0', stroke: '#564e44' }

export function qualityShade(cls: string | null): QualityShade {
  return QUALITY_SHADES.find(q => q.key === cls) ?? UNKNOWN_QUALITY
}

/** A symbol's outline centred on 0,0, about `size` px across. */
export function symbolPath(source: PointSource, size = 7, cx = 0, cy = 0): string {
  const h = size / 2
  const n = (v: number) => Math.round(v * 100) / 100
  switch (source) {
    // A lab specimen: a square.
    case 'oedometer': return `M${n(cx - h)},${n(cy - h)}H${n(cx + h)}V${n(cy + h)}H${n(cx - h)}Z`
    // A resampled cone value: a small disc.
    case 'cpt': {
      const r = h * 0.72
      return `M${n(cx - r)},${n(cy)}a${r},${r} 0 1,0 ${2 * r},0a${r},${r} 0 1,0 ${-2 * r},0Z`
    }
    // A vane blade seen end-on: a triangle.
    case 'vane': return `M${n(cx)},${n(cy - h * 1.1)}L${n(cx + h * 1.05)},${n(cy + h * 0.8)}H${n(cx - h * 1.05)}Z`
  }
}

/** Reviewer verdict marks: a ring around the symbol. */
export const VERDICT_INK = {
  exclude: { stroke: '#c0392b', dash: '', width: 1.8 },
  questionable: { stroke: '#dc9c38', dash: '2.5 1.5', width: 1.6 },
  accepted: { stroke: '#2e8b57', dash: '', width: 1.2 },
} as const

/** How one σ'p point is drawn: symbol by source, shading by quality, hollow when left out, a ring for a flag. */
export interface MarkStyle {
  d: string
  fill: string
  stroke: string
  width: number
  dash?: string
  opacity: number
  ring: { stroke: string, dash: string, width: number } | null
  slash: boolean
}

/** Symbol sizes of the σ'p marks, px across. */
export const MARK_SIZES: Record<PointSource, number> = { oedometer: 8, cpt: 6, vane: 7.5 }
const MARK_SYMBOLS: Record<PointSource, string> = { oedometer: symbolPath('oedometer', 8), cpt: symbolPath('cpt', 6), vane: symbolPath('vane', 7.5) }
export const RING_PATH = 'M-7,0a7,7 0 1,0 14,0a7,7 0 1,0 -14,0Z'
export const SLASH_PATH = 'M-5,-5L5,5'
/** The ring and slash at a point (for marks drawn as one path per style). */
export const ringPathAt = (x: number, y: number) => `M${Math.round((x - 7) * 100) / 100},${Math.round(y * 100) / 100}a7,7 0 1,0 14,0a7,7 0 1,0 -14,0Z`
export const slashPathAt = (x: number, y: number) => `M${Math.round((x - 5) * 100) / 100},${Math.round((y - 5) * 100) / 100}l10,10`

export function markStyle(source: PointSource, qualityClass: string | null, state: 'included' | 'excluded' | 'flagged-out' | 'unassigned', verdict: keyof typeof VERDICT_INK | null): MarkStyle {
  const out = state === 'excluded' || state === 'flagged-out'
  const q = source === 'oedometer' ? qualityShade(qualityClass) : null
  return {
    d: MARK_SYMBOLS[source],
    fill: out ? '#ffffff' : q ? q.fill : SOURCE_INK[source],
    stroke: out ? INK.left : q ? q.stroke : '#ffffff',
    width: source === 'oedometer' ? 1.2 : 0.6,
    dash: q?.dash,
    opacity: state === 'included' ? 1 : 0.7,
    ring: verdict ? VERDICT_INK[verdict] : null,
    slash: state === 'flagged-out',
  }
}
