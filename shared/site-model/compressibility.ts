import type { Compressibility } from './definition'

/** What a stratum's adopted compressibility is made from: one interpreted oedometer test. */
export interface TestCompressibility {
  id: string
  stratumCode: string | null
  qualityClass: string | null
  cc: number | null
  cr: number | null
  e0: number | null
  cv: number | null
  calpha: number | null
}

/**
 * The mean Cc, Cr, e0 (and cv, Cα where measured) of a stratum's oedometer tests.
 * Tests a reviewer excluded and very poor samples are left out: disturbance flattens
 * the curve and lowers Cc (Lunne, Berre & Strandvik 1997; common practice).
 * Null when no test is left.
 */
export function meanCompressibility(tests: readonly TestCompressibility[], stratumCode: string, excluded: ReadonlySet<string> = new Set()): (Pick<Compressibility, 'cc' | 'cr' | 'e0' | 'cv' | 'calpha' | 'n'> & { used: string[] }) | null {
  const use = tests.filter(t => t.stratumCode === stratumCode && !excluded.has(t.id) && t.qualityClass !== 'very-poor' && t.cc !== null && t.cr !== null && t.e0 !== null)
  if (!use.length) return null
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length
  const round = (v: number, d: number) => Math.round(v * 10 ** d) / 10 ** d
  const cv = use.map(t => t.cv).filter((v): v is number => v !== null && v > 0)
  const ca = use.map(t => t.calpha).filter((v): v is number => v !== null && v >= 0)
  return {
    cc: round(mean(use.map(t => t.cc!)), 3),
    cr: round(mean(use.map(t => t.cr!)), 3),
    e0: round(mean(use.map(t => t.e0!)), 3),
    ...(cv.length ? { cv: round(mean(cv), 2) } : {}),
    ...(ca.length ? { calpha: round(mean(ca), 4) } : {}),
    n: use.length,
    used: use.map(t => t.id),
  }
}
