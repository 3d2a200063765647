import type { PreconsolidationModel, SettlementLayer } from '../geotech/settlement'
import { createStressEvaluator } from '../geotech/stress'
import type { SiteModelDefinition } from './definition'
import { toSettlementLayers, toStressInput } from './convert'

export interface SublayerRow {
  layer: string
  top: number
  bottom: number
  depth: number
  effectiveStress: number
  preconsolidation: number
  ocr: number
  pop: number
  cc: number
  cr: number
  e0: number
  cv: number | null
}

/** σ'p of a settlement layer's form at a depth (σ'v0 there for OCR and POP forms). */
export function preconsolidationAt(form: PreconsolidationModel, depth: number, top: number, bottom: number, effectiveStress: number): number {
  switch (form.type) {
    case 'ocr': return form.value * effectiveStress
    case 'pop': return effectiveStress + form.value
    case 'constant': return form.value
    case 'linear': return form.top + ((form.bottom - form.top) * (depth - top)) / (bottom - top)
  }
}

/**
 * The model's compressible strata cut into sublayers no thicker than
 * `maxThickness`, with σ'v0 and σ'p at each mid-depth and the adopted
 * compressibility (a depth trend's values at each mid-depth): the table other
 * settlement tools take.
 */
export function sublayerTable(def: SiteModelDefinition, maxThickness = 0.25): { rows: SublayerRow[], layers: SettlementLayer[] } {
  const evaluate = createStressEvaluator(toStressInput(def))
  // Strata with compressibility depth trends come sliced at the same thickness, so each
  // sublayer below carries the trend's values at its own mid-depth.
  const layers = toSettlementLayers(def, z => evaluate(z).effectiveStress, { maxThickness })
  const rows: SublayerRow[] = []
  let top = 0
  for (const layer of layers) {
    const bottom = top + layer.thickness
    if (layer.compressible && layer.preconsolidation) {
      const n = Math.max(1, Math.ceil(layer.thickness / maxThickness - 1e-9))
      const h = layer.thickness / n
      for (let i = 0; i < n; i++) {
        const a = top + i * h
        const b = i === n - 1 ? bottom : a + h
        const z = (a + b) / 2
        const s0 = evaluate(z).effectiveStress
        const sp = preconsolidationAt(layer.preconsolidation, z, top, bottom, s0)
        rows.push({ layer: layer.name, top: a, bottom: b, depth: z, effectiveStress: s0, preconsolidation: sp, ocr: sp / s0, pop: sp - s0, cc: layer.cc!, cr: layer.cr!, e0: layer.e0!, cv: layer.cv ?? null })
      }
    }
    top = bottom
  }
  return { rows, layers }
}
