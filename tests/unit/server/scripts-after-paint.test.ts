import { describe, expect, it } from 'vitest'
import { scriptsAfterPaint } from '../../../server/utils/scripts-after-paint'

const HEAD = [
  '<meta charset="utf-8"><title>Projects · Pastload</title>',
  '<link nonce="N1" integrity="sha384-font" rel="preload" as="font" type="font/woff2" href="/_nuxt/sans.woff2" crossorigin="anonymous">'
  + '<link nonce="N1" integrity="sha384-aaa" rel="modulepreload" as="script" crossorigin href="/_nuxt/entry.js">'
  + '<link nonce="N1" integrity="sha384-bbb" rel="modulepreload" as="script" crossorigin href="/_nuxt/page.js">'
  + '<script nonce="N1" integrity="sha384-aaa" type="module" src="/_nuxt/entry.js" crossorigin></script>',
  '<link nonce="N1" rel="icon" type="image/svg+xml" href="/favicon.svg">',
]

describe('scriptsAfterPaint: the page is painted before its scripts are asked for', () => {
  it('takes the module script and module preloads out of the head and leaves the other tags', () => {
    const out = scriptsAfterPaint(HEAD, {}).join('')
    expect(out).not.toMatch(/<link[^>]*rel="modulepreload"/)
    expect(out).not.toMatch(/<script[^>]*\bsrc=/)
    expect(out).toContain('rel="preload" as="font"')
    expect(out).toContain('<title>Projects · Pastload</title>')
    expect(out).toContain('rel="icon"')
  })

  it('keeps every module\'s integrity hash in an import map: the tag\'s own, else the build\'s', () => {
    const out = scriptsAfterPaint(HEAD, {}).join('')
    const map = /<script type="importmap">(.*?)<\/script>/.exec(out)?.[1]
    expect(JSON.parse(map!)).toEqual({ integrity: { '/_nuxt/entry.js': 'sha384-aaa', '/_nuxt/page.js': 'sha384-bbb' } })
    const bare = [HEAD[1]!.replace(/ integrity="[^"]*"/g, '')]
    const fromTable = /<script type="importmap">(.*?)<\/script>/.exec(scriptsAfterPaint(bare, { '/_nuxt/entry.js': 'sha384-ccc', '/_nuxt/page.js': 'sha384-ddd' }).join(''))?.[1]
    expect(JSON.parse(fromTable!)).toEqual({ integrity: { '/_nuxt/entry.js': 'sha384-ccc', '/_nuxt/page.js': 'sha384-ddd' } })
    const loader = /<script type="module">(.*?)<\/script>/.exec(out)?.[1]
    expect(loader).toContain('const e="/_nuxt/entry.js",p=["/_nuxt/entry.js","/_nuxt/page.js"]')
  })

  /** Runs the loader with a fake browser: timers, the paint observer and the document are in the test's hands. */
  function runLoader(visibilityState: 'visible' | 'hidden') {
    const loader = /<script type="module">(.*?)<\/script>/.exec(scriptsAfterPaint(HEAD, {}).join(''))![1]!
    const timers: { f: () => void, ms: number }[] = []
    const observers: { cb: (l: { getEntriesByName: (n: string) => unknown[] }, o: { disconnect: () => void }) => void, type?: string }[] = []
    const appended: string[] = []
    const imported: string[] = []
    class FakeObserver {
      constructor(public cb: (l: { getEntriesByName: (n: string) => unknown[] }, o: { disconnect: () => void }) => void) {}
      observe(o: { type: string }) { observers.push({ cb: this.cb, type: o.type }) }
    }
    const document = { visibilityState, createElement: () => ({}), head: { append: (l: { rel: string, href: string }) => appended.push(`${l.rel} ${l.href}`) } }
    new Function('setTimeout', 'PerformanceObserver', 'document', '__import', loader.replace('import(e)', '__import(e)'))(
      (f: () => void, ms: number) => timers.push({ f, ms }), FakeObserver, document, (u: string) => imported.push(u),
    )
    const paint = (name: string) => observers.forEach(o => o.cb({ getEntriesByName: (n: string) => (n === name ? [{}] : []) }, { disconnect: () => {} }))
    const runTimers = (upTo: number) => timers.filter(t => t.ms <= upTo).forEach(t => t.f())
    return { timers, observers, appended, imported, paint, runTimers }
  }

  it('the loader imports the entry once, after the first contentful paint is presented, preloading the modules first', () => {
    const b = runLoader('visible')
    expect(b.observers.map(o => o.type)).toEqual(['paint'])
    b.runTimers(0)
    expect(b.imported).toEqual([])
    b.paint('first-paint')
    b.runTimers(0)
    expect(b.imported).toEqual([])
    b.paint('first-contentful-paint')
    b.runTimers(0)
    expect(b.appended).toEqual(['modulepreload /_nuxt/entry.js', 'modulepreload /_nuxt/page.js'])
    expect(b.imported).toEqual(['/_nuxt/entry.js'])
    // The 3 s safety timer finds the work done.
    b.runTimers(3000)
    expect(b.imported).toEqual(['/_nuxt/entry.js'])
  })

  it('in a hidden tab the loader imports at once; a page that never paints anything contentful gets its scripts after 3 s', () => {
    const hidden = runLoader('hidden')
    expect(hidden.imported).toEqual(['/_nuxt/entry.js'])
    expect(hidden.observers).toEqual([])
    const blank = runLoader('visible')
    expect(blank.timers.map(t => t.ms)).toEqual([3000])
    blank.runTimers(3000)
    expect(blank.imported).toEqual(['/_nuxt/entry.js'])
  })

  it('leaves a head without a same-origin entry module as it is', () => {
    const plain = ['<meta charset="utf-8"><title>Error</title>']
    expect(scriptsAfterPaint(plain, {})).toBe(plain)
    const foreign = ['<script type="module" src="https://cdn.invalid/x.js"></script>']
    expect(scriptsAfterPaint(foreign, {})).toBe(foreign)
  })

  it('escapes "<" in the JSON it writes into a script element', () => {
    const out = scriptsAfterPaint(['<script type="module" src="/_nuxt/a</script>.js"></script>'], {}).join('')
    expect(out).not.toContain('a</script>.js"')
  })
})
