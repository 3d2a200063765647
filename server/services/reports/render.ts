import { existsSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { TDocumentDefinitions } from 'pdfmake/interfaces'
import { REPORT_FONT_FILES } from '#shared/reports/fonts'
import { REPORT_FONT } from '#shared/reports/sheet'
import { loadPdfmake } from './pdf-library'

/**
 * Turns a report's document definition (`shared/reports/`) into PDF bytes with pdfmake. The fonts are
 * Source Sans 3's TrueType files (the `source-sans` package; the build copies the four used into
 * `.output/server/fonts/`), registered by absolute path (SVG text opens them by path too). Nothing is
 * fetched: URLs are refused and local files outside the font folder too, so a document definition can
 * only use what is given to it.
 */

/** The folder holding the TTF files: `fonts/` beside the built server, else the package (development, tests). */
export function reportFontDir(): string {
  let dir = dirname(fileURLToPath(import.meta.url))
  for (let i = 0; i < 6; i++) {
    const candidate = join(dir, 'fonts')
    if (existsSync(join(candidate, REPORT_FONT_FILES.normal))) return candidate
    const up = dirname(dir)
    if (up === dir) break
    dir = up
  }
  const require = createRequire(import.meta.url)
  return join(dirname(require.resolve('source-sans/package.json')), 'TTF')
}

let ready: ReturnType<typeof loadPdfmake> | null = null
function prepare(): ReturnType<typeof loadPdfmake> {
  if (ready) return ready
  const pdfmake = loadPdfmake()
  const dir = reportFontDir()
  const files = Object.fromEntries(Object.entries(REPORT_FONT_FILES).map(([k, f]) => [k, join(dir, f)]))
  const allowed = new Set(Object.values(files))
  pdfmake.setFonts({ [REPORT_FONT]: files })
  pdfmake.setUrlAccessPolicy(() => false)
  pdfmake.setLocalAccessPolicy(path => allowed.has(path))
  ready = pdfmake
  return pdfmake
}

/**
 * Drawings are written with each arc as one cubic Bézier per quarter turn, the construction PDF writers use
 * for circles (pdfkit's own, for one): radial error under 0.03 % of the radius. The SVG reader's default cuts
 * arcs into sixths and samples every curve's length 18 times for features the reports do not use (markers,
 * text on a path); on the site-model report that was about a tenth of its time.
 */
export const SVG_ARC_PRECISION = 2

/**
 * The document with every drawing (a node with an `svg` string) given the arc precision, its own options
 * kept. Returns a new tree; the definition given is not changed.
 */
export function withDrawingOptions<T>(node: T): T {
  if (Array.isArray(node)) return (node as unknown[]).map(n => withDrawingOptions(n)) as T
  if (!node || typeof node !== 'object') return node
  // Only plain objects are content nodes: anything else (a Buffer, a class instance) is passed as it is.
  const proto = Object.getPrototypeOf(node) as unknown
  if (proto !== Object.prototype && proto !== null) return node
  const out: Record<string, unknown> = {}
  for (const [key, value] of Object.entries(node)) out[key] = typeof value === 'object' ? withDrawingOptions(value) : value
  if (typeof out.svg === 'string') out.options = { precision: SVG_ARC_PRECISION, ...(out.options as object | undefined) }
  return out as T
}

/** The PDF of a document definition. */
export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
  return await prepare().createPdf({ ...doc, content: withDrawingOptions(doc.content) }).getBuffer()
}

/** The PDF and its page count (read from the footer pdfmake draws on every page). */
export async function renderReport(doc: TDocumentDefinitions): Promise<{ pdf: Buffer, pages: number }> {
  let pages = 0
  const footer = doc.footer
  const counted: TDocumentDefinitions = {
    ...doc,
    footer: (page, count, size) => {
      pages = count
      return typeof footer === 'function' ? footer(page, count, size) : (footer ?? null)
    },
  }
  const pdf = await renderPdf(counted)
  return { pdf, pages }
}
