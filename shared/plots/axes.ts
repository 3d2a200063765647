import * as d3 from 'd3'

/** Axis helpers shared by the page drawings and the reports' SVG. */

export interface AxisTick { at: number, label: string }

/**
 * Ticks of an SI scale placed at round values of the display unit: `factor` is how
 * many display units one SI unit is (1 for SI).
 */
export function displayTicks(scale: d3.ScaleLinear<number, number>, factor: number, count: number): AxisTick[] {
  const [a, b] = scale.domain() as [number, number]
  const shown = d3.scaleLinear().domain([a * factor, b * factor])
  const fmt = shown.tickFormat(count)
  return shown.ticks(count).map(t => ({ at: scale(t / factor), label: fmt(t) }))
}

/** Width of a tick label in px: about 0.6 em per character of a sans-serif label (common practice). */
export function labelWidthPx(label: string, fontPx = 10): number {
  return label.length * fontPx * 0.6
}

export interface FittedTicksOptions {
  /** How many display units one SI unit is (1 for SI). */
  factor?: number
  /** Labels side by side (a horizontal axis) or stacked (a vertical axis). */
  orientation?: 'horizontal' | 'vertical'
  /** Label font size in px. */
  fontPx?: number
  /** Free space wanted between two labels, px. */
  gapPx?: number
  /** At most this many ticks whatever the length. */
  max?: number
}

/** True when two neighbouring labels of the ticks would touch. */
export function ticksOverlap(ticks: readonly AxisTick[], options: Pick<FittedTicksOptions, 'orientation' | 'fontPx' | 'gapPx'> = {}): boolean {
  const font = options.fontPx ?? 10
  const gap = options.gapPx ?? 6
  const sorted = [...ticks].sort((a, b) => a.at - b.at)
  for (let i = 1; i < sorted.length; i++) {
    const a = sorted[i - 1]
    const b = sorted[i]
    if (!a || !b) continue
    const need = options.orientation === 'vertical' ? font + gap : (labelWidthPx(a.label, font) + labelWidthPx(b.label, font)) / 2 + gap
    if (b.at - a.at < need) return true
  }
  return false
}

/**
 * Ticks at round display values whose labels never overlap: d3's `ticks` with a count derived from
 * the axis length in px (about one label and a gap per tick), then fewer until no two labels touch —
 * so "12 000" psf labels get wider spacing than "500" kPa ones on the same axis.
 */
export function fittedTicks(scale: d3.ScaleLinear<number, number>, options: FittedTicksOptions = {}): AxisTick[] {
  const factor = options.factor ?? 1
  const font = options.fontPx ?? 10
  const gap = options.gapPx ?? 6
  const [r0, r1] = scale.range() as [number, number]
  const length = Math.abs(r1 - r0)
  const [a, b] = scale.domain() as [number, number]
  const widest = Math.max(...[a, b].map(v => labelWidthPx(d3.format(',')(Math.round(v * factor)), font)), labelWidthPx('0.00', font))
  const slot = options.orientation === 'vertical' ? font + gap : widest + gap
  let count = Math.max(1, Math.min(options.max ?? 12, Math.floor(length / slot)))
  let ticks = displayTicks(scale, factor, count)
  while (count > 1 && ticksOverlap(ticks, { orientation: options.orientation, fontPx: font, gapPx: gap })) {
    count -= 1
    ticks = displayTicks(scale, factor, count)
  }
  return ticks
}

/** Ticks of a log scale of SI values at 1, 2 and 5 of each display decade (fewer when their labels would touch). */
export function fittedLogTicks(scale: d3.ScaleLogarithmic<number, number>, options: FittedTicksOptions = {}): (AxisTick & { major: boolean })[] {
  const factor = options.factor ?? 1
  const [lo, hi] = (scale.domain() as [number, number]).map(v => v * factor) as [number, number]
  const label = (v: number) => (v >= 1 ? d3.format(',')(v) : String(Number(v.toPrecision(2))))
  const pick = (mantissas: number[]) => {
    const out: (AxisTick & { major: boolean })[] = []
    for (let d = Math.floor(Math.log10(lo)); d <= Math.ceil(Math.log10(hi)); d++) {
      for (const m of mantissas) {
        const v = m * 10 ** d
        if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) out.push({ at: scale(v / factor), label: label(v), major: m === 1 })
      }
    }
    return out
  }
  for (const set of [[1, 2, 5], [1, 3], [1]]) {
    const ticks = pick(set)
    if (!ticksOverlap(ticks, options)) return ticks
  }
  return pick([1])
}

/** Text made safe inside SVG markup (element content and attribute values). */
export function svgEscape(v: string): string {
  return v.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
}

/** A coordinate written short (two decimals at most). */
export function px(v: number): string {
  return String(Math.round(v * 100) / 100)
}
