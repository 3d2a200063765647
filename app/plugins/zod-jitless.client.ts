import { z } from 'zod'

// zod compiles object parsers with `new Function` when it may; the page's Content-Security-Policy forbids eval,
// and zod's probe for it is reported as a violation. In the browser it runs its interpreted parsers instead.
z.config({ jitless: true })

export default defineNuxtPlugin({ name: 'zod-jitless', enforce: 'pre', setup() {} })
