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

/** The PDF of a document definition. */
export async function renderPdf(doc: TDocumentDefinitions): Promise<Buffer> {
  return await prepare().createPdf(doc).getBuffer()
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
