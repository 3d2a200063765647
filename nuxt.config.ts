// Pastload — Nuxt configuration. See DEVELOPERS.md for the architecture map.
import { cpSync, mkdirSync } from 'node:fs'
import { createRequire } from 'node:module'
import { basename, dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { REPORT_FONT_FILES } from './shared/reports/fonts'
import { workerBundleOptions } from './server/workers/bundle-options'

// Browser features the product never uses are switched off for every page.
const PERMISSIONS_POLICY: Record<string, string[]> = {
  'accelerometer': [], 'autoplay': [], 'camera': [], 'display-capture': [], 'encrypted-media': [], 'fullscreen': [],
  'geolocation': [], 'gyroscope': [], 'magnetometer': [], 'microphone': [], 'midi': [], 'payment': [],
  'picture-in-picture': [], 'publickey-credentials-get': [], 'screen-wake-lock': [], 'usb': [],
  'xr-spatial-tracking': [],
}
const PERMISSIONS_POLICY_HEADER = Object.keys(PERMISSIONS_POLICY).map(k => `${k}=()`).join(', ')
const NON_PAGE_HEADERS = {
  'cache-control': 'no-store',
  'content-security-policy': "default-src 'none'; frame-ancestors 'none'",
  'permissions-policy': PERMISSIONS_POLICY_HEADER,
}

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  future: { compatibilityVersion: 4 },
  devtools: { enabled: false },
  // Separate build folders let two checkouts' builds run side by side (e.g. a UI build while tests run).
  buildDir: process.env.PASTLOAD_BUILD_DIR ?? '.nuxt',
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-security', '@nuxt/eslint'],
  // Lint config is generated at one fixed path whatever the build folder; eslint.config.mjs extends it.
  eslint: { config: { configFile: '.nuxt/eslint.config.mjs', typescript: { strict: false } } },
  css: ['~/assets/css/main.css'],
  // The page's CSS (Tailwind's output with the font faces, about 7 kB compressed) is written into the HTML,
  // so the first paint waits for no stylesheet request.
  features: { inlineStyles: true },
  // A link's page is fetched when the pointer reaches the link or it takes the focus, not as soon as it is on
  // screen: the section navigation alone would otherwise load and run every project page right after each load.
  experimental: { defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } } },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Pastload',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Stress history from borehole to settlement' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  // Security headers (nuxt-security): a per-request nonce for every script and style element Nuxt renders
  // (the entry, its preloads, the hydration payload), 'strict-dynamic' for the chunks they load, no 'unsafe-eval'.
  // Only style *attributes* are allowed inline: pages rendered on the server carry Vue's :style bindings as
  // style="…" attributes (D3 and Vue set styles through the CSSOM afterwards, which CSP does not restrict).
  // The product has its own body limit, Origin check and sign-in throttle (server/middleware, services), so the
  // module's request-size limiter, CORS handler, rate limiter and XSS filter stay off.
  security: {
    nonce: true,
    sri: true,
    removeLoggers: false,
    hidePoweredBy: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ["'none'"],
        'base-uri': ["'none'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'frame-src': ["'none'"],
        'form-action': ["'self'"],
        'script-src': ["'self'", "'strict-dynamic'", "'nonce-{{nonce}}'"],
        'script-src-attr': ["'none'"],
        'style-src': ["'self'", "'nonce-{{nonce}}'"],
        'style-src-attr': ["'unsafe-inline'"],
        // data: for CSS-drawn fill patterns, blob: for the plot's PNG export (drawn from an SVG blob).
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'manifest-src': ["'self'"],
        'worker-src': ["'self'"],
        'upgrade-insecure-requests': false,
      },
      crossOriginEmbedderPolicy: 'require-corp',
      crossOriginOpenerPolicy: 'same-origin',
      crossOriginResourcePolicy: 'same-origin',
      referrerPolicy: 'same-origin',
      xFrameOptions: 'DENY',
      xContentTypeOptions: 'nosniff',
      strictTransportSecurity: { maxAge: 15552000, includeSubdomains: false },
      permissionsPolicy: PERMISSIONS_POLICY,
    },
    requestSizeLimiter: false,
    rateLimiter: false,
    xssValidator: false,
    corsHandler: false,
    allowedMethodsRestricter: false,
    csrf: false,
  },
  routeRules: {
    // The sign-in page is a plain form the browser sends itself (app/pages/login.vue): it is sent without scripts.
    '/login': { noScripts: true },
    // Everything that is not a page: JSON replies and downloads are never cached, framed or run as a document.
    '/api/**': { headers: NON_PAGE_HEADERS },
    '/exports/**': { headers: NON_PAGE_HEADERS },
    // The browser's workers (app/workers/, e.g. the stress workspace's canvas painter): a page that isolates itself
    // (COEP require-corp) may start a worker only from a script that does too; the worker itself fetches nothing.
    '/_nuxt/workers/**': { headers: { 'cross-origin-embedder-policy': 'require-corp', 'content-security-policy': "default-src 'none'" } },
  },
  tailwindcss: {
    cssPath: false,
    viewer: false,
  },
  nitro: {
    // The server applies the migrations itself when it starts (server/plugins/database.ts, then the demo seed
    // when PASTLOAD_SEED=demo); requests wait until that is done (server/middleware/00.ready.ts). scripts/start.mjs
    // only starts PostgreSQL and the object store and passes DATABASE_URL and PASTLOAD_MIGRATIONS_DIR. The database
    // URL is read from DATABASE_URL (or NUXT_DATABASE_URL) by server/db/client.ts, not from runtimeConfig.
    experimental: { openAPI: false },
    // The built scripts, styles and fonts are stored brotli- and gzip-compressed beside the originals and
    // served in the form the browser accepts (pages and JSON replies: server/plugins/compress-replies.ts).
    compressPublicAssets: { gzip: true, brotli: true },
    output: { dir: process.env.PASTLOAD_OUTPUT_DIR ?? '.output' },
    hooks: {
      // Worker threads (server/workers/*.mjs, e.g. the workbook reader) run as files of their own next to the
      // bundle; the packages they import are traced into .output because the bundle imports them too.
      async compiled(nitro) {
        // The workers that import the TypeScript engine are bundled into one plain file each, `<name>.bundle.mjs`
        // (server/workers/bundle-options.ts): the settlement run, the Monte Carlo task (a piscina task,
        // services/monte-carlo-pool.ts) and the report renderer (pdfmake resolved from .output's node_modules).
        const bundled: Record<string, { external?: string[] }> = { 'settlement-run.mjs': {}, 'monte-carlo.mjs': {}, 'report-render.mjs': { external: ['pdfmake'] } }
        // The others are copied as they are; neither the bundled entries nor the bundling options (TypeScript of the build's own) go along.
        cpSync(resolve(nitro.options.rootDir, 'server/workers'), join(nitro.options.output.serverDir, 'workers'), { recursive: true, filter: src => !src.endsWith('.ts') && !(basename(src) in bundled) })
        const { build } = await import('esbuild')
        const workers = join(nitro.options.output.serverDir, 'workers')
        for (const [entry, extra] of Object.entries(bundled)) await build(workerBundleOptions(nitro.options.rootDir, entry, join(workers, entry.replace(/\.mjs$/, '.bundle.mjs')), extra))
        // Reports embed Source Sans 3 from its TrueType files (server/services/reports/render.ts).
        const fonts = join(dirname(createRequire(import.meta.url).resolve('source-sans/package.json')), 'TTF')
        mkdirSync(join(nitro.options.output.serverDir, 'fonts'), { recursive: true })
        for (const f of Object.values(REPORT_FONT_FILES)) cpSync(join(fonts, f), join(nitro.options.output.serverDir, 'fonts', f))
        cpSync(join(fonts, '..', 'LICENSE.md'), join(nitro.options.output.serverDir, 'fonts', 'LICENSE.md'))
      },
    },
  },
  hooks: {
    // No <link rel="prefetch"> for every chunk a page might load later: on a phone's connection those requests
    // compete with the page's own first paint. A link's page is still fetched when the pointer or the focus
    // reaches it (experimental.defaults.nuxtLink above), and a chunk the page needs is fetched when it is needed.
    'build:manifest'(manifest) {
      for (const chunk of Object.values(manifest)) chunk.prefetch = false
    },
    // server/error.ts runs before Nuxt's page error handler and Nitro's JSON one: it logs an
    // unexpected error once, redacted, and answers a lost database connection with 503.
    'nitro:config'(config) {
      const others = config.errorHandler === undefined ? [] : [config.errorHandler].flat()
      config.errorHandler = [fileURLToPath(new URL('./server/error.ts', import.meta.url)), ...others]
    },
  },
  vite: {
    optimizeDeps: { include: ['d3', 'zod'] },
    // Small shared chunks (a composable, a two-line helper) are merged into a neighbour: a page then waits for
    // a few requests instead of thirty, which on a phone's connection is most of the time to the first paint.
    build: { rollupOptions: { output: { experimentalMinChunkSize: 20_000 } } },
    // Browser workers are built as one file each, in a folder of their own (its headers: routeRules above).
    worker: { rollupOptions: { output: { entryFileNames: '_nuxt/workers/[name]-[hash].js' } } },
  },
  typescript: {
    strict: true,
    typeCheck: false,
  },
})
