import { FOOT_M, type UnitSystem } from '../units'
import { groupThousands } from '../text/count'

/**
 * Settlement at the edges: the engine gives metres; pages show millimetres (SI) or inches (US,
 * 1 in = 0.0254 m exactly: 1 ft = 0.3048 m / 12, NIST SP 811, 2008, App. B.8).
 */
const INCH_M = FOOT_M / 12

/** Display units per metre of settlement. */
export function settlementFactor(system: UnitSystem): number {
  return system === 'US' ? 1 / INCH_M : 1000
}

export function settlementUnitLabel(system: UnitSystem): string {
  return system === 'US' ? 'in' : 'mm'
}

/** A settlement (m) in display units, as a number. */
export function settlementShow(v: number, system: UnitSystem): number {
  return v * settlementFactor(system)
}

/** A settlement (m) as text with its unit: 1 decimal in mm, 2 in inches; '—' for none. */
export function formatSettlement(v: number | null | undefined, system: UnitSystem, withUnit = true): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  const d = system === 'US' ? 2 : 1
  const shown = settlementShow(v, system).toFixed(d)
  const text = shown === `-${(0).toFixed(d)}` ? (0).toFixed(d) : shown
  return withUnit ? `${text} ${settlementUnitLabel(system)}` : text
}

/** A duration in years as short text: months below a year, else years with sensible digits. */
export function formatYears(v: number | null | undefined): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  if (v < 1) {
    const months = v * 12
    return months < 1 ? `${Math.max(1, Math.round(v * 365.25))} days` : `${months.toFixed(months < 10 ? 1 : 0)} months`
  }
  return `${v.toFixed(v < 10 ? 1 : 0)} years`
}

/** An angular distortion (a ratio) as 1/n, rounded to a readable n. */
export function formatDistortion(v: number | null | undefined): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  if (v <= 0) return '0'
  const n = 1 / v
  const round = n >= 1000 ? Math.round(n / 10) * 10 : Math.round(n)
  return `1/${groupThousands(round, ',')}`
}

/** A plan position (m) as "E x, N y" in the project's length unit. */
export function formatPlanAt(x: number, y: number, system: UnitSystem): string {
  const f = system === 'US' ? 1 / FOOT_M : 1
  const u = system === 'US' ? 'ft' : 'm'
  return `E ${(x * f).toFixed(1)}, N ${(y * f).toFixed(1)} ${u}`
}
