import { readdirSync } from 'node:fs'
import { join } from 'node:path'

/** Every file under `dir` (at any depth) whose name matches `pattern`: the tree checks read the sources with it. */
export function sourceFiles(dir: string, pattern: RegExp): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name)
    if (e.isDirectory()) return sourceFiles(path, pattern)
    return pattern.test(e.name) ? [path] : []
  })
}
