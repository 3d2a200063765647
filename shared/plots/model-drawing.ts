import * as d3 from 'd3'
import type { TrendBandPoint } from '../geotech/trend-model'
import type { PreconsolidationSource } from '../schemas/lab'
import type { FlagVerdict } from '../review/flags'
import type { SiteModelDefinition } from '../site-model/definition'
import type { ProfilePoint } from '../types/calc'
import { conversionFactor, unitLabel, type UnitSystem, type UsStressUnit } from '../units'
import { px, svgEscape } from './axes'
import {
  depthAxisSvg, drawingSheet, frameScene, frameSvg, ocrAxis, pointMarksSvg, popAxis, ratioDotsSvg, ratioTrackScene, ratioTrackSvg,
  stressAxis, stressTrackScene, stressTrackSvg, type PlotBand, type PointState, type Scale,
} from './model-tracks'
import { INK, markStyle, QUALITY_SHADES, RING_PATH, SLASH_PATH, SOURCE_INK, SOURCE_LABELS, symbolPath, VERDICT_INK } from './palette'
import { sampleTrend, stressAt, type TrendSample } from './stress-history'

/**
 * The model canvas's drawing for a report page: depth axis, strata, σv / u / σ'v0 with the σ'p points and
 * each stratum's trend and band, OCR and POP, over a depth range (the whole model or one stratum), with
 * its key. Built from the same track scenes as the canvas (`model-tracks.ts`), written as one SVG string.
 */

export interface DrawingPoint {
  depth: number
  preconsolidation: number
  source: PreconsolidationSource
  qualityClass: string | null
  state: PointState
  verdict: FlagVerdict | null
}

export interface ModelDrawingInput {
  definition: SiteModelDefinition
  profile: readonly ProfilePoint[]
  points: readonly DrawingPoint[]
  /** Per stratum: the fit's confidence band (null for none or a hand-drawn trend). */
  fitBands: readonly (readonly TrendBandPoint[] | null)[]
  units: UnitSystem
  /** US stresses in psf (default) or tsf, as the project chose. */
  usStress?: UsStressUnit
  /** Depth range drawn, m (defaults to the whole model). */
  range?: { top: number, bottom: number }
  width?: number
  height?: number
  /** Draw the key under the drawing (default true; a report draws it once). */
  legend?: boolean
}

export interface ModelDrawing {
  svg: string
  width: number
  height: number
  /** The scales used, for tests and captions. */
  y: Scale
  stress: Scale
  band: PlotBand
  frames: { strata: { x: number, width: number }, stress: { x: number, width: number }, ocr: { x: number, width: number }, pop: { x: number, width: number } }
}

const GAP = 10
const LEFT = 46
const LEGEND_HEIGHT = 84

/** The drawing of a depth range of a model. */
export function modelDrawing(input: ModelDrawingInput): ModelDrawing {
  const def = input.definition
  const legend = input.legend ?? true
  const { width, height, bounds, base, band } = drawingSheet(input, { height: 900, keyHeight: legend ? LEGEND_HEIGHT : 0 })
  const range = input.range ?? { top: 0, bottom: base }
  const y = d3.scaleLinear().domain([range.top, range.bottom]).range([band.top, band.bottom])

  const fixed = { strata: 54, ocr: 92, pop: 100 }
  const stressWidth = width - LEFT - 8 - fixed.strata - fixed.ocr - fixed.pop - 3 * GAP
  let x = LEFT
  const place = (w: number) => {
    const f = { x, width: w }
    x += w + GAP
    return f
  }
  const frames = { strata: place(fixed.strata), stress: place(stressWidth), ocr: place(fixed.ocr), pop: place(fixed.pop) }

  // The profile within the range (with its ends), and the points within it, for the axes of a zoomed page.
  const inRange = (z: number) => z >= range.top - 1e-9 && z <= range.bottom + 1e-9
  const ends = [range.top, range.bottom].map(z => ({ z, s: stressAt(input.profile, z) }))
  const profileShown = input.profile.filter(p => inRange(p.depth))
  for (const e of ends) if (e.s && !profileShown.some(p => Math.abs(p.depth - e.z) < 1e-9)) profileShown.push({ depth: e.z, layer: '', ...e.s })
  profileShown.sort((a, b) => a.depth - b.depth)
  const pointsShown = input.points.filter(p => inRange(p.depth))

  const stress = stressAxis({ profile: profileShown, preconsolidation: pointsShown, base: range.bottom, width: frames.stress.width })
  // Only the strata the range shows (a stratum's page draws its own trend and its neighbours' ends).
  const overlaps = (i: number) => bounds[i]!.bottom > range.top && bounds[i]!.top < range.bottom
  const lines: { band: number, samples: TrendSample[] }[] = def.strata.map((_s, i) => ({ band: i, samples: overlaps(i) ? sampleTrend(def, i, input.profile) : [] })).filter(l => l.samples.length)
  const linesShown = lines.map(l => ({ band: l.band, samples: l.samples.filter(s => inRange(s.depth)) })).filter(l => l.samples.length)
  const ocr = ocrAxis(linesShown, frames.ocr.width)
  const pop = popAxis(linesShown, frames.pop.width)
  const lengthFactor = conversionFactor('length', 'SI', input.units)
  const stressFactor = conversionFactor('stress', 'SI', input.units, { usStress: input.usStress })
  const stressUnit = unitLabel('stress', input.units, { usStress: input.usStress })

  const parts: string[] = []
  parts.push(depthAxisSvg({ x: LEFT - 6, band, y, lengthFactor, unit: unitLabel('length', input.units) }))

  // Strata: each band in its stratum's place, with its code.
  const strataContent = bounds.map((b, i) => {
    const y0 = y(b.top)
    const y1 = y(b.bottom)
    const s = def.strata[i]!
    const mid = (Math.max(y0, band.top) + Math.min(y1, band.bottom)) / 2
    return `<rect x="0" y="${px(y0)}" width="${fixed.strata}" height="${px(Math.max(0, y1 - y0))}" fill="${i % 2 ? '#efede7' : '#f7f5f0'}" stroke="${INK.frame}" stroke-width="0.6"/>`
      + `<text x="${fixed.strata / 2}" y="${px(mid + 4)}" text-anchor="middle" font-size="11" font-weight="600" fill="${INK.axis}">${svgEscape(s.code)}</text>`
  }).join('')
  parts.push(frameSvg({ ...frames.strata, band, title: 'Strata', scene: frameScene({ width: fixed.strata, band, y, lengthFactor }), content: strataContent }))

  // Stresses, σ'p points, trends and bands.
  const scene = stressTrackScene({
    width: frames.stress.width,
    band,
    y,
    scale: stress,
    profile: input.profile,
    bounds,
    trends: lines.map(l => ({ band: l.band, samples: l.samples, fitBand: input.fitBands[l.band] ?? null, bounds: bounds[l.band]!, manual: !!def.strata[l.band]?.trend?.manual })),
  })
  scene.baseLabel = profileShown.length ? { x: Math.min(frames.stress.width - 4, stress(profileShown[profileShown.length - 1]!.effectiveStress) + 4), y: band.bottom - 4 } : null
  const marks = pointsShown.map(p => ({ x: stress(p.preconsolidation), y: y(p.depth), source: p.source, qualityClass: p.qualityClass, state: p.state, verdict: p.verdict }))
  parts.push(frameSvg({
    ...frames.stress, band, title: 'σv, u, σ\'v0 and σ\'p', unit: stressUnit,
    scene: frameScene({ width: frames.stress.width, band, y, lengthFactor, scale: stress, factor: stressFactor, ticks: 5 }),
    content: stressTrackSvg(scene, { width: frames.stress.width, points: pointMarksSvg(marks) }),
  }))

  // OCR and POP of the trends, with the points' own values as dots.
  for (const kind of ['ocr', 'pop'] as const) {
    const scale = kind === 'ocr' ? ocr : pop
    const f = frames[kind]
    const dots = pointsShown.flatMap((p) => {
      const e = stressAt(input.profile, p.depth)?.effectiveStress
      if (e === undefined || !(e > 0)) return []
      return [{ x: scale(kind === 'ocr' ? p.preconsolidation / e : p.preconsolidation - e), y: y(p.depth) }]
    })
    parts.push(frameSvg({
      ...f, band, title: kind === 'ocr' ? 'OCR' : 'POP', unit: kind === 'pop' ? stressUnit : '',
      scene: frameScene({ width: f.width, band, y, lengthFactor, scale, factor: kind === 'pop' ? stressFactor : 1, ticks: 3 }),
      content: ratioTrackSvg(ratioTrackScene({ kind, y, scale, lines: lines }), { band, dots: ratioDotsSvg(dots) }),
    }))
  }
  if (legend) parts.push(legendSvg(8, band.bottom + 18, width - 16))
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="SourceSans3">${parts.join('')}</svg>`
  return { svg, width, height, y, stress, band, frames }
}

/** The key under the drawing: sources, sample quality, review states and the lines. */
export function legendSvg(x: number, y: number, width: number): string {
  type Item = { label: string, draw: string }
  const sym = (source: PreconsolidationSource, state: PointState, verdict: FlagVerdict | null, quality: string | null = null) => {
    const st = markStyle(source, quality, state, verdict)
    return `<path d="${st.d}" fill="${st.fill}" stroke="${st.stroke}" stroke-width="${st.width}"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}/>`
      + (st.ring ? `<path d="${RING_PATH}" fill="none" stroke="${st.ring.stroke}" stroke-width="${st.ring.width}"${st.ring.dash ? ` stroke-dasharray="${st.ring.dash}"` : ''}/>` : '')
      + (st.slash ? `<path d="${SLASH_PATH}" stroke="#c0392b" stroke-width="1.4"/>` : '')
  }
  const line = (stroke: string, w: number, dash = '') => `<line x1="-9" x2="9" y1="0" y2="0" stroke="${stroke}" stroke-width="${w}"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`
  const rows: { title: string, items: Item[] }[] = [
    {
      title: 'σ\'p from',
      items: [
        { label: SOURCE_LABELS.oedometer, draw: `<path d="${symbolPath('oedometer', 8)}" fill="${SOURCE_INK.oedometer}" stroke="#0c242b" stroke-width="1.2"/>` },
        { label: SOURCE_LABELS.cpt, draw: sym('cpt', 'included', null) },
        { label: SOURCE_LABELS.vane, draw: sym('vane', 'included', null) },
      ],
    },
    { title: 'Sample quality', items: QUALITY_SHADES.map(q => ({ label: q.label, draw: sym('oedometer', 'included', null, q.key) })) },
    {
      title: 'Review',
      items: [
        { label: 'Left out of the fit', draw: sym('cpt', 'excluded', null) },
        { label: 'Flagged: exclude', draw: sym('cpt', 'flagged-out', 'exclude') },
        { label: 'Flagged: questionable', draw: `<path d="${symbolPath('cpt', 6)}" fill="${SOURCE_INK.cpt}"/><path d="${RING_PATH}" fill="none" stroke="${VERDICT_INK.questionable.stroke}" stroke-width="${VERDICT_INK.questionable.width}" stroke-dasharray="${VERDICT_INK.questionable.dash}"/>` },
        { label: 'Flagged: accepted', draw: `<path d="${symbolPath('cpt', 6)}" fill="${SOURCE_INK.cpt}"/><path d="${RING_PATH}" fill="none" stroke="${VERDICT_INK.accepted.stroke}" stroke-width="${VERDICT_INK.accepted.width}"/>` },
      ],
    },
    {
      title: 'Lines',
      items: [
        { label: 'σv', draw: line(INK.totalStress, 1.2) },
        { label: 'u', draw: line(INK.porePressure, 1.3, '5 3') },
        { label: 'σ\'v0', draw: line(INK.effectiveStress, 2.4) },
        { label: 'σ\'p trend', draw: line(INK.trend, 2.4) },
        { label: 'Hand-drawn trend', draw: line(INK.trend, 2.4, '7 3') },
        { label: '95 % band of the fit', draw: `<rect x="-9" y="-5" width="18" height="10" fill="${INK.trendBand}" opacity="0.55"/>` },
      ],
    },
  ]
  const out: string[] = [`<g transform="translate(${px(x)},${px(y)})">`]
  const titleWidth = 78
  const per = Math.max(1, Math.floor((width - titleWidth) / 126))
  let row = 0
  for (const r of rows) {
    for (let k = 0; k < r.items.length; k += per) {
      const cy = row * 15
      if (k === 0) out.push(`<text x="0" y="${cy + 3.5}" font-size="9.5" font-weight="600" fill="${INK.axis}">${svgEscape(r.title)}</text>`)
      r.items.slice(k, k + per).forEach((it, j) => {
        const cx = titleWidth + j * 126 + 9
        out.push(`<g transform="translate(${cx},${cy})">${it.draw}</g><text x="${cx + 14}" y="${cy + 3.5}" font-size="9.5" fill="${INK.axis}">${svgEscape(it.label)}</text>`)
      })
      row++
    }
  }
  out.push('</g>')
  return out.join('')
}
