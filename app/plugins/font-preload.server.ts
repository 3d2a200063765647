import latin400 from '@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff2?url'
import latin600 from '@fontsource/source-sans-3/files/source-sans-3-latin-600-normal.woff2?url'

/**
 * The two Latin faces of Source Sans 3 every page's first screen uses (regular and semibold) are asked for with the
 * HTML: with the CSS written into the page, the first paint comes before the stylesheet's font requests would, and
 * the faces are `font-display: optional` (tailwind.config.ts), so a face not there by then is not used on that
 * page. The shell's heavier text (the name, the initials, the inbox count) is semibold too, so no third face is
 * fetched and decoded before the first paint (a browser test checks that the text of the overview, stress-model and
 * run pages uses no other weight; drawings, built after the first paint, may).
 */
export default defineNuxtPlugin(() => {
  useHead({
    link: [latin400, latin600].map(href => ({ rel: 'preload', as: 'font', type: 'font/woff2', href, crossorigin: 'anonymous' })),
  })
})
