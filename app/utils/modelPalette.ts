/** The stress workspace's marks: shared with the reports' drawings (`shared/plots/palette.ts`). */
export { INK, SOURCE_LABELS, SOURCE_INK, QUALITY_SHADES, qualityShade, symbolPath, VERDICT_INK, RING_PATH, SLASH_PATH, markStyle } from '#shared/plots/palette'
export type { QualityShade, MarkStyle } from '#shared/plots/palette'
