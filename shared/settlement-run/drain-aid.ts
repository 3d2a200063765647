import { DRAIN_SPACING_SEARCH, drainSpacingFor } from '../geotech/radial-consolidation'
import { DRAIN_PATTERNS, type DrainPattern } from '../schemas/settlement-run-limits'
import type { SiteModelDefinition } from '../site-model/definition'

/**
 * The drain spacing aid of the run editor and the run page: for a target degree of consolidation
 * at a target time, the spacing of each pattern that reaches it in every drained stratum (the
 * tightest of the strata governs). Each stratum's spacing is `drainSpacingFor` (radial and vertical
 * drainage combined); this only picks the governing stratum and gathers the strata's numbers.
 */

/** A drained stratum as the aid needs it: SI (m²/year, m). */
export interface AidStratum {
  name: string
  cv: number
  ch: number
  /** Vertical drainage path, m. */
  drainagePath: number
}

/** The drain itself (SI: m). The aid leaves out well resistance (it would need each stratum's kh). */
export interface AidDrain {
  diameter: number
  smearRatio: number
  permeabilityRatio: number
}

/** What the designer asks for: a degree of consolidation (0–1) reached at a time (years). */
export interface AidTarget {
  degree: number
  years: number
}

export interface AidAnswer {
  pattern: DrainPattern
  /** m, or null when no spacing reaches the target in some stratum. */
  spacing: number | null
  /** True when even the widest spacing searched reaches the target (the figure is that widest spacing). */
  atWidest: boolean
  /** The stratum that sets the spacing (or that cannot reach the target), null without strata. */
  governing: string | null
}

/** The spacing of one pattern that reaches `target` in every stratum of `strata`. */
export function aidSpacing(pattern: DrainPattern, target: AidTarget, strata: readonly AidStratum[], drain: AidDrain): AidAnswer {
  let best: AidAnswer = { pattern, spacing: null, atWidest: false, governing: null }
  for (const st of strata) {
    const s = drainSpacingFor({
      pattern,
      targetDegree: target.degree,
      years: target.years,
      ch: st.ch,
      cv: st.cv,
      drainagePath: st.drainagePath,
      diameter: drain.diameter,
      smearRatio: drain.smearRatio,
      permeabilityRatio: drain.permeabilityRatio,
    })
    if (s === null) return { pattern, spacing: null, atWidest: false, governing: st.name }
    if (best.spacing === null || s < best.spacing) best = { pattern, spacing: s, atWidest: s >= DRAIN_SPACING_SEARCH.max, governing: st.name }
  }
  return best
}

/** Both patterns' spacings. */
export function aidSpacings(target: AidTarget, strata: readonly AidStratum[], drain: AidDrain): AidAnswer[] {
  return DRAIN_PATTERNS.map(p => aidSpacing(p, target, strata, drain))
}

/**
 * The strata of a model version the drains pass through, as the aid needs them: cv of the stratum
 * (its constant value), ch = cv × `chRatio`, the drainage path half the thickness when the stratum
 * drains both ways, the whole thickness when one way. Strata without cv are left out.
 */
export function aidStrataOf(definition: Pick<SiteModelDefinition, 'strata'>, codes: readonly string[], chRatio: number): AidStratum[] {
  const wanted = new Set(codes)
  return definition.strata.flatMap((s) => {
    const cv = s.compressibility?.cv
    if (!wanted.has(s.code) || !s.compressible || !cv) return []
    const drainagePath = s.compressibility?.drainage === 'double' || s.compressibility?.drainage === undefined ? s.thickness / 2 : s.thickness
    return [{ name: s.name, cv, ch: cv * chRatio, drainagePath }]
  })
}
