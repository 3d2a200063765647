import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/** Reading PDFs back in tests with poppler-utils (installed by `npm test`). */

function withFile<T>(pdf: Uint8Array, fn: (path: string, dir: string) => T): T {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-pdf-'))
  try {
    const path = join(dir, 'report.pdf')
    writeFileSync(path, pdf)
    return fn(path, dir)
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/**
 * The text of every page, pages split at form feeds: laid out as on the page (`-layout`), or in the order
 * it was drawn (`raw`: a rotated line such as the not-approved band stays in one piece).
 */
export function pdfPagesText(pdf: Uint8Array, mode: 'layout' | 'raw' = 'layout'): string[] {
  return withFile(pdf, (path) => {
    const text = execFileSync('pdftotext', [`-${mode}`, '-enc', 'UTF-8', path, '-'], { encoding: 'utf8' })
    return text.split('\f').slice(0, -1)
  })
}

/** The whole text, pages joined. */
export function pdfText(pdf: Uint8Array): string {
  return pdfPagesText(pdf).join('\n')
}

/** Page count and size from `pdfinfo`. */
export function pdfInfo(pdf: Uint8Array): { pages: number, width: number, height: number } {
  return withFile(pdf, (path) => {
    const info = execFileSync('pdfinfo', [path], { encoding: 'utf8' })
    const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1])
    const size = /Page size:\s+([\d.]+) x ([\d.]+)/.exec(info)
    return { pages, width: Number(size?.[1]), height: Number(size?.[2]) }
  })
}

/** Renders page `page` (1-based) to `test-results/screenshots/<name>.png` with pdftoppm, to look at. */
export function pdfPageToPng(pdf: Uint8Array, name: string, page = 1, dpi = 100): string {
  const outDir = join(process.cwd(), 'test-results', 'screenshots')
  mkdirSync(outDir, { recursive: true })
  return withFile(pdf, (path, dir) => {
    execFileSync('pdftoppm', ['-f', String(page), '-l', String(page), '-r', String(dpi), '-png', '-singlefile', path, join(dir, 'page')])
    const png = readdirSync(dir).find(f => f.endsWith('.png'))!
    const target = join(outDir, `${name}.png`)
    renameSync(join(dir, png), target)
    return target
  })
}
