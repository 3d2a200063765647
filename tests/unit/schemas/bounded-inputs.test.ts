// Every input schema, walked leaf by leaf: each string refuses a NUL character and an
// unpaired surrogate (the one shared text type), and each number refuses 1e308 and,
// when whole, 2^31 (PostgreSQL's integer range). Response shapes are not inputs.
import type { z } from 'zod'
import { describe, expect, it } from 'vitest'
import * as attachments from '../../../shared/schemas/attachments'
import * as auth from '../../../shared/schemas/auth'
import * as calc from '../../../shared/schemas/calc'
import * as common from '../../../shared/schemas/common'
import * as imports from '../../../shared/schemas/imports'
import * as investigation from '../../../shared/schemas/investigation'
import * as lab from '../../../shared/schemas/lab'
import * as models from '../../../shared/schemas/models'
import * as projects from '../../../shared/schemas/projects'
import * as review from '../../../shared/schemas/review'
import { SiteModelDefinitionSchema } from '../../../shared/site-model/definition'

interface Def { type: string, [k: string]: unknown }
const defOf = (s: z.ZodType): Def => (s as unknown as { _zod: { def: Def } })._zod.def

/** Every string and number leaf of a schema, with its path (`*` for array items and record values). */
function leaves(schema: z.ZodType, path = '', out: { path: string, kind: 'string' | 'number', schema: z.ZodType }[] = [], seen = new Set<unknown>()): typeof out {
  if (seen.has(schema)) return out
  seen.add(schema)
  const d = defOf(schema)
  const walk = (s: unknown, p: string) => leaves(s as z.ZodType, p, out, seen)
  switch (d.type) {
    case 'string': out.push({ path, kind: 'string', schema }); break
    case 'number': out.push({ path, kind: 'number', schema }); break
    case 'object': for (const [k, v] of Object.entries(d.shape as Record<string, unknown>)) walk(v, path ? `${path}.${k}` : k); break
    case 'array': walk(d.element, `${path}.*`); break
    case 'tuple': (d.items as unknown[]).forEach((v, i) => walk(v, `${path}.${i}`)); break
    case 'record': walk(d.keyType, `${path}.<key>`); walk(d.valueType, `${path}.*`); break
    case 'union': (d.options as unknown[]).forEach(v => walk(v, path)); break
    case 'intersection': walk(d.left, path); walk(d.right, path); break
    case 'pipe': walk(d.in, path); break
    case 'optional': case 'nullable': case 'default': case 'prefault': case 'readonly': case 'nonoptional': case 'catch': walk(d.innerType, path); break
    default: break
  }
  return out
}

const isZod = (v: unknown): v is z.ZodType => typeof v === 'object' && v !== null && '_zod' in v
const EXPORTS: [string, unknown][] = [
  ...Object.entries({ ...attachments, ...auth, ...calc, ...common, ...imports, ...investigation, ...lab, ...models, ...projects, ...review }),
  ['SiteModelDefinitionSchema', SiteModelDefinitionSchema],
]
const INPUTS = EXPORTS.filter((e): e is [string, z.ZodType] => isZod(e[1]) && e[0].endsWith('Schema') && !/Response|ApiError|Row|StressPoint/.test(e[0]))

describe('every input schema is bounded', () => {
  it('finds the input schemas and their leaves', () => {
    expect(INPUTS.length).toBeGreaterThan(40)
    expect(INPUTS.map(([n]) => n)).toEqual(expect.arrayContaining(['SettlementRequestSchema', 'CreateTokenSchema', 'AttachmentFieldsSchema', 'GroundwaterUpdateSchema', 'SiteModelDefinitionSchema']))
  })

  for (const [name, schema] of INPUTS) {
    it(name, () => {
      const problems: string[] = []
      for (const leaf of leaves(schema)) {
        if (leaf.kind === 'string') {
          for (const bad of ['a\u0000b', 'ok\ud800', '\udc00']) {
            if (leaf.schema.safeParse(bad).success) problems.push(`${leaf.path} takes ${JSON.stringify(bad)}`)
          }
          if (leaf.schema.safeParse('x'.repeat(10_001)).success) problems.push(`${leaf.path} takes 10 001 characters`)
        }
        else {
          if (leaf.schema.safeParse(1e308).success) problems.push(`${leaf.path} takes 1e308`)
          if (leaf.schema.safeParse(-1e308).success) problems.push(`${leaf.path} takes -1e308`)
          const whole = (leaf.schema as unknown as { _zod: { bag: { format?: string } } })._zod.bag.format
          if (whole && leaf.schema.safeParse(2 ** 31).success) problems.push(`${leaf.path} (whole number) takes 2^31`)
        }
      }
      expect(problems).toEqual([])
    })
  }

  it('dates stay within 1900–2100', () => {
    expect(common.IsoDateSchema.safeParse('0000-01-01').success).toBe(false)
    expect(common.IsoDateSchema.safeParse('9999-12-31').success).toBe(false)
    expect(common.IsoDateSchema.safeParse('2025-03-01').success).toBe(true)
    expect(common.IsoDateTimeSchema.safeParse('0000-01-01T00:00:00Z').success).toBe(false)
    expect(common.IsoDateTimeSchema.safeParse('9999-12-31T23:59:59Z').success).toBe(false)
    expect(common.IsoDateTimeSchema.safeParse('2025-03-01T09:00:00+01:00').success).toBe(true)
  })

  it('the shared text type keeps proper surrogate pairs and refuses with a plain message', () => {
    expect(common.str(10).safeParse('σ\'p 😀').success).toBe(true)
    const r = common.str(10).safeParse('a\u0000')
    expect(r.success).toBe(false)
    expect(r.error?.issues[0]?.message).toBe(common.PLAIN_TEXT_MESSAGE)
  })
})
