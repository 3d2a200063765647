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

/** Text made safe inside SVG markup (element content and attribute values). */
export function svgEscape(v: string): string {
  return v.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
}

/** A coordinate written short (two decimals at most). */
export function px(v: number): string {
  return String(Math.round(v * 100) / 100)
}
