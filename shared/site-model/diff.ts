/** One difference between two site model definitions, at a dotted path (`strata[2].thickness`). */
export interface DefinitionChange { path: string, a: unknown, b: unknown }

const isRecord = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v)

/**
 * Field-by-field differences between two definitions, as dotted paths: for the
 * compare table of two saved versions and the "theirs vs yours" list of a
 * conflicting save. Lists are compared item by item, except the long point id
 * lists (`…PointIds`), which are summarised as counts added and removed. A list
 * on one side and a record on the other is one change of the whole value.
 */
export function diffDefinitions(a: unknown, b: unknown, path = ''): DefinitionChange[] {
  if (Object.is(a, b)) return []
  if (Array.isArray(a) && Array.isArray(b)) {
    if (path.endsWith('PointIds')) {
      const sa = new Set(a as string[])
      const sb = new Set(b as string[])
      const added = [...sb].filter(x => !sa.has(x)).length
      const removed = [...sa].filter(x => !sb.has(x)).length
      return added || removed ? [{ path, a: `${a.length} points`, b: `${b.length} points (+${added} −${removed})` }] : []
    }
    const out: DefinitionChange[] = []
    for (let i = 0; i < Math.max(a.length, b.length); i++) out.push(...diffDefinitions(a[i], b[i], `${path}[${i}]`))
    return out
  }
  if (isRecord(a) && isRecord(b)) {
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort()
    return keys.flatMap(k => diffDefinitions(a[k], b[k], path ? `${path}.${k}` : k))
  }
  return [{ path, a: a ?? null, b: b ?? null }]
}
