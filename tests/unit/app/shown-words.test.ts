import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

// Text people read cites its sources; the note that a value was recalled rather than looked up belongs in
// docs/ and tests, never on a page. This reads every page and component template and the strings the
// server and engine write into replies and reports.
const ROOT = join(__dirname, '..', '..', '..')

function files(dir: string, ext: RegExp): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? files(path, ext) : ext.test(name) ? [path] : []
  })
}

/** The template of a single-file component (what the page shows). */
const template = (source: string) => source.slice(source.indexOf('<template>'))

/** String literals of a TypeScript source, without its comments. */
function literals(source: string): string[] {
  const code = source.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '')
  return [...code.matchAll(/'(?:[^'\\\n]|\\.)*'|`(?:[^`\\]|\\.)*`|"(?:[^"\\\n]|\\.)*"/g)].map(m => m[0])
}

const RECALLED = /\bmemory\)|\(memory|, memory\b|recalled/i

describe('words shown to users', () => {
  it('never say a value was recalled, in any page or component', () => {
    const found = files(join(ROOT, 'app'), /\.vue$/).filter(f => RECALLED.test(template(readFileSync(f, 'utf8')))).map(f => relative(ROOT, f))
    expect(found).toEqual([])
  })

  it('never say so in a string the server or the engine writes', () => {
    const found = [...files(join(ROOT, 'shared'), /\.ts$/), ...files(join(ROOT, 'server'), /\.ts$/)]
      .flatMap(f => literals(readFileSync(f, 'utf8')).filter(s => RECALLED.test(s)).map(s => `${relative(ROOT, f)}: ${s.slice(0, 80)}`))
    expect(found).toEqual([])
  })
})
