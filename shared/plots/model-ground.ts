import * as d3 from 'd3'
import { stratumBounds } from '../site-model/definition-plain'
import type { SiteModelDefinition } from '../site-model/definition'
import type { ProfilePoint } from '../types/calc'
import { conversionFactor, unitLabel, type UnitSystem, type UsStressUnit } from '../units'
import { px, svgEscape } from './axes'
import { depthAxisSvg, drawingSheet, frameScene, frameSvg, type PlotBand, type Scale } from './model-tracks'
import { INK } from './palette'

/**
 * The ground the stresses come from, one implementation for the model canvas (its γ and u tracks draw these
 * scenes and layer their handles over them) and the site-model report (the same scenes written as SVG): unit
 * weights per stratum — γ above the water table, γsat below it, each drawn strong where it applies — and the
 * pore pressure: the model's u (its water profile, piezometric control points included), the hydrostatic line
 * from the water table, the control points and the water table. Pure; SI values in, display units only in labels.
 */

// --- unit weights ---------------------------------------------------------------------------------

export type UnitWeightKey = 'unitWeight' | 'unitWeightSaturated'

/** The γ axis: at least 14 to 21 kN/m³, widened to the strata's (and logged) values, within 5 to 30. */
export function unitWeightScale(def: Pick<SiteModelDefinition, 'strata'>, width: number, logged: readonly number[] = []): Scale {
  const values = [...def.strata.flatMap(s => [s.unitWeight, s.unitWeightSaturated]), ...logged]
  const lo = Math.max(5, Math.floor(Math.min(14, ...values) - 0.5))
  const hi = Math.min(30, Math.ceil(Math.max(21, ...values) + 0.5))
  return d3.scaleLinear().domain([lo, hi]).range([4, width - 4])
}

export interface UnitWeightSegment {
  band: number
  key: UnitWeightKey
  top: number
  bottom: number
  value: number
  /** The part of the stratum where this weight applies (above or below the water table), or null. */
  active: { top: number, bottom: number } | null
}

export interface UnitWeightTrackScene { scale: Scale, segments: UnitWeightSegment[] }

/** Each stratum's γ and γsat as vertical lines over its depth, with where each applies. */
export function unitWeightTrackScene(args: { definition: Pick<SiteModelDefinition, 'strata' | 'groundwater'>, width: number, logged?: readonly number[] }): UnitWeightTrackScene {
  const def = args.definition
  const zw = def.groundwater.waterTableDepth
  const segments = stratumBounds(def).flatMap((b, i): UnitWeightSegment[] => {
    const s = def.strata[i]!
    const above = b.top < zw ? { top: b.top, bottom: Math.min(b.bottom, zw) } : null
    const below = b.bottom > zw ? { top: Math.max(b.top, zw), bottom: b.bottom } : null
    return [
      { band: i, key: 'unitWeight', top: b.top, bottom: b.bottom, value: s.unitWeight, active: above },
      { band: i, key: 'unitWeightSaturated', top: b.top, bottom: b.bottom, value: s.unitWeightSaturated, active: below },
    ]
  })
  return { scale: unitWeightScale(def, args.width, args.logged), segments }
}

/** How a unit-weight line is drawn: γ solid in the handle ink, γsat dashed in the water ink. */
export function unitWeightInk(key: UnitWeightKey): { stroke: string, dash: string } {
  return key === 'unitWeight' ? { stroke: INK.handle, dash: '' } : { stroke: INK.water, dash: '4 2' }
}

/**
 * The γ track's lines as SVG (faint over the whole stratum, strong where the weight applies); with `label`,
 * each strong line taller than 16 px carries its value beside it.
 */
export function unitWeightTrackSvg(scene: UnitWeightTrackScene, y: Scale, opts: { label?: (value: number) => string, width?: number } = {}): string {
  return scene.segments.map((seg) => {
    const ink = unitWeightInk(seg.key)
    const xv = scene.scale(seg.value)
    const x = px(xv)
    const dash = ink.dash ? ` stroke-dasharray="${ink.dash}"` : ''
    let out = `<line x1="${x}" x2="${x}" y1="${px(y(seg.top))}" y2="${px(y(seg.bottom))}" stroke="${ink.stroke}" stroke-width="1" opacity="0.3"${dash}/>`
    if (seg.active) {
      const y0 = y(seg.active.top)
      const y1 = y(seg.active.bottom)
      out += `<line x1="${x}" x2="${x}" y1="${px(y0)}" y2="${px(y1)}" stroke="${ink.stroke}" stroke-width="1.8"${dash}/>`
      if (opts.label && y1 - y0 > 16) {
        // Right of the line, or left of it near the track's right edge.
        const left = opts.width !== undefined && xv > opts.width - 34
        out += `<text x="${px(left ? xv - 4 : xv + 4)}" y="${px((y0 + y1) / 2 + 3.5)}"${left ? ' text-anchor="end"' : ''} font-size="9.5" fill="${ink.stroke}">${svgEscape(opts.label(seg.value))}</text>`
      }
    }
    return out
  }).join('')
}

// --- pore pressure --------------------------------------------------------------------------------

export interface PoreTrackScene {
  scale: Scale
  /** The model's u against depth (SVG path). */
  pore: string
  /** The hydrostatic line from the water table to the model's base. */
  hydrostatic: { x1: number, y1: number, x2: number, y2: number }
  /** The water table's y and depth. */
  waterTable: { y: number, depth: number }
  /** Piezometric control points. */
  piezometers: { x: number, y: number, depth: number, porePressure: number }[]
}

/** The u axis from 0: wide enough for the model's u, hydrostatic u at the base, the control points and `extra` values. */
export function poreScale(def: Pick<SiteModelDefinition, 'strata' | 'groundwater' | 'gammaW'>, profile: readonly ProfilePoint[], width: number, extra: readonly number[] = []): Scale {
  const base = modelDepth(def)
  const zw = def.groundwater.waterTableDepth
  const hi = Math.max(
    10,
    ...profile.map(p => p.porePressure),
    def.gammaW * Math.max(0, base - zw),
    ...def.groundwater.piezometers.map(p => p.porePressure),
    ...extra,
  )
  return d3.scaleLinear().domain([0, hi * 1.06]).nice(4).range([6, width - 6])
}

function modelDepth(def: Pick<SiteModelDefinition, 'strata'>): number {
  return def.strata.reduce((a, s) => a + s.thickness, 0)
}

export function poreTrackScene(args: { definition: Pick<SiteModelDefinition, 'strata' | 'groundwater' | 'gammaW'>, profile: readonly ProfilePoint[], y: Scale, width: number, extra?: readonly number[] }): PoreTrackScene {
  const { definition: def, y } = args
  const x = poreScale(def, args.profile, args.width, args.extra)
  const zw = def.groundwater.waterTableDepth
  const bottom = Math.max(modelDepth(def), zw)
  return {
    scale: x,
    pore: d3.line<ProfilePoint>().x(p => x(p.porePressure)).y(p => y(p.depth))(args.profile as ProfilePoint[]) ?? '',
    hydrostatic: { x1: x(0), y1: y(zw), x2: x(def.gammaW * (bottom - zw)), y2: y(bottom) },
    waterTable: { y: y(zw), depth: zw },
    piezometers: def.groundwater.piezometers.map(p => ({ x: x(p.porePressure), y: y(p.depth), depth: p.depth, porePressure: p.porePressure })),
  }
}

/** The u track as SVG: hydrostatic (dotted), the model's u, the control points and the water table with its depth. */
export function poreTrackSvg(scene: PoreTrackScene, args: { width: number, waterLabel: string }): string {
  const h = scene.hydrostatic
  const zy = px(scene.waterTable.y)
  return `<line x1="${px(h.x1)}" y1="${px(h.y1)}" x2="${px(h.x2)}" y2="${px(h.y2)}" stroke="${INK.hydrostatic}" stroke-width="1.4" stroke-dasharray="1.5 3"/>`
    + `<path d="${scene.pore}" fill="none" stroke="${INK.porePressure}" stroke-width="2"/>`
    + scene.piezometers.map(p => `<circle cx="${px(p.x)}" cy="${px(p.y)}" r="4" fill="#ffffff" stroke="${INK.handle}" stroke-width="1.4"/>`).join('')
    + `<line x1="0" x2="${px(args.width)}" y1="${zy}" y2="${zy}" stroke="${INK.water}" stroke-width="2"/>`
    + `<circle cx="14" cy="${zy}" r="5" fill="${INK.water}" stroke="#ffffff" stroke-width="1.5"/>`
    + `<text x="${px(args.width - 4)}" y="${px(scene.waterTable.y - 4)}" text-anchor="end" font-size="10" fill="${INK.water}">${svgEscape(args.waterLabel)}</text>`
}

// --- the report's drawing of the ground -------------------------------------------------------------

export interface GroundDrawingInput {
  definition: SiteModelDefinition
  profile: readonly ProfilePoint[]
  units: UnitSystem
  /** US stresses in psf (default) or tsf, as the project chose. */
  usStress?: UsStressUnit
  width?: number
  height?: number
}

export interface GroundDrawing {
  svg: string
  width: number
  height: number
  y: Scale
  band: PlotBand
  unitWeight: UnitWeightTrackScene
  pore: PoreTrackScene
  frames: { strata: { x: number, width: number }, unitWeight: { x: number, width: number }, pore: { x: number, width: number } }
}

const LEFT = 46
const GAP = 12
const KEY_HEIGHT = 30

/** Depth axis, strata with their codes and names, the γ track and the u track over the whole model, with a key. */
export function groundDrawing(input: GroundDrawingInput): GroundDrawing {
  const def = input.definition
  const { width, height, bounds, base, band } = drawingSheet(input, { height: 800, keyHeight: KEY_HEIGHT })
  const y = d3.scaleLinear().domain([0, Math.max(base, def.groundwater.waterTableDepth, 0.1)]).range([band.top, band.bottom])
  const strataWidth = 150
  const uwWidth = Math.round((width - LEFT - 8 - strataWidth - 2 * GAP) * 0.42)
  const poreWidth = width - LEFT - 8 - strataWidth - 2 * GAP - uwWidth
  const frames = { strata: { x: LEFT, width: strataWidth }, unitWeight: { x: LEFT + strataWidth + GAP, width: uwWidth }, pore: { x: LEFT + strataWidth + GAP + uwWidth + GAP, width: poreWidth } }
  const lengthFactor = conversionFactor('length', 'SI', input.units)
  const lengthUnit = unitLabel('length', input.units)

  const parts: string[] = [depthAxisSvg({ x: LEFT - 6, band, y, lengthFactor, unit: lengthUnit })]
  const strata = bounds.map((b, i) => {
    const s = def.strata[i]!
    const y0 = y(b.top)
    const y1 = y(b.bottom)
    const mid = (y0 + y1) / 2
    const name = s.name.length > 24 ? `${s.name.slice(0, 23)}…` : s.name
    return `<rect x="0" y="${px(y0)}" width="${strataWidth}" height="${px(Math.max(0, y1 - y0))}" fill="${i % 2 ? '#efede7' : '#f7f5f0'}" stroke="${INK.frame}" stroke-width="0.6"/>`
      + `<text x="6" y="${px(mid + (y1 - y0 > 26 ? -2 : 4))}" font-size="11" font-weight="600" fill="${INK.axis}">${svgEscape(s.code)}</text>`
      + (y1 - y0 > 26 ? `<text x="6" y="${px(mid + 10)}" font-size="9.5" fill="${INK.axis}">${svgEscape(name)}</text>` : '')
  }).join('')
  parts.push(frameSvg({ ...frames.strata, band, title: 'Strata', scene: frameScene({ width: strataWidth, band, y, lengthFactor }), content: strata }))

  const uw = unitWeightTrackScene({ definition: def, width: uwWidth })
  const uwFactor = conversionFactor('unitWeight', 'SI', input.units)
  parts.push(frameSvg({
    ...frames.unitWeight, band, title: 'γ and γsat', unit: unitLabel('unitWeight', input.units),
    scene: frameScene({ width: uwWidth, band, y, lengthFactor, scale: uw.scale, factor: uwFactor, ticks: 4 }),
    content: unitWeightTrackSvg(uw, y, { width: uwWidth, label: v => (v * uwFactor).toFixed(1) }),
  }))

  const pore = poreTrackScene({ definition: def, profile: input.profile, y, width: poreWidth })
  const stressFactor = conversionFactor('stress', 'SI', input.units, { usStress: input.usStress })
  parts.push(frameSvg({
    ...frames.pore, band, title: 'Pore pressure u', unit: unitLabel('stress', input.units, { usStress: input.usStress }),
    scene: frameScene({ width: poreWidth, band, y, lengthFactor, scale: pore.scale, factor: stressFactor, ticks: 4 }),
    content: poreTrackSvg(pore, { width: poreWidth, waterLabel: `water table ${(def.groundwater.waterTableDepth * lengthFactor).toFixed(2)} ${lengthUnit}` }),
  }))

  // Key: one row under the tracks.
  const ky = band.bottom + 26
  const items: { draw: string, label: string }[] = [
    { draw: `<line x1="-9" x2="9" y1="0" y2="0" stroke="${INK.handle}" stroke-width="1.8"/>`, label: 'γ above the water table' },
    { draw: `<line x1="-9" x2="9" y1="0" y2="0" stroke="${INK.water}" stroke-width="1.8" stroke-dasharray="4 2"/>`, label: 'γsat below it' },
    { draw: `<line x1="-9" x2="9" y1="0" y2="0" stroke="${INK.porePressure}" stroke-width="2"/>`, label: 'u of the model' },
    { draw: `<line x1="-9" x2="9" y1="0" y2="0" stroke="${INK.hydrostatic}" stroke-width="1.4" stroke-dasharray="1.5 3"/>`, label: 'hydrostatic' },
    { draw: `<circle cx="0" cy="0" r="4" fill="#ffffff" stroke="${INK.handle}" stroke-width="1.4"/>`, label: 'piezometric control point' },
  ]
  const step = (width - 16) / items.length
  parts.push(`<g transform="translate(8,${px(ky)})">${items.map((it, k) => `<g transform="translate(${px(k * step + 9)},0)">${it.draw}</g><text x="${px(k * step + 23)}" y="3.5" font-size="9.5" fill="${INK.axis}">${svgEscape(it.label)}</text>`).join('')}</g>`)

  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="SourceSans3">${parts.join('')}</svg>`
  return { svg, width, height, y, band, unitWeight: uw, pore, frames }
}
