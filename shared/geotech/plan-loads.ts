import { GeotechError } from './errors'
import { createStressIncrease } from './loads'

/**
 * Loads placed on the site plan (site grid, m; pressures kPa; rotation in degrees,
 * anticlockwise from the grid's x axis) and Δσz under any plan point by superposition.
 *
 * FIRST CUT (contract stub): the embankment is taken as a uniform rectangle over its
 * mid-height footprint. To be replaced by the exact treatment (see issue 13).
 */
export type PlanLoad =
  | { type: 'uniform', pressure: number }
  | { type: 'rectangle', x: number, y: number, width: number, length: number, rotation: number, pressure: number }
  | { type: 'circle', x: number, y: number, radius: number, pressure: number }
  | { type: 'embankment', x: number, y: number, crestWidth: number, crestLength: number, height: number, sideSlope: number, unitWeight: number, rotation: number }

/** A plan point in a load's own frame (origin at its centre, x along its width). */
function toLocal(load: { x: number, y: number, rotation: number }, x: number, y: number): { x: number, y: number } {
  const a = (-load.rotation * Math.PI) / 180
  const dx = x - load.x
  const dy = y - load.y
  return { x: dx * Math.cos(a) - dy * Math.sin(a), y: dx * Math.sin(a) + dy * Math.cos(a) }
}

/** Δσz(depth) at plan point (x, y) under all `loads` (superposition). */
export function planStressIncrease(loads: readonly PlanLoad[], x: number, y: number): (depth: number) => number {
  const parts = loads.map((load) => {
    switch (load.type) {
      case 'uniform': return createStressIncrease(load)
      case 'rectangle': return createStressIncrease({ type: 'rectangle', width: load.width, length: load.length, pressure: load.pressure, at: toLocal(load, x, y) })
      case 'circle': return createStressIncrease({ type: 'circle', radius: load.radius, pressure: load.pressure, at: { x: x - load.x, y: y - load.y } })
      case 'embankment': {
        const mid = load.sideSlope * load.height
        return createStressIncrease({ type: 'rectangle', width: load.crestWidth + mid, length: load.crestLength + mid, pressure: load.height * load.unitWeight, at: toLocal(load, x, y) })
      }
      default: throw new GeotechError('load-invalid', 'Unknown load type.')
    }
  })
  return (z: number) => {
    let s = 0
    for (const f of parts) s += f(z)
    return s
  }
}

/** The load's footprint on the plan (toe outline, site grid, m), or null for a uniform fill. */
export function loadFootprint(load: PlanLoad): { x: number, y: number }[] | null {
  const rect = (cx: number, cy: number, w: number, l: number, rot: number) => {
    const a = (rot * Math.PI) / 180
    return [[-w / 2, -l / 2], [w / 2, -l / 2], [w / 2, l / 2], [-w / 2, l / 2]].map(([u, v]) => ({ x: cx + u! * Math.cos(a) - v! * Math.sin(a), y: cy + u! * Math.sin(a) + v! * Math.cos(a) }))
  }
  switch (load.type) {
    case 'uniform': return null
    case 'rectangle': return rect(load.x, load.y, load.width, load.length, load.rotation)
    case 'circle': return Array.from({ length: 48 }, (_, i) => ({ x: load.x + load.radius * Math.cos((i * 2 * Math.PI) / 48), y: load.y + load.radius * Math.sin((i * 2 * Math.PI) / 48) }))
    case 'embankment': {
      const t = 2 * load.sideSlope * load.height
      return rect(load.x, load.y, load.crestWidth + t, load.crestLength + t, load.rotation)
    }
  }
}
