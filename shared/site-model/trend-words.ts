import type { StratumTrend } from './definition'

/** The σ'p trend models and their parameters in words, as the model canvas and the site-model report show them. */

export const TREND_MODEL_LABELS: Record<StratumTrend['model'], string> = {
  constant: 'Constant σ\'p',
  linear: 'σ\'p linear in depth',
  pop: 'Constant POP',
  ocr: 'Constant OCR',
  crust: 'Crust over constant POP',
}

/** A trend parameter's label and what it measures (`perDepth`: a stress per unit depth). */
export const TREND_PARAMETERS: Record<string, { label: string, quantity: 'stress' | 'length' | null, perDepth?: boolean }> = {
  preconsolidation: { label: 'σ\'p', quantity: 'stress' },
  intercept: { label: 'σ\'p at 0 m', quantity: 'stress' },
  gradient: { label: 'gradient', quantity: 'stress', perDepth: true },
  pop: { label: 'POP', quantity: 'stress' },
  ocr: { label: 'OCR', quantity: null },
  breakpointDepth: { label: 'crust base', quantity: 'length' },
  crustGradient: { label: 'crust gradient', quantity: 'stress', perDepth: true },
  valueAtBreakpoint: { label: 'σ\'p at crust base', quantity: 'stress' },
  effectiveStressAtBreakpoint: { label: 'σ\'v0 at crust base', quantity: 'stress' },
}

/** A trend parameter's label with depths in the given length unit ("σ'p at 0 ft" on a US project); the key itself when unknown. */
export function trendParameterLabel(key: string, lengthUnit = 'm'): string {
  const label = TREND_PARAMETERS[key]?.label ?? key
  return label.replace(/ at 0 m$/, ` at 0 ${lengthUnit}`)
}
