import { createHash } from 'node:crypto'
import { createRequire, Module } from 'node:module'

/**
 * pdfmake, loaded so that the fonts are parsed once per process instead of once per document.
 *
 * pdfkit (under pdfmake) turns every font file into a fontkit font for each new document, and parsing
 * Source Sans 3's tables (glyphs, kerning, ligatures) was about half of a short report's time. A fontkit
 * font is read-only once parsed (pdfkit keeps each document's subset and layout cache on its own
 * objects), so pdfkit is handed a fontkit whose `create` returns the font already parsed from the same
 * bytes. This is done through Node's module cache, before pdfkit is first loaded: nothing in either
 * package is modified. If pdfkit was loaded before (another path loaded it first), fonts are simply
 * parsed per document as before.
 */

type Pdfmake = typeof import('pdfmake')
interface Fontkit { create: (data: Uint8Array, postscriptName?: string) => unknown }

/** At most this many distinct font files are kept parsed (the report sheet uses four). */
const MAX_SHARED_FONTS = 8

let pdfmake: Pdfmake | null = null
let sharing = false

/** Whether fonts are shared between documents in this process (false only if pdfkit was loaded first). */
export function fontsShared(): boolean {
  return sharing
}

export function loadPdfmake(): Pdfmake {
  if (pdfmake) return pdfmake
  const require = createRequire(import.meta.url)
  const pdfmakeEntry = require.resolve('pdfmake')
  const pdfkitEntry = createRequire(pdfmakeEntry).resolve('pdfkit')
  const fontkitEntry = createRequire(pdfkitEntry).resolve('fontkit')
  if (!require.cache[pdfkitEntry]) {
    const fontkit = createRequire(pdfkitEntry)(fontkitEntry) as Fontkit & Record<string, unknown>
    const parsed = new Map<string, unknown>()
    const create = (data: Uint8Array, postscriptName?: string): unknown => {
      const key = `${createHash('sha256').update(data).digest('hex')}:${postscriptName ?? ''}`
      const known = parsed.get(key)
      if (known) return known
      const font = fontkit.create(data, postscriptName)
      if (parsed.size < MAX_SHARED_FONTS) parsed.set(key, font)
      return font
    }
    const facade = new Module(fontkitEntry)
    facade.filename = fontkitEntry
    facade.loaded = true
    facade.exports = { ...fontkit, create }
    require.cache[fontkitEntry] = facade
    try {
      createRequire(pdfmakeEntry)('pdfkit')
    }
    finally {
      // Only pdfkit sees the facade; anything loading fontkit later gets the package itself.
      delete require.cache[fontkitEntry]
    }
    sharing = true
  }
  pdfmake = require(pdfmakeEntry) as Pdfmake
  return pdfmake
}
