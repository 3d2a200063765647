// tailwind.config.ts: Tailwind's per-element defaults (the --tw-* custom properties that rings, shadows, transforms
// and filters read) are set only on the elements whose classes use them, not on every element and pseudo-element.
// A component's own <style> block is compiled apart from the app's stylesheet, so a utility it @applies must not read
// a default it does not set itself: these tests compile every such block with the project's config and look.
import { readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import postcss, { type Rule } from 'postcss'
import tailwindcss from 'tailwindcss'
import { describe, expect, it } from 'vitest'
import { sourceFiles } from '../../helpers/source-files'
import config from '../../../tailwind.config'

const root = join(import.meta.dirname, '../../..')

/** The project's Tailwind configuration with the given markup as its only content. */
function compile(css: string, markup = ''): Promise<postcss.Result> {
  return postcss([tailwindcss({ ...config, content: [{ raw: markup, extension: 'html' }] })]).process(css, { from: undefined })
}

/**
 * The --tw-* custom properties a rule's own properties read through var() with no fallback, directly or through the
 * custom properties it sets itself, that the rule does not set (a shadow's unused `--tw-shadow-colored` reads nothing).
 */
function readsUnset(rule: Rule): string[] {
  const declared = new Map<string, string>()
  rule.walkDecls(d => { if (d.prop.startsWith('--')) declared.set(d.prop, d.value) })
  const unset = new Set<string>()
  const seen = new Set<string>()
  const visit = (value: string) => {
    for (const m of value.matchAll(/var\((--tw-[\w-]+)\s*([,)])/g)) {
      const prop = m[1]!
      if (m[2] !== ')' || seen.has(prop)) continue
      seen.add(prop)
      const own = declared.get(prop)
      if (own === undefined) unset.add(prop)
      else visit(own)
    }
  }
  rule.walkDecls(d => { if (!d.prop.startsWith('--')) visit(d.value) })
  return [...unset]
}

/** The defaults a component's rules read and do not set: nothing else sets them on its elements. */
function unsetDefaults(result: postcss.Result): string[] {
  const unset: string[] = []
  result.root.walkRules((rule: Rule) => {
    for (const prop of readsUnset(rule)) unset.push(`${rule.selector} reads ${prop}`)
  })
  return unset
}

/**
 * The element part of a selector, as Tailwind sets a rule's defaults on it: the last compound without its
 * pseudo-classes (`.log-grid .cell:focus` → `.cell`, `.peer:checked ~ .peer-checked\:ring-2` → `.peer-checked\:ring-2`).
 */
function elementPart(selector: string): string {
  const last = selector.trim().split(/\s*[\s>+~]\s*(?![^(]*\))/).at(-1) ?? ''
  const tokens = last.match(/(?:\\.|[^.#[:])+|[.#](?:\\.|[\w-])+|\[[^\]]*\]|::?[\w-]+(?:\([^)]*\))?/g) ?? []
  const simple = tokens.filter(t => !/^:[^:]/.test(t) && !t.startsWith('::'))
  return simple.at(-1) ?? ''
}

describe('Tailwind defaults', () => {
  it('finds the element part of a selector', () => {
    expect(elementPart('.log-grid .cell:focus')).toBe('.cell')
    expect(elementPart('.peer:checked~.peer-checked\\:ring-2')).toBe('.peer-checked\\:ring-2')
    expect(elementPart('.focus-visible\\:ring-2:focus-visible')).toBe('.focus-visible\\:ring-2')
    expect(elementPart(':focus-visible')).toBe('')
  })

  it('in the app\'s stylesheet: no rule has an empty selector, and every default a rule reads is set on its elements', async () => {
    const css = readFileSync(join(root, 'app/assets/css/main.css'), 'utf8')
    const result = await postcss([tailwindcss(config)]).process(css, { from: join(root, 'app/assets/css/main.css') })
    const setters = new Map<string, Set<string>>()
    const rules: Rule[] = []
    result.root.walkRules((rule: Rule) => {
      rules.push(rule)
      rule.walkDecls((d) => {
        if (d.prop.startsWith('--tw-')) for (const sel of rule.selectors) setters.set(d.prop, (setters.get(d.prop) ?? new Set()).add(sel.trim()))
      })
    })
    expect(rules.length).toBeGreaterThan(300)
    // An empty selector in a list makes the browser drop the whole rule (a defaults rule among them).
    expect(rules.filter(r => r.selectors.some(sel => sel.trim() === '')).map(r => r.selector.slice(0, 80))).toEqual([])
    const unset: string[] = []
    for (const rule of rules) {
      for (const prop of readsUnset(rule)) {
        for (const sel of rule.selectors) {
          const element = elementPart(sel)
          if (!element || !setters.get(prop)?.has(element)) unset.push(`${sel} reads ${prop}`)
        }
      }
    }
    expect(unset).toEqual([])
  })

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
    const blocks = sourceFiles(join(root, 'app'), /\.vue$/).flatMap((f) => {
      const text = readFileSync(f, 'utf8')
      return [...text.matchAll(/<style[^>]*>([\s\S]*?)<\/style>/g)].map(m => ({ file: relative(root, f), css: m[1]! }))
    })
    expect(blocks.filter(b => b.css.includes('@apply')).length).toBeGreaterThanOrEqual(2)
    const found: string[] = []
    for (const b of blocks) found.push(...unsetDefaults(await compile(b.css)).map(f => `${b.file}: ${f}`))
    expect(found).toEqual([])
  })
})
