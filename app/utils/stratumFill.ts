import {
  defaultAppearanceFor,
  FALLBACK_APPEARANCE,
  stratumColour,
  stratumPattern,
  type StratumColour,
  type StratumPattern,
} from '#shared/strata/appearance'

/**
 * Turns a stratum's colour and pattern keys (shared/strata/appearance.ts) into
 * SVG `<pattern>` fills, so the graphic log, the strata editor's swatches and the
 * printed legend draw a stratum alike.
 */
export interface ResolvedAppearance {
  colour: StratumColour
  pattern: StratumPattern
}

function fallbackColour(): StratumColour {
  return stratumColour(FALLBACK_APPEARANCE.colour)!
}

function fallbackPattern(): StratumPattern {
  return stratumPattern(FALLBACK_APPEARANCE.pattern)!
}

/** The stratum's own look; without a stratum, a suggestion from the logged USCS symbol. */
export function resolveAppearance(stratum: { colour: string, pattern: string } | null | undefined, uscs?: string | null): ResolvedAppearance {
  const keys = stratum ?? defaultAppearanceFor(uscs ?? '')
  return {
    colour: stratumColour(keys.colour) ?? fallbackColour(),
    pattern: stratumPattern(keys.pattern) ?? fallbackPattern(),
  }
}

/** An id safe for `url(#…)`, unique within `scope` (one scope per drawing). */
export function patternId(scope: string, a: ResolvedAppearance): string {
  return `${scope}-${a.colour.key}-${a.pattern.key}`
}

/** One `<pattern>` tile: the colour as background, the pattern strokes in its ink. */
export function patternMarkup(id: string, a: ResolvedAppearance, scale = 1): string {
  const s = a.pattern.size
  const transform = scale !== 1 ? ` patternTransform="scale(${scale})"` : ''
  return `<pattern id="${id}" width="${s}" height="${s}" patternUnits="userSpaceOnUse"${transform}>`
    + `<rect width="${s}" height="${s}" fill="${a.colour.hex}"/>`
    + `<g style="color:${a.colour.ink}">${a.pattern.svg}</g></pattern>`
}

/** Diagonal hatching for depths that are not logged (one definition for the D3 log and the key). */
export const GAP_PATTERN = { size: 6, angle: 45, background: '#ffffff', d: 'M0,0V6', ink: '#978a72', strokeWidth: 1.2 } as const

/** The hatching as a `<pattern>` in markup, for D3 drawings. */
export function gapPatternMarkup(id: string): string {
  const g = GAP_PATTERN
  return `<pattern id="${id}" width="${g.size}" height="${g.size}" patternUnits="userSpaceOnUse" patternTransform="rotate(${g.angle})">`
    + `<rect width="${g.size}" height="${g.size}" fill="${g.background}"/><path d="${g.d}" stroke="${g.ink}" stroke-width="${g.strokeWidth}"/></pattern>`
}
