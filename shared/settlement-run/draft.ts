import { loadOutlines, type PlanLoad } from '../geotech/plan-loads'
import { convert, type Quantity, type UnitSystem } from '../units'
import { gridAxes } from './grid'
import { RUN_DRAIN_DEFAULTS, RUN_LIMITS, RUN_OPTION_DEFAULTS, RUN_PROBABILISTIC_DEFAULTS, RUN_SCATTER_VARIABLES, type DrainPattern, type RunScatterVariable } from '../schemas/settlement-run-limits'
import type { RunGrid, RunLoad, RunLoadInput, RunOptions, RunPoint, RunStratumVariation, RunVariation } from '../schemas/settlement-runs'

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
  /** How the load is built: stages of start, duration (years from the run's time zero) and share of the full load. */
  stages: DraftStage[]
  /** When a surcharge is taken off, years; null: it stays. */
  removeAt: number | null
}

/** One construction stage of a load: years from the run's time zero, and the share of the full load (0–1) it adds. */
export interface DraftStage {
  start: number
  duration: number
  fraction: number
}

/** Vertical drains through some strata of the run, kept while switched off so the values typed stay. */
export interface DraftDrains {
  on: boolean
  /** Stratum codes of the model version. */
  strata: string[]
  pattern: DrainPattern
  /** Centre-to-centre, m. */
  spacing: number
  /** Equivalent drain diameter, m. */
  diameter: number
  /** Smeared zone diameter over the drain's, ds/dw. */
  smearRatio: number
  /** kh/ks: undisturbed over smeared horizontal permeability. */
  permeabilityRatio: number
  /** ch/cv. */
  chRatio: number
  /** qw, m³/year; null: no well resistance. */
  dischargeCapacity: number | null
}

/**
 * A probabilistic run's inputs (SI; the settlement limit in m), kept while switched off so the values
 * typed stay. `layers` holds only the COVs the engineer typed, by stratum code; "from the data" fills
 * the others on the server.
 */
export interface DraftProbabilistic {
  on: boolean
  realizations: number
  seed: number
  fromData: boolean
  ccE0Correlation: number
  /** m; null: no limit. */
  limit: number | null
  layers: Record<string, RunStratumVariation>
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
  /** The options without the drains and the probabilistic inputs (those are `drains`, `probabilistic`). */
  options: DraftOptions
  drains: DraftDrains
  probabilistic: DraftProbabilistic
}

export type DraftOptions = Omit<RunOptions, 'drains' | 'probabilistic'>

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
  stages: [{ start: 0, duration: 0, fraction: 1 }],
  removeAt: null,
}

/** The default schedule: the whole load at once, at time zero. */
export function instantStages(): DraftStage[] {
  return [{ start: 0, duration: 0, fraction: 1 }]
}

/** The spacing drains switched on start with, m (a first guess the spacing aid refines). */
export const DEFAULT_DRAIN_SPACING = 1.5

/** The drains a draft starts with (off). */
export function defaultDrains(): DraftDrains {
  const D = RUN_DRAIN_DEFAULTS
  return {
    on: false,
    strata: [],
    pattern: D.pattern,
    spacing: DEFAULT_DRAIN_SPACING,
    diameter: D.diameter,
    smearRatio: D.smearRatio,
    permeabilityRatio: D.permeabilityRatio,
    chRatio: D.chRatio,
    dischargeCapacity: null,
  }
}

/** The probabilistic inputs a draft starts with (off, "from the data"). */
export function defaultProbabilistic(): DraftProbabilistic {
  const D = RUN_PROBABILISTIC_DEFAULTS
  return { on: false, realizations: D.realizations, seed: D.seed, fromData: true, ccE0Correlation: D.ccE0Correlation, limit: null, layers: {} }
}

/** A stratum's entered variations with one variable set (or left out with null); empty strata are dropped. */
export function withVariation(layers: Record<string, RunStratumVariation>, code: string, variable: RunScatterVariable, v: RunVariation | null): Record<string, RunStratumVariation> {
  const stratum: RunStratumVariation = { ...(layers[code] ?? {}) }
  if (v) stratum[variable] = { cov: v.cov, ...(v.correlationLength === undefined ? {} : { correlationLength: v.correlationLength }) }
  else delete stratum[variable]
  const out = { ...layers }
  if (Object.keys(stratum).length) out[code] = stratum
  else delete out[code]
  return out
}

/** The probabilistic inputs as the request sends them (SI), or nothing when they are off. */
export function requestProbabilisticOf(p: DraftProbabilistic) {
  if (!p.on) return undefined
  const layers: Record<string, RunStratumVariation> = {}
  for (const [code, s] of Object.entries(p.layers)) {
    const entry: RunStratumVariation = {}
    for (const v of RUN_SCATTER_VARIABLES) {
      const e = s[v]
      if (e) entry[v] = { cov: e.cov, ...(e.correlationLength === undefined ? {} : { correlationLength: e.correlationLength }) }
    }
    if (Object.keys(entry).length) layers[code] = entry
  }
  return {
    realizations: p.realizations,
    seed: p.seed,
    fromData: p.fromData,
    layers,
    ccE0Correlation: p.ccE0Correlation,
    ...(p.limit === null ? {} : { limit: p.limit }),
  }
}

/** A run's probabilistic inputs as the draft's (on), or the defaults (off) for a run without. */
export function probabilisticFromRun(p: RunOptions['probabilistic']): DraftProbabilistic {
  const base = defaultProbabilistic()
  if (!p) return base
  return {
    on: true,
    realizations: p.realizations ?? base.realizations,
    seed: p.seed ?? base.seed,
    fromData: p.fromData ?? false,
    ccE0Correlation: p.ccE0Correlation ?? base.ccE0Correlation,
    limit: p.limit ?? null,
    layers: structuredClone(p.layers ?? {}),
  }
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
    drains: defaultDrains(),
    probabilistic: defaultProbabilistic(),
  }
}

/** A load of `type` centred at (x, y) with the default sizes. */
export function newLoad(id: string, type: DraftLoadType, at: { x: number, y: number }, label = ''): DraftLoad {
  return { id, type, label, x: round(at.x), y: round(at.y), ...DEFAULT_LOAD, stages: instantStages() }
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

/** The load as the request sends it (SI); the default schedule (all at once at time zero) is left out. */
export function requestLoadOf(l: DraftLoad): RunLoadInput {
  const label = l.label.trim() ? { label: l.label.trim() } : {}
  const loading = l.loading === 'fill' ? { fill: { thickness: l.fillThickness, unitWeight: l.fillUnitWeight } } : { pressure: l.pressure }
  const schedule = {
    ...(isInstant(l.stages) ? {} : { stages: l.stages.map(st => ({ start: st.start, duration: st.duration, fraction: st.fraction })) }),
    ...(l.removeAt === null ? {} : { removeAt: l.removeAt }),
  }
  switch (l.type) {
    case 'uniform': return { type: 'uniform', ...label, ...loading, ...schedule }
    case 'rectangle': return { type: 'rectangle', ...label, x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, ...loading, ...schedule }
    case 'circle': return { type: 'circle', ...label, x: l.x, y: l.y, radius: l.radius, ...loading, ...schedule }
    case 'embankment': return { type: 'embankment', ...label, x: l.x, y: l.y, crestWidth: l.crestWidth, crestLength: l.crestLength, height: l.height, sideSlope: l.sideSlope, unitWeight: l.unitWeight, rotation: l.rotation, ...schedule }
  }
}

/** The drains as the request sends them (SI), or nothing when they are off. */
export function requestDrainsOf(d: DraftDrains) {
  if (!d.on) return undefined
  return {
    strata: [...d.strata],
    pattern: d.pattern,
    spacing: d.spacing,
    diameter: d.diameter,
    smearRatio: d.smearRatio,
    permeabilityRatio: d.permeabilityRatio,
    chRatio: d.chRatio,
    ...(d.dischargeCapacity === null ? {} : { dischargeCapacity: d.dischargeCapacity }),
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
    options: {
      ...d.options,
      years: [...d.options.years],
      ...(d.drains.on ? { drains: requestDrainsOf(d.drains) } : {}),
      ...(d.probabilistic.on ? { probabilistic: requestProbabilisticOf(d.probabilistic) } : {}),
    },
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
    const base: DraftLoad = {
      id: ids(), type: l.type, label: l.label ?? '', x: 0, y: 0, ...DEFAULT_LOAD,
      stages: l.stages?.length ? l.stages.map(st => ({ start: st.start, duration: st.duration, fraction: st.fraction })) : instantStages(),
      removeAt: l.removeAt ?? null,
    }
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
    options: { ...RUN_OPTION_DEFAULTS, ...withoutDrains(run.options), years: [...(run.options.years ?? RUN_OPTION_DEFAULTS.years)] },
    drains: drainsFromRun(run.options.drains),
    probabilistic: probabilisticFromRun(run.options.probabilistic),
  }
}

function withoutDrains(o: RunOptions): DraftOptions {
  const { drains: _drains, probabilistic: _probabilistic, ...rest } = o
  return rest
}

/** A run's drains as the draft's (on), or the defaults (off) for a run without. */
export function drainsFromRun(d: RunOptions['drains']): DraftDrains {
  const base = defaultDrains()
  if (!d) return base
  return {
    on: true,
    strata: [...d.strata],
    pattern: d.pattern,
    spacing: d.spacing,
    diameter: d.diameter ?? base.diameter,
    smearRatio: d.smearRatio ?? base.smearRatio,
    permeabilityRatio: d.permeabilityRatio ?? base.permeabilityRatio,
    chRatio: d.chRatio ?? base.chRatio,
    dischargeCapacity: d.dischargeCapacity ?? null,
  }
}

/**
 * A draft kept by an earlier Pastload (a tab's session copy) brought up to today's fields: loads
 * without a schedule are placed at once, a draft without drains or probabilistic inputs has them off.
 */
export function normalizeDraft(d: Partial<SettlementDraft>): SettlementDraft {
  const empty = emptyDraft()
  const { drains: _drains, probabilistic: _probabilistic, ...options } = { ...empty.options, ...(d.options ?? {}) } as RunOptions
  return {
    ...empty,
    ...d,
    loads: (d.loads ?? []).map(l => ({
      ...l,
      stages: Array.isArray(l.stages) && l.stages.length ? l.stages : instantStages(),
      removeAt: typeof l.removeAt === 'number' ? l.removeAt : null,
    })),
    options,
    drains: { ...empty.drains, ...(d.drains ?? {}) },
    probabilistic: { ...empty.probabilistic, ...(d.probabilistic ?? {}), layers: { ...(d.probabilistic?.layers ?? {}) } },
  }
}

// Construction schedules (years; the editor shows months)

export const MONTHS_PER_YEAR = 12

/** True for the default schedule: one stage, the whole load at time zero, at once. */
export function isInstant(stages: readonly DraftStage[]): boolean {
  const [only] = stages
  return stages.length === 1 && !!only && only.start === 0 && only.duration === 0 && only.fraction === 1
}

/** The stages' shares added up (1 when the whole load is placed). */
export function stagesTotal(stages: readonly DraftStage[]): number {
  return stages.reduce((a, st) => a + st.fraction, 0)
}

/** True when the shares add up to the whole load (within the tolerance the server allows). */
export function stagesComplete(stages: readonly DraftStage[]): boolean {
  return Math.abs(stagesTotal(stages) - 1) <= RUN_LIMITS.fractionTolerance
}

/** When the last stage ends, years. */
export function scheduleEnd(stages: readonly DraftStage[]): number {
  return stages.reduce((a, st) => Math.max(a, st.start + st.duration), 0)
}

/**
 * One more stage after the last: a month after the last ends, lasting as long as it (at least a
 * month), taking half of its share, so the shares still add up as before.
 */
export function addStage(stages: readonly DraftStage[]): DraftStage[] {
  const last = stages[stages.length - 1]
  if (!last) return instantStages()
  const month = 1 / MONTHS_PER_YEAR
  const half = last.fraction / 2
  return [
    ...stages.slice(0, -1),
    { ...last, fraction: half },
    { start: last.start + last.duration + month, duration: Math.max(last.duration, month), fraction: last.fraction - half },
  ]
}

/** The schedule without stage `i`; the last stage's removal gives back the default. */
export function removeStage(stages: readonly DraftStage[], i: number): DraftStage[] {
  const rest = stages.filter((_st, k) => k !== i)
  return rest.length ? rest : instantStages()
}

/** The schedule with stage `i` changed. */
export function updateStage(stages: readonly DraftStage[], i: number, patch: Partial<DraftStage>): DraftStage[] {
  return stages.map((st, k) => (k === i ? { ...st, ...patch } : st))
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

// Drain sizes at the edges: a drain's diameter in mm (SI) or inches (US), its discharge capacity in m³ or ft³ a year.

/** How many display units of `system` one metre of drain diameter is (1000 mm; 39.37 in). */
export function drainDiameterFactor(system: UnitSystem): number {
  return system === 'US' ? convert(1, 'length', 'SI', 'US') * 12 : 1000
}
export function drainDiameterUnit(system: UnitSystem): string {
  return system === 'US' ? 'in' : 'mm'
}
/** How many display units of `system` one m³/year of discharge capacity is. */
export function dischargeFactor(system: UnitSystem): number {
  return system === 'US' ? convert(1, 'length', 'SI', 'US') ** 3 : 1
}
export function dischargeUnit(system: UnitSystem): string {
  return system === 'US' ? 'ft³/yr' : 'm³/yr'
}
