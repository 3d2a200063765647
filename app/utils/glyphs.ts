import type { GroundwaterKind, PointKind, SampleType } from '#shared/investigation/types'
import { sampleGlyph } from '#shared/plots/log-glyphs'

/**
 * Pastload's own marks for plans and logs, as plain SVG path parts so D3 drawings
 * and the HTML legends draw them from one definition.
 */
export interface GlyphPart {
  d: string
  fill: string
  stroke?: string
  strokeWidth?: number
}

const TIDE = '#1f5261'
const OCHRE = '#ab621c'
const SILT = '#564e44'
const GOOD = '#216641'
const WHITE = '#ffffff'

function circle(cx: number, cy: number, r: number): string {
  return `M${cx - r},${cy}a${r},${r} 0 1,0 ${2 * r},0a${r},${r} 0 1,0 ${-2 * r},0Z`
}

export const POINT_KIND_LABELS: Record<PointKind, string> = {
  'borehole': 'Borehole',
  'cpt': 'CPT sounding',
  'test-pit': 'Test pit',
  'piezometer': 'Piezometer',
}

/** Plan symbols, centred on the point, about 14 px across. */
export const POINT_GLYPHS: Record<PointKind, GlyphPart[]> = {
  // A drilled hole: a solid disc with a bright core.
  'borehole': [
    { d: circle(0, 0, 6.5), fill: TIDE, stroke: WHITE, strokeWidth: 1.2 },
    { d: circle(0, 0, 2.2), fill: WHITE },
  ],
  // A cone pushed into the ground: a downward wedge under a short rod.
  'cpt': [
    { d: 'M0,-8.5V-4', fill: 'none', stroke: OCHRE, strokeWidth: 2 },
    { d: 'M-6.5,-4.5H6.5L0,7.5Z', fill: OCHRE, stroke: WHITE, strokeWidth: 1.2 },
  ],
  // An excavation seen from above: a square with a floor line.
  'test-pit': [
    { d: 'M-6,-6H6V6H-6Z', fill: SILT, stroke: WHITE, strokeWidth: 1.2 },
    { d: 'M-3.5,1.5H3.5', fill: 'none', stroke: WHITE, strokeWidth: 1.6 },
  ],
  // A standpipe: a diamond pierced by a riser.
  'piezometer': [
    { d: 'M0,-7L7,0L0,7L-7,0Z', fill: GOOD, stroke: WHITE, strokeWidth: 1.2 },
    { d: 'M0,-4V4', fill: 'none', stroke: WHITE, strokeWidth: 1.8 },
  ],
}

export const SAMPLE_TYPE_LABELS: Record<SampleType, string> = {
  'thin-walled-tube': 'Thin-walled tube',
  'piston': 'Piston',
  'block': 'Block',
  'bulk': 'Bulk',
  'spt-split-spoon': 'SPT split spoon',
  'core': 'Core',
}

/**
 * A sample's mark in a log column `w` px wide spanning `h` px (the sampled length): the shape of what was
 * taken, as on the stress-history log (`shared/plots/log-glyphs.ts`).
 */
export function sampleMarkParts(type: SampleType, w: number, h: number): GlyphPart[] {
  return sampleGlyph(type, w, h)
}

export const GROUNDWATER_KIND_LABELS: Record<GroundwaterKind, string> = {
  strike: 'Water strike',
  standing: 'Standing level',
  piezometer: 'Piezometer reading',
}

const WATER = '#246575'

/** Water marks with their tip on the level (0,0): strike open ▽, standing filled ▼ over two ripples, piezometer ◇. */
export const WATER_GLYPHS: Record<GroundwaterKind, GlyphPart[]> = {
  strike: [{ d: 'M-5,-8H5L0,0Z', fill: WHITE, stroke: WATER, strokeWidth: 1.4 }],
  standing: [
    { d: 'M-5,-8H5L0,0Z', fill: WATER, stroke: WATER, strokeWidth: 1.2 },
    { d: 'M-6,3H6M-3.5,5.5H3.5', fill: 'none', stroke: WATER, strokeWidth: 1.1 },
  ],
  piezometer: [{ d: 'M0,-5L5,0L0,5L-5,0Z', fill: WHITE, stroke: WATER, strokeWidth: 1.4 }],
}

/** Markup of glyph parts, for `v-html` inside an `<svg>` or a D3 `.html()`. */
export function glyphMarkup(parts: readonly GlyphPart[]): string {
  return parts.map(p => `<path d="${p.d}" fill="${p.fill}"${p.stroke ? ` stroke="${p.stroke}" stroke-width="${p.strokeWidth ?? 1}"` : ''}/>`).join('')
}
