// tailwind.config.ts: Tailwind's per-element defaults (the --tw-* custom properties that rings, shadows, transforms
// and filters read) are set only on the elements whose classes use them, not on every element and pseudo-element.
// A component's own <style> block is compiled apart from the app's stylesheet, so a utility it @applies must not read
// a default it does not set itself: these tests compile every such block with the project's config and look.
import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import postcss, { type Rule } from 'postcss'
import tailwindcss from 'tailwindcss'
import { describe, expect, it } from 'vitest'
import config from '../../../tailwind.config'

const root = join(import.meta.dirname, '../../..')

function files(dir: string, pattern: RegExp): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const path = join(dir, e.name)
    if (e.isDirectory()) return files(path, pattern)
    return pattern.test(e.name) ? [path] : []
  })
}

/** The project's Tailwind configuration with the given markup as its only content. */
function compile(css: string, markup = ''): Promise<postcss.Result> {
  return postcss([tailwindcss({ ...config, content: [{ raw: markup, extension: 'html' }] })]).process(css, { from: undefined })
}

/**
 * The --tw-* custom properties a rule reads with var() (and no fallback) but does not set itself. Inheritance aside,
 * nothing else sets them any more: the app's stylesheet sets them only on the elements of the classes that use them.
 */
function unsetDefaults(result: postcss.Result): string[] {
  const unset: string[] = []
  result.root.walkRules((rule: Rule) => {
    const declared = new Set<string>()
    rule.walkDecls(d => { if (d.prop.startsWith('--tw-')) declared.add(d.prop) })
    rule.walkDecls((d) => {
      for (const m of d.value.matchAll(/var\((--tw-[\w-]+)\s*([,)])/g)) {
        if (m[2] === ')' && !declared.has(m[1]!)) unset.push(`${rule.selector} { ${d.prop} } reads ${m[1]}`)
      }
    })
  })
  return unset
}

describe('Tailwind defaults', () => {
  it('are set on the elements that use them, not on every element', async () => {
    const result = await compile('@tailwind base; @tailwind utilities;', '<div class="ring-2 shadow rotate-45 p-2"></div>')
    const setting = (prop: string) => {
      const selectors: string[] = []
      result.root.walkRules((rule: Rule) => { if (rule.some(n => n.type === 'decl' && n.prop === prop)) selectors.push(...rule.selectors) })
      return selectors
    }
    // No universal rule or ::backdrop rule carries them (they did, about fifty on every element).
    for (const prop of ['--tw-ring-inset', '--tw-shadow', '--tw-rotate', '--tw-blur', '--tw-pan-x']) {
      expect(setting(prop).filter(s => /^(?:\*|::?before|::?after|::backdrop)$/.test(s.trim()))).toEqual([])
    }
    // The classes that read them set them: the ring, the shadow and the transform have what they read, and no other.
    expect(setting('--tw-ring-inset')).toContain('.ring-2')
    expect(setting('--tw-shadow')).toEqual(expect.arrayContaining(['.ring-2', '.shadow']))
    expect(setting('--tw-rotate')).toContain('.rotate-45')
    expect([...setting('--tw-ring-inset'), ...setting('--tw-rotate')]).not.toContain('.p-2')
    expect(setting('--tw-blur')).toEqual([])
  })

  it('finds a rule that reads a default it does not set', async () => {
    const found = unsetDefaults(await compile('.x:focus-visible { @apply ring-2 ring-ochre-400; }'))
    expect(found.some(f => f.includes('--tw-ring-inset'))).toBe(true)
    expect(unsetDefaults(await compile('.y { @apply border-b px-1 text-sm text-silt-700 bg-silt-50; }'))).toEqual([])
  })

  it('are not read by any component style block that does not set them', async () => {
    const blocks = files(join(root, 'app'), /\.vue$/).flatMap((f) => {
      const text = readFileSync(f, 'utf8')
      return [...text.matchAll(/<style[^>]*>([\s\S]*?)<\/style>/g)].map(m => ({ file: relative(root, f), css: m[1]! }))
    })
    expect(blocks.filter(b => b.css.includes('@apply')).length).toBeGreaterThanOrEqual(2)
    const found: string[] = []
    for (const b of blocks) found.push(...unsetDefaults(await compile(b.css)).map(f => `${b.file}: ${f}`))
    expect(found).toEqual([])
  })
})
