// DEVELOPERS.md: reply types have one home, shared/types/. No file under app/ declares a type or interface of a
// name shared/types/ exports (it imports it instead), so a client copy cannot drift from the server's reply.
import { readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import { sourceFiles } from '../../helpers/source-files'

const root = join(import.meta.dirname, '../../..')

/** Names a file declares as its own types (`interface X`, `type X =`), not the ones it imports. */
function declaredTypes(text: string): string[] {
  return [...text.matchAll(/^\s*(?:export\s+)?(?:interface\s+([A-Z]\w*)|type\s+([A-Z]\w*)\s*(?:<[^=]*>)?\s*=)/gm)].map(m => (m[1] ?? m[2])!)
}

describe('reply types', () => {
  it('reads declared names and leaves imported ones', () => {
    expect(declaredTypes(`import { type A } from 'x'\ninterface B { a: 1 }\nexport type C<T> = T[]\n  type D = string\nconst type = 1`)).toEqual(['B', 'C', 'D'])
  })

  it('are declared in shared/types/ only: no file in app/ declares one of their names again', () => {
    const shared = new Set(sourceFiles(join(root, 'shared/types'), /\.ts$/).flatMap(f => [...readFileSync(f, 'utf8').matchAll(/^export\s+(?:interface|type)\s+([A-Z]\w*)/gm)].map(m => m[1]!)))
    expect(shared.size).toBeGreaterThan(150)
    const again = sourceFiles(join(root, 'app'), /\.(?:ts|vue)$/).flatMap(f => declaredTypes(readFileSync(f, 'utf8')).filter(n => shared.has(n)).map(n => `${relative(root, f)}: ${n}`))
    expect(again).toEqual([])
  })
})
