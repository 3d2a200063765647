import { createHash } from 'node:crypto'
import { asc, eq } from 'drizzle-orm'
import { PDFDocument, rgb, StandardFonts } from 'pdf-lib'
import seedrandom from 'seedrandom'
import sharp from 'sharp'
import { DEMO_PEOPLE, DEMO_PROJECT } from '#shared/demo/scenario'
import type { Database } from '../db/client'
import { investigationPoints, projects, users } from '../db/schema'
import { present } from '../db/rows'
import { logServerError } from '../utils/error-log'
import { storeAttachment, type UploadedFile } from './attachments'
import { storageConfigured } from './storage'

/**
 * Demo attachments for the invented Saltmarsh Lane site (TRN-0417): a short
 * oedometer lab report (PDF), core-box photos (PNG drawn from SVG) and a field
 * sheet (CSV). Everything here is made up; nothing describes a real site,
 * laboratory or test.
 */

function file(filename: string, data: Buffer): UploadedFile {
  return { filename, data, sha256: createHash('sha256').update(data).digest('hex') }
}

/** Invented oedometer results, consistent with the scenario's ground model (crust σ'p falling with depth, POP ≈ 25 kPa in the estuarine clay, OCR ≈ 2.4 in the glacial clay). */
const LAB_ROWS = [
  ['BH-02', 'U3', '2.60', 'Crust', '31', '1.10', '39', '137', '0.35', '0.04', '0.028', 'Very good'],
  ['BH-02', 'U5', '5.30', 'Estuarine clay', '78', '2.08', '57', '82', '0.84', '0.09', '0.035', 'Very good'],
  ['BH-02', 'U7', '8.30', 'Estuarine clay', '81', '2.12', '76', '101', '0.87', '0.09', '0.041', 'Good'],
  ['BH-04', 'U4', '6.80', 'Estuarine clay', '79', '2.10', '67', '71', '0.62', '0.08', '0.092', 'Poor (disturbed)'],
  ['BH-04', 'U8', '11.00', 'Estuarine clay', '76', '2.05', '93', '118', '0.83', '0.09', '0.038', 'Very good'],
  ['BH-04', 'U11', '16.40', 'Glacial clay', '22', '0.66', '130', '310', '0.22', '0.03', '0.047', 'Good'],
] as const

const LAB_HEADERS = ['Point', 'Sample', 'Depth m', 'Stratum', 'w %', 'e0', "s'v0 kPa", "s'p kPa", 'Cc', 'Cr', 'de/e0', 'Quality']

/** A two-page PDF lab report drawn with pdf-lib's standard fonts. */
export async function demoLabReportPdf(): Promise<Buffer> {
  const doc = await PDFDocument.create()
  doc.setTitle('LR-0417-03 Oedometer tests, BH-02 and BH-04')
  doc.setAuthor('Pastload demo data')
  doc.setSubject(`${DEMO_PROJECT.jobNumber} ${DEMO_PROJECT.name} (invented)`)
  doc.setCreationDate(new Date('2025-05-14T09:00:00Z'))
  doc.setModificationDate(new Date('2025-05-14T09:00:00Z'))
  const regular = await doc.embedFont(StandardFonts.Helvetica)
  const bold = await doc.embedFont(StandardFonts.HelveticaBold)
  const ink = rgb(0.15, 0.14, 0.12)
  const tide = rgb(0.12, 0.32, 0.38)

  const page = doc.addPage([595.28, 841.89]) // A4
  let y = 790
  const text = (s: string, x: number, size = 10, font = regular, color = ink) => page.drawText(s, { x, y, size, font, color })
  text(`${DEMO_PROJECT.client} · ${DEMO_PROJECT.jobNumber} ${DEMO_PROJECT.name}`, 50, 9, regular, tide)
  y -= 28
  text('Laboratory report LR-0417-03', 50, 18, bold, tide)
  y -= 20
  text('One-dimensional consolidation (oedometer) tests on thin-walled tube samples', 50, 11)
  y -= 30
  for (const line of [
    'Incremental loading, 24-hour increments from 6 to 800 kPa with one unload-reload loop.',
    'Specimens 50 mm in diameter and 20 mm high, trimmed from the centre of each tube.',
    'Preconsolidation stress by the Casagrande construction (1936), checked by the work method',
    '(Becker et al., 1987). Sample quality from de/e0 at the in-situ stress (Lunne et al., 1997).',
  ]) {
    text(line, 50)
    y -= 14
  }
  y -= 16
  const cols = [50, 88, 124, 164, 240, 268, 296, 338, 380, 408, 436, 468]
  page.drawRectangle({ x: 46, y: y - 5, width: 503, height: 17, color: rgb(0.94, 0.93, 0.9) })
  LAB_HEADERS.forEach((h, i) => page.drawText(h, { x: present(cols[i], 'A column position'), y, size: 7.5, font: bold, color: ink }))
  y -= 18
  for (const row of LAB_ROWS) {
    row.forEach((v, i) => page.drawText(v, { x: present(cols[i], 'A column position'), y, size: 7.5, font: regular, color: row[11].startsWith('Poor') ? rgb(0.57, 0.17, 0.13) : ink }))
    y -= 15
  }
  y -= 14
  for (const line of [
    'BH-04 U4 shows a rounded compression curve with no clear break: its s\'p is a lower bound only.',
    'Water contents from the trimmings (oven-dried at 105 °C). Full curves on page 2.',
  ]) {
    text(line, 50, 9)
    y -= 13
  }

  const curves = doc.addPage([595.28, 841.89])
  curves.drawText('Compression curves, void ratio against log vertical effective stress', { x: 50, y: 790, size: 12, font: bold, color: tide })
  // Axes of a schematic e–log σ' plot: 10 to 1000 kPa over 400 pt, e from 0.4 to 2.4 over 500 pt.
  const x0 = 80
  const y0 = 220
  const px = (s: number) => x0 + (Math.log10(s) - 1) * 200
  const py = (e: number) => y0 + (e - 0.4) * 250
  curves.drawLine({ start: { x: x0, y: y0 }, end: { x: x0 + 400, y: y0 }, thickness: 0.8, color: ink })
  curves.drawLine({ start: { x: x0, y: y0 }, end: { x: x0, y: y0 + 500 }, thickness: 0.8, color: ink })
  for (const s of [10, 100, 1000]) curves.drawText(`${s}`, { x: px(s) - 6, y: y0 - 14, size: 8, font: regular, color: ink })
  for (const e of [0.5, 1.0, 1.5, 2.0]) curves.drawText(e.toFixed(1), { x: x0 - 24, y: py(e) - 3, size: 8, font: regular, color: ink })
  curves.drawText("vertical effective stress (kPa, log scale)", { x: x0 + 110, y: y0 - 30, size: 9, font: regular, color: ink })
  curves.drawText('void ratio e', { x: x0 - 60, y: y0 + 510, size: 9, font: regular, color: ink })
  const labelYs: number[] = []
  LAB_ROWS.forEach((row, k) => {
    const e0 = Number(row[5])
    const sp = Number(row[7])
    const cc = Number(row[8])
    const cr = Number(row[9])
    const s0 = 6
    let previous: [number, number] | null = null
    let last: [number, number] = [s0, e0]
    const colour = row[11].startsWith('Poor') ? rgb(0.57, 0.17, 0.13) : k % 2 ? tide : rgb(0.54, 0.28, 0.1)
    for (let s = s0; s <= 800; s *= 1.25) {
      const e = s <= sp ? e0 - cr * Math.log10(s / s0) : e0 - cr * Math.log10(sp / s0) - cc * Math.log10(s / sp)
      last = [Math.max(s, 10), e]
      if (previous) curves.drawLine({ start: { x: px(previous[0]), y: py(previous[1]) }, end: { x: px(last[0]), y: py(last[1]) }, thickness: 1.2, color: colour })
      previous = last
    }
    // Curve labels at the right end, nudged apart where two curves finish close together.
    let labelY = py(last[1]) - 3
    while (labelYs.some(u => Math.abs(u - labelY) < 9)) labelY -= 9
    labelYs.push(labelY)
    curves.drawText(`${row[0]} ${row[1]}`, { x: px(last[0]) + 4, y: labelY, size: 7, font: regular, color: colour })
  })
  for (const p of [page, curves]) {
    p.drawText('Invented demonstration data for Pastload: no real site, laboratory or test.', { x: 50, y: 40, size: 7.5, font: regular, color: rgb(0.45, 0.42, 0.37) })
  }
  return Buffer.from(await doc.save({ useObjectStreams: false }))
}

const CORE_COLOURS: { top: number, colour: string, fleck: string }[] = [
  { top: 0, colour: '#8d7a5f', fleck: '#c9b99a' }, // made ground: sandy gravel fill
  { top: 1.2, colour: '#8a5a34', fleck: '#b58a5c' }, // desiccated crust: brown silty clay
  { top: 3.4, colour: '#5c6263', fleck: '#e7e3d8' }, // estuarine clay: soft grey, shells
]

/** A core box photographed from above: five 1 m channels of core from `from` metres, drawn as SVG and rendered to PNG. */
export async function demoCoreBoxPng(point: string, box: number, from: number, seed: string): Promise<Buffer> {
  const rand = seedrandom(seed)
  const W = 1200
  const H = 800
  const rows = 5
  const left = 140
  const right = W - 60
  const top = 150
  const rowH = 110
  const gap = 14
  const len = right - left
  const parts: string[] = []
  for (let r = 0; r < rows; r++) {
    const y = top + r * (rowH + gap)
    parts.push(`<rect x="${left - 6}" y="${y - 6}" width="${len + 12}" height="${rowH + 12}" fill="#3b2a1c"/>`)
    parts.push(`<text x="${left - 16}" y="${y + rowH / 2 + 8}" font-family="DejaVu Sans, sans-serif" font-size="22" fill="#f3ead8" text-anchor="end">${(from + r).toFixed(1)}</text>`)
    for (let step = 0; step < 20; step++) {
      const depth = from + r + step * 0.05
      const layer = present([...CORE_COLOURS].reverse().find(c => depth >= c.top), 'A core colour')
      const x = left + (step / 20) * len
      parts.push(`<rect x="${x.toFixed(1)}" y="${y}" width="${(len / 20 + 0.6).toFixed(1)}" height="${rowH}" fill="${layer.colour}"/>`)
      for (let f = 0; f < 5; f++) {
        const fx = x + rand() * (len / 20)
        const fy = y + 8 + rand() * (rowH - 16)
        parts.push(`<ellipse cx="${fx.toFixed(1)}" cy="${fy.toFixed(1)}" rx="${(2 + rand() * 5).toFixed(1)}" ry="${(1.5 + rand() * 3).toFixed(1)}" fill="${layer.fleck}" opacity="0.7"/>`)
      }
    }
    // A tube sample taken from the middle of the channel leaves a labelled spacer block.
    if (r === 2) {
      const x = left + len * 0.55
      parts.push(`<rect x="${x}" y="${y}" width="${len * 0.1}" height="${rowH}" fill="#d8c7a1"/>`)
      parts.push(`<text x="${x + len * 0.05}" y="${y + rowH / 2 + 8}" font-family="DejaVu Sans, sans-serif" font-size="22" fill="#3b2a1c" text-anchor="middle">U${box * 2 + 1}</text>`)
    }
  }
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}">
  <defs>
    <filter id="grain"><feTurbulence type="fractalNoise" baseFrequency="0.9" numOctaves="2" seed="7"/><feColorMatrix type="saturate" values="0"/><feComponentTransfer><feFuncA type="linear" slope="0.18"/></feComponentTransfer><feComposite in2="SourceGraphic" operator="in"/></filter>
    <linearGradient id="wood" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#a77b4f"/><stop offset="1" stop-color="#7d5634"/></linearGradient>
  </defs>
  <rect width="${W}" height="${H}" fill="#6f6a5c"/>
  <rect x="40" y="40" width="${W - 80}" height="${H - 60}" rx="6" fill="url(#wood)"/>
  <rect x="${left}" y="62" width="640" height="62" rx="4" fill="#f4f1e8"/>
  <text x="${left + 16}" y="103" font-family="DejaVu Sans, sans-serif" font-size="28" font-weight="bold" fill="#1f2933">${DEMO_PROJECT.jobNumber}  ${point}  Box ${box}  ${from.toFixed(2)}–${(from + rows).toFixed(2)} m</text>
  ${parts.join('\n  ')}
  <rect width="${W}" height="${H}" filter="url(#grain)" fill="#ffffff"/>
</svg>`
  return sharp(Buffer.from(svg)).png({ palette: true, quality: 90, compressionLevel: 9 }).toBuffer()
}

/** A small field sheet: standing water levels read at one hole. */
export function demoFieldSheetCsv(point: string): Buffer {
  const rows = [
    ['point', 'date', 'time', 'depth to water m', 'casing depth m', 'remarks'],
    [point, '2025-03-04', '07:40', '1.71', '0.00', 'before drilling resumed'],
    [point, '2025-03-05', '07:35', '1.64', '12.00', 'overnight rise'],
    [point, '2025-03-06', '07:45', '1.62', '19.50', ''],
    [point, '2025-03-07', '16:10', '1.60', 'removed', 'standpipe installed'],
  ]
  return Buffer.from(`${rows.map(r => r.join(',')).join('\n')}\n`, 'utf8')
}

/**
 * Stores the demo attachments through the same path as an upload (content
 * check, thumbnail, audit entry), the report last so it lists first.
 * `pointIds` in identifier order (BH-01 first).
 * Returns how many were stored.
 */
export async function seedDemoAttachments(projectId: string, uploaderId: string, pointIds: string[]): Promise<number> {
  const firstPoint = pointIds[0] ?? null
  const items: { ownerType: 'project' | 'point', ownerId: string | null, caption: string, file: UploadedFile }[] = [
    { ownerType: 'project', ownerId: null, caption: 'Standing water levels read each morning at BH-02.', file: file('BH-02 water levels.csv', demoFieldSheetCsv('BH-02')) },
    { ownerType: 'project', ownerId: null, caption: 'Core box 1 of BH-02, 1.0–6.0 m: fill, brown crust, then soft grey estuarine clay with shells.', file: file('BH-02 core box 1.png', await demoCoreBoxPng('BH-02', 1, 1, 'trn-0417/bh-02/box-1')) },
    { ownerType: 'project', ownerId: null, caption: 'Oedometer lab report LR-0417-03: six tests from BH-02 and BH-04 (one disturbed).', file: file('LR-0417-03 oedometer tests BH-02 BH-04.pdf', await demoLabReportPdf()) },
  ]
  if (firstPoint) {
    items.push({ ownerType: 'point', ownerId: firstPoint, caption: 'Core box 1 of BH-01, 1.0–6.0 m.', file: file('BH-01 core box 1.png', await demoCoreBoxPng('BH-01', 1, 1, 'trn-0417/bh-01/box-1')) })
  }
  for (const item of items) {
    await storeAttachment({ projectId, uploadedBy: uploaderId, ...item })
  }
  return items.length
}

/**
 * After the main demo seed: finds the demo project, its field geologist and
 * its points, and stores the demo attachments. Storage not configured: a log
 * line. Storage down or any other failure: logged, and the start goes on.
 */
export async function seedDemoAttachmentsAfterDemoSeed(db: Database): Promise<void> {
  if (!storageConfigured()) {
    console.info('[pastload:db] object storage is not configured: demo attachments skipped')
    return
  }
  try {
    const [project] = await db.select({ id: projects.id }).from(projects).where(eq(projects.jobNumber, DEMO_PROJECT.jobNumber)).limit(1)
    const geologist = present(DEMO_PEOPLE.find(p => p.role === 'geologist'), 'The demo geologist')
    const [uploader] = await db.select({ id: users.id }).from(users).where(eq(users.email, geologist.email)).limit(1)
    if (!project || !uploader) throw new Error('the demo project or its field geologist is missing')
    const points = await db.select({ id: investigationPoints.id }).from(investigationPoints)
      .where(eq(investigationPoints.projectId, project.id))
      .orderBy(asc(investigationPoints.identifier))
    const n = await seedDemoAttachments(project.id, uploader.id, points.map(p => p.id))
    console.info(`[pastload:db] ${n} demo attachments stored`)
  }
  catch (err) {
    logServerError('demo attachments skipped', err, { stack: false, level: 'warn' })
  }
}
