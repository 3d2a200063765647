/**
 * A number as `toLocaleString('en-GB')` writes it (digits grouped by commas, at most three decimals),
 * written directly when the number's own shortest form already has three decimals or fewer: the
 * browser's first `toLocaleString` loads its number-format data, about 30 ms of main thread while a
 * page hydrates. Anything else (more decimals, exponents, NaN, ±∞) goes through `toLocaleString`.
 * Checked against it in tests/unit/app/number-text.test.ts.
 */
const PLAIN = /^(-?)(\d+)(\.\d{1,3})?$/

export function groupedNumber(v: number): string {
  const m = PLAIN.exec(String(v))
  if (!m) return v.toLocaleString('en-GB')
  const [, sign, whole, decimals] = m
  // -0 prints as "-0" through toLocaleString; String(-0) is "0".
  const negativeZero = Object.is(v, -0) ? '-' : ''
  return `${negativeZero}${sign}${whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}${decimals ?? ''}`
}
