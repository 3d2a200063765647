// Reads one uploaded workbook in a worker thread (run by the pool in
// server/services/imports/workbook.ts), so a large or slow sheet never holds up
// the server's request loop. Plain JavaScript: the build copies this file as it is
// into the server output, next to the bundle's traced node_modules.
import * as XLSX from 'xlsx-republish'

/**
 * `sheetRows` bounds the rows read from each sheet; `truncated` says the chosen
 * sheet reached it (the rest was not read). Refusals are returned, not thrown, so
 * the caller words them.
 */
export default function readWorkbook({ data, sheet, sheetRows }) {
  let wb
  try {
    wb = XLSX.read(data, { type: 'array', cellDates: true, dense: true, sheetRows })
  }
  catch {
    return { refusal: 'unreadable' }
  }
  const sheets = wb.SheetNames
  if (sheet && !sheets.includes(sheet)) return { refusal: 'no-such-sheet', sheets }
  const chosen = sheet ?? sheets[0]
  if (!chosen) return { refusal: 'no-sheets', sheets }
  const ws = wb.Sheets[chosen]
  const grid = XLSX.utils.sheet_to_json(ws, { header: 1, raw: true, blankrows: true, defval: null })
  // The reader keeps the sheet's full extent in !fullref when it stopped early.
  return { sheets, sheet: chosen, grid, truncated: Boolean(ws['!fullref']) || grid.length >= sheetRows }
}
