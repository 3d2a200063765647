import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import type { TDocumentDefinitions } from 'pdfmake/interfaces'
import { fontsShared } from '~~/server/services/reports/pdf-library'
import { renderPdf, SVG_ARC_PRECISION, withDrawingOptions } from '~~/server/services/reports/render'
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

describe('drawing options', () => {
  it('gives every drawing in the tree the arc precision and keeps its own options and the rest of the node', () => {
    const image = Buffer.from([1, 2, 3])
    const content = [
      { svg: '<svg/>', width: 100 },
      { stack: [{ text: 'a' }, { columns: [{ svg: '<svg/>', options: { precision: 4 } }, { table: { body: [[{ svg: '<svg/>' }, 'cell']] } }] }] },
      { image, width: 10 },
    ]
    const out = withDrawingOptions(content)
    expect(out[0]).toEqual({ svg: '<svg/>', width: 100, options: { precision: SVG_ARC_PRECISION } })
    expect(SVG_ARC_PRECISION).toBe(2)
    const columns = (out[1] as { stack: [unknown, { columns: [unknown, { table: { body: unknown[][] } }] }] }).stack[1].columns
    expect(columns[0]).toEqual({ svg: '<svg/>', options: { precision: 4 } })
    expect(columns[1].table.body[0]).toEqual([{ svg: '<svg/>', options: { precision: 2 } }, 'cell'])
    // Not a plain object: passed through untouched.
    expect((out[2] as { image: Buffer }).image).toBe(image)
    // The definition given is not changed.
    expect(content[0]).toEqual({ svg: '<svg/>', width: 100 })
  })

  it('draws a circle as four quarter-turn curves', async () => {
    const circle = { svg: '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><circle cx="20" cy="20" r="10" fill="#000"/></svg>', width: 40 }
    const pdf = await renderPdf({ compress: false, content: [circle] } as TDocumentDefinitions)
    const stream = Buffer.from(pdf).toString('latin1')
    // pdfkit writes a cubic Bézier as "x1 y1 x2 y2 x y c": one per quarter turn (the reader's default made six).
    expect(stream.match(/(?:-?[\d.]+ ){6}c\n/g)?.length).toBe(4)
  })
})
