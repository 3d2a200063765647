// Speed of the stress workspace's drawing in Chromium: frame times while the
// depth axis is zoomed and panned with a dense layer of synthetic CPT rows, and
// the time from an edit (the water table moved) to the redrawn σ'v0 curve.
import type { Page } from 'playwright-core'

export interface CanvasBenchResult {
  /** Dense rows on the canvas (the project's CPT rows plus the synthetic ones). */
  points: number
  frames: number
  frameMedianMs: number
  frameP95Ms: number
  /** Time of one dense-layer redraw (bin and write the image, in the layer's worker where the browser can hand the canvas over), p95. */
  drawP95Ms: number
  edits: number
  /** Keydown on the water table → new profile on screen (includes the 60 ms debounce and the round trip). */
  editToCurveMedianMs: number
  editToCurveP95Ms: number
}

const RECORD_FRAMES = `(() => {
  window.__frames = []
  window.__draws = []
  window.__stop = false
  const layer = document.querySelector('[data-testid="dense-layer"]')
  new MutationObserver(() => {
    const ms = Number(layer.getAttribute('data-draw-ms'))
    if (Number.isFinite(ms)) window.__draws.push(ms)
  }).observe(layer, { attributes: true, attributeFilter: ['data-draw-ms'] })
  let last = performance.now()
  const tick = (t) => {
    window.__frames.push(t - last)
    last = t
    if (!window.__stop) requestAnimationFrame(tick)
  }
  requestAnimationFrame(tick)
})()`

const STOP_FRAMES = `(() => {
  window.__stop = true
  return { frames: window.__frames.slice(1), draws: window.__draws }
})()`

/** Arrow keys move the water table; each time runs from the keydown until a new profile is drawn. */
function timeEdits(count: number): string {
  return `(async () => {
  const handle = document.querySelector('[data-testid="water-table-handle"]')
  const ws = document.querySelector('[data-testid="model-workspace"]')
  if (!handle || !ws) throw new Error('no water table handle')
  handle.focus()
  const out = []
  for (let i = 0; i < ${count}; i++) {
    const before = ws.getAttribute('data-profile-sequence')
    const t0 = performance.now()
    handle.dispatchEvent(new KeyboardEvent('keydown', { key: i % 2 ? 'ArrowUp' : 'ArrowDown', bubbles: true }))
    await new Promise((resolve) => {
      const obs = new MutationObserver(() => {
        if (ws.getAttribute('data-profile-sequence') !== before) { obs.disconnect(); resolve() }
      })
      obs.observe(ws, { attributes: true, attributeFilter: ['data-profile-sequence'] })
    })
    // The curve is on screen once the next frame is painted.
    await new Promise(r => requestAnimationFrame(() => requestAnimationFrame(r)))
    out.push(performance.now() - t0)
    await new Promise(r => setTimeout(r, 50))
  }
  return out
})()`
}

function quantile(sorted: number[], q: number): number {
  if (!sorted.length) return Number.NaN
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))
  return sorted[i]!
}

/**
 * Opens a new stress model of the demo project with `points` synthetic dense rows
 * (`?bench=N`, client-side only), then measures. `page` must be signed in as
 * someone who may write models (the demo engineer).
 */
export async function runCanvasBench(baseUrl: string, page: Page, options: { points?: number, zoomSteps?: number, edits?: number } = {}): Promise<CanvasBenchResult> {
  const n = options.points ?? 200_000
  await page.goto(`${baseUrl}/`)
  const ids = await page.evaluate(`(async () => {
    const projects = await (await fetch('/api/projects')).json()
    const project = projects.projects.find(p => p.jobNumber === 'TRN-0417')
    if (!project) throw new Error('demo project TRN-0417 not found')
    const r = await fetch('/api/projects/' + project.id + '/models', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ name: 'Canvas bench ' + Date.now().toString(36) }),
    })
    if (r.status !== 201) throw new Error('creating the bench model failed: ' + r.status)
    const { model } = await r.json()
    return { projectId: project.id, modelId: model.id }
  })()`) as { projectId: string, modelId: string }
  await page.goto(`${baseUrl}/projects/${ids.projectId}/models/${ids.modelId}?bench=${n}`)
  // Polled from here: a predicate written as text would be evaluated in the page, which its CSP forbids.
  const deadline = Date.now() + 60_000
  while (Number(await page.getByTestId('dense-layer').getAttribute('data-count') ?? 0) < n) {
    if (Date.now() > deadline) throw new Error(`the dense layer did not reach ${n} points within 60 s`)
    await page.waitForTimeout(200)
  }
  await page.getByTestId('effective-stress-line').waitFor()
  const points = Number(await page.getByTestId('dense-layer').getAttribute('data-count'))

  // Frame times: a rAF loop records every frame while the wheel zooms in and out and a drag pans.
  // In-page code goes as text: a TypeScript runner would otherwise wrap its functions in helpers the page lacks.
  await page.evaluate(RECORD_FRAMES)
  const box = await page.getByTestId('stress-overlay').boundingBox()
  if (!box) throw new Error('no stress track on screen')
  const cx = box.x + box.width / 2
  const cy = box.y + box.height / 2
  const steps = options.zoomSteps ?? 24
  await page.mouse.move(cx, cy)
  for (let i = 0; i < steps; i++) { await page.mouse.wheel(0, -120); await page.waitForTimeout(16) }
  await page.mouse.down()
  for (let i = 0; i < 30; i++) { await page.mouse.move(cx, cy + (i % 15 - 7) * 12); await page.waitForTimeout(16) }
  await page.mouse.up()
  for (let i = 0; i < steps; i++) { await page.mouse.wheel(0, 120); await page.waitForTimeout(16) }
  const timing = await page.evaluate(STOP_FRAMES) as { frames: number[], draws: number[] }
  const frames = [...timing.frames].sort((a, b) => a - b)
  const draws = [...timing.draws].sort((a, b) => a - b)

  // Edit → redrawn curve: arrow keys move the water table; the time runs until a new profile is drawn.
  const edits = options.edits ?? 12
  const editTimes = await page.evaluate(timeEdits(edits)) as number[]
  const e = [...editTimes].sort((a, b) => a - b)
  return {
    points,
    frames: frames.length,
    frameMedianMs: quantile(frames, 0.5),
    frameP95Ms: quantile(frames, 0.95),
    drawP95Ms: quantile(draws, 0.95),
    edits: e.length,
    editToCurveMedianMs: quantile(e, 0.5),
    editToCurveP95Ms: quantile(e, 0.95),
  }
}
