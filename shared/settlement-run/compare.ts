import type { RunLoad, RunOptions } from '../schemas/settlement-runs'
import type { RunResults, SettlementRun } from '../types/settlement-runs'
import { convert, displayDigits, unitLabel, type Quantity, type UnitSystem, type UsStressUnit } from '../units'

/**
 * Two settlement runs side by side: what differs in their inputs, their headline figures with
 * the difference (b − a), and their named points matched by label. Pure; SI values (m, kPa, years) in, words in the
 * project's units.
 */
export interface InputDifference {
  /** What differs, in plain words ('Model version', 'Load 2', 'Design life'). */
  what: string
  a: string
  b: string
}

export interface HeadlineFigure {
  key: 'maxSettlement' | 't90' | 'maxDifferential' | 'maxAngularDistortion' | 'secondary'
  a: number | null
  b: number | null
  /** b − a, or null when either is missing. */
  difference: number | null
}

export interface MatchedPoint {
  label: string
  a: number | null
  b: number | null
  difference: number | null
}

type RunInputs = Pick<SettlementRun, 'model' | 'loads' | 'points' | 'grid' | 'options'>

function fmt(v: number, digits = 2): string {
  return String(Number(v.toFixed(digits)))
}

/** The units the words are written in: the project's (SI when not given; US stresses in psf unless tsf). */
export interface CompareUnits { system: UnitSystem, usStress?: UsStressUnit }
const SI: CompareUnits = { system: 'SI' }

/** A value given in SI, in the display unit, rounded, without its unit. */
function num(v: number, q: Quantity, u: CompareUnits, digits: number): string {
  return fmt(convert(v, q, 'SI', u.system, { usStress: u.usStress }), digits)
}

/** One load in a line of plain words, in the given units (SI by default). */
export function describeLoad(l: RunLoad, u: CompareUnits = SI): string {
  const L = unitLabel('length', u.system)
  const G = unitLabel('unitWeight', u.system)
  const len = (v: number, d = 2) => num(v, 'length', u, d)
  const at = (x: number, y: number) => `(${len(x, 1)}, ${len(y, 1)})`
  const p = 'fill' in l && l.fill ? `fill ${len(l.fill.thickness)} ${L} × ${num(l.fill.unitWeight, 'unitWeight', u, 1)} ${G}` : 'pressure' in l && l.pressure !== undefined ? `${num(l.pressure, 'stress', u, displayDigits('stress', u.system, { usStress: u.usStress }))} ${unitLabel('stress', u.system, { usStress: u.usStress })}` : ''
  switch (l.type) {
    case 'uniform': return `uniform, ${p}`
    case 'rectangle': return `rectangle ${len(l.width)} × ${len(l.length)} ${L} at ${at(l.x, l.y)}${l.rotation ? `, ${fmt(l.rotation, 1)}°` : ''}, ${p}`
    case 'circle': return `circle r ${len(l.radius)} ${L} at ${at(l.x, l.y)}, ${p}`
    case 'embankment': return `embankment crest ${len(l.crestWidth)} × ${len(l.crestLength)} ${L} at ${at(l.x, l.y)}, ${len(l.height)} ${L} high, slope ${fmt(l.sideSlope)}:1, ${num(l.unitWeight, 'unitWeight', u, 1)} ${G}${l.rotation ? `, ${fmt(l.rotation, 1)}°` : ''}`
  }
}

function describeOptions(o: RunOptions, u: CompareUnits): [string, string][] {
  return [
    ['Largest sublayer', `${num(o.maxSublayerThickness, 'length', u, 3)} ${unitLabel('length', u.system)}`],
    ['Times of interest', `${o.years.map(y => fmt(y, 3)).join(', ')} years`],
    ['Design life', `${fmt(o.designLife, 1)} years`],
    ['Angular distortion limit', `1/${fmt(1 / o.angularDistortionLimit, 0)}`],
  ]
}

/** What differs between two runs' inputs, in order: version, loads, points, grid, options. */
export function inputDifferences(a: RunInputs, b: RunInputs, u: CompareUnits = SI): InputDifference[] {
  const L = unitLabel('length', u.system)
  const out: InputDifference[] = []
  const ver = (r: RunInputs) => `${r.model.modelName} v${r.model.version}${r.model.status === 'approved' ? ' (approved)' : ' (not approved)'}`
  if (a.model.modelId !== b.model.modelId || a.model.version !== b.model.version || a.model.status !== b.model.status) out.push({ what: 'Model version', a: ver(a), b: ver(b) })
  const n = Math.max(a.loads.length, b.loads.length)
  for (let i = 0; i < n; i++) {
    const loadA = a.loads[i]
    const loadB = b.loads[i]
    const la = loadA ? describeLoad(loadA, u) : '—'
    const lb = loadB ? describeLoad(loadB, u) : '—'
    const label = loadA?.label ?? loadB?.label
    if (la !== lb) out.push({ what: `Load ${i + 1}${label ? ` (${label})` : ''}`, a: la, b: lb })
  }
  const pts = (r: RunInputs) => r.points.map(p => `${p.label} (${num(p.x, 'length', u, 1)}, ${num(p.y, 'length', u, 1)})`).join('; ') || '—'
  if (pts(a) !== pts(b)) out.push({ what: 'Named points', a: pts(a), b: pts(b) })
  const grid = (r: RunInputs) => (r.grid ? `every ${num(r.grid.spacing, 'length', u, 2)} ${L}, ${num(r.grid.margin, 'length', u, 2)} ${L} beyond the loads` : 'none')
  if (grid(a) !== grid(b)) out.push({ what: 'Grid', a: grid(a), b: grid(b) })
  const oa = describeOptions(a.options, u)
  const ob = describeOptions(b.options, u)
  oa.forEach(([what, va], i) => {
    const vb = ob[i]?.[1] ?? '—'
    if (va !== vb) out.push({ what, a: va, b: vb })
  })
  return out
}

function diff(a: number | null, b: number | null): number | null {
  return a === null || b === null ? null : b - a
}

/** The longest t90 over a run's named points, years (null when none has one). */
export function longestT90(results: RunResults | null): number | null {
  const ts = (results?.points ?? []).map(p => p.t90).filter((t): t is number => t !== null)
  return ts.length ? Math.max(...ts) : null
}

/** The largest secondary compression over the design life among the named points, m. */
export function largestSecondary(results: RunResults | null): number | null {
  const s = (results?.points ?? []).map(p => p.secondary).filter((t): t is number => t !== null)
  return s.length ? Math.max(...s) : null
}

/** The headline figures of two finished runs, with b − a. */
export function headlineDifferences(a: RunResults | null, b: RunResults | null): HeadlineFigure[] {
  const fig = (key: HeadlineFigure['key'], f: (r: RunResults) => number | null): HeadlineFigure => {
    const va = a ? f(a) : null
    const vb = b ? f(b) : null
    return { key, a: va, b: vb, difference: diff(va, vb) }
  }
  const finite = (v: number) => (Number.isFinite(v) ? v : null)
  return [
    fig('maxSettlement', r => finite(r.maximum.settlement)),
    fig('t90', r => longestT90(r)),
    fig('secondary', r => largestSecondary(r)),
    fig('maxDifferential', r => r.grid?.maxDifferential ?? null),
    fig('maxAngularDistortion', r => r.grid?.maxAngularDistortion ?? null),
  ]
}

/**
 * The named points of both runs matched by label (labels compared trimmed and case-blind), in the
 * order of run a, then run b's own.
 */
export function matchPoints(a: RunResults | null, b: RunResults | null): MatchedPoint[] {
  const key = (l: string) => l.trim().toLowerCase()
  const byB = new Map((b?.points ?? []).map(p => [key(p.label), p]))
  const seen = new Set<string>()
  const out: MatchedPoint[] = []
  for (const p of a?.points ?? []) {
    const k = key(p.label)
    if (seen.has(k)) continue
    seen.add(k)
    const q = byB.get(k)
    out.push({ label: p.label, a: p.settlement, b: q?.settlement ?? null, difference: diff(p.settlement, q?.settlement ?? null) })
  }
  for (const q of b?.points ?? []) {
    const k = key(q.label)
    if (seen.has(k)) continue
    seen.add(k)
    out.push({ label: q.label, a: null, b: q.settlement, difference: null })
  }
  return out
}
