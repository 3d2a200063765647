import type { AttachmentContentType } from '#shared/schemas/attachments'

/**
 * Decides an attachment's content type from its bytes (the file name and the
 * browser's claimed type are never trusted). Accepted: PDF reports, PNG, JPEG
 * and WebP photos, and field sheets as CSV, plain UTF-8 text or XLSX. Every
 * refusal says what the file is and what to do instead.
 */
export class AttachmentContentError extends Error {
  constructor(message: string, readonly code: 'empty-file' | 'wrong-type' | 'wrong-encoding') {
    super(message)
  }
}

const ACCEPTED = 'Attach a PDF report, a PNG, JPEG or WebP photo, or a field sheet as CSV, plain text or XLSX.'

const startsWith = (buf: Buffer, bytes: readonly number[], at = 0) => bytes.every((b, i) => buf[at + i] === b)
const ascii = (buf: Buffer, from: number, to: number) => buf.subarray(from, to).toString('latin1')

const PNG = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]
const JPEG = [0xFF, 0xD8, 0xFF]
const ZIP = [0x50, 0x4B, 0x03, 0x04]
const OLE = [0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1]

/** Other well-known signatures, refused with a specific message. */
const REFUSED: { test: (b: Buffer) => boolean, what: string }[] = [
  { test: b => ascii(b, 0, 6) === 'GIF87a' || ascii(b, 0, 6) === 'GIF89a', what: 'a GIF image: save the photo as PNG or JPEG' },
  { test: b => startsWith(b, [0x49, 0x49, 0x2A, 0x00]) || startsWith(b, [0x4D, 0x4D, 0x00, 0x2A]), what: 'a TIFF image: save it as PNG or JPEG' },
  { test: b => ascii(b, 4, 8) === 'ftyp' && /^(heic|heix|hevc|mif1|msf1|avif)$/.test(ascii(b, 8, 12)), what: 'a HEIC/AVIF photo: export it as JPEG' },
  { test: b => startsWith(b, OLE), what: 'an old binary Office file (.xls/.doc): save it as XLSX or PDF' },
  { test: b => startsWith(b, [0x7F, 0x45, 0x4C, 0x46]) || ascii(b, 0, 2) === 'MZ', what: 'a program' },
  { test: b => startsWith(b, [0x1F, 0x8B]) || startsWith(b, [0x37, 0x7A, 0xBC, 0xAF]) || ascii(b, 0, 4) === 'Rar!', what: 'a compressed archive' },
]

function isPdf(buf: Buffer): boolean {
  // Readers accept the header anywhere in the first 1024 bytes (Adobe PDF Reference 1.7, appendix H, note 13 (memory)).
  return buf.subarray(0, 1024).includes('%PDF-')
}

function zipEntries(buf: Buffer): string[] {
  // Local file headers (PK\3\4) name their entry at offset 30; reading the first few dozen is enough to tell an XLSX.
  const names: string[] = []
  let at = buf.indexOf(Buffer.from(ZIP))
  while (at >= 0 && names.length < 64) {
    const nameLength = buf.readUInt16LE(at + 26)
    const extraLength = buf.readUInt16LE(at + 28)
    if (at + 30 + nameLength > buf.length) break
    names.push(buf.subarray(at + 30, at + 30 + nameLength).toString('utf8'))
    at = buf.indexOf(Buffer.from(ZIP), at + 30 + nameLength + extraLength)
  }
  return names
}

function looksLikeCsv(text: string): boolean {
  const lines = text.split(/\r?\n/).filter(l => l.trim() !== '').slice(0, 20)
  if (lines.length < 2) return false
  for (const sep of [',', ';', '\t']) {
    const counts = lines.map(l => l.split(sep).length - 1)
    const [first = 0] = counts
    if (first >= 1 && counts.every(c => c === first)) return true
  }
  return false
}

export function sniffAttachment(buf: Buffer, filename: string): AttachmentContentType {
  if (buf.length === 0) throw new AttachmentContentError(`${filename} is empty (0 bytes).`, 'empty-file')
  if (isPdf(buf)) return 'application/pdf'
  if (startsWith(buf, PNG)) return 'image/png'
  if (startsWith(buf, JPEG)) return 'image/jpeg'
  if (ascii(buf, 0, 4) === 'RIFF' && ascii(buf, 8, 12) === 'WEBP') return 'image/webp'
  if (startsWith(buf, ZIP)) {
    const names = zipEntries(buf)
    if (names.includes('[Content_Types].xml') && names.some(n => n.startsWith('xl/'))) return 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
    throw new AttachmentContentError(`${filename} is a ZIP archive but not an Excel workbook (.xlsx). ${ACCEPTED}`, 'wrong-type')
  }
  const refused = REFUSED.find(r => r.test(buf))
  if (refused) throw new AttachmentContentError(`${filename} is ${refused.what}. ${ACCEPTED}`, 'wrong-type')
  if (buf.subarray(0, 8192).includes(0)) throw new AttachmentContentError(`${filename} is not a type Pastload keeps. ${ACCEPTED}`, 'wrong-type')

  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buf)
  }
  catch {
    throw new AttachmentContentError(`${filename} is not UTF-8 text (it may be saved in a legacy encoding): save it as "CSV UTF-8" or PDF and attach it again.`, 'wrong-encoding')
  }
  if (text.charCodeAt(0) === 0xFEFF) text = text.slice(1)
  if (text.trim() === '') throw new AttachmentContentError(`${filename} has only blank lines.`, 'empty-file')
  // Markup (HTML, SVG, XML) could run script if ever opened in a browser: refuse it rather than store it as text.
  if (/^\s*</.test(text)) throw new AttachmentContentError(`${filename} is HTML, SVG or XML markup. ${ACCEPTED}`, 'wrong-type')
  return /\.csv$/i.test(filename) || looksLikeCsv(text) ? 'text/csv' : 'text/plain'
}
