/**
 * Helpers for the demo-data tests: the in-situ stresses a user of the product would build from the
 * investigation record alone (logs, stratum unit weights, groundwater readings), and a small CSV reader.
 */
import { createStressEvaluator, type Groundwater, type StressAtDepth, type StressLayer } from '../../../shared/geotech/stress'
import type { InvestigationRecord, PointRecord } from '../../../shared/investigation/types'

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = sorted.length >> 1
  return sorted.length % 2 === 1 ? sorted[mid]! : 0.5 * (sorted[mid - 1]! + sorted[mid]!)
}

/** Groundwater from the record: the median standing level of the boreholes and each piezometer's mean pressure at its tip. */
export function groundwaterFromRecord(record: InvestigationRecord): Groundwater {
  const standing = record.points.flatMap(p => p.groundwater.filter(g => g.kind === 'standing' && g.depth !== null).map(g => g.depth!))
  const piezometers = record.points
    .filter(p => p.kind === 'piezometer')
    .map((p) => {
      const readings = p.groundwater.filter(g => g.kind === 'piezometer' && g.pressure !== null).map(g => g.pressure!)
      return { depth: p.finalDepth, porePressure: readings.reduce((s, v) => s + v, 0) / readings.length }
    })
  return { waterTableDepth: median(standing), piezometers }
}

/** Stratum tops and bottoms of a point's log, consecutive intervals of one stratum merged. */
export function strataOfLog(point: PointRecord): Array<{ code: string, top: number, bottom: number }> {
  const out: Array<{ code: string, top: number, bottom: number }> = []
  for (const iv of point.intervals) {
    const code = iv.stratumCode ?? '?'
    const last = out[out.length - 1]
    if (last && last.code === code && Math.abs(last.bottom - iv.top) < 1e-9) last.bottom = iv.bottom
    else out.push({ code, top: iv.top, bottom: iv.bottom })
  }
  return out
}

/** σv, u, σ'v0 at a point from its own log and the record's unit weights and groundwater, through the engine. */
export function stressFromRecord(record: InvestigationRecord, point: PointRecord): (depth: number) => StressAtDepth {
  const layers: StressLayer[] = strataOfLog(point).map((s) => {
    const stratum = record.strata.find(r => r.code === s.code)
    if (!stratum) throw new Error(`No stratum ${s.code}`)
    return { name: s.code, thickness: s.bottom - s.top, unitWeight: stratum.unitWeight, unitWeightSaturated: stratum.unitWeightSaturated }
  })
  return createStressEvaluator({ layers, groundwater: groundwaterFromRecord(record) })
}

/** Stratum code of a depth in a point's log (an interval's top belongs to it, its bottom to the next). */
export function stratumAtDepth(point: PointRecord, depth: number): string | null {
  return point.intervals.find(iv => depth >= iv.top && depth < iv.bottom)?.stratumCode ?? null
}

/** RFC 4180 reader for the small example files: quoted cells, doubled quotes, \n or \r\n line ends. */
export function parseCsv(text: string): string[][] {
  const rows: string[][] = []
  let row: string[] = []
  let cell = ''
  let quoted = false
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"'
        i++
      }
      else if (c === '"') quoted = false
      else cell += c
    }
    else if (c === '"') quoted = true
    else if (c === ',') {
      row.push(cell)
      cell = ''
    }
    else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i++
      row.push(cell)
      rows.push(row)
      row = []
      cell = ''
    }
    else cell += c
  }
  if (cell !== '' || row.length > 0) {
    row.push(cell)
    rows.push(row)
  }
  return rows
}
