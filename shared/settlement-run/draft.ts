import { loadOutlines, type PlanLoad } from '../geotech/plan-loads'
import { convert, type Quantity, type UnitSystem } from '../units'
import { gridAxes } from './grid'
import { RUN_OPTION_DEFAULTS, type RunGrid, type RunLoad, type RunLoadInput, type RunOptions, type RunPoint } from '../schemas/settlement-runs'

/**
 * The run editor's working copy of a settlement run (SI: m, kPa, kN/m³, degrees, years) and the
 * pure steps between it, the plan and the request. A draft load keeps every field of every load
 * type, so switching a load's type in the table keeps the values typed for the other types.
 */

export const DRAFT_LOAD_TYPES = ['embankment', 'rectangle', 'circle', 'uniform'] as const
export type DraftLoadType = (typeof DRAFT_LOAD_TYPES)[number]

export const DRAFT_LOAD_TYPE_LABELS: Record<DraftLoadType, string> = {
  embankment: 'Embankment',
  rectangle: 'Rectangle',
  circle: 'Circle',
  uniform: 'Uniform fill (whole site)',
}

export interface DraftLoad {
  /** The editor's own id (not sent). */
  id: string
  type: DraftLoadType
  label: string
  /** Centre, site grid, m. */
  x: number
  y: number
  /** Degrees, anticlockwise from the grid's x axis (rectangle, embankment). */
  rotation: number
  width: number
  length: number
  radius: number
  crestWidth: number
  crestLength: number
  height: number
  /** n of n:1 (horizontal : vertical). */
  sideSlope: number
  /** The embankment's fill, kN/m³. */
  unitWeight: number
  /** How a rectangle, circle or uniform fill is loaded: a pressure, or a fill thickness × unit weight. */
  loading: 'pressure' | 'fill'
  pressure: number
  fillThickness: number
  fillUnitWeight: number
}

export interface DraftPoint {
  id: string
  label: string
  x: number
  y: number
  /** The investigation point it was picked from. */
  pointId?: string
}

export interface SettlementDraft {
  name: string
  model: { modelId: string, version: number } | null
  loads: DraftLoad[]
  points: DraftPoint[]
  gridOn: boolean
  grid: { spacing: number, margin: number }
  options: RunOptions
}

/** Sizes a load placed by a click takes (m, kPa, kN/m³): a 6 m embankment of 20 kN/m³ fill at 2:1. */
export const DEFAULT_LOAD: Omit<DraftLoad, 'id' | 'type' | 'label' | 'x' | 'y'> = {
  rotation: 0,
  width: 20,
  length: 30,
  radius: 10,
  crestWidth: 40,
  crestLength: 60,
  height: 6,
  sideSlope: 2,
  unitWeight: 20,
  loading: 'pressure',
  pressure: 50,
  fillThickness: 1,
  fillUnitWeight: 20,
}

export const DEFAULT_GRID = { spacing: 5, margin: 10 }

export function emptyDraft(): SettlementDraft {
  return {
    name: '',
    model: null,
    loads: [],
    points: [],
    gridOn: false,
    grid: { ...DEFAULT_GRID },
    options: { ...RUN_OPTION_DEFAULTS, years: [...RUN_OPTION_DEFAULTS.years] },
  }
}

/** A load of `type` centred at (x, y) with the default sizes. */
export function newLoad(id: string, type: DraftLoadType, at: { x: number, y: number }, label = ''): DraftLoad {
  return { id, type, label, x: round(at.x), y: round(at.y), ...DEFAULT_LOAD }
}

/**
 * A load whose footprint is the box dragged from `a` to `b` (north-up, no rotation): a rectangle
 * fills it, a circle fits inside it, an embankment's toe is the box (crest = box less two slope widths,
 * at least 1 m).
 */
export function loadFromBox(id: string, type: Exclude<DraftLoadType, 'uniform'>, a: { x: number, y: number }, b: { x: number, y: number }, label = ''): DraftLoad {
  const w = Math.abs(b.x - a.x)
  const l = Math.abs(b.y - a.y)
  const load = newLoad(id, type, { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 }, label)
  if (type === 'rectangle') return { ...load, width: round(w), length: round(l) }
  if (type === 'circle') return { ...load, radius: round(Math.min(w, l) / 2) }
  const toe = 2 * load.sideSlope * load.height
  return { ...load, crestWidth: round(Math.max(1, w - toe)), crestLength: round(Math.max(1, l - toe)) }
}

/** Rounds a plan value to the centimetre (what a drag or a click can mean). */
export function round(v: number): number {
  return Math.round(v * 100) / 100
}

/** The load as the engine's plan load (a fill resolved to its pressure). */
export function planLoadOf(l: DraftLoad): PlanLoad {
  const pressure = l.loading === 'fill' ? l.fillThickness * l.fillUnitWeight : l.pressure
  switch (l.type) {
    case 'uniform': return { type: 'uniform', pressure }
    case 'rectangle': return { type: 'rectangle', x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, pressure }
    case 'circle': return { type: 'circle', x: l.x, y: l.y, radius: l.radius, pressure }
    case 'embankment': return { type: 'embankment', x: l.x, y: l.y, crestWidth: l.crestWidth, crestLength: l.crestLength, height: l.height, sideSlope: l.sideSlope, unitWeight: l.unitWeight, rotation: l.rotation }
  }
}

/** The pressure a load puts on the ground, kPa (an embankment: height × unit weight). */
export function loadPressure(l: DraftLoad): number {
  if (l.type === 'embankment') return l.height * l.unitWeight
  return l.loading === 'fill' ? l.fillThickness * l.fillUnitWeight : l.pressure
}

/** What the plan draws of a load: its footprint (the toe of an embankment) and an embankment's crest. */
export function draftOutlines(l: DraftLoad): { toe: { x: number, y: number }[], crest: { x: number, y: number }[] | null } | null {
  const { toe, crest } = loadOutlines(planLoadOf(l))
  if (!toe) return null
  return { toe, crest: l.type === 'embankment' ? crest : null }
}

/** The ground the loads and points take up (for the plan's first view), or null with nothing placed. */
export function draftExtent(d: Pick<SettlementDraft, 'loads' | 'points'>): { minX: number, maxX: number, minY: number, maxY: number } | null {
  const pts = [...d.loads.flatMap(l => draftOutlines(l)?.toe ?? []), ...d.points]
  if (!pts.length) return null
  return {
    minX: Math.min(...pts.map(p => p.x)),
    maxX: Math.max(...pts.map(p => p.x)),
    minY: Math.min(...pts.map(p => p.y)),
    maxY: Math.max(...pts.map(p => p.y)),
  }
}

/**
 * How many points the grid would have: the loads' footprints widened by the margin, at the spacing
 * (the same axes the run computes; 0 without a load that has a footprint or with no valid spacing).
 */
export function gridPointCount(loads: readonly DraftLoad[], grid: RunGrid): number {
  const axes = gridAxes(loads.map(planLoadOf), grid)
  return axes ? axes.xs.length * axes.ys.length : 0
}

/** The load as the request sends it (SI). */
export function requestLoadOf(l: DraftLoad): RunLoadInput {
  const label = l.label.trim() ? { label: l.label.trim() } : {}
  const loading = l.loading === 'fill' ? { fill: { thickness: l.fillThickness, unitWeight: l.fillUnitWeight } } : { pressure: l.pressure }
  switch (l.type) {
    case 'uniform': return { type: 'uniform', ...label, ...loading }
    case 'rectangle': return { type: 'rectangle', ...label, x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, ...loading }
    case 'circle': return { type: 'circle', ...label, x: l.x, y: l.y, radius: l.radius, ...loading }
    case 'embankment': return { type: 'embankment', ...label, x: l.x, y: l.y, crestWidth: l.crestWidth, crestLength: l.crestLength, height: l.height, sideSlope: l.sideSlope, unitWeight: l.unitWeight, rotation: l.rotation }
  }
}

/** The request body a draft makes (before the schema checks it). */
export function requestOf(d: SettlementDraft) {
  return {
    name: d.name,
    model: d.model ?? undefined,
    loads: d.loads.map(requestLoadOf),
    points: d.points.map(p => ({ label: p.label, x: p.x, y: p.y, ...(p.pointId ? { pointId: p.pointId } : {}) })),
    ...(d.gridOn ? { grid: { ...d.grid } } : {}),
    options: { ...d.options, years: [...d.options.years] },
  }
}

/** A run's inputs as stored (what GET …/settlement-runs/{id} returns). */
export interface RunInputs {
  name: string
  model: { modelId: string, version: number }
  loads: RunLoad[]
  points: RunPoint[]
  grid: RunGrid | null
  options: RunOptions
}

/** A draft holding a run's inputs, for "Run again with changes"; `ids` names the loads and points. */
export function draftFromRun(run: RunInputs, ids: () => string): SettlementDraft {
  const loads = run.loads.map((l): DraftLoad => {
    const base: DraftLoad = { id: ids(), type: l.type, label: l.label ?? '', x: 0, y: 0, ...DEFAULT_LOAD }
    const loading = l.type === 'embankment'
      ? {}
      : l.fill ? { loading: 'fill' as const, fillThickness: l.fill.thickness, fillUnitWeight: l.fill.unitWeight } : { loading: 'pressure' as const, pressure: l.pressure ?? 0 }
    switch (l.type) {
      case 'uniform': return { ...base, ...loading }
      case 'rectangle': return { ...base, x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, ...loading }
      case 'circle': return { ...base, x: l.x, y: l.y, radius: l.radius, ...loading }
      case 'embankment': return { ...base, x: l.x, y: l.y, crestWidth: l.crestWidth, crestLength: l.crestLength, height: l.height, sideSlope: l.sideSlope, unitWeight: l.unitWeight, rotation: l.rotation }
    }
  })
  return {
    name: run.name,
    model: { modelId: run.model.modelId, version: run.model.version },
    loads,
    points: run.points.map(p => ({ id: ids(), label: p.label, x: p.x, y: p.y, ...(p.pointId ? { pointId: p.pointId } : {}) })),
    gridOn: !!run.grid,
    grid: run.grid ? { spacing: run.grid.spacing, margin: run.grid.margin } : { ...DEFAULT_GRID },
    options: { ...RUN_OPTION_DEFAULTS, ...run.options, years: [...(run.options.years ?? RUN_OPTION_DEFAULTS.years)] },
  }
}

/** The next free label of the form `${prefix}${n}` among `taken`. */
export function nextLabel(prefix: string, taken: readonly string[]): string {
  const used = new Set(taken)
  for (let n = 1; ; n += 1) if (!used.has(`${prefix}${n}`)) return `${prefix}${n}`
}

/** The quantity of each numeric load field, for the project's units at the edges (null: no unit to convert). */
export const LOAD_FIELD_QUANTITY = {
  x: 'length',
  y: 'length',
  width: 'length',
  length: 'length',
  radius: 'length',
  crestWidth: 'length',
  crestLength: 'length',
  height: 'length',
  fillThickness: 'length',
  unitWeight: 'unitWeight',
  fillUnitWeight: 'unitWeight',
  pressure: 'stress',
  sideSlope: null,
  rotation: null,
} as const satisfies Record<string, Quantity | null>
export type DraftLoadNumberField = keyof typeof LOAD_FIELD_QUANTITY

/** A number typed in `system`'s units ("1,5" too) in SI; null when it is not a number. */
export function siFromTyped(text: string, quantity: Quantity | null, system: UnitSystem): number | null {
  const t = text.trim().replace(',', '.')
  if (t === '') return null
  const v = Number(t)
  if (!Number.isFinite(v)) return null
  return quantity ? convert(v, quantity, system, 'SI') : v
}
