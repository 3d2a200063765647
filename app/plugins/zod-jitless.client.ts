// zod compiles object parsers with `new Function` when it may; the page's Content-Security-Policy forbids eval,
// and zod's probe for it is reported as a violation. In the browser it runs its interpreted parsers instead.
// The setting is put in zod's global configuration object (`globalThis.__zod_globalConfig`, which zod takes as
// its own when it loads, as `z.config()` would write it), so this plugin does not bring zod into every page's
// first script: zod loads with the pages and forms that use it. The browser tests fail on any CSP violation.
interface ZodGlobalConfig { jitless?: boolean }
const holder = globalThis as typeof globalThis & { __zod_globalConfig?: ZodGlobalConfig }
holder.__zod_globalConfig = Object.assign(holder.__zod_globalConfig ?? {}, { jitless: true })

export default defineNuxtPlugin({ name: 'zod-jitless', enforce: 'pre', setup() {} })
