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

/** Diagonal hatching for depths that are not logged. */
export function gapPatternMarkup(id: string): string {
  return `<pattern id="${id}" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">`
    + '<rect width="6" height="6" fill="#ffffff"/><path d="M0,0V6" stroke="#978a72" stroke-width="1.2"/></pattern>'
}

/**
 * A whole `<svg>` swatch of a stratum look, for `v-html`. The id depends only on the look, so
 * repeated swatches share identical definitions and server and client render the same markup.
 */
export function swatchSvg(a: ResolvedAppearance, width = 40, height = 24, label = ''): string {
  const id = `sw-${a.colour.key}-${a.pattern.key}`
  const aria = label ? `role="img" aria-label="${label.replace(/"/g, '&quot;')}"` : 'aria-hidden="true"'
  return `<svg width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" ${aria} focusable="false">`
    + `<defs>${patternMarkup(id, a)}</defs>`
    + `<rect x="0.5" y="0.5" width="${width - 1}" height="${height - 1}" fill="url(#${id})" stroke="#564e44" stroke-width="1"/></svg>`
}
