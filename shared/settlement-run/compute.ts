import { RESULT_CAUTION } from '../caution'
import { planStressIncrease, loadFootprint, type PlanLoad } from '../geotech/plan-loads'
import { computeSettlement } from '../geotech/settlement'
import { createStressEvaluator } from '../geotech/stress'
import type { RunGrid, RunLoad, RunOptions, RunPoint } from '../schemas/settlement-runs'
import { MAX_GRID_POINTS, SITE_EXTENT } from '../schemas/settlement-runs'
import type { SiteModelDefinition } from '../site-model/definition'
import { toSettlementLayers, toStressInput } from '../site-model/convert'
import type { RunGridResult, RunPointDetail, RunPointResult, RunResults } from '../types/settlement-runs'

/**
 * A settlement run computed from its inputs: pure, no I/O (the worker writes the result).
 * FIRST CUT (contract stub): the signatures are the contract; the body is to be completed
 * (drainage groups, time curves, differential settlement, speed) under issue 13.
 */
export interface RunComputeInput {
  definition: SiteModelDefinition
  loads: readonly RunLoad[]
  points: readonly RunPoint[]
  grid: RunGrid | null
  options: RunOptions
}

export interface RunComputeOutput {
  results: RunResults
  /** One per named point, in order: the sublayer tables. */
  details: RunPointDetail[]
}

/** A refusal of a well-formed run, for a 422: plain words naming the stratum, depth or load. */
export interface RunInputProblem { code: string, message: string, path?: (string | number)[] }

/** A load with its pressure resolved (a fill's thickness × unit weight). */
export function resolveLoads(loads: readonly RunLoad[]): PlanLoad[] {
  return loads.map((l) => {
    if (l.type === 'embankment') return { ...l }
    const pressure = l.pressure ?? (l.fill!.thickness * l.fill!.unitWeight)
    if (l.type === 'uniform') return { type: 'uniform', pressure }
    if (l.type === 'rectangle') return { type: 'rectangle', x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, pressure }
    return { type: 'circle', x: l.x, y: l.y, radius: l.radius, pressure }
  })
}

/** The grid's columns and rows: the loads' footprints and the margin, at the spacing. */
export function gridAxes(loads: readonly PlanLoad[], grid: RunGrid): { xs: number[], ys: number[] } | null {
  const pts = loads.flatMap(l => loadFootprint(l) ?? [])
  if (pts.length === 0) return null
  const x0 = Math.min(...pts.map(p => p.x)) - grid.margin
  const x1 = Math.max(...pts.map(p => p.x)) + grid.margin
  const y0 = Math.min(...pts.map(p => p.y)) - grid.margin
  const y1 = Math.max(...pts.map(p => p.y)) + grid.margin
  const axis = (a: number, b: number) => {
    const n = Math.floor((b - a) / grid.spacing + 1e-9)
    return Array.from({ length: n + 1 }, (_, i) => a + i * grid.spacing)
  }
  return { xs: axis(x0, x1), ys: axis(y0, y1) }
}

/** Why a well-formed run cannot be computed on this site (422), or null. */
export function checkRunInput(input: RunComputeInput): RunInputProblem | null {
  const resolved = resolveLoads(input.loads)
  for (const [i, l] of resolved.entries()) {
    for (const p of loadFootprint(l) ?? []) {
      if (Math.abs(p.x) > SITE_EXTENT || Math.abs(p.y) > SITE_EXTENT) {
        return { code: 'load-off-site', message: `Load ${i + 1} reaches (${p.x.toFixed(1)}, ${p.y.toFixed(1)}) m, beyond ±${SITE_EXTENT} m of the site origin.`, path: ['loads', i] }
      }
    }
  }
  if (input.grid) {
    const axes = gridAxes(resolved, input.grid)
    if (!axes) return { code: 'grid-without-footprint', message: 'A grid needs at least one load with a footprint (a rectangle, circle or embankment).', path: ['grid'] }
    const n = axes.xs.length * axes.ys.length
    if (n > MAX_GRID_POINTS) return { code: 'grid-too-large', message: `The grid would have ${n} points; the limit is ${MAX_GRID_POINTS}. Use a larger spacing or a smaller margin.`, path: ['grid', 'spacing'] }
  }
  return null
}

/** Computes the run; `onProgress(fraction)` is called as points are done. */
export function computeRun(input: RunComputeInput, onProgress?: (fraction: number) => void): RunComputeOutput {
  const started = Date.now()
  const loads = resolveLoads(input.loads)
  const evaluate = createStressEvaluator(toStressInput(input.definition))
  const layers = toSettlementLayers(input.definition, z => evaluate(z).effectiveStress, { maxThickness: input.options.maxSublayerThickness })
  const base = { ...toStressInput(input.definition), layers, load: { type: 'uniform' as const, pressure: 0 }, sublayers: { maxThickness: input.options.maxSublayerThickness } }
  let sublayers = 0
  const details: RunPointDetail[] = input.points.map((p, index) => {
    const r = computeSettlement({ ...base, stressIncrease: planStressIncrease(loads, p.x, p.y), time: { years: input.options.years }, designLife: input.options.designLife })
    sublayers += r.sublayers.length
    const point: RunPointResult = {
      label: p.label, x: p.x, y: p.y, settlement: r.settlement, layers: r.layers,
      t50: r.times?.t50 ?? null, t90: r.times?.t90 ?? null, time: r.time ?? [],
      secondary: r.secondary?.settlement ?? null, curve: null, convergence: r.convergence,
      surfaceStressIncrease: planStressIncrease(loads, p.x, p.y)(0), warnings: r.warnings,
    }
    return { ...point, index, sublayers: r.sublayers }
  })
  let grid: RunGridResult | undefined
  if (input.grid) {
    const axes = gridAxes(loads, input.grid)!
    const settlement = axes.ys.map((y, j) => {
      const row = axes.xs.map(x => computeSettlement({ ...base, stressIncrease: planStressIncrease(loads, x, y) }, { convergence: false }).settlement)
      onProgress?.((j + 1) / axes.ys.length)
      return row
    })
    grid = { ...axes, settlement, maxDifferential: 0, maxAngularDistortion: 0, worstDifferential: null, worstAngularDistortion: null, angularDistortionLimit: input.options.angularDistortionLimit, exceedsLimit: false }
  }
  const points = details.map(({ index: _i, sublayers: _s, ...rest }) => rest)
  const best = points.reduce<{ settlement: number, x: number, y: number, label: string | null }>((m, p) => (p.settlement > m.settlement ? { settlement: p.settlement, x: p.x, y: p.y, label: p.label } : m), { settlement: -Infinity, x: 0, y: 0, label: null })
  if (grid) grid.settlement.forEach((row, j) => row.forEach((s, i) => { if (s > best.settlement) Object.assign(best, { settlement: s, x: grid.xs[i], y: grid.ys[j], label: null }) }))
  onProgress?.(1)
  return { results: { points, grid, maximum: best, warnings: [], caution: RESULT_CAUTION, stats: { computeMs: Date.now() - started, sublayers } }, details }
}
