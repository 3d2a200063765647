/**
 * SI ⇄ US customary conversion at the edges of the product (input forms,
 * imports, reports); the engine itself works in m, kPa, kN/m³ and m²/yr only.
 * Conversion factors are built from exact definitions, so no unit library is
 * shipped to the browser (a unit test checks each factor against mathjs):
 * - international foot: 1 ft = 0.3048 m exactly (NIST SP 811, 2008, App. B.8);
 * - avoirdupois pound: 1 lb = 0.453 592 37 kg exactly (NIST SP 811, 2008, App. B.8);
 * - standard acceleration of gravity: gn = 9.806 65 m/s² exactly (3rd CGPM, 1901;
 *   NIST SP 811, 2008, App. B.8; ISO 80000-3), so 1 lbf = 0.453 592 37 × 9.806 65 N
 *   = 4.448 221 615 260 5 N exactly;
 * - psf = lbf/ft², pcf = lbf/ft³, tsf = 2000 lbf/ft² (US short ton-force per ft²).
 */

export type UnitSystem = 'SI' | 'US'

export type Quantity = 'length' | 'unitWeight' | 'stress' | 'coefficientOfConsolidation'

/** US customary stress can be shown in psf or in tsf (US short tons-force per ft², 2000 lbf/ft²). */
export const US_STRESS_UNITS = ['psf', 'tsf'] as const
export type UsStressUnit = (typeof US_STRESS_UNITS)[number]

export interface ConvertOptions {
  /** US stress unit (default psf). */
  usStress?: UsStressUnit
}

export const QUANTITIES: readonly Quantity[] = ['length', 'unitWeight', 'stress', 'coefficientOfConsolidation']

/** 1 ft in m (exact). */
export const FOOT_M = 0.3048
/** 1 lbf in N (exact: 1 lb = 0.45359237 kg times gn = 9.80665 m/s²). */
export const POUND_FORCE_N = 0.45359237 * 9.80665

/** Unit expressions behind each quantity (mathjs syntax, for display or parsing at the edges). */
const SI_UNITS: Record<Quantity, string> = {
  length: 'm',
  unitWeight: 'kN/m^3',
  stress: 'kPa',
  coefficientOfConsolidation: 'm^2/year',
}

function usUnit(quantity: Quantity, usStress: UsStressUnit): string {
  switch (quantity) {
    case 'length': return 'ft'
    case 'unitWeight': return 'pcf'
    case 'stress': return usStress
    case 'coefficientOfConsolidation': return 'ft^2/year'
  }
}

/** How many SI units (m, kN/m³, kPa, m²/yr) one US unit (ft, pcf, psf or tsf, ft²/yr) is, per quantity. */
export const US_TO_SI: Readonly<Record<Quantity | 'stressTsf', number>> = {
  length: FOOT_M,
  unitWeight: POUND_FORCE_N / FOOT_M ** 3 / 1000,
  stress: POUND_FORCE_N / FOOT_M ** 2 / 1000,
  stressTsf: (2000 * POUND_FORCE_N) / FOOT_M ** 2 / 1000,
  coefficientOfConsolidation: FOOT_M ** 2,
}

/** Display labels per system. */
export const UNIT_LABELS: Record<UnitSystem, Record<Quantity, string>> = {
  SI: { length: 'm', unitWeight: 'kN/m³', stress: 'kPa', coefficientOfConsolidation: 'm²/yr' },
  US: { length: 'ft', unitWeight: 'pcf', stress: 'psf', coefficientOfConsolidation: 'ft²/yr' },
}

/** The label of a quantity in a system, honouring the psf/tsf choice for US stress. */
export function unitLabel(quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}): string {
  if (system === 'US' && quantity === 'stress') return options.usStress ?? 'psf'
  return UNIT_LABELS[system][quantity]
}

function isSystem(value: unknown): value is UnitSystem {
  return value === 'SI' || value === 'US'
}

/** SI units per US unit for a quantity, after checking the arguments. */
function usToSi(quantity: Quantity, from: UnitSystem, to: UnitSystem, options: ConvertOptions): number {
  if (!isSystem(from) || !isSystem(to)) throw new RangeError(`Unknown unit system: ${String(from)} → ${String(to)}.`)
  if (!(QUANTITIES as readonly string[]).includes(quantity)) throw new RangeError(`Unknown quantity: ${String(quantity)}.`)
  const usStress = options.usStress ?? 'psf'
  if (usStress !== 'psf' && usStress !== 'tsf') throw new RangeError(`Unknown US stress unit: ${String(usStress)}.`)
  return quantity === 'stress' && usStress === 'tsf' ? US_TO_SI.stressTsf : US_TO_SI[quantity]
}

/** The factor f with value_to = f · value_from. */
export function conversionFactor(quantity: Quantity, from: UnitSystem, to: UnitSystem, options: ConvertOptions = {}): number {
  const f = usToSi(quantity, from, to, options)
  if (from === to) return 1
  return from === 'US' ? f : 1 / f
}

/** Converts a value of `quantity` from one unit system to the other (identity when they match). */
export function convert(value: number, quantity: Quantity, from: UnitSystem, to: UnitSystem, options: ConvertOptions = {}): number {
  const f = usToSi(quantity, from, to, options)
  if (from === to) return value
  // Divide rather than multiply by 1/f so that a round trip returns the value to within one rounding.
  return from === 'US' ? value * f : value / f
}

/** The unit expression (mathjs syntax) for a quantity in a system (for display or parsing at the edges). */
export function unitExpression(quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}): string {
  return system === 'SI' ? SI_UNITS[quantity] : usUnit(quantity, options.usStress ?? 'psf')
}

/** Decimals a number of each quantity is shown with, per system (US stress: psf whole; tsf to 0.01, see `displayDigits`). */
export const DISPLAY_DIGITS: Record<UnitSystem, Record<Quantity, number>> = {
  SI: { length: 2, stress: 1, unitWeight: 1, coefficientOfConsolidation: 2 },
  US: { length: 2, stress: 0, unitWeight: 1, coefficientOfConsolidation: 2 },
}

/** Decimals for a quantity in a system (a tsf is 2000 psf, so tsf needs two where psf needs none). */
export function displayDigits(quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}): number {
  if (system === 'US' && quantity === 'stress' && options.usStress === 'tsf') return 2
  return DISPLAY_DIGITS[system][quantity]
}

/**
 * The one formatter of a number with its unit, for pages (through `useModelUnits`), files and reports:
 * an SI value shown in the system's unit with its label ("98.43 ft", "1250 psf", "0.63 tsf"); '—' when missing.
 */
export function formatQuantity(value: number | null | undefined, quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}, digits?: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  return `${convert(value, quantity, 'SI', system, options).toFixed(digits ?? displayDigits(quantity, system, options))} ${unitLabel(quantity, system, options)}`
}
