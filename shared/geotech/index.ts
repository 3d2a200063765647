/** Public surface of the Pastload engine: pure functions, SI units (m, kPa, kN/m³, m²/yr, years). */
export * from './errors'
export * from './stress'
export * from './loads'
export * from './consolidation'
export * from './settlement'

// ---- Stress-history modules (oedometer interpretation, in-situ tests, trends, plasticity) ----
// Their re-exports go below this line.
export * from './oedometer'
export * from './insitu'
export * from './trends'
export * from './plasticity'
export * from './radial-consolidation'
