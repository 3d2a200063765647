import type { RunLoad, RunOptions } from '../schemas/settlement-runs'
import type { RunResults, SettlementRun } from '../types/settlement-runs'

/**
 * Two settlement runs side by side: what differs in their inputs, their headline figures with
 * the difference (b − a), and their named points matched by label. Pure; SI values (m, kPa, years).
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

/** One load in a line of plain words (SI). */
export function describeLoad(l: RunLoad): string {
  const p = 'fill' in l && l.fill ? `fill ${fmt(l.fill.thickness)} m × ${fmt(l.fill.unitWeight, 1)} kN/m³` : 'pressure' in l && l.pressure !== undefined ? `${fmt(l.pressure, 1)} kPa` : ''
  switch (l.type) {
    case 'uniform': return `uniform, ${p}`
    case 'rectangle': return `rectangle ${fmt(l.width)} × ${fmt(l.length)} m at (${fmt(l.x, 1)}, ${fmt(l.y, 1)})${l.rotation ? `, ${fmt(l.rotation, 1)}°` : ''}, ${p}`
    case 'circle': return `circle r ${fmt(l.radius)} m at (${fmt(l.x, 1)}, ${fmt(l.y, 1)}), ${p}`
    case 'embankment': return `embankment crest ${fmt(l.crestWidth)} × ${fmt(l.crestLength)} m at (${fmt(l.x, 1)}, ${fmt(l.y, 1)}), ${fmt(l.height)} m high, slope ${fmt(l.sideSlope)}:1, ${fmt(l.unitWeight, 1)} kN/m³${l.rotation ? `, ${fmt(l.rotation, 1)}°` : ''}`
  }
}

function describeOptions(o: RunOptions): [string, string][] {
  return [
    ['Largest sublayer', `${fmt(o.maxSublayerThickness, 3)} m`],
    ['Times of interest', `${o.years.map(y => fmt(y, 3)).join(', ')} years`],
    ['Design life', `${fmt(o.designLife, 1)} years`],
    ['Angular distortion limit', `1/${fmt(1 / o.angularDistortionLimit, 0)}`],
  ]
}

/** What differs between two runs' inputs, in order: version, loads, points, grid, options. */
export function inputDifferences(a: RunInputs, b: RunInputs): InputDifference[] {
  const out: InputDifference[] = []
  const ver = (r: RunInputs) => `${r.model.modelName} v${r.model.version}${r.model.status === 'approved' ? ' (approved)' : ' (not approved)'}`
  if (a.model.modelId !== b.model.modelId || a.model.version !== b.model.version || a.model.status !== b.model.status) out.push({ what: 'Model version', a: ver(a), b: ver(b) })
  const n = Math.max(a.loads.length, b.loads.length)
  for (let i = 0; i < n; i++) {
    const loadA = a.loads[i]
    const loadB = b.loads[i]
    const la = loadA ? describeLoad(loadA) : '—'
    const lb = loadB ? describeLoad(loadB) : '—'
    const label = loadA?.label ?? loadB?.label
    if (la !== lb) out.push({ what: `Load ${i + 1}${label ? ` (${label})` : ''}`, a: la, b: lb })
  }
  const pts = (r: RunInputs) => r.points.map(p => `${p.label} (${fmt(p.x, 1)}, ${fmt(p.y, 1)})`).join('; ') || '—'
  if (pts(a) !== pts(b)) out.push({ what: 'Named points', a: pts(a), b: pts(b) })
  const grid = (r: RunInputs) => (r.grid ? `every ${fmt(r.grid.spacing)} m, ${fmt(r.grid.margin)} m beyond the loads` : 'none')
  if (grid(a) !== grid(b)) out.push({ what: 'Grid', a: grid(a), b: grid(b) })
  const oa = describeOptions(a.options)
  const ob = describeOptions(b.options)
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
