/**
 * Units an AGS4 file may state for the quantities Pastload reads, with the
 * factor to Pastload's internal unit (m, kPa, %, kN/m³, Mg/m³, minutes). A
 * unit outside these tables is reported by the importer, never guessed.
 */

export type Quantity = 'length' | 'stress' | 'percent' | 'unitWeight' | 'density' | 'ratio' | 'count' | 'minutes'

export const INTERNAL_UNITS: Readonly<Record<Quantity, string>> = {
  length: 'm',
  stress: 'kPa',
  percent: '%',
  unitWeight: 'kN/m3',
  density: 'Mg/m3',
  ratio: '',
  count: '',
  minutes: 'min',
}

// Exact conversion factors (kgf/cm² uses standard gravity 9.80665 m/s²; US units by their definitions).
const FACTORS: Readonly<Record<Quantity, Readonly<Record<string, number>>>> = {
  length: { 'm': 1, 'mm': 0.001, 'cm': 0.01, 'km': 1000, 'ft': 0.3048, 'in': 0.0254 },
  stress: { 'kPa': 1, 'kN/m2': 1, 'Pa': 0.001, 'MPa': 1000, 'MN/m2': 1000, 'bar': 100, 'mbar': 0.1, 'kg/cm2': 98.0665, 'psi': 6.894757293168361, 'psf': 0.04788025898033584, 'tsf': 95.76051796067168 },
  percent: { '%': 1 },
  unitWeight: { 'kN/m3': 1, 'pcf': 4.4482216152605 / 0.028316846592 / 1000 },
  density: { 'Mg/m3': 1, 'g/cm3': 1, 't/m3': 1, 'kg/m3': 0.001 },
  ratio: { '': 1, '-': 1 },
  count: { '': 1, '-': 1 },
  minutes: { 'min': 1, 's': 1 / 60, 'hr': 60, 'h': 60 },
}

/** Factor from `unit` to the internal unit of the quantity, or null when Pastload does not read that unit for it. */
export function unitFactor(quantity: Quantity, unit: string): number | null {
  return FACTORS[quantity][unit.trim()] ?? null
}

/** Removes the binary noise a unit factor leaves (0.1 × 3 = 0.30000000000000004) without touching measured digits. */
export function clean(value: number): number {
  return Number(value.toPrecision(12))
}

/** Standard gravity as the domain rules take it: γ = ρ·g with g = 9.81 m/s², so γw = 9.81 kN/m³ for ρw = 1 Mg/m³. */
export const GRAVITY = 9.81
