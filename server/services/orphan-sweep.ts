import { usePool } from '../db/client'
import { deleteObject, listObjects } from './storage'

/**
 * Removes attachment objects that no row refers to. An upload stores its file
 * (and a photo's thumbnail) before the row is written, so a process killed in
 * between, a failed clean-up, or a deleted project (its rows go with it, its
 * objects do not) leaves objects behind. Only objects older than the age
 * threshold are considered, so an upload still between its store and its row
 * is never touched. Safe to run from several app processes at once: deleting a
 * key that is already gone succeeds.
 */
export const ATTACHMENT_PREFIX = 'projects/'

/** Default age before an unreferenced object is removed: one hour. */
export const DEFAULT_ORPHAN_AGE_MS = 60 * 60 * 1000

export interface SweepResult {
  /** Objects listed under the attachment prefix. */
  scanned: number
  /** Unreferenced objects older than the threshold, removed. */
  removed: number
  /** Unreferenced objects still younger than the threshold, kept for now. */
  young: number
}

/** Which of `keys` a row refers to (as its file or its thumbnail); one array parameter, whatever the number of keys. */
async function referencedKeys(keys: string[]): Promise<Set<string>> {
  if (keys.length === 0) return new Set()
  const r = await usePool().query<{ key: string }>(
    `select object_key as key from attachments where object_key = any($1::text[])
     union select thumbnail_key from attachments where thumbnail_key = any($1::text[])`,
    [keys],
  )
  return new Set(r.rows.map(row => row.key))
}

export async function sweepOrphanedObjects(opts: { olderThanMs?: number, now?: Date } = {}): Promise<SweepResult> {
  const olderThanMs = opts.olderThanMs ?? DEFAULT_ORPHAN_AGE_MS
  const cutoff = (opts.now ?? new Date()).getTime() - olderThanMs
  const result: SweepResult = { scanned: 0, removed: 0, young: 0 }
  let token: string | undefined
  do {
    const page = await listObjects(ATTACHMENT_PREFIX, token)
    token = page.next
    result.scanned += page.objects.length
    const referenced = await referencedKeys(page.objects.map(o => o.key))
    for (const o of page.objects) {
      if (referenced.has(o.key)) continue
      // An object without a date is treated as old: the listing of every S3-compatible store gives one.
      if (o.lastModified && o.lastModified.getTime() > cutoff) {
        result.young += 1
        continue
      }
      // Checked again just before deleting: a row written since the page was read keeps its object.
      if ((await referencedKeys([o.key])).size > 0) continue
      await deleteObject(o.key)
      result.removed += 1
    }
  } while (token)
  return result
}

/** Age threshold and interval from the environment (milliseconds), bounded to sane values. */
export function sweepSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): { olderThanMs: number, intervalMs: number } {
  const num = (v: string | undefined, fallback: number, min: number, max: number) => {
    const n = Number(v)
    return v !== undefined && v.trim() !== '' && Number.isFinite(n) ? Math.min(max, Math.max(min, Math.round(n))) : fallback
  }
  return {
    olderThanMs: num(env.PASTLOAD_ORPHAN_AGE_MS, DEFAULT_ORPHAN_AGE_MS, 0, 30 * 24 * 3600 * 1000),
    intervalMs: num(env.PASTLOAD_ORPHAN_SWEEP_INTERVAL_MS, 15 * 60 * 1000, 200, 24 * 3600 * 1000),
  }
}
