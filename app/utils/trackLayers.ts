import { INK, markStyle, RING_PATH, SLASH_PATH, type MarkStyle } from '#shared/plots/palette'
import { RATIO_DOT, type PointMarkInput } from '#shared/plots/model-tracks'
import type { TrackFrame } from '~/composables/useModelWorkspace'

/**
 * The stress workspace's two canvas layers — the dense CPT σ'p rows under the stress track, and the σ'p symbols
 * with the ratio dots and the logs' reference marks — painted from plain data. The same painter runs in a worker
 * on a canvas handed over with `transferControlToOffscreen` (`app/workers/trackLayer.worker.ts`, through
 * `useLayerPainter`), so a phone's page keeps its main thread for the page, or on the page itself where a browser
 * cannot hand a canvas over, and for the dense layer of an exported drawing.
 */

type Context2D = CanvasRenderingContext2D | OffscreenCanvasRenderingContext2D
type LayerCanvas = HTMLCanvasElement | OffscreenCanvas

/** The dense layer's rows, sorted by depth. */
export interface DenseRows { depth: Float32Array, preconsolidation: Float32Array }

/**
 * One view of the dense layer: the canvas's size in CSS px, the device pixel ratio, and the two linear scales
 * as px = a·v + b in CSS px from the canvas's top left (depth in m down, σ'p in kPa across).
 */
export interface DenseView {
  dpr: number
  width: number
  height: number
  depth: { a: number, b: number }
  stress: { a: number, b: number }
}

/** Everything the marks layer draws, in drawing coordinates. */
export interface MarksScene {
  dpr: number
  /** The canvas's box: from `left` across `width`, from `top` down `height` (CSS px of the drawing). */
  left: number
  width: number
  top: number
  height: number
  frames: { stress: TrackFrame, ocr: TrackFrame, pop: TrackFrame, uw: TrackFrame, water: TrackFrame }
  /** σ'p symbols, x from the stress track's left. */
  marks: PointMarkInput[]
  /** OCR and POP dots, x from their tracks' left. */
  ratio: { ocrX: number, popX: number, cy: number }[]
  /** Logged unit weights, x from the γ track's left. */
  unitWeights: { x: number, y: number }[]
  /** Groundwater records, x from the u track's left: a level (a strike dashed) or a piezometer reading (a cross). */
  water: { x: number, y: number, kind: 'level' | 'strike' | 'reading' }[]
}

export type LayerMessage =
  | { kind: 'dense-rows', rows: DenseRows }
  | { kind: 'dense-draw', view: DenseView }
  | { kind: 'marks-draw', scene: MarksScene }

/** What a draw reports back: how many rows or marks it drew and how long it took. */
export interface LayerReply { kind: 'drawn', drawn: number, ms: number }

export interface LayerPainter { handle: (message: LayerMessage) => LayerReply | null }

/** A painter for one canvas (dense or marks, as the messages it is sent say). */
export function createLayerPainter(canvas: LayerCanvas): LayerPainter {
  const dense = denseLayer(canvas)
  const marks = marksLayer(canvas)
  return {
    handle(message) {
      if (message.kind === 'dense-rows') { dense.rows(message.rows); return null }
      if (message.kind === 'dense-draw') return dense.draw(message.view)
      return marks.draw(message.scene)
    },
  }
}

function context(canvas: LayerCanvas): Context2D | null {
  return canvas.getContext('2d') as Context2D | null
}

function lowerBound(a: Float32Array, v: number): number {
  let lo = 0
  let hi = a.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (a[mid]! < v) lo = mid + 1
    else hi = mid
  }
  return lo
}

/**
 * The dense CPT σ'p layer (every sounding row, up to hundreds of thousands), binned to device pixels: each
 * visible row adds to its pixel's count and the count sets the opacity, so a redraw costs one pass over the
 * visible rows and one image write, whatever the zoom. The visible rows are found by binary search.
 */
function denseLayer(canvas: LayerCanvas) {
  let data: DenseRows | null = null
  let image: ImageData | null = null
  let counts: Uint16Array | null = null
  /** Pixels with at least one row in the last draw (indices into the image, the first `touchedCount`), so only those are written. */
  let touched: Uint32Array = new Uint32Array(0)
  let touchedCount = 0

  function draw(view: DenseView): LayerReply | null {
    const t0 = performance.now()
    const ctx = context(canvas)
    if (!ctx || !data) return null
    const { dpr } = view
    const w = Math.max(1, Math.round(view.width * dpr))
    const h = Math.max(1, Math.round(view.height * dpr))
    if (canvas.width !== w || canvas.height !== h || !image || !counts) {
      canvas.width = w
      canvas.height = h
      image = ctx.createImageData(w, h)
      counts = new Uint16Array(w * h)
      touchedCount = 0
    }
    const ya = view.depth.a * dpr
    const yb = view.depth.b * dpr
    const xa = view.stress.a * dpr
    const xb = view.stress.b * dpr
    // The depths at the canvas's top and bottom edges.
    const z0 = -view.depth.b / view.depth.a
    const z1 = (view.height - view.depth.b) / view.depth.a
    const depth = data.depth
    const value = data.preconsolidation
    const i0 = lowerBound(depth, Math.min(z0, z1))
    const i1 = lowerBound(depth, Math.max(z0, z1) + 1e-6)
    const dot = dpr >= 1.5 ? 3 : 2
    const px32 = new Uint32Array(image.data.buffer)
    // Only the pixels the last draw wrote are cleared, and only those this one touches are written (not every
    // pixel); the rows round both are all that is copied to the canvas.
    let lo = w * h
    let hi = -1
    for (let j = 0; j < touchedCount; j++) {
      const q = touched[j]!
      counts[q] = 0
      px32[q] = 0
      if (q < lo) lo = q
      if (q > hi) hi = q
    }
    const most = Math.min(w * h, (i1 - i0) * dot * dot)
    if (touched.length < most) touched = new Uint32Array(most)
    const hit = touched
    let m = 0
    let n = 0
    for (let i = i0; i < i1; i++) {
      const px = (xa * value[i]! + xb) | 0
      const py = (ya * depth[i]! + yb) | 0
      if (px < 0 || py < 0 || px + dot > w || py + dot > h) continue
      n++
      for (let dy = 0; dy < dot; dy++) {
        const row = (py + dy) * w + px
        for (let dx = 0; dx < dot; dx++) {
          const q = row + dx
          if (counts[q]!++ === 0) hit[m++] = q
        }
      }
    }
    touchedCount = m
    const [r, g, b] = INK.dense
    const rgb = (b << 16) | (g << 8) | r
    for (let j = 0; j < m; j++) {
      const q = touched[j]!
      // Opacity grows with the rows in the pixel: a lone row is faint, a trace is solid (little-endian RGBA).
      px32[q] = ((Math.min(235, 55 + 38 * counts[q]!) << 24) | rgb) >>> 0
      if (q < lo) lo = q
      if (q > hi) hi = q
    }
    // Whole rows between the first and last pixel changed (rows are the cheap direction to cut).
    if (hi >= lo) {
      const row0 = Math.floor(lo / w)
      ctx.putImageData(image, 0, 0, 0, row0, w, Math.floor(hi / w) - row0 + 1)
    }
    return { kind: 'drawn', drawn: n, ms: Math.round((performance.now() - t0) * 100) / 100 }
  }

  return {
    rows(rows: DenseRows) {
      data = rows
    },
    draw,
  }
}

/** Logged unit weights: grey dots. */
export const UW_DOT = { r: 2.4, fill: '#c9c1b0', stroke: '#7f7360', width: 0.6 }

/** Marks of one style gathered into one path: a few fills and strokes for hundreds of points, not several per point. */
interface MarkGroup { style: MarkStyle, body: Path2D, ring: Path2D | null, slash: Path2D | null }

/** The σ'p symbols, the OCR and POP dots and the logs' reference marks, each clipped to its track. */
function marksLayer(canvas: LayerCanvas) {
  const paths = new Map<string, Path2D>()
  function path(d: string): Path2D {
    let p = paths.get(d)
    if (!p) { p = new Path2D(d); paths.set(d, p) }
    return p
  }
  function clipTo(ctx: Context2D, f: TrackFrame, s: MarksScene) {
    ctx.beginPath()
    ctx.rect(f.x, s.top, f.width, s.height)
    ctx.clip()
  }

  /** The left-out points (`included` false) or the fitted ones: drawn in two passes, so fitted ones sit on top. */
  function drawMarkGroups(ctx: Context2D, s: MarksScene, included: boolean) {
    const sx = s.frames.stress.x
    // One group per set of what `markStyle` reads, so the style is made once per group.
    const groups = new Map<string, MarkGroup>()
    for (const m of s.marks) {
      if ((m.state === 'included') !== included) continue
      const key = `${m.source}|${m.qualityClass}|${m.state}|${m.verdict}`
      let g = groups.get(key)
      if (!g) {
        const st = markStyle(m.source, m.qualityClass, m.state, m.verdict)
        g = { style: st, body: new Path2D(), ring: st.ring ? new Path2D() : null, slash: st.slash ? new Path2D() : null }
        groups.set(key, g)
      }
      const at = new DOMMatrix([1, 0, 0, 1, sx + m.x, m.y])
      g.body.addPath(path(g.style.d), at)
      g.ring?.addPath(path(RING_PATH), at)
      g.slash?.addPath(path(SLASH_PATH), at)
    }
    for (const g of groups.values()) strokeGroup(ctx, g)
  }

  function drawReferences(ctx: Context2D, s: MarksScene) {
    const uw = s.frames.uw
    ctx.save()
    clipTo(ctx, uw, s)
    ctx.beginPath()
    for (const m of s.unitWeights) {
      ctx.moveTo(uw.x + m.x + UW_DOT.r, m.y)
      ctx.arc(uw.x + m.x, m.y, UW_DOT.r, 0, 2 * Math.PI)
    }
    ctx.fillStyle = UW_DOT.fill
    ctx.fill()
    ctx.strokeStyle = UW_DOT.stroke
    ctx.lineWidth = UW_DOT.width
    ctx.stroke()
    ctx.restore()

    const wf = s.frames.water
    ctx.save()
    clipTo(ctx, wf, s)
    for (const m of s.water) {
      const x = wf.x + m.x
      ctx.beginPath()
      if (m.kind !== 'reading') {
        const strike = m.kind === 'strike'
        ctx.strokeStyle = strike ? INK.muted : INK.water
        ctx.lineWidth = 1.6
        ctx.setLineDash(strike ? [2, 1.5] : [])
        ctx.moveTo(x, m.y)
        ctx.lineTo(x + 10, m.y)
        ctx.stroke()
        ctx.setLineDash([])
      }
      else {
        ctx.globalAlpha = 0.75
        ctx.strokeStyle = INK.water
        ctx.lineWidth = 1.2
        ctx.moveTo(x - 3, m.y - 3)
        ctx.lineTo(x + 3, m.y + 3)
        ctx.moveTo(x + 3, m.y - 3)
        ctx.lineTo(x - 3, m.y + 3)
        ctx.stroke()
        ctx.globalAlpha = 1
      }
    }
    ctx.restore()
  }

  function draw(s: MarksScene): LayerReply | null {
    const t0 = performance.now()
    const ctx = context(canvas)
    if (!ctx) return null
    const w = Math.round(s.width * s.dpr)
    const h = Math.round(s.height * s.dpr)
    if (canvas.width !== w || canvas.height !== h) { canvas.width = w; canvas.height = h }
    ctx.setTransform(1, 0, 0, 1, 0, 0)
    ctx.clearRect(0, 0, w, h)
    // Drawing coordinates throughout: the canvas's own origin is at (left, top).
    ctx.setTransform(s.dpr, 0, 0, s.dpr, -s.left * s.dpr, -s.top * s.dpr)
    // Ratio dots: one path per track.
    for (const [f, key] of [[s.frames.ocr, 'ocrX'], [s.frames.pop, 'popX']] as const) {
      ctx.save()
      clipTo(ctx, f, s)
      ctx.fillStyle = RATIO_DOT
      ctx.beginPath()
      for (const m of s.ratio) {
        const x = f.x + m[key]
        ctx.moveTo(x + 1.6, m.cy)
        ctx.arc(x, m.cy, 1.6, 0, 2 * Math.PI)
      }
      ctx.fill()
      ctx.restore()
    }
    drawReferences(ctx, s)
    // σ'p symbols in the stress track; left-out points first so fitted ones sit on top.
    ctx.save()
    clipTo(ctx, s.frames.stress, s)
    drawMarkGroups(ctx, s, false)
    drawMarkGroups(ctx, s, true)
    ctx.restore()
    return { kind: 'drawn', drawn: s.marks.length, ms: Math.round((performance.now() - t0) * 100) / 100 }
  }

  return { draw }
}

function strokeGroup(ctx: Context2D, g: MarkGroup) {
  const st = g.style
  ctx.globalAlpha = st.opacity
  ctx.fillStyle = st.fill
  ctx.fill(g.body)
  ctx.strokeStyle = st.stroke
  ctx.lineWidth = st.width
  ctx.setLineDash(st.dash ? st.dash.split(' ').map(Number) : [])
  ctx.stroke(g.body)
  ctx.setLineDash([])
  if (st.ring && g.ring) {
    ctx.strokeStyle = st.ring.stroke
    ctx.lineWidth = st.ring.width
    ctx.setLineDash(st.ring.dash ? st.ring.dash.split(' ').map(Number) : [])
    ctx.stroke(g.ring)
    ctx.setLineDash([])
  }
  if (g.slash) {
    ctx.strokeStyle = '#c0392b'
    ctx.lineWidth = 1.4
    ctx.stroke(g.slash)
  }
  ctx.globalAlpha = 1
}
