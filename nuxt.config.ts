// Pastload — Nuxt configuration. See DEVELOPERS.md for the architecture map.
import { cpSync } from 'node:fs'
import { join, resolve } from 'node:path'

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  future: { compatibilityVersion: 4 },
  devtools: { enabled: false },
  // Separate build folders let two checkouts' builds run side by side (e.g. a UI build while tests run).
  buildDir: process.env.PASTLOAD_BUILD_DIR ?? '.nuxt',
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt'],
  css: ['~/assets/css/main.css'],
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
  runtimeConfig: {
    // Overridden at run time by NUXT_DATABASE_URL / DATABASE_URL (see server/db/client.ts).
    databaseUrl: '',
  },
  tailwindcss: {
    cssPath: false,
    viewer: false,
  },
  nitro: {
    // Migrations are applied by scripts/start.mjs before the server listens; the
    // server also refuses to answer before its own readiness check (server/plugins/db.ts).
    experimental: { openAPI: false },
    output: { dir: process.env.PASTLOAD_OUTPUT_DIR ?? '.output' },
    hooks: {
      // Worker threads (server/workers/*.mjs, e.g. the workbook reader) run as files of their own next to the
      // bundle; the packages they import are traced into .output because the bundle imports them too.
      compiled(nitro) {
        cpSync(resolve(nitro.options.rootDir, 'server/workers'), join(nitro.options.output.serverDir, 'workers'), { recursive: true })
      },
    },
  },
  vite: {
    optimizeDeps: { include: ['d3', 'zod'] },
  },
  typescript: {
    strict: true,
    typeCheck: false,
  },
})
