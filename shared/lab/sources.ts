/**
 * Where a σ'p point comes from: an oedometer test, a CPT sounding or a field vane. Plain constants (no schema
 * library), so the stress-model page's drawing code loads them without zod; `shared/schemas/lab.ts` exports them too.
 */
export const PRECONSOLIDATION_SOURCES = ['oedometer', 'cpt', 'vane'] as const
export type PreconsolidationSource = (typeof PRECONSOLIDATION_SOURCES)[number]
