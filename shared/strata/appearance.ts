/**
 * Pastload's own look for strata on logs, sections and charts: a muted palette that survives greyscale
 * printing and a set of SVG fill patterns. Defined once here so every view and export draws a stratum alike.
 * Pure data and functions: no DOM.
 */
import { uscsFamily } from './uscs'

export const STRATUM_COLOUR_KEYS = [
  'fill-ochre',
  'crust-tan',
  'clay-grey',
  'estuary-slate',
  'silt-sage',
  'sand-straw',
  'gravel-rust',
  'peat-brown',
  'organic-olive',
  'glacial-umber',
  'rock-charcoal',
  'stone-neutral',
] as const
export type StratumColourKey = (typeof STRATUM_COLOUR_KEYS)[number]

export interface StratumColour {
  key: StratumColourKey
  label: string
  /** Fill colour, `#rrggbb`. */
  hex: string
  /** A darker tone of the same hue for the pattern strokes drawn over the fill, `#rrggbb`. */
  ink: string
}

/** Fill hex per key: muted mid-tones so black text stays readable and greyscale copies keep strata apart. */
const FILL_HEX: Record<StratumColourKey, { label: string, hex: string }> = {
  'fill-ochre': { label: 'Fill ochre', hex: '#b39660' },
  'crust-tan': { label: 'Crust tan', hex: '#a98c6b' },
  'clay-grey': { label: 'Clay grey', hex: '#8e959b' },
  'estuary-slate': { label: 'Estuary slate', hex: '#77858f' },
  'silt-sage': { label: 'Silt sage', hex: '#a6af8f' },
  'sand-straw': { label: 'Sand straw', hex: '#d9c793' },
  'gravel-rust': { label: 'Gravel rust', hex: '#b8845e' },
  'peat-brown': { label: 'Peat brown', hex: '#6f5a48' },
  'organic-olive': { label: 'Organic olive', hex: '#7e7858' },
  'glacial-umber': { label: 'Glacial umber', hex: '#8c7862' },
  'rock-charcoal': { label: 'Rock charcoal', hex: '#5c6065' },
  'stone-neutral': { label: 'Stone neutral', hex: '#b8b4ab' },
}

/** Moves each channel toward a target (0 = black, 255 = white) by a share: the tints of the pattern inks. */
function mix(hex: string, target: number, share: number): string {
  const value = Number.parseInt(hex.slice(1), 16)
  const channel = (shift: number): string => {
    const c = (value >> shift) & 0xff
    return Math.round(c + (target - c) * share).toString(16).padStart(2, '0')
  }
  return `#${channel(16)}${channel(8)}${channel(0)}`
}

/** Mean of the channels, 0–255: enough to tell the dark fills, which need a light ink, from the rest. */
function brightness(hex: string): number {
  const value = Number.parseInt(hex.slice(1), 16)
  return (((value >> 16) & 0xff) + ((value >> 8) & 0xff) + (value & 0xff)) / 3
}

/** Pattern ink for a fill: a deep shade of the same hue, or a pale tint on the darkest fills, so marks read in colour and greyscale. */
function inkFor(hex: string): string {
  return brightness(hex) < 110 ? mix(hex, 255, 0.6) : mix(hex, 0, 0.55)
}

export const STRATUM_COLOURS: readonly StratumColour[] = STRATUM_COLOUR_KEYS.map(key => ({
  key,
  label: FILL_HEX[key].label,
  hex: FILL_HEX[key].hex,
  ink: inkFor(FILL_HEX[key].hex),
}))

export const STRATUM_PATTERN_KEYS = [
  'made-ground',
  'clay',
  'silt',
  'sand',
  'gravel',
  'gravelly-clay',
  'peat',
  'organic-clay',
  'rock',
  'plain',
] as const
export type StratumPatternKey = (typeof STRATUM_PATTERN_KEYS)[number]

export interface StratumPattern {
  key: StratumPatternKey
  label: string
  /** Edge of the square tile in user units; the `<pattern>` uses width = height = size. */
  size: number
  /**
   * `<path>`/`<circle>` markup for one tile. Strokes and dots use `currentColor`, so the view sets the
   * ink with CSS `color`; every mark stays inside the tile (or meets its copy on the next tile) so tiles join seamlessly.
   */
  svg: string
  /** The same marks as data, for views that build SVG elements rather than markup. */
  marks: readonly PatternMark[]
}

/** One mark of a tile: a stroked path, a stroked ring or a filled dot, all in `currentColor`. */
export type PatternMark =
  | { kind: 'line', d: string }
  | { kind: 'ring' | 'dot', cx: number, cy: number, r: number }

/** The stroke every line and ring shares, as SVG attributes. */
export const PATTERN_STROKE = { 'fill': 'none', 'stroke': 'currentColor', 'stroke-width': 0.9, 'stroke-linecap': 'round', 'stroke-linejoin': 'round' } as const

const STROKE = 'fill="none" stroke="currentColor" stroke-width="0.9" stroke-linecap="round" stroke-linejoin="round"'

/** One stroked path; all patterns share the stroke so their weights match on one log. */
function line(d: string): PatternMark {
  return { kind: 'line', d }
}

function ring(cx: number, cy: number, r: number): PatternMark {
  return { kind: 'ring', cx, cy, r }
}

function dot(cx: number, cy: number, r: number): PatternMark {
  return { kind: 'dot', cx, cy, r }
}

/** A mark as SVG markup (for D3 drawings that write a `<pattern>` as text). */
export function patternMarkMarkup(m: PatternMark): string {
  if (m.kind === 'line') return `<path d="${m.d}" ${STROKE}/>`
  if (m.kind === 'ring') return `<circle cx="${m.cx}" cy="${m.cy}" r="${m.r}" ${STROKE}/>`
  return `<circle cx="${m.cx}" cy="${m.cy}" r="${m.r}" fill="currentColor"/>`
}

const PATTERN_DEFS: ReadonlyArray<Omit<StratumPattern, 'svg'>> = [
  {
    key: 'made-ground',
    label: 'Fill / made ground',
    size: 16,
    // Mixed debris: a shard, a block, a chip and a stray dash at odd angles — deliberately unordered.
    marks: [line('M2.5 5.5L5 1.8L6.8 5.2Z'), line('M9.5 3L13.5 6'), line('M3 10.5h3v3h-3Z'), line('M8 13.8h2.5'), dot(12, 11.5, 1.1)],
  },
  {
    key: 'clay',
    label: 'Clay',
    size: 12,
    // Staggered horizontal dashes: the bedded, fine-grained look without a continuous ruling.
    marks: [line('M0.5 3h6.5'), line('M6.5 9h5')],
  },
  {
    key: 'silt',
    label: 'Silt',
    size: 12,
    // Dashes broken by dots: between the clay dashes and the sand stipple.
    marks: [line('M1 3h5'), dot(9.2, 3, 0.75), dot(3.5, 9, 0.75), line('M6.5 9h4.5')],
  },
  {
    key: 'sand',
    label: 'Sand',
    size: 10,
    // Irregular stipple of five grains.
    marks: [dot(2, 2.5, 0.7), dot(7, 1.5, 0.7), dot(4.5, 6, 0.7), dot(8.5, 7.5, 0.7), dot(1.5, 8.5, 0.7)],
  },
  {
    key: 'gravel',
    label: 'Gravel',
    size: 16,
    // Open rings of mixed size with one fine grain: clasts in a sandy matrix.
    marks: [ring(4, 4.5, 2.2), ring(11.5, 3.5, 1.4), ring(9, 10.5, 2.6), ring(2.8, 12.5, 1.2), dot(14, 13.5, 0.6)],
  },
  {
    key: 'gravelly-clay',
    label: 'Gravelly clay (till)',
    size: 16,
    // Clay dashes carrying scattered clasts.
    marks: [line('M1 3h7'), line('M9 11h6'), ring(12.5, 4, 1.5), ring(4, 11.5, 1.8)],
  },
  {
    key: 'peat',
    label: 'Peat',
    size: 14,
    // Short ground lines with three-stem tufts: plant remains.
    marks: [line('M1 5h6M4 5V2.2M2.6 5L1.6 3M5.4 5L6.4 3'), line('M8 12h5M10.5 12V9.2M9.2 12l-1-2M11.8 12l1-2')],
  },
  {
    key: 'organic-clay',
    label: 'Organic clay',
    size: 14,
    // Clay dashes with one small tuft: fine-grained soil with organic matter.
    marks: [line('M1 3.5h6'), line('M7.5 10.5h5.5'), line('M3.5 11V9M2.5 11l-0.8-1.5M4.5 11l0.8-1.5')],
  },
  {
    key: 'rock',
    label: 'Rock',
    size: 16,
    // Courses of blocks with staggered joints.
    marks: [line('M0 0.5h16M0 8.5h16'), line('M5 0.5v8'), line('M12 8.5v7.5')],
  },
  {
    key: 'plain',
    label: 'Plain (solid fill)',
    size: 8,
    // No marks: the colour alone, for strata the engineer prefers unpatterned.
    marks: [],
  },
]

export const STRATUM_PATTERNS: readonly StratumPattern[] = PATTERN_DEFS.map(p => ({ ...p, svg: p.marks.map(patternMarkMarkup).join('') }))

export interface StratumAppearance {
  colour: StratumColourKey
  pattern: StratumPatternKey
}

const COLOUR_SET: ReadonlySet<string> = new Set(STRATUM_COLOUR_KEYS)
const PATTERN_SET: ReadonlySet<string> = new Set(STRATUM_PATTERN_KEYS)

export function isStratumColourKey(key: string): key is StratumColourKey {
  return COLOUR_SET.has(key)
}

export function isStratumPatternKey(key: string): key is StratumPatternKey {
  return PATTERN_SET.has(key)
}

/** The palette entry for a key; undefined for a key that is not in the palette (e.g. from an old export). */
export function stratumColour(key: string): StratumColour | undefined {
  return STRATUM_COLOURS.find(c => c.key === key)
}

/** The pattern for a key; undefined for a key that is not in the set. */
export function stratumPattern(key: string): StratumPattern | undefined {
  return STRATUM_PATTERNS.find(p => p.key === key)
}

/** Shown for a symbol that is empty or not a USCS group symbol: neutral, so it does not pretend to know the soil. */
export const FALLBACK_APPEARANCE: StratumAppearance = { colour: 'stone-neutral', pattern: 'plain' }

/**
 * A first suggestion of colour and pattern from a USCS group symbol, which the engineer can change per stratum.
 * Dual symbols follow their first half (SP-SM → sand); unknown symbols get the neutral fallback.
 */
export function defaultAppearanceFor(uscs: string): StratumAppearance {
  switch (uscsFamily(uscs)) {
    case 'gravel': return { colour: 'gravel-rust', pattern: 'gravel' }
    case 'sand': return { colour: 'sand-straw', pattern: 'sand' }
    case 'silt': return { colour: 'silt-sage', pattern: 'silt' }
    case 'clay': return { colour: 'clay-grey', pattern: 'clay' }
    case 'organic': return { colour: 'organic-olive', pattern: 'organic-clay' }
    case 'peat': return { colour: 'peat-brown', pattern: 'peat' }
    case null: return { ...FALLBACK_APPEARANCE }
  }
}
