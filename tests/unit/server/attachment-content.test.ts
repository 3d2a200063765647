import { PDFDocument } from 'pdf-lib'
import sharp from 'sharp'
import * as XLSX from 'xlsx-republish'
import { describe, expect, it } from 'vitest'
import { AttachmentContentError, sniffAttachment } from '../../../server/services/attachment-content'
import { cleanFilename, contentDisposition } from '../../../server/services/attachments'
import { demoCoreBoxPng, demoFieldSheetCsv, demoLabReportPdf } from '../../../server/services/demo-seed-attachments'

function refusal(buf: Buffer, name: string): AttachmentContentError {
  try {
    sniffAttachment(buf, name)
  }
  catch (err) {
    if (err instanceof AttachmentContentError) return err
    throw err
  }
  throw new Error(`${name} was accepted`)
}

const workbook = (): Buffer => {
  const wb = XLSX.utils.book_new()
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([['point', 'depth'], ['BH-01', 1.6]]), 'Water')
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx' }) as Buffer
}

describe('attachment content sniffing', () => {
  it('recognises photos by their signatures, whatever the file is called', async () => {
    const png = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#777' } }).png().toBuffer()
    const jpeg = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#777' } }).jpeg().toBuffer()
    const webp = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#777' } }).webp().toBuffer()
    expect(sniffAttachment(png, 'photo.jpg')).toBe('image/png')
    expect(sniffAttachment(jpeg, 'photo.png')).toBe('image/jpeg')
    expect(sniffAttachment(webp, 'photo')).toBe('image/webp')
  })

  it('recognises a PDF even after a little leading junk, and an XLSX among ZIP files', () => {
    expect(sniffAttachment(Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj\n'), 'report.txt')).toBe('application/pdf')
    expect(sniffAttachment(Buffer.concat([Buffer.from('\r\n\r\n'), Buffer.from('%PDF-1.4\n')]), 'r.pdf')).toBe('application/pdf')
    expect(sniffAttachment(workbook(), 'levels.bin')).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
  })

  it('tells CSV from plain text by the content, and lets the .csv name settle single-column files', () => {
    expect(sniffAttachment(Buffer.from('point,depth\nBH-01,1.6\nBH-02,1.7\n'), 'levels.txt')).toBe('text/csv')
    expect(sniffAttachment(Buffer.from('\uFEFFpoint;depth\nBH-01;1.6\n'), 'levels')).toBe('text/csv')
    expect(sniffAttachment(Buffer.from('Drilling resumed at 07:40, casing at 12 m.\nRain all afternoon.\n'), 'diary.txt')).toBe('text/plain')
    expect(sniffAttachment(Buffer.from('depth\n1.6\n'), 'levels.csv')).toBe('text/csv')
  })

  it('refuses empty and blank files as empty', () => {
    expect(refusal(Buffer.alloc(0), 'a.pdf')).toMatchObject({ code: 'empty-file', message: 'a.pdf is empty (0 bytes).' })
    expect(refusal(Buffer.from('\n  \n'), 'b.csv').code).toBe('empty-file')
  })

  it('refuses other types with a message naming what the file is', () => {
    expect(refusal(Buffer.from('GIF89a\x01\x00', 'latin1'), 'anim.gif').message).toMatch(/^anim\.gif is a GIF image: save the photo as PNG or JPEG\. Attach a PDF report/)
    expect(refusal(Buffer.from([0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1, 0, 0]), 'old.xls').message).toContain('old binary Office file')
    expect(refusal(Buffer.from([0x7F, 0x45, 0x4C, 0x46, 2, 1, 1, 0]), 'tool').message).toContain('is a program')
    expect(refusal(Buffer.from([0x50, 0x4B, 0x03, 0x04, 0x14, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 5, 0, 0, 0, 0x61, 0x2E, 0x74, 0x78, 0x74]), 'bundle.zip').message).toContain('ZIP archive but not an Excel workbook')
    expect(refusal(Buffer.from([1, 2, 3, 0, 4, 5]), 'blob.dat').code).toBe('wrong-type')
  })

  it('refuses markup that a browser could run, even when it is valid UTF-8 text', () => {
    expect(refusal(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), 'plan.svg').message).toMatch(/HTML, SVG or XML markup/)
    expect(refusal(Buffer.from('  <!doctype html><html></html>'), 'page.txt').code).toBe('wrong-type')
  })

  it('refuses text in a legacy encoding with a way out', () => {
    const latin1 = Buffer.from('point,description\nBH-01,argile grise molle à coquilles\n', 'latin1')
    expect(refusal(latin1, 'log.csv')).toMatchObject({ code: 'wrong-encoding' })
    expect(refusal(latin1, 'log.csv').message).toContain('CSV UTF-8')
  })
})

describe('attachment names in headers', () => {
  it('drops paths and control characters from a file name, and falls back when nothing is left', () => {
    expect(cleanFilename('C:\\fakepath\\BH-02 box 1.png')).toBe('BH-02 box 1.png')
    expect(cleanFilename('../../etc/passwd')).toBe('passwd')
    expect(cleanFilename('a\u0000b\nc.pdf')).toBe('abc.pdf')
    expect(cleanFilename('  ')).toBe('attachment')
    expect(cleanFilename(undefined)).toBe('attachment')
  })

  it('writes an ASCII fallback and the UTF-8 name in Content-Disposition', () => {
    expect(contentDisposition('attachment', 'Boîte "1".pdf')).toBe('attachment; filename="Bo_te _1_.pdf"; filename*=UTF-8\'\'Bo%C3%AEte%20%221%22.pdf')
  })
})

describe('demo attachments', () => {
  it('generates a two-page PDF lab report that reads back with its title', async () => {
    const pdf = await demoLabReportPdf()
    expect(sniffAttachment(pdf, 'report.pdf')).toBe('application/pdf')
    const doc = await PDFDocument.load(pdf)
    expect(doc.getPageCount()).toBe(2)
    expect(doc.getTitle()).toBe('LR-0417-03 Oedometer tests, BH-02 and BH-04')
  })

  it('draws the same core-box photo every time, 1200 × 800 px', async () => {
    const a = await demoCoreBoxPng('BH-02', 1, 1, 'seed-a')
    const b = await demoCoreBoxPng('BH-02', 1, 1, 'seed-a')
    expect(a.equals(b)).toBe(true)
    expect(sniffAttachment(a, 'box.png')).toBe('image/png')
    const meta = await sharp(a).metadata()
    expect([meta.width, meta.height, meta.format]).toEqual([1200, 800, 'png'])
  }, 30_000) // two 1200 × 800 renders: seconds on a loaded 2-core machine

  it('writes a field sheet that is recognised as CSV', () => {
    const csv = demoFieldSheetCsv('BH-02')
    expect(sniffAttachment(csv, 'levels.csv')).toBe('text/csv')
    expect(csv.toString('utf8').split('\n')[1]).toBe('BH-02,2025-03-04,07:40,1.71,0.00,before drilling resumed')
  })
})
