import type { GroundwaterKind, SampleType } from '../investigation/types'
import type { PreconsolidationSource } from '../schemas/lab'

/**
 * Pastload's marks on the stress-history log, as SVG path parts: each sample mark is the shape of what was
 * taken (a tube, a tube with its piston, a cut block, a tied bag, a split barrel, a stack of core sticks),
 * the SPT a driven chevron, water a drop on its level, σ'p points by source and sample quality. One
 * definition for the PDF, the HTML sheet and the key.
 */
export interface LogGlyphPart { d: string, fill: string, stroke?: string, strokeWidth?: number }

export const LOG_INK = {
  tide: '#1f5261',
  tideDark: '#183a44',
  tideLight: '#d5ecef',
  ochre: '#c98024',
  ochreDark: '#8a5414',
  ochreLight: '#f7eacb',
  silt: '#7f7360',
  siltLight: '#efede7',
  water: '#246575',
  text: '#27231f',
  white: '#ffffff',
} as const

export const SAMPLE_WORDS: Record<SampleType, string> = {
  'thin-walled-tube': 'Thin-walled tube',
  'piston': 'Piston tube',
  'block': 'Block',
  'bulk': 'Bulk bag',
  'spt-split-spoon': 'SPT split barrel',
  'core': 'Core run',
}

/** Width of a sample mark in the samples lane, pt. */
export const SAMPLE_MARK_WIDTH = 8

/** A rounded capsule `w` wide and `h` tall from (0,0): the tube's outline. */
function capsule(w: number, h: number): string {
  const r = Math.min(w / 2, h / 2)
  return `M0,${r}A${r},${r} 0 0,1 ${w},${r}V${h - r}A${r},${r} 0 0,1 0,${h - r}Z`
}

/**
 * A sample's mark over its sampled length `h` (pt), `w` wide, top-left at (0,0). Tubes and cores span the
 * length; a block and a bag are objects drawn at their depth (centred on the span).
 */
export function sampleGlyph(type: SampleType, w: number, h: number): LogGlyphPart[] {
  // Tubes and cores stay longer than wide at small scales, so a tube never reads as a ring.
  const hh = Math.max(h, w + 3)
  const mid = h / 2
  switch (type) {
    case 'thin-walled-tube':
      return [{ d: capsule(w, hh), fill: LOG_INK.tideLight, stroke: LOG_INK.tide, strokeWidth: 1 }]
    case 'piston':
      return [
        { d: capsule(w, hh), fill: LOG_INK.tideLight, stroke: LOG_INK.tide, strokeWidth: 1 },
        { d: `M${w / 2},${Math.min(2.5, hh / 2)}V${hh - 1}`, fill: 'none', stroke: LOG_INK.tide, strokeWidth: 0.8 },
        { d: `M1.2,${Math.min(2.5, hh / 2)}H${w - 1.2}`, fill: 'none', stroke: LOG_INK.tideDark, strokeWidth: 2 },
      ]
    case 'block': {
      // A cut cube seen from above and aside.
      const s = w * 0.45
      const y0 = mid - w / 2
      return [
        { d: `M${w / 2},${y0}L${w},${y0 + s / 2}V${y0 + w - s / 2}L${w / 2},${y0 + w}L0,${y0 + w - s / 2}V${y0 + s / 2}Z`, fill: LOG_INK.ochreLight, stroke: LOG_INK.ochreDark, strokeWidth: 0.9 },
        { d: `M0,${y0 + s / 2}L${w / 2},${y0 + s}L${w},${y0 + s / 2}M${w / 2},${y0 + s}V${y0 + w}`, fill: 'none', stroke: LOG_INK.ochreDark, strokeWidth: 0.7 },
      ]
    }
    case 'bulk': {
      // A tied sack: a round body under a pinched neck and its tie.
      const y0 = mid - w * 0.6
      return [
        { d: `M${w * 0.35},${y0 + w * 0.3}C${-w * 0.15},${y0 + w * 0.55} ${-w * 0.05},${y0 + w * 1.2} ${w / 2},${y0 + w * 1.2}C${w * 1.05},${y0 + w * 1.2} ${w * 1.15},${y0 + w * 0.55} ${w * 0.65},${y0 + w * 0.3}Z`, fill: LOG_INK.ochre, stroke: LOG_INK.ochreDark, strokeWidth: 0.8 },
        { d: `M${w * 0.25},${y0}L${w * 0.5},${y0 + w * 0.3}L${w * 0.75},${y0}`, fill: 'none', stroke: LOG_INK.ochreDark, strokeWidth: 0.9 },
      ]
    }
    case 'spt-split-spoon':
      // The barrel opened lengthwise: two half-shells with the core between.
      return [
        { d: `M0,0H${w * 0.32}V${hh}H0Z`, fill: LOG_INK.silt },
        { d: `M${w * 0.68},0H${w}V${hh}H${w * 0.68}Z`, fill: LOG_INK.silt },
        { d: `M${w / 2},0.8V${hh - 0.8}`, fill: 'none', stroke: LOG_INK.ochre, strokeWidth: 1.6 },
      ]
    case 'core': {
      // Sticks of core stacked down the run, a small break between each.
      const sticks: LogGlyphPart[] = []
      const n = Math.max(1, Math.round(hh / 13))
      const step = hh / n
      for (let i = 0; i < n; i++) sticks.push({ d: translatePath(capsule(w, Math.max(2, step - 1.2)), 0, i * step), fill: LOG_INK.siltLight, stroke: LOG_INK.silt, strokeWidth: 0.8 })
      return sticks
    }
  }
}

/** Shifts an absolute path (M, L, H, V, A, C, Z only) by (dx, dy). */
function translatePath(d: string, dx: number, dy: number): string {
  if (!dx && !dy) return d
  return d.replace(/([MLHVAC])([^MLHVACZ]*)/g, (_m, cmd: string, args: string) => {
    const nums = args.split(/[\s,]+/).filter(Boolean).map(Number)
    const shift = (v: number, axis: 'x' | 'y') => String(Math.round((v + (axis === 'x' ? dx : dy)) * 100) / 100)
    switch (cmd) {
      case 'H': return `H${nums.map(v => shift(v, 'x')).join(',')}`
      case 'V': return `V${nums.map(v => shift(v, 'y')).join(',')}`
      case 'A': return `A${nums.slice(0, 5).join(',')} ${shift(nums[5]!, 'x')},${shift(nums[6]!, 'y')}`
      default: return cmd + nums.map((v, i) => shift(v, i % 2 === 0 ? 'x' : 'y')).join(',')
    }
  })
}

/** The SPT mark: a chevron driven down; a refusal adds the bar it stopped on. Centre at (0,0), about 8 pt across. */
export function sptGlyph(refusal: boolean): LogGlyphPart[] {
  const chevron: LogGlyphPart = { d: 'M-3.5,-3L0,1L3.5,-3', fill: 'none', stroke: LOG_INK.ochreDark, strokeWidth: 1.4 }
  return refusal ? [chevron, { d: 'M-4,3.2H4', fill: 'none', stroke: LOG_INK.ochreDark, strokeWidth: 1.6 }] : [chevron]
}

export const WATER_WORDS: Record<GroundwaterKind, string> = {
  strike: 'Water met while drilling',
  standing: 'Water level after standing',
  piezometer: 'Piezometer level',
}

/** A water level mark with its level at y = 0 from x = 0 to the right: a drop sitting on a short level line. */
export function waterGlyph(kind: GroundwaterKind): LogGlyphPart[] {
  const drop = 'M5,-9C5,-9 1.8,-5.2 1.8,-3.4A3.2,3.2 0 0,0 8.2,-3.4C8.2,-5.2 5,-9 5,-9Z'
  const level: LogGlyphPart = { d: 'M0,0H10', fill: 'none', stroke: LOG_INK.water, strokeWidth: 1.3 }
  switch (kind) {
    case 'strike': return [level, { d: drop, fill: LOG_INK.white, stroke: LOG_INK.water, strokeWidth: 1 }]
    case 'standing': return [level, { d: drop, fill: LOG_INK.water, stroke: LOG_INK.water, strokeWidth: 1 }]
    case 'piezometer': return [level, { d: 'M5,-1V-5', fill: 'none', stroke: LOG_INK.water, strokeWidth: 1 }, { d: 'M5,-9.5A2.4,2.4 0 1,0 5,-4.7A2.4,2.4 0 1,0 5,-9.5Z', fill: LOG_INK.white, stroke: LOG_INK.water, strokeWidth: 1 }]
  }
}

/** σ'p point marks, by source; an oedometer point is solid for quality class 1 or 2 and open otherwise. */
export type SigmaPMark = 'oedometer-good' | 'oedometer-other' | 'cpt' | 'vane'

export const SIGMA_P_WORDS: Record<SigmaPMark, string> = {
  'oedometer-good': "σ'p oedometer, sample quality 1–2",
  'oedometer-other': "σ'p oedometer, lower or unknown quality",
  'cpt': "σ'p from CPT",
  'vane': "σ'p from vane",
}

export function sigmaPMarkOf(source: PreconsolidationSource, qualityClass: string | null): SigmaPMark {
  if (source === 'oedometer') return qualityClass !== null && /^[12]$/.test(qualityClass.trim()) ? 'oedometer-good' : 'oedometer-other'
  return source
}

/** A σ'p mark centred on (0,0). */
export function sigmaPGlyph(mark: SigmaPMark): LogGlyphPart[] {
  switch (mark) {
    case 'oedometer-good': return [{ d: 'M-3,0A3,3 0 1,0 3,0A3,3 0 1,0 -3,0Z', fill: LOG_INK.ochre, stroke: LOG_INK.ochreDark, strokeWidth: 0.8 }]
    case 'oedometer-other': return [{ d: 'M-3,0A3,3 0 1,0 3,0A3,3 0 1,0 -3,0Z', fill: LOG_INK.white, stroke: LOG_INK.ochreDark, strokeWidth: 1 }]
    case 'cpt': return [{ d: 'M-1.3,0A1.3,1.3 0 1,0 1.3,0A1.3,1.3 0 1,0 -1.3,0Z', fill: LOG_INK.silt }]
    case 'vane': return [{ d: 'M0,-3.4L3,2.2H-3Z', fill: LOG_INK.white, stroke: LOG_INK.tide, strokeWidth: 1 }]
  }
}

/** Markup of glyph parts, optionally moved to (x, y). */
export function logGlyphMarkup(parts: readonly LogGlyphPart[], x = 0, y = 0, key?: string): string {
  const body = parts.map(p => `<path d="${p.d}" fill="${p.fill}"${p.stroke ? ` stroke="${p.stroke}" stroke-width="${p.strokeWidth ?? 1}"` : ''}/>`).join('')
  const tag = key ? ` data-key="${key}"` : ''
  return x || y || key ? `<g${tag} transform="translate(${round2(x)},${round2(y)})">${body}</g>` : body
}

export function round2(v: number): number {
  return Math.round(v * 100) / 100
}
