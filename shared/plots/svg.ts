import * as d3 from 'd3'

/**
 * Small helpers for the plot builders' SVG strings (the PDF reports embed them; the pages render the same
 * scenes with Vue). Text is escaped; numbers are rounded to 0.01 px so the strings stay short.
 */

export interface AxisTick { at: number, label: string }

/** The font family of plot text: Source Sans 3 (the reports register it under this name). */
export const PLOT_FONT = 'SourceSans3'

export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

export function n(v: number): string {
  return String(Math.round(v * 100) / 100)
}

type AttrValue = string | number | null | undefined
/** An SVG element: `el('line', { x1: 0, … })`; null/undefined attributes are left out. */
export function el(tag: string, attrs: Record<string, AttrValue>, body?: string): string {
  const a = Object.entries(attrs)
    .filter(([, v]) => v !== null && v !== undefined && v !== '')
    .map(([k, v]) => ` ${k}="${typeof v === 'number' ? n(v) : esc(v as string)}"`)
    .join('')
  return body === undefined ? `<${tag}${a}/>` : `<${tag}${a}>${body}</${tag}>`
}

export function text(x: number, y: number, content: string, attrs: Record<string, AttrValue> = {}): string {
  return el('text', { x, y, ...attrs }, esc(content))
}

export function svgDocument(width: number, height: number, body: string, font = PLOT_FONT): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${n(width)}" height="${n(height)}" viewBox="0 0 ${n(width)} ${n(height)}" font-family="${font}">${body}</svg>`
}

/** Round ticks of a scale in display units (`factor` display units per SI unit), placed in px. */
export function scaleTicks(scale: { domain: () => number[], (v: number): number }, factor: number, count: number): AxisTick[] {
  const [a = 0, b = 1] = scale.domain()
  const shown = d3.scaleLinear().domain([a * factor, b * factor])
  const fmt = shown.tickFormat(count)
  return shown.ticks(count).map(t => ({ at: scale(t / factor), label: fmt(t) }))
}
