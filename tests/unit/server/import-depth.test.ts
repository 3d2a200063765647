// DEVELOPERS.md, "Imports on the server": no import in server/ climbs more than one level; code under server/ is
// imported as ~~/server/…, shared code as #shared/… (the worker entries' #shared through package.json's imports).
import { readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { sourceFiles } from '../../helpers/source-files'

const root = join(import.meta.dirname, '../../..')

/** Module specifiers of static imports, re-exports and dynamic imports. */
function specifiers(text: string): string[] {
  const out: string[] = []
  for (const m of text.matchAll(/(?:\bfrom\s*|\bimport\s*\(\s*|^\s*import\s+)['"]([^'"]+)['"]/gm)) out.push(m[1]!)
  return out
}

describe('imports under server/', () => {
  it('reads the specifiers of each kind of import', () => {
    expect(specifiers(`import a from '../x'\nexport { b } from "../../y"\nconst c = await import('../../../z')\nimport './side-effect'`))
      .toEqual(['../x', '../../y', '../../../z', './side-effect'])
  })

  it('climb one level at most', () => {
    const files = sourceFiles(join(root, 'server'), /\.(?:ts|mjs|js)$/)
    expect(files.length).toBeGreaterThan(100)
    const climbing = files.flatMap(f => specifiers(readFileSync(f, 'utf8')).filter(s => s.startsWith('../../')).map(s => `${relative(root, f)}: ${s}`))
    expect(climbing).toEqual([])
  })
})
