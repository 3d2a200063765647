import { create, createUnitDependencies, unitDependencies } from 'mathjs'

/**
 * SI ⇄ US customary conversion at the edges of the product (input forms,
 * imports, reports); the engine itself works in m, kPa, kN/m³ and m²/yr only.
 * Conversion factors come from mathjs unit definitions (ft = 0.3048 m exactly,
 * lbf = 4.4482216152605 N, NIST SP 811), computed once at load time.
 */

export type UnitSystem = 'SI' | 'US'

export type Quantity = 'length' | 'unitWeight' | 'stress' | 'coefficientOfConsolidation'

/** US customary stress can be shown in psf or in tsf (US short tons-force per ft², 2000 lbf/ft²). */
export type UsStressUnit = 'psf' | 'tsf'

export interface ConvertOptions {
  /** US stress unit (default psf). */
  usStress?: UsStressUnit
}

export const QUANTITIES: readonly Quantity[] = ['length', 'unitWeight', 'stress', 'coefficientOfConsolidation']

/** A private mathjs instance so the extra units do not leak into other users of mathjs. */
const math = create({ ...unitDependencies, ...createUnitDependencies })
math.createUnit('psf', '1 lbf/ft^2')
math.createUnit('pcf', '1 lbf/ft^3')
math.createUnit('tsf', '2000 lbf/ft^2')

/** mathjs unit expressions behind each quantity. */
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

/** How many SI units one US unit is, per quantity (mathjs, once). */
const US_TO_SI: Record<Quantity | 'stressTsf', number> = {
  length: math.unit(1, 'ft').toNumber(SI_UNITS.length),
  unitWeight: math.unit(1, 'pcf').toNumber(SI_UNITS.unitWeight),
  stress: math.unit(1, 'psf').toNumber(SI_UNITS.stress),
  stressTsf: math.unit(1, 'tsf').toNumber(SI_UNITS.stress),
  coefficientOfConsolidation: math.unit(1, 'ft^2/year').toNumber(SI_UNITS.coefficientOfConsolidation),
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

/** The mathjs unit expression for a quantity in a system (for display or parsing at the edges). */
export function unitExpression(quantity: Quantity, system: UnitSystem, options: ConvertOptions = {}): string {
  return system === 'SI' ? SI_UNITS[quantity] : usUnit(quantity, options.usStress ?? 'psf')
}
