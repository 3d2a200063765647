import type { Column, Content, DynamicContent, TDocumentDefinitions, Watermark } from 'pdfmake/interfaces'
import { RESULT_CAUTION } from '../caution'
import type { UnitSystem, UsStressUnit } from '../units'

/**
 * Pastload's report sheet: one visual language for every PDF (point log, site-model version, settlement
 * run). Pure: builds pdfmake document definitions; `server/services/reports/render.ts` turns them into
 * bytes. Page furniture is A4, Source Sans 3, in the tide / ochre / silt palette of the app:
 * - a header strip on every page: report title and subject on the left, the project's job number and
 *   revision in a tide block on the right;
 * - a sign-off footer on every page: prepared / checked / approved with names and dates, issue status,
 *   units, the caution line, and "page x of y";
 * - a report of anything not approved carries a diagonal band on every page.
 */

export const REPORT_INK = {
  tide: '#1f5261',
  tideDark: '#183a44',
  tideLight: '#d5ecef',
  ochre: '#c98024',
  ochreLight: '#f7eacb',
  silt: '#7f7360',
  siltLight: '#efede7',
  rule: '#ada18b',
  text: '#27231f',
  alert: '#c0392b',
} as const

/** pdfmake font family name registered by the renderer (Source Sans 3, normal/bold/italic). */
export const REPORT_FONT = 'SourceSans3'

export const NOT_APPROVED_BAND = 'NOT APPROVED — FOR DISCUSSION'

export interface ReportSignOff { name: string, date: string }

export interface ReportHeader {
  project: { name: string, jobNumber: string, client: string }
  /** The kind of report, e.g. "Stress-history log", "Site-model version", "Settlement run". */
  title: string
  /** What it is of, e.g. "BH-03", "Yard model, version 3", "Yard embankment". */
  subject: string
  /** Revision letter once issued (A, B, …); null for a preview that has not been issued. */
  revision: string | null
  prepared?: ReportSignOff | null
  checked?: ReportSignOff | null
  approved?: ReportSignOff | null
  units: UnitSystem
  /** US stresses in psf (default) or tsf, as the project chose. */
  usStress?: UsStressUnit
  /** false: the diagonal "not approved" band on every page. */
  approvedRecord: boolean
}

export interface ReportOptions {
  pageOrientation?: 'portrait' | 'landscape'
  /** Document info (PDF metadata). */
  author?: string
}

/** Page margins in points: [left, top, right, bottom]; the header and footer live in the top and bottom margins. */
export const REPORT_MARGINS: [number, number, number, number] = [36, 62, 36, 74]

/** The units line of the sheet's footer. */
export function unitWords(units: UnitSystem, usStress: UsStressUnit = 'psf'): string {
  return units === 'SI' ? 'SI units (m, kPa, kN/m³)' : `US customary units (ft, ${usStress}, pcf)`
}

function signOffCell(label: string, s: ReportSignOff | null | undefined): Column {
  return {
    width: 92,
    stack: [
      { text: label, fontSize: 6.5, color: REPORT_INK.silt, characterSpacing: 0.4 },
      { text: s ? s.name : '—', fontSize: 8, bold: !!s },
      { text: s ? s.date : ' ', fontSize: 7, color: REPORT_INK.silt },
    ],
  }
}

/** The header strip drawn on every page. */
export function reportHeaderContent(h: ReportHeader, pageWidth: number): Content {
  const inner = pageWidth - REPORT_MARGINS[0] - REPORT_MARGINS[2]
  return {
    margin: [REPORT_MARGINS[0], 22, REPORT_MARGINS[2], 0],
    stack: [
      {
        columns: [
          {
            width: '*',
            stack: [
              { text: [{ text: `${h.title}  `, bold: true, fontSize: 12, color: REPORT_INK.tideDark }, { text: h.subject, fontSize: 12 }] },
              { text: [h.project.name, h.project.client ? ` · ${h.project.client}` : ''].join(''), fontSize: 8, color: REPORT_INK.silt, margin: [0, 1, 0, 0] },
            ],
          },
          {
            width: 'auto',
            table: {
              body: [[
                { text: [{ text: 'JOB ', fontSize: 6.5, color: REPORT_INK.tideLight }, { text: h.project.jobNumber, bold: true, fontSize: 10, color: '#ffffff' }], noWrap: true, fillColor: REPORT_INK.tide, margin: [6, 3, 6, 2] },
                { text: [{ text: 'REV ', fontSize: 6.5, color: REPORT_INK.tide }, { text: h.revision ?? '–', bold: true, fontSize: 10, color: REPORT_INK.tideDark }], noWrap: true, fillColor: REPORT_INK.tideLight, margin: [6, 3, 6, 2] },
              ]],
            },
            layout: 'noBorders',
          },
        ],
      },
      { canvas: [{ type: 'line', x1: 0, y1: 4, x2: inner, y2: 4, lineWidth: 1.2, lineColor: REPORT_INK.ochre }] },
    ],
  }
}

/** The sign-off footer drawn on every page. */
export function reportFooterContent(h: ReportHeader, page: number, pages: number, pageWidth: number): Content {
  const inner = pageWidth - REPORT_MARGINS[0] - REPORT_MARGINS[2]
  const status = h.revision ? `Issued, revision ${h.revision}` : 'Preview, not issued'
  return {
    margin: [REPORT_MARGINS[0], 6, REPORT_MARGINS[2], 0],
    stack: [
      { canvas: [{ type: 'line', x1: 0, y1: 0, x2: inner, y2: 0, lineWidth: 0.5, lineColor: REPORT_INK.rule }] },
      {
        margin: [0, 4, 0, 0],
        columns: [
          signOffCell('PREPARED', h.prepared),
          signOffCell('CHECKED', h.checked),
          signOffCell('APPROVED', h.approved),
          {
            width: '*',
            stack: [
              { text: status, fontSize: 7.5, bold: true, color: h.approvedRecord ? REPORT_INK.tideDark : REPORT_INK.alert },
              { text: unitWords(h.units, h.usStress), fontSize: 7, color: REPORT_INK.silt },
            ],
          },
          { width: 'auto', text: `page ${page} of ${pages}`, fontSize: 8, alignment: 'right', color: REPORT_INK.tideDark, bold: true },
        ],
      },
      { text: RESULT_CAUTION, fontSize: 6.5, italics: true, color: REPORT_INK.silt, margin: [0, 3, 0, 0] },
    ],
  }
}

/** The diagonal band of a report of something not approved (pdfmake draws it on every page). */
export function notApprovedBand(): Watermark {
  return { text: NOT_APPROVED_BAND, color: REPORT_INK.alert, opacity: 0.14, bold: true, fontSize: 44, angle: -35 }
}

/** Reusable text styles for report bodies. */
export const REPORT_STYLES = {
  section: { fontSize: 11, bold: true, color: REPORT_INK.tideDark, margin: [0, 10, 0, 4] },
  subsection: { fontSize: 9, bold: true, color: REPORT_INK.tide, margin: [0, 6, 0, 3] },
  small: { fontSize: 7.5 },
  note: { fontSize: 7.5, italics: true, color: REPORT_INK.silt },
  tableHead: { fontSize: 7.5, bold: true, color: REPORT_INK.tideDark, fillColor: REPORT_INK.siltLight },
  tableCell: { fontSize: 7.5 },
} as const

/** A whole report: the page furniture around `content`. */
export function reportDocument(h: ReportHeader, content: Content[], opts: ReportOptions = {}): TDocumentDefinitions {
  const header: DynamicContent = (_page, _pages, size) => reportHeaderContent(h, size.width)
  const footer: DynamicContent = (page, pages, size) => reportFooterContent(h, page, pages, size.width)
  return {
    pageSize: 'A4',
    pageOrientation: opts.pageOrientation ?? 'portrait',
    pageMargins: REPORT_MARGINS,
    info: {
      title: `${h.title} — ${h.subject}`,
      subject: `${h.project.jobNumber} ${h.project.name}`,
      author: opts.author ?? 'Pastload',
      creator: 'Pastload',
      producer: 'Pastload',
    },
    header,
    footer,
    watermark: h.approvedRecord ? undefined : notApprovedBand(),
    defaultStyle: { font: REPORT_FONT, fontSize: 9, color: REPORT_INK.text, lineHeight: 1.15 },
    styles: REPORT_STYLES as unknown as TDocumentDefinitions['styles'],
    content,
  }
}
