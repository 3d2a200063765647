/**
 * The web font's faces are `font-display: optional` (tailwind.config.ts): when they arrive after a first visit's first
 * paint, that page stays in the device's sans-serif rather than being set again and moving under the reader. From the
 * visit's first navigation on (a click or a key: the page is being replaced anyway, and a shift that follows an input
 * is not one the reader is surprised by) the same faces, cached by then, are added once more with `swap`, so the rest
 * of the visit is set in Source Sans 3 whatever the first page did.
 */
function optionalFaces(): FontFace[] {
  const faces: FontFace[] = []
  for (const sheet of Array.from(document.styleSheets)) {
    let rules: CSSRuleList
    try {
      rules = sheet.cssRules
    }
    catch {
      continue // a sheet of another origin cannot be read (the app has none)
    }
    for (const rule of Array.from(rules)) {
      if (!(rule instanceof CSSFontFaceRule) || rule.style.getPropertyValue('font-display') !== 'optional') continue
      const s = rule.style
      // The rule gives the family as CSS (quoted); FontFace takes the bare name.
      const family = s.getPropertyValue('font-family').trim().replace(/^(["'])(.*)\1$/, '$2')
      faces.push(new FontFace(family, s.getPropertyValue('src'), {
        weight: s.getPropertyValue('font-weight') || 'normal',
        style: s.getPropertyValue('font-style') || 'normal',
        unicodeRange: s.getPropertyValue('unicode-range') || 'U+0-10FFFF',
        display: 'swap',
      }))
    }
  }
  return faces
}

export default defineNuxtPlugin({
  name: 'web-font-swap',
  setup(nuxtApp) {
    const router = useRouter()
    nuxtApp.hooks.hookOnce('app:suspense:resolve', () => {
      const stop = router.beforeEach(() => {
        stop()
        for (const face of optionalFaces()) document.fonts.add(face)
      })
    })
  },
})
