import { convert, unitLabel, type Quantity, type UnitSystem } from '#shared/units'

/**
 * The project's unit system at the edges of the stress workspace: values stay SI
 * in the draft and the engine; labels, axes, read-outs and typed inputs convert
 * here and nowhere else.
 */
export function useModelUnits(system: MaybeRefOrGetter<UnitSystem | undefined>) {
  const sys = computed((): UnitSystem => toValue(system) ?? 'SI')
  const label = (q: Quantity) => unitLabel(q, sys.value)
  /** SI → display. */
  const show = (v: number, q: Quantity) => convert(v, q, 'SI', sys.value)
  /** Display → SI. */
  const read = (v: number, q: Quantity) => convert(v, q, sys.value, 'SI')
  /** How many display units one SI unit is (for axes drawn on SI scales). */
  const factor = (q: Quantity) => convert(1, q, 'SI', sys.value)
  const DIGITS: Record<Quantity, number> = { length: 2, stress: 1, unitWeight: 1, coefficientOfConsolidation: 2 }
  function format(v: number | null | undefined, q: Quantity, digits?: number): string {
    if (v === null || v === undefined || !Number.isFinite(v)) return '—'
    const d = digits ?? (sys.value === 'US' && q === 'stress' ? 0 : DIGITS[q])
    return `${show(v, q).toFixed(d)} ${label(q)}`
  }
  /** A display value for an input field, rounded so the field is readable. */
  function input(v: number | null | undefined, q: Quantity, digits = 3): string {
    if (v === null || v === undefined || !Number.isFinite(v)) return ''
    return String(Math.round(show(v, q) * 10 ** digits) / 10 ** digits)
  }
  return { system: sys, label, show, read, factor, format, input }
}

export type ModelUnits = ReturnType<typeof useModelUnits>
