import { RESULT_CAUTION } from '../caution'
import { GeotechError } from '../geotech/errors'
import { planStressIncrease, loadFootprint, type PlanLoad } from '../geotech/plan-loads'
import { computeSettlement, type SettlementLayer } from '../geotech/settlement'
import { createStressEvaluator } from '../geotech/stress'
import type { RunGrid, RunLoad, RunOptions, RunPoint } from '../schemas/settlement-runs'
import { MAX_GRID_POINTS, RUN_LIMITS, SITE_EXTENT } from '../schemas/settlement-runs'
import { influenceDiameter } from '../geotech/radial-consolidation'
import { stratumBounds, type SiteModelDefinition } from '../site-model/definition'
import { ModelIncompleteError, toSettlementLayers, toStressInput } from '../site-model/convert'
import type { RunGridResult, RunPointDetail, RunPointResult, RunResults } from '../types/settlement-runs'
import { gridAxes, gridDistortion } from './grid'
import { buildSettlementKernel, kernelSettlement } from './kernel'
import { timeCurve, type CurveLayer } from './time-rate'
import { computeTreatedPoint, isTreated, permanentLoads, treatmentProfile, type TreatmentProfile } from './treatment'

export { gridAxes, gridDistortion } from './grid'
export { buildSettlementKernel, kernelSettlement } from './kernel'
export { timeCurve, logSpace } from './time-rate'

/**
 * A settlement run computed from its inputs: pure, no I/O (the worker writes the result).
 * Named points get the engine's full answer (sublayer table, convergence report, time rate,
 * secondary compression, a time curve); grid points the lean kernel (totals only).
 */
export interface RunComputeInput {
  definition: SiteModelDefinition
  loads: readonly RunLoad[]
  points: readonly RunPoint[]
  grid: RunGrid | null
  options: RunOptions
  /** The site-model version number, named in refusals ("… in version 3."). */
  version?: number
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

const PARAMETER_WORDS = { cc: 'compression index (Cc)', cr: 'recompression index (Cr)', e0: 'initial void ratio (e0)' } as const

/** Every compressible stratum's mid-depths at the run's sublayering (where the engine takes σ'v0). */
function sublayerDepths(def: SiteModelDefinition, maxThickness: number): { stratum: number, depth: number }[] {
  const out: { stratum: number, depth: number }[] = []
  stratumBounds(def).forEach(({ top, bottom }, i) => {
    if (!def.strata[i]!.compressible || !(bottom > top)) return
    const n = Math.max(1, Math.ceil((bottom - top) / maxThickness - 1e-9))
    const h = (bottom - top) / n
    for (let k = 0; k < n; k++) out.push({ stratum: i, depth: top + (k + 0.5) * h })
  })
  return out
}

/** Any load with a pressure that is not zero: without one no stratum settles and no parameter is needed. */
function loadsSettle(loads: readonly PlanLoad[]): boolean {
  return loads.some(l => (l.type === 'embankment' ? l.height * l.unitWeight : l.pressure) !== 0)
}

/** A time in a message: years as the API takes them, and months as the editor shows them ("0.833 years (10 months)"). */
function timeWords(years: number): string {
  return `${Number(years.toPrecision(3))} years (${Number((years * 12).toPrecision(3))} months)`
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
  for (const [i, p] of input.points.entries()) {
    if (Math.abs(p.x) > SITE_EXTENT || Math.abs(p.y) > SITE_EXTENT) {
      return { code: 'point-off-site', message: `Point "${p.label}" at (${p.x.toFixed(1)}, ${p.y.toFixed(1)}) m lies beyond ±${SITE_EXTENT} m of the site origin.`, path: ['points', i] }
    }
  }
  if (input.grid) {
    const axes = gridAxes(resolved, input.grid)
    if (!axes) return { code: 'grid-without-footprint', message: 'A grid needs at least one load with a footprint (a rectangle, circle or embankment).', path: ['grid'] }
    const n = axes.xs.length * axes.ys.length
    if (n > MAX_GRID_POINTS) return { code: 'grid-too-large', message: `The grid would have ${n} points; the limit is ${MAX_GRID_POINTS}. Use a larger spacing or a smaller margin.`, path: ['grid', 'spacing'] }
  }
  const def = input.definition
  const inVersion = input.version !== undefined ? `in version ${input.version}` : 'in this version'
  const treatment = checkTreatment(input, inVersion)
  if (treatment) return treatment
  // Compressibility: every compressible stratum settles under a load that is not zero
  // (Δσ from a surface load is positive at every depth under and beside it).
  if (loadsSettle(resolved)) {
    for (const s of def.strata) {
      if (!s.compressible) continue
      const c = s.compressibility
      if (!c) return { code: 'compressibility-missing', message: `Stratum ${s.code} (${s.name}) is compressible but has no compressibility (Cc, Cr, e0) ${inVersion}.`, path: ['model'] }
      for (const key of ['cc', 'cr', 'e0'] as const) {
        if (c[key] === undefined || c[key] === null) return { code: 'compressibility-missing', message: `Stratum ${s.code} has no ${PARAMETER_WORDS[key]} ${inVersion}.`, path: ['model'] }
      }
      if (!s.trend) return { code: 'preconsolidation-missing', message: `Stratum ${s.code} has no σ'p trend ${inVersion}.`, path: ['model'] }
    }
  }
  // σ'v0 at every mid-depth the engine will use.
  let evaluate: ReturnType<typeof createStressEvaluator>
  try {
    evaluate = createStressEvaluator(toStressInput(def))
  }
  catch (e) {
    if (e instanceof GeotechError && e.code === 'effective-stress-not-positive' && e.depth !== undefined) {
      // The stress model finds the first depth where σ'v0 reaches 0 (its breakpoints bound it).
      const bounds = stratumBounds(def)
      const i = Math.max(0, bounds.findIndex(b => e.depth! >= b.top && e.depth! <= b.bottom))
      const s = def.strata[i]!
      return { code: e.code, message: `σ'v0 falls to 0 kPa at ${Number(e.depth.toFixed(2))} m in stratum ${s.code} (${s.name}) ${inVersion}: the water pressures exceed the weight of the ground (uplift). Check the groundwater.`, path: ['model'] }
    }
    if (e instanceof GeotechError) return { code: e.code, message: `The ground model ${inVersion} cannot be used: ${e.message}`, path: ['model'] }
    throw e
  }
  for (const { stratum, depth } of sublayerDepths(def, input.options.maxSublayerThickness)) {
    const s0 = evaluate(depth).effectiveStress
    if (!(s0 > 0)) {
      const s = def.strata[stratum]!
      return { code: 'effective-stress-not-positive', message: `σ'v0 is ${s0.toFixed(1)} kPa at ${Number(depth.toFixed(2))} m in stratum ${s.code} (${s.name}) ${inVersion}: the water pressures exceed the weight of the ground (uplift). Check the groundwater.`, path: ['model'] }
    }
  }
  try {
    toSettlementLayers(def, z => evaluate(z).effectiveStress, { maxThickness: input.options.maxSublayerThickness })
  }
  catch (e) {
    if (e instanceof ModelIncompleteError) return { code: 'model-incomplete', message: `${e.message.replace(/\.$/, '')} (${inVersion}).`, path: ['model'] }
    throw e
  }
  return null
}

/** The schedule and drain checks of a well-formed run (422): plain reasons. */
function checkTreatment(input: RunComputeInput, inVersion: string): RunInputProblem | null {
  for (const [i, l] of input.loads.entries()) {
    const stages = l.stages ?? []
    if (stages.length > 0) {
      const sum = stages.reduce((a, st) => a + st.fraction, 0)
      if (Math.abs(sum - 1) > RUN_LIMITS.fractionTolerance) {
        return { code: 'stage-fractions', message: `The stages of load ${i + 1} add ${Number((sum * 100).toFixed(2))} % of the load; their fractions must sum to 100 %.`, path: ['loads', i, 'stages'] }
      }
    }
    if (l.removeAt !== undefined) {
      const late = stages.findIndex(st => st.start + st.duration > l.removeAt!)
      if (late >= 0) {
        const st = stages[late]!
        const what = st.start >= l.removeAt ? `starts at ${timeWords(st.start)}` : `runs until ${timeWords(st.start + st.duration)}`
        return { code: 'stage-after-removal', message: `Stage ${late + 1} of load ${i + 1} ${what}, after the load is removed at ${timeWords(l.removeAt)}.`, path: ['loads', i, 'stages', late, 'start'] }
      }
    }
  }
  const drains = input.options.drains
  const def = input.definition
  if (drains) {
    if (!(drains.spacing > drains.diameter)) {
      return { code: 'drain-spacing-too-small', message: `The drain spacing (${drains.spacing} m) must be larger than the drain diameter (${drains.diameter} m).`, path: ['options', 'drains', 'spacing'] }
    }
    const de = influenceDiameter(drains.pattern, drains.spacing)
    if (!(de / drains.diameter > drains.smearRatio)) {
      return { code: 'drain-smear-overlap', message: `At ${drains.spacing} m the smear zones around the drains (${drains.smearRatio} × ${drains.diameter} m across) would fill the soil between them; space the drains further apart.`, path: ['options', 'drains', 'spacing'] }
    }
    for (const [k, code] of drains.strata.entries()) {
      if (!def.strata.some(s => s.code === code)) {
        return { code: 'drain-stratum-unknown', message: `The drains pass through stratum ${code}, which is not ${inVersion}. Strata there: ${def.strata.map(s => s.code).join(', ')}.`, path: ['options', 'drains', 'strata', k] }
      }
    }
  }
  if (isTreated(input.loads, drains)) {
    for (const s of def.strata) {
      const c = s.compressibility
      if (s.compressible && c && (c.cv === undefined || c.cv === null) && !c.trends?.cv) {
        return { code: 'cv-missing', message: `Stratum ${s.code} (${s.name}) has no cv ${inVersion}: a construction schedule, a removal or drains need the time rate of every compressible stratum.`, path: ['model'] }
      }
    }
  }
  return null
}

/** "Halving every sublayer changes the total by 0.012 %": the convergence report in words. */
export function describeConvergence(c: { halved: number, relativeChange: number } | null): string | null {
  if (!c) return null
  return `Halving every sublayer changes the total by ${Number((c.relativeChange * 100).toPrecision(2))} %.`
}

/** The run's settlement layers, each with the stratum it came from. */
export interface RunProfile {
  layers: SettlementLayer[]
  /** Index into definition.strata per settlement layer. */
  stratumOf: number[]
  base: { layers: SettlementLayer[], sublayers: { maxThickness: number } } & ReturnType<typeof toStressInput>
  timed: boolean
  hasCalpha: boolean
}

/** The run's settlement profile (layers, their strata, the stress input): the same for every point. */
export function runProfile(input: RunComputeInput): RunProfile {
  const def = input.definition
  const stressInput = toStressInput(def)
  const evaluate = createStressEvaluator(stressInput)
  const layers = toSettlementLayers(def, z => evaluate(z).effectiveStress, { maxThickness: input.options.maxSublayerThickness })
  const bounds = stratumBounds(def)
  let top = 0
  const stratumOf = layers.map((l) => {
    const mid = top + l.thickness / 2
    top += l.thickness
    const i = bounds.findIndex(b => mid >= b.top && mid <= b.bottom)
    return i < 0 ? bounds.length - 1 : i
  })
  const compressible = layers.filter(l => l.compressible)
  return {
    layers,
    stratumOf,
    base: { ...stressInput, layers, sublayers: { maxThickness: input.options.maxSublayerThickness } },
    timed: compressible.length > 0 && compressible.every(l => l.cv !== undefined),
    hasCalpha: compressible.some(l => l.calpha !== undefined),
  }
}

/** Computes one named point with the engine's full answer. */
function computePoint(input: RunComputeInput, profile: RunProfile, loads: PlanLoad[], p: RunPoint, index: number, treatment: TreatmentProfile | null = null): RunPointDetail {
  if (treatment) return computeTreatedRunPoint(input, profile, loads, p, index, treatment)
  const def = input.definition
  const { options } = input
  const loadAt = planStressIncrease(loads, p.x, p.y)
  const r = computeSettlement({
    ...profile.base,
    load: { type: 'uniform', pressure: 0 },
    stressIncrease: loadAt,
    ...(profile.timed ? { time: { years: options.years } } : {}),
    ...(profile.timed && profile.hasCalpha ? { designLife: options.designLife } : {}),
  })
  const warnings = [...r.warnings]
  if (!profile.timed) warnings.push('A compressible stratum has no cv: no time rate (t50, t90, settlement with time) at this point.')
  // By stratum: the slices of a stratum summed.
  const byStratum = def.strata.map(s => ({ name: s.name, settlement: 0 }))
  r.layers.forEach((l, i) => {
    byStratum[profile.stratumOf[i]!]!.settlement += l.settlement
  })
  let curve = null
  if (profile.timed && r.settlement !== 0) {
    const curveLayers: CurveLayer[] = []
    profile.layers.forEach((l, i) => {
      if (!l.compressible) return
      curveLayers.push({
        stratum: def.strata[profile.stratumOf[i]!]!.name,
        settlement: r.layers[i]!.settlement,
        thickness: l.thickness,
        e0: l.e0!,
        cv: l.cv,
        calpha: l.calpha,
        drainage: l.drainage,
        drainageGroup: l.drainageGroup,
      })
    })
    curve = timeCurve(curveLayers, def.strata.filter(s => s.compressible).map(s => s.name), options.designLife)
  }
  return {
    index,
    label: p.label,
    x: p.x,
    y: p.y,
    settlement: r.settlement,
    layers: byStratum,
    t50: r.times?.t50 ?? null,
    t90: r.times?.t90 ?? null,
    time: r.time ?? [],
    secondary: r.secondary && r.secondary.layers.length > 0 ? r.secondary.settlement : null,
    curve,
    convergence: r.convergence,
    surfaceStressIncrease: loadAt(0),
    warnings,
    sublayers: r.sublayers,
  }
}

/**
 * A named point of a treated run: the sublayer table, convergence and warnings of the loads in
 * place at the end (the engine), the settlement, time rate, curve and secondary compression
 * of the staged engine (`treatment.ts`).
 */
function computeTreatedRunPoint(input: RunComputeInput, profile: RunProfile, loads: PlanLoad[], p: RunPoint, index: number, treatment: TreatmentProfile): RunPointDetail {
  const def = input.definition
  const { options } = input
  const endLoadAt = planStressIncrease(permanentLoads(input.loads, loads), p.x, p.y)
  const r = computeSettlement({ ...profile.base, load: { type: 'uniform', pressure: 0 }, stressIncrease: endLoadAt })
  const t = computeTreatedPoint(def, treatment, input.loads, loads, p.x, p.y, options)
  const warnings = [...r.warnings]
  return {
    index,
    label: p.label,
    x: p.x,
    y: p.y,
    settlement: t.settlement,
    layers: def.strata.map((s, i) => ({ name: s.name, settlement: t.strata[i]! })),
    t50: t.t50,
    t90: t.t90,
    ...(t.t50WithoutDrains !== undefined ? { t50WithoutDrains: t.t50WithoutDrains, t90WithoutDrains: t.t90WithoutDrains ?? null } : {}),
    ...(t.removal ? { rebound: t.removal.rebound, residualAfterRemoval: t.removal.residual, removedAt: t.removal.at } : {}),
    time: t.time,
    secondary: t.secondary,
    curve: t.curve,
    convergence: r.convergence,
    surfaceStressIncrease: planStressIncrease(loads, p.x, p.y)(0),
    warnings,
    sublayers: r.sublayers,
  }
}

/** Computes the run; `onProgress(fraction)` is called after the named points and after every grid row. */
export function computeRun(input: RunComputeInput, onProgress?: (fraction: number) => void): RunComputeOutput {
  const started = Date.now()
  const loads = resolveLoads(input.loads)
  const profile = runProfile(input)
  const axes = input.grid ? gridAxes(loads, input.grid) : null
  // Work units for the progress: a named point costs about three grid points (convergence, rows).
  const pointWork = 3 * input.points.length
  const gridWork = axes ? axes.xs.length * axes.ys.length : 0
  const totalWork = Math.max(1, pointWork + gridWork)

  const treated = isTreated(input.loads, input.options.drains)
  const kernel = treated || axes ? buildSettlementKernel(profile.base) : null
  const treatment = treated ? treatmentProfile(input.definition, profile.layers, profile.stratumOf, kernel!, input.options.drains) : null
  // The grid shows the final primary settlement of the loads in place at the end.
  const gridLoads = treated ? permanentLoads(input.loads, loads) : loads

  let sublayers = 0
  const details = input.points.map((p, index) => {
    const d = computePoint(input, profile, loads, p, index, treatment)
    sublayers += d.sublayers.length
    return d
  })
  if (input.points.length > 0) onProgress?.(pointWork / totalWork)

  let grid: RunGridResult | undefined
  if (axes) {
    const settlement = axes.ys.map((y, j) => {
      const row = axes.xs.map(x => kernelSettlement(kernel!, planStressIncrease(gridLoads, x, y)))
      onProgress?.((pointWork + (j + 1) * axes.xs.length) / totalWork)
      return row
    })
    sublayers += kernel!.count * gridWork
    const limit = input.options.angularDistortionLimit
    const distortion = gridDistortion(axes.xs, axes.ys, settlement)
    grid = { ...axes, settlement, ...distortion, angularDistortionLimit: limit, exceedsLimit: distortion.maxAngularDistortion > limit }
  }

  const points: RunPointResult[] = details.map(({ index: _i, sublayers: _s, ...rest }) => rest)
  const maximum: RunResults['maximum'] = { settlement: -Infinity, x: 0, y: 0, label: null }
  for (const p of points) {
    if (p.settlement > maximum.settlement) Object.assign(maximum, { settlement: p.settlement, x: p.x, y: p.y, label: p.label })
  }
  if (grid) {
    grid.settlement.forEach((row, j) => row.forEach((s, i) => {
      if (s > maximum.settlement) Object.assign(maximum, { settlement: s, x: grid.xs[i], y: grid.ys[j], label: null })
    }))
  }
  if (maximum.settlement === -Infinity) maximum.settlement = 0
  const warnings = [...new Set(points.flatMap(p => p.warnings))]
  if (grid?.exceedsLimit) {
    warnings.push(`The largest angular distortion between neighbouring grid points, 1/${Math.round(1 / grid.maxAngularDistortion)}, exceeds the limit of 1/${Math.round(1 / grid.angularDistortionLimit)}.`)
  }
  if (treated && grid) {
    warnings.push('The grid shows the final primary settlement under the loads in place at the end, without the construction schedule or any surcharge taken off; the named points carry the schedule.')
  }
  onProgress?.(1)
  return {
    results: {
      points,
      grid,
      maximum,
      warnings,
      caution: RESULT_CAUTION,
      stats: { computeMs: Date.now() - started, sublayers },
      ...(treatment?.design ? { drains: treatment.design } : {}),
    },
    details,
  }
}
