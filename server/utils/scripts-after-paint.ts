/** A module tag of the page's head: its URL and, when set, its integrity hash. */
interface ModuleRef { href: string, integrity: string | null }

const PRELOAD_RE = /<link\b[^>]*\brel="modulepreload"[^>]*>/g
const ENTRY_RE = /<script\b[^>]*\btype="module"[^>]*\bsrc="([^"]+)"[^>]*><\/script>/
const attr = (tag: string, name: string) => new RegExp(`\\b${name}="([^"]*)"`).exec(tag)?.[1] ?? null

/**
 * The page's head with its module script and module preloads replaced by an import map (the modules'
 * integrity hashes: the tag's own, else the build's table `hashes`) and an inline loader that preloads and
 * imports them once the first frame is painted. The two new script elements get their CSP nonce from
 * nuxt-security, which adds it to every script element of the page after this runs.
 * Only same-origin paths are taken (`/…`); a head without an entry module is returned as it is.
 */
export function scriptsAfterPaint(head: string[], hashes: Readonly<Record<string, string>>): string[] {
  let entry: ModuleRef | null = null
  const preloads: ModuleRef[] = []
  const out = head.map((chunk) => {
    let s = chunk.replace(PRELOAD_RE, (tag) => {
      const href = attr(tag, 'href')
      if (!href?.startsWith('/')) return tag
      preloads.push({ href, integrity: attr(tag, 'integrity') ?? hashes[href] ?? null })
      return ''
    })
    if (!entry) {
      s = s.replace(ENTRY_RE, (tag, src: string) => {
        if (!src.startsWith('/')) return tag
        entry = { href: src, integrity: attr(tag, 'integrity') ?? hashes[src] ?? null }
        return ''
      })
    }
    return s
  })
  const found = entry as ModuleRef | null
  if (!found) return head
  const integrity: Record<string, string> = {}
  for (const m of [found, ...preloads]) if (m.integrity) integrity[m.href] = m.integrity
  // JSON in a script element: "<" is escaped so no value can close the element.
  const json = (v: unknown) => JSON.stringify(v).replace(/</g, '\\u003c')
  const importMap = `<script type="importmap">${json({ integrity })}</script>`
  const loader = `<script type="module">${loaderSource(found.href, preloads.map(p => p.href), json)}</script>`
  out.push(importMap + loader)
  return out
}

/**
 * The loader: once the page's first contentful paint has been presented (its paint timing entry is reported
 * then, not when the frame is drawn), or at once in a hidden tab, where no frame comes until it is shown;
 * after 3 s whatever happened (a page with nothing contentful to paint).
 */
function loaderSource(entry: string, preloads: string[], json: (v: unknown) => string): string {
  return [
    `const e=${json(entry)},p=${json(preloads)};let d=0;`,
    'const go=()=>{if(d)return;d=1;for(const h of p){const l=document.createElement("link");l.rel="modulepreload";l.href=h;document.head.append(l)}import(e)};',
    'if(document.visibilityState==="hidden")go();else{setTimeout(go,3000);',
    'new PerformanceObserver((l,o)=>{if(l.getEntriesByName("first-contentful-paint").length){o.disconnect();setTimeout(go,0)}}).observe({type:"paint",buffered:true})}',
  ].join('')
}
