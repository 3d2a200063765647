import { computed, toValue, type MaybeRefOrGetter } from 'vue'
import { convert, displayDigits, formatQuantity, unitLabel, type Quantity, type UnitSystem, type UsStressUnit } from '#shared/units'
import { boundMessage, type BoundIssue } from '#shared/units/bounds'

/**
 * Numbers with units at the edges of every page: values stay SI in state, the store and the engine;
 * labels, axes, read-outs and typed inputs convert here and nowhere else. `usStress` is the
 * project's choice of psf or tsf for US stresses (psf when not given).
 * Pages of a project use `useProjectUnits()`, which reads both from the project.
 */
export function useModelUnits(system: MaybeRefOrGetter<UnitSystem | undefined>, usStress?: MaybeRefOrGetter<UsStressUnit | null | undefined>) {
  const sys = computed((): UnitSystem => toValue(system) ?? 'SI')
  const stressUnit = computed((): UsStressUnit => toValue(usStress) ?? 'psf')
  const opts = computed(() => ({ usStress: stressUnit.value }))
  const label = (q: Quantity) => unitLabel(q, sys.value, opts.value)
  /** SI → display. */
  const show = (v: number, q: Quantity) => convert(v, q, 'SI', sys.value, opts.value)
  /** Display → SI. */
  const read = (v: number, q: Quantity) => convert(v, q, sys.value, 'SI', opts.value)
  /** How many display units one SI unit is (for axes drawn on SI scales). */
  const factor = (q: Quantity) => convert(1, q, 'SI', sys.value, opts.value)
  /** Decimals for a quantity in the current system (tsf needs two where psf needs none). */
  function digitsFor(q: Quantity): number {
    return displayDigits(q, sys.value, opts.value)
  }
  /** The bare number in display units, rounded ('—' when missing). */
  function number(v: number | null | undefined, q: Quantity, digits?: number): string {
    if (v === null || v === undefined || !Number.isFinite(v)) return '—'
    return show(v, q).toFixed(digits ?? digitsFor(q))
  }
  /** The number with its unit label ("98.43 ft", "1250 psf"; '—' when missing). */
  function format(v: number | null | undefined, q: Quantity, digits?: number): string {
    return formatQuantity(v, q, sys.value, opts.value, digits)
  }
  /** A column heading or field label with its unit: "Depth (ft)". */
  const heading = (text: string, q: Quantity) => `${text} (${label(q)})`
  /** A display value for an input field, rounded so the field is readable. */
  function input(v: number | null | undefined, q: Quantity, digits = 3): string {
    if (v === null || v === undefined || !Number.isFinite(v)) return ''
    return String(Math.round(show(v, q) * 10 ** digits) / 10 ** digits)
  }
  /** A schema's range message for a value typed in this system ("must be at most 1640.41 ft" for the SI check's 500 m). */
  const bound = (issue: BoundIssue, q: Quantity) => boundMessage(issue, q, sys.value, opts.value)
  /** The fields of a form typed in these units, for `fieldIssues`: bounds in the units the person typed. */
  const typed = (quantities: Partial<Record<string, Quantity>>) => ({ quantities, bound })
  return { system: sys, stressUnit, label, show, read, factor, digitsFor, number, format, heading, input, bound, typed }
}

export type ModelUnits = ReturnType<typeof useModelUnits>
