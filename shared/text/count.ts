/**
 * A whole number with its thousands grouped: "12 345" in messages that quote a limit (as the unit bounds
 * are quoted), "12,345" on the pages (British English, as Intl's en-GB writes it). Written from the digits
 * rather than with Intl.NumberFormat: the first Intl formatter a page creates loads the locale's data
 * (40–150 ms on a phone), which a page opening with a count in it would otherwise pay.
 */
export function groupThousands(n: number, separator: ' ' | ',' = ' '): string {
  return Math.round(n).toString().replace(/\B(?=(\d{3})+(?!\d))/g, separator)
}
