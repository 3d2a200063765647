// Property-based request bodies for the write-route fuzz test (tests/api/fuzz-writes.test.ts):
// plausible bodies generated from a route's own zod schema (through zod 4's JSON Schema
// output), and hostile mutations of them (NUL bytes, lone surrogates, out-of-range
// numbers, impossible dates, wrong types, nested junk, malformed ids and flag targets).
import fc from 'fast-check'
import { z } from 'zod'

type Json = null | boolean | number | string | Json[] | { [k: string]: Json }
type JsonSchema = Record<string, unknown>

/** A marker for a raw JSON token the serializer writes unquoted (`-0`, `1e999`, `NaN`). */
const RAW = '\u0001raw:'

/** Hostile values, one family per group (see issue: zero 500s under hostile input). */
export const HOSTILE_VALUES: Json[] = [
  // NUL bytes and lone surrogates in text
  'a\u0000b', '\u0000', 'ok\ud800', '\udfff', '\ud800\u0000',
  // integers and floats out of every column's range
  2 ** 31, -(2 ** 31) - 1, 2 ** 53 + 2, 1e308, -1e308, 5e-324, `${RAW}-0`, `${RAW}1e999`, `${RAW}-1e999`,
  // numbers as text
  'NaN', 'Infinity', '-0', '1e308', '',
  // dates at the edges of the calendar
  '0000-01-01', '9999-12-31', '0000-01-01T00:00:00Z', '9999-12-31T23:59:59Z', '2025-02-30', '+275760-09-13T00:00:00Z',
  // malformed ids and flag targets
  '00000000-0000-0000-0000-000000000000', `cpt:${'-'.repeat(36)}:1`, `vane:${'a'.repeat(36)}`, `cpt:${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}:99999999999`, 'oedometer:x',
  // wrong types and nested junk
  null, true, [], {}, [[[[[]]]]], { a: { b: { c: { d: [null] } } } }, [1, 'a', null, {}],
  JSON.parse('{"__proto__":{"polluted":true}}') as Json, { constructor: { prototype: { x: 1 } } },
]

/** Large values: built once, only a few per run (they are slow to send). */
const HUGE_STRING = 'x'.repeat(200_000)
const HUGE_ARRAY: Json = Array.from({ length: 60_000 }, (_, i) => i)

export const hostileValue = fc.oneof(
  { weight: 20, arbitrary: fc.constantFrom(...HOSTILE_VALUES) },
  { weight: 1, arbitrary: fc.constantFrom<Json>(HUGE_STRING, HUGE_ARRAY) },
  { weight: 3, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 2, arbitrary: fc.double() },
  { weight: 2, arbitrary: fc.integer({ min: -(2 ** 52), max: 2 ** 52 }) },
)

/** Serialises a body, writing RAW markers as bare JSON tokens (some of them invalid JSON on purpose). */
export function serialise(body: Json): string {
  return JSON.stringify(body).replace(/"\\u0001raw:([^"]*)"/g, '$1')
}

function pick<T>(xs: readonly T[], i: number): T {
  return xs[i % xs.length]!
}

/** Every path into a JSON value (the root is []), objects' keys and arrays' indexes. */
export function pathsOf(v: Json, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix)
  if (out.length > 2000) return out
  if (Array.isArray(v)) v.slice(0, 20).forEach((x, i) => pathsOf(x, [...prefix, i], out))
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) pathsOf(x, [...prefix, k], out)
  return out
}

function setAt(v: Json, path: (string | number)[], value: Json): Json {
  if (path.length === 0) return value
  const [head, ...rest] = path
  if (Array.isArray(v)) {
    const copy = [...v]
    copy[head as number] = setAt(copy[head as number] ?? null, rest, value)
    return copy
  }
  if (v && typeof v === 'object') return { ...v, [head!]: setAt((v as Record<string, Json>)[head as string] ?? null, rest, value) }
  return value
}

function getAt(v: Json, path: (string | number)[]): Json {
  let cur: Json = v
  for (const p of path) cur = (cur && typeof cur === 'object') ? ((cur as Record<string | number, Json>)[p] ?? null) : null
  return cur
}

/** How one body is spoilt: a value replaced, a NUL or surrogate slipped into a text, a key added, or the body replaced. */
export type Mutation
  = | { kind: 'replace', at: number, value: Json }
    | { kind: 'taint', at: number, with: string }
    | { kind: 'extra', key: string, value: Json }
    | { kind: 'whole', value: Json }
    | { kind: 'none' }

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 10, arbitrary: fc.record({ kind: fc.constant('replace' as const), at: fc.nat(), value: hostileValue }) },
  { weight: 6, arbitrary: fc.record({ kind: fc.constant('taint' as const), at: fc.nat(), with: fc.constantFrom('\u0000', '\ud800', '\udc00x', '\u0000\u0000', `${'\u202e'}`) }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('extra' as const), key: fc.constantFrom('__proto__', 'constructor', 'version', 'id', 'projectId', '\u0000'), value: hostileValue }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('whole' as const), value: hostileValue }) },
  { weight: 1, arbitrary: fc.constant({ kind: 'none' as const }) },
)

/** Applies mutations in turn; a `taint` on a non-text value puts the tainted text there instead. */
export function mutate(body: Json, mutations: Mutation[]): Json {
  let out = body
  for (const m of mutations) {
    if (m.kind === 'none') continue
    if (m.kind === 'whole') { out = m.value; continue }
    if (m.kind === 'extra') {
      if (out && typeof out === 'object' && !Array.isArray(out)) out = JSON.parse(JSON.stringify(out).replace(/^\{/, `{${JSON.stringify(m.key)}:${JSON.stringify(m.value)}${Object.keys(out).length ? ',' : ''}`)) as Json
      continue
    }
    const paths = pathsOf(out)
    const path = pick(paths, m.at)
    if (m.kind === 'replace') { out = setAt(out, path, m.value); continue }
    const cur = getAt(out, path)
    const text = typeof cur === 'string' ? cur : 'text'
    const cut = Math.floor(text.length / 2)
    out = setAt(out, path, text.slice(0, cut) + m.with + text.slice(cut))
  }
  return out
}

// ---------------------------------------------------------------------------
// Plausible bodies from a zod schema, through its JSON Schema (input side).

const FORMAT_SAMPLES: Record<string, fc.Arbitrary<string>> = {
  'uuid': fc.uuid({ version: 4 }),
  'date': fc.constantFrom('2025-03-01', '2024-12-31', '2026-01-15'),
  'date-time': fc.constantFrom('2025-03-01T09:00:00Z', '2024-12-31T23:59:00+01:00'),
  'email': fc.constantFrom('fuzz.someone@test.example', 'a@b.example'),
}

function numberArb(s: JsonSchema, integer: boolean): fc.Arbitrary<number> {
  const lo = typeof s.minimum === 'number' ? s.minimum : typeof s.exclusiveMinimum === 'number' ? s.exclusiveMinimum : -1e6
  const hi = typeof s.maximum === 'number' ? s.maximum : typeof s.exclusiveMaximum === 'number' ? s.exclusiveMaximum : 1e6
  const min = Math.max(lo, -1e9)
  const max = Math.min(hi, 1e9)
  if (integer) return fc.integer({ min: Math.ceil(min), max: Math.max(Math.ceil(min), Math.floor(max)) })
  return fc.double({ min, max: Math.max(min, max), noNaN: true, noDefaultInfinity: true })
}

/** An arbitrary of plausible JSON values for a JSON Schema (a subset: what zod 4 emits for our schemas). */
export function fromJsonSchema(s: JsonSchema | boolean, defs: Record<string, JsonSchema> = {}, depth = 0): fc.Arbitrary<Json> {
  if (s === true || s === false || depth > 12) return fc.constant(null)
  if (typeof s.$ref === 'string') {
    const id = s.$ref.split('/').pop()!
    return defs[id] ? fromJsonSchema(defs[id], defs, depth + 1) : fc.constant(null)
  }
  if ('const' in s) return fc.constant(s.const as Json)
  if (Array.isArray(s.enum)) return fc.constantFrom(...(s.enum as Json[]))
  const union = (s.anyOf ?? s.oneOf) as JsonSchema[] | undefined
  if (union?.length) return fc.oneof(...union.map(u => fromJsonSchema(u, defs, depth + 1)))
  if (Array.isArray(s.allOf)) {
    return fc.tuple(...(s.allOf as JsonSchema[]).map(p => fromJsonSchema(p, defs, depth + 1))).map(parts =>
      parts.reduce<Json>((acc, p) => (acc && p && typeof acc === 'object' && typeof p === 'object' && !Array.isArray(acc) && !Array.isArray(p) ? { ...acc, ...p } : p), {}))
  }
  const type = Array.isArray(s.type) ? s.type[0] : s.type
  switch (type) {
    case 'null': return fc.constant(null)
    case 'boolean': return fc.boolean()
    case 'integer': return numberArb(s, true)
    case 'number': return numberArb(s, false)
    case 'string': {
      if (typeof s.format === 'string' && FORMAT_SAMPLES[s.format]) return FORMAT_SAMPLES[s.format]!
      const minLength = typeof s.minLength === 'number' ? s.minLength : 0
      const maxLength = Math.max(minLength, Math.min(typeof s.maxLength === 'number' ? s.maxLength : 40, 40))
      return fc.string({ minLength, maxLength })
    }
    case 'array': {
      const prefix = s.prefixItems as JsonSchema[] | undefined
      if (prefix) return fc.tuple(...prefix.map(p => fromJsonSchema(p, defs, depth + 1)))
      const minLength = typeof s.minItems === 'number' ? Math.min(s.minItems, 4) : 0
      const maxLength = Math.max(minLength, Math.min(typeof s.maxItems === 'number' ? s.maxItems : 4, 4))
      return fc.array(fromJsonSchema((s.items as JsonSchema) ?? {}, defs, depth + 1), { minLength, maxLength })
    }
    case 'object': {
      const props = (s.properties ?? {}) as Record<string, JsonSchema>
      const required = new Set((s.required ?? []) as string[])
      const shape: Record<string, fc.Arbitrary<Json>> = {}
      for (const [k, p] of Object.entries(props)) shape[k] = fromJsonSchema(p, defs, depth + 1)
      if (Object.keys(props).length === 0 && s.additionalProperties && typeof s.additionalProperties === 'object') {
        return fc.dictionary(fc.string({ minLength: 1, maxLength: 12 }), fromJsonSchema(s.additionalProperties as JsonSchema, defs, depth + 1), { maxKeys: 4 })
      }
      return fc.record(shape, { requiredKeys: Object.keys(props).filter(k => required.has(k)) }) as fc.Arbitrary<Json>
    }
    default: return fc.oneof(fc.constant(null), fc.string({ maxLength: 8 }), fc.double({ noNaN: true }))
  }
}

/** Plausible bodies for a zod schema (its input side). */
export function bodiesOf(schema: z.ZodType): fc.Arbitrary<Json> {
  const js = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema
  return fromJsonSchema(js, (js.$defs ?? {}) as Record<string, JsonSchema>)
}

export type { Json }
