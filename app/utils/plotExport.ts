/**
 * Drawings out of the browser: an on-screen <svg> serialised on its own (white
 * background, a raster layer placed under it, a footer with the caution), and a
 * PNG made by drawing that SVG on a canvas.
 */

export interface SerialiseOptions {
  width: number
  height: number
  /** A raster drawn under the SVG content (the dense canvas layer), as a data URL. */
  underlay: { href: string, x: number, y: number, width: number, height: number } | null
  /** Vector marks drawn on a canvas on screen, as SVG markup in the drawing's coordinates, placed under the content. */
  underMarkup?: string
  /** Lines of small print under the drawing. */
  footer: string[]
}

const SVG_NS = 'http://www.w3.org/2000/svg'
const FOOTER_LINE = 13
const CHARS_PER_PX = 1 / 5.6

/** Splits text into lines of at most `max` characters at spaces. */
export function wrapText(text: string, max: number): string[] {
  const out: string[] = []
  let line = ''
  for (const word of text.split(/\s+/)) {
    if (line && (line.length + 1 + word.length) > max) { out.push(line); line = word }
    else line = line ? `${line} ${word}` : word
  }
  if (line) out.push(line)
  return out
}

export function serialiseSvg(svg: SVGSVGElement, o: SerialiseOptions): string {
  const clone = svg.cloneNode(true) as SVGSVGElement
  // Inputs typed in place and anything interactive-only do not belong in a drawing.
  clone.querySelectorAll('foreignObject').forEach(el => el.remove())
  clone.querySelectorAll('[data-handle]').forEach(el => el.removeAttribute('data-handle'))
  const maxChars = Math.max(40, Math.floor((o.width - 16) * CHARS_PER_PX))
  const lines = o.footer.flatMap(t => wrapText(t, maxChars))
  const height = o.height + lines.length * FOOTER_LINE + 8
  clone.setAttribute('xmlns', SVG_NS)
  clone.setAttribute('width', String(o.width))
  clone.setAttribute('height', String(height))
  clone.setAttribute('viewBox', `0 0 ${o.width} ${height}`)
  clone.removeAttribute('class')
  const bg = document.createElementNS(SVG_NS, 'rect')
  bg.setAttribute('width', String(o.width))
  bg.setAttribute('height', String(height))
  bg.setAttribute('fill', '#ffffff')
  clone.insertBefore(bg, clone.firstChild)
  if (o.underlay) {
    const img = document.createElementNS(SVG_NS, 'image')
    img.setAttribute('href', o.underlay.href)
    img.setAttribute('x', String(o.underlay.x))
    img.setAttribute('y', String(o.underlay.y))
    img.setAttribute('width', String(o.underlay.width))
    img.setAttribute('height', String(o.underlay.height))
    img.setAttribute('preserveAspectRatio', 'none')
    bg.after(img)
  }
  if (o.underMarkup) {
    const g = document.createElementNS(SVG_NS, 'g')
    // Markup made by this module's caller from numbers and fixed strings; parsed as SVG, not HTML.
    const parsed = new DOMParser().parseFromString(`<svg xmlns="${SVG_NS}">${o.underMarkup}</svg>`, 'image/svg+xml')
    for (const child of Array.from(parsed.documentElement.childNodes)) g.appendChild(document.importNode(child, true))
    const after = clone.querySelector('image') ?? bg
    after.after(g)
  }
  const foot = document.createElementNS(SVG_NS, 'g')
  foot.setAttribute('font-size', '10')
  foot.setAttribute('fill', '#564e44')
  lines.forEach((l, i) => {
    const t = document.createElementNS(SVG_NS, 'text')
    t.setAttribute('x', '8')
    t.setAttribute('y', String(o.height + 10 + i * FOOTER_LINE))
    t.textContent = l
    foot.appendChild(t)
  })
  clone.appendChild(foot)
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(clone)}`
}

/** The serialised SVG drawn on a canvas at `scale`, as a PNG blob. */
export async function pngFromSvg(svgText: string, scale = 2): Promise<Blob> {
  const size = /<svg[^>]*\swidth="([\d.]+)"[^>]*\sheight="([\d.]+)"/.exec(svgText) ?? /<svg[^>]*\sheight="([\d.]+)"[^>]*\swidth="([\d.]+)"/.exec(svgText)
  const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml' }))
  try {
    const img = new Image()
    img.decoding = 'sync'
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve()
      img.onerror = () => reject(new Error('The drawing could not be rendered as an image.'))
      img.src = url
    })
    const w = Math.round((img.naturalWidth || Number(size?.[1] ?? 800)) * scale)
    const h = Math.round((img.naturalHeight || Number(size?.[2] ?? 600)) * scale)
    const canvas = document.createElement('canvas')
    canvas.width = w
    canvas.height = h
    const ctx = canvas.getContext('2d')
    if (!ctx) throw new Error('This browser cannot draw to a canvas.')
    ctx.fillStyle = '#ffffff'
    ctx.fillRect(0, 0, w, h)
    ctx.drawImage(img, 0, 0, w, h)
    return await new Promise<Blob>((resolve, reject) => canvas.toBlob(b => (b ? resolve(b) : reject(new Error('The PNG could not be made.'))), 'image/png'))
  }
  finally {
    URL.revokeObjectURL(url)
  }
}

export function downloadBlob(blob: Blob, name: string) {
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = name
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 1000)
}
