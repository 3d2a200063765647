// Rewrites one measured section of docs/performance.md, between its start and end marks.
import { readFileSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'

export function replaceDocSection(name: string, body: string) {
  const doc = resolve(import.meta.dirname, '../../docs/performance.md')
  const text = readFileSync(doc, 'utf8')
  const start = `<!-- bench:${name}:start -->`
  const end = `<!-- bench:${name}:end -->`
  const i = text.indexOf(start)
  const j = text.indexOf(end)
  if (i >= 0 && j > i) writeFileSync(doc, `${text.slice(0, i + start.length)}\n${body}\n${text.slice(j)}`)
}
