import sriHashes from '#sri-hashes'
import { scriptsAfterPaint } from '../utils/scripts-after-paint'

/**
 * Every server-rendered page is painted before its scripts are asked for. The page the server sends is
 * complete to read; hydrating it is one long piece of work during which a phone cannot paint, and the
 * scripts' download competes with the page's own first paint on a slow link. So the HTML carries no
 * module script tag and no module preload: a small inline module (`scriptsAfterPaint`) waits until the
 * first contentful paint is on the screen (at once in a hidden tab, where frames do not come), then
 * preloads the same modules and imports the entry. The modules keep their integrity
 * hashes (from nuxt-security's table of the build) through an import map. This hook runs before
 * nuxt-security's page hooks, which then give the loader and the map the page's CSP nonce like every other
 * script element (tests/api/security-headers.test.ts checks both).
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:html', (html) => {
    html.head = scriptsAfterPaint(html.head, sriHashes)
  })
})
