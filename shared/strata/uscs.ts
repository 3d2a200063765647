/**
 * Unified Soil Classification System group symbols (ASTM D2487, D2488), so logs, importers and the
 * demo data agree on what a valid symbol is. Dual symbols are the borderline classes the standard names.
 */

import { USCS_GROUP_SYMBOLS } from '../geotech/plasticity'

// One list of symbols for the whole product: the plasticity module's.
export { USCS_GROUP_SYMBOLS, type UscsGroupSymbol } from '../geotech/plasticity'

const SYMBOL_SET: ReadonlySet<string> = new Set(USCS_GROUP_SYMBOLS)

/** Upper-cases and trims, so "ch " and "CH" read the same; the standard's symbols carry no lower case. */
export function normaliseUscs(symbol: string): string {
  return symbol.trim().toUpperCase()
}

/** True for a group symbol of ASTM D2487 (case and surrounding spaces ignored). */
export function isUscsGroupSymbol(symbol: string): boolean {
  return SYMBOL_SET.has(normaliseUscs(symbol))
}

/** Main soil family of a symbol, from its first letter (dual symbols by their first half); null when invalid. */
export function uscsFamily(symbol: string): 'gravel' | 'sand' | 'silt' | 'clay' | 'organic' | 'peat' | null {
  const s = normaliseUscs(symbol)
  if (!SYMBOL_SET.has(s)) return null
  if (s === 'PT') return 'peat'
  switch (s[0]) {
    case 'G': return 'gravel'
    case 'S': return 'sand'
    case 'M': return 'silt'
    case 'C': return 'clay'
    case 'O': return 'organic'
    default: return null
  }
}
