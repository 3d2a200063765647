/**
 * Page and label geometry of the point log: which depth range each page shows at a drawing scale, and
 * where labels go in a lane so none overlaps. Pure; the SVG builder (`shared/plots/point-log.ts`), the
 * PDF (`point-log.ts`) and the HTML sheet use the same numbers.
 */

export const LOG_SCALES = [50, 100, 200] as const
export type LogScale = (typeof LOG_SCALES)[number]

/** Points (1/72 in) per millimetre of paper. */
export const PT_PER_MM = 72 / 25.4

/** Drawn points per metre of depth at 1:scale (1 m of ground is 1000/scale mm of paper). */
export function ptPerMetre(scale: LogScale): number {
  return (1000 / scale) * PT_PER_MM
}

/**
 * Depth shown on one page: the largest whole number of metres that fits `drawHeight` points, rounded down
 * to a multiple of 5 m when at least 5 m fit (page breaks at round depths, common practice on logs).
 */
export function depthPerPage(scale: LogScale, drawHeight: number): number {
  const fit = drawHeight / ptPerMetre(scale)
  if (!(fit >= 1)) throw new RangeError(`a page of ${drawHeight} pt cannot hold 1 m at 1:${scale}`)
  return fit >= 5 ? Math.floor(fit / 5) * 5 : Math.floor(fit)
}

export interface LogPage { index: number, from: number, to: number }

/** The pages of a hole `finalDepth` m deep: consecutive depth ranges from 0, the last one ending at the hole's end. */
export function paginateLog(finalDepth: number, scale: LogScale, drawHeight: number): LogPage[] {
  if (!(finalDepth > 0) || !Number.isFinite(finalDepth)) throw new RangeError('the final depth must be a positive number')
  const per = depthPerPage(scale, drawHeight)
  const pages: LogPage[] = []
  for (let from = 0, i = 0; from < finalDepth - 1e-9; from += per, i++) {
    pages.push({ index: i, from, to: Math.min(from + per, finalDepth) })
  }
  return pages
}

export interface LabelWish { id: string, want: number, height: number }
export interface PlacedLabel { id: string, y: number, height: number, want: number }

/**
 * Places labels in one lane: each as near its wanted top `want` as it can be, in depth order, none
 * overlapping the next (a gap of `gap`), all between `min` and `max`. Pushes down, then back up from the
 * bottom when the last one runs past `max`. When the labels together are taller than the lane, they stack
 * from `min` without overlap (and the last ones run past `max`: the caller keeps lanes roomy).
 */
export function placeLabels(wishes: readonly LabelWish[], min: number, max: number, gap = 1): PlacedLabel[] {
  const sorted = [...wishes].sort((a, b) => a.want - b.want || a.id.localeCompare(b.id))
  const out: PlacedLabel[] = sorted.map(w => ({ id: w.id, y: w.want, height: w.height, want: w.want }))
  let floor = min
  for (const l of out) {
    l.y = Math.max(l.y, floor)
    floor = l.y + l.height + gap
  }
  let ceiling = max
  for (let i = out.length - 1; i >= 0; i--) {
    const l = out[i]!
    if (l.y + l.height > ceiling) l.y = ceiling - l.height
    ceiling = l.y - gap
  }
  // Too many for the lane: stack from the top again, so none overlaps.
  if (out.length && out[0]!.y < min) {
    let y = min
    for (const l of out) {
      l.y = y
      y += l.height + gap
    }
  }
  return out
}

/** Whether any two placed labels overlap (for tests and checks). */
export function labelsOverlap(placed: readonly PlacedLabel[]): boolean {
  const s = [...placed].sort((a, b) => a.y - b.y)
  for (let i = 1; i < s.length; i++) if (s[i]!.y < s[i - 1]!.y + s[i - 1]!.height - 1e-9) return true
  return false
}

/** Source Sans 3's mean advance is about half an em (memory): enough to wrap text into a column. */
const CHAR_EM = 0.5

/** Splits text into lines no wider than `width` points at `fontSize`, by words; a word longer than a line is cut. */
export function wrapText(text: string, width: number, fontSize: number): string[] {
  const perLine = Math.max(4, Math.floor(width / (fontSize * CHAR_EM)))
  const lines: string[] = []
  let line = ''
  for (const raw of text.split(/\s+/).filter(Boolean)) {
    let word = raw
    while (word.length > perLine) {
      if (line) {
        lines.push(line)
        line = ''
      }
      lines.push(word.slice(0, perLine))
      word = word.slice(perLine)
    }
    if (!line) line = word
    else if (line.length + 1 + word.length <= perLine) line += ` ${word}`
    else {
      lines.push(line)
      line = word
    }
  }
  if (line) lines.push(line)
  return lines
}
