import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import type { TDocumentDefinitions } from 'pdfmake/interfaces'
import { fontsShared } from '~~/server/services/reports/pdf-library'
import { renderPdf } from '~~/server/services/reports/render'
import { REPORT_FONT } from '#shared/reports/sheet'
import { pdfPagesText } from '../../helpers/pdf'

/** The fonts a PDF embeds, as poppler's pdffonts lists them (name, type, embedded). */
function embeddedFonts(pdf: Uint8Array): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-fonts-'))
  try {
    const file = join(dir, 'doc.pdf')
    writeFileSync(file, pdf)
    return execFileSync('pdffonts', [file], { encoding: 'utf8' }).split('\n').slice(2).filter(Boolean)
      .map(line => line.split(/\s+/)[0]!.replace(/^[A-Z]{6}\+/, ''))
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

const doc = (label: string): TDocumentDefinitions => ({
  defaultStyle: { font: REPORT_FONT },
  content: [
    { text: `Plain ${label} σ'p 45.2 kPa`, margin: [0, 0, 0, 4] },
    { text: `Bold ${label} OCR 1.8`, bold: true },
    { text: `Italic ${label} POP 25 kPa`, italics: true },
    { svg: `<svg xmlns="http://www.w3.org/2000/svg" width="200" height="40"><text x="4" y="20" font-family="${REPORT_FONT}" font-size="12">Drawing ${label} σ'v0</text></svg>`, width: 200 },
  ],
})

describe('pdf library', () => {
  it('parses the fonts once per process and still writes every document whole, one after another and side by side', async () => {
    const first = await renderPdf(doc('one'))
    const [second, third] = await Promise.all([renderPdf(doc('two')), renderPdf(doc('three'))])
    // The shared parse is in force in this process (pdfkit was first loaded through it).
    expect(fontsShared()).toBe(true)
    for (const [pdf, label] of [[first, 'one'], [second, 'two'], [third, 'three']] as const) {
      const text = pdfPagesText(pdf)[0]!.replace(/\s+/g, ' ')
      expect(text).toContain(`Plain ${label} σ'p 45.2 kPa`)
      expect(text).toContain(`Bold ${label} OCR 1.8`)
      expect(text).toContain(`Italic ${label} POP 25 kPa`)
      expect(text).toContain(`Drawing ${label} σ'v0`)
      // Each document embeds its own subsets of the three faces it uses.
      expect(new Set(embeddedFonts(pdf))).toEqual(new Set(['SourceSans3-Regular', 'SourceSans3-Semibold', 'SourceSans3-It']))
    }
  })
})
