import { poreScale, unitWeightScale } from '#shared/plots/model-ground'
import type { UnitWeightReading, WaterReading } from '#shared/investigation/reference'
import { filterWater, type ModelWorkspace } from '~/composables/useModelWorkspace'

/** A logged bulk unit weight where the γ track draws it (x in the track's own x, the drawing's y). */
export interface UnitWeightMark { x: number, y: number, reading: UnitWeightReading }

/** A groundwater record where the u track draws it: a level as a tick at u = 0, a piezometer reading as a cross at its tip. */
export interface WaterMark { x: number, y: number, reading: WaterReading }

/** What a reference mark says (the hover card and the list of marks read the same words); made when shown, not with the marks. */
export function unitWeightName(ws: Pick<ModelWorkspace, 'units'>, r: UnitWeightReading): string {
  return `${r.pointIdentifier} ${r.sample}: bulk γ ${ws.units.format(r.value, 'unitWeight')} at ${ws.units.format(r.depth, 'length')}`
}
export function waterName(ws: Pick<ModelWorkspace, 'units'>, m: WaterReading): string {
  const day = formatDate(m.observedAt)
  if (m.pressure === null) return `${m.pointIdentifier} ${m.kind === 'strike' ? 'water strike' : 'standing level'} ${ws.units.format(m.depth, 'length')} on ${day}`
  return `${m.pointIdentifier} at ${ws.units.format(m.depth, 'length')}: u = ${ws.units.format(m.pressure, 'stress')} on ${day}`
}

/**
 * The logs' reference marks of the γ and u tracks — logged bulk unit weights and the groundwater
 * records in the chosen date range — placed on the tracks' scales (the same scales the tracks draw
 * their lines with: `shared/plots/model-ground.ts`), for the canvas that draws them, the tracks'
 * hover cards and the exported drawing. They are many and only read, so they are not SVG elements.
 */
export function useReferenceMarks(ws: ModelWorkspace, widths: () => { uw: number, water: number }) {
  const uwScale = computed(() => unitWeightScale(ws.definition.value, widths().uw, ws.unitWeights.value.map(r => r.value)))
  const shownWater = computed(() => filterWater(ws.water.value, ws.waterFrom.value, ws.waterTo.value))
  const waterScale = computed(() => poreScale(ws.definition.value, ws.profile.value, widths().water, shownWater.value.map(m => m.pressure ?? 0)))

  const unitWeights = computed((): UnitWeightMark[] => {
    const y = ws.y.value
    const x = uwScale.value
    return ws.unitWeights.value.map(r => ({ x: x(r.value), y: y(r.depth), reading: r }))
  })
  const water = computed((): WaterMark[] => {
    const y = ws.y.value
    const x = waterScale.value
    return shownWater.value.map(m => ({ x: x(m.pressure ?? 0), y: y(m.depth), reading: m }))
  })

  /** The mark nearest to a point of a track (track x, drawing y) within `px`, else null. */
  function nearest<T extends { x: number, y: number }>(list: readonly T[], x: number, y: number, px = 6): T | null {
    let best: T | null = null
    let bestD = px * px
    for (const m of list) {
      const dx = m.x - x
      const dy = m.y - y
      const dd = dx * dx + dy * dy
      if (dd <= bestD) { best = m; bestD = dd }
    }
    return best
  }
  function unitWeightAt(x: number, y: number): UnitWeightMark | null {
    return nearest(unitWeights.value, x, y)
  }
  function waterAt(x: number, y: number): WaterMark | null {
    // Levels are ticks from u = 0 to 10 px right of it: measured from the tick's middle.
    const levels = water.value.filter(m => m.reading.pressure === null).map(m => ({ ...m, x: m.x + 5 }))
    const tips = water.value.filter(m => m.reading.pressure !== null)
    return nearest([...levels, ...tips], x, y, 7)
  }

  return { uwScale, waterScale, unitWeights, water, unitWeightAt, waterAt }
}

export type ReferenceMarks = ReturnType<typeof useReferenceMarks>
