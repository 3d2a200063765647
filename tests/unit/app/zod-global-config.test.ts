// app/plugins/zod-jitless.client.ts switches zod's JIT off in the browser without importing zod: it writes zod's
// global configuration object before zod loads. This checks that zod (the version installed) takes that object as
// its own, so the setting reaches every schema's parser and zod never probes for `new Function`.
import { afterAll, describe, expect, it } from 'vitest'

type Holder = typeof globalThis & { __zod_globalConfig?: { jitless?: boolean } }
const holder = globalThis as Holder
const before = holder.__zod_globalConfig?.jitless

describe('zod\'s global configuration set before zod loads', () => {
  afterAll(() => {
    if (holder.__zod_globalConfig) holder.__zod_globalConfig.jitless = before
  })

  it('is the object zod reads: jitless is on in z.config() and stays off when unset', async () => {
    holder.__zod_globalConfig = Object.assign(holder.__zod_globalConfig ?? {}, { jitless: true })
    const { z } = await import('zod')
    expect(z.config().jitless).toBe(true)
    // The same object, not a copy: a change after zod loaded is seen by zod too.
    holder.__zod_globalConfig.jitless = false
    expect(z.config().jitless).toBe(false)
    holder.__zod_globalConfig.jitless = true
    // Parsers still work jitless (an object schema, the kind zod would compile).
    const schema = z.object({ depth: z.number().min(0).max(500), code: z.string().min(1) })
    expect(schema.parse({ depth: 12.5, code: 'EST' })).toEqual({ depth: 12.5, code: 'EST' })
    expect(schema.safeParse({ depth: -1, code: '' }).success).toBe(false)
  })
})
