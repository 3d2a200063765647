import { PROJECT_POINT_LIMIT } from '#shared/imports/limits'
import { formatCount } from './counts'

/** The list routes' largest page (PointListQuerySchema, OedometerListQuerySchema, FlagListQuerySchema). */
export const LIST_PAGE = 500

/** Rows read before a list is called cut: as many as a project may hold points, so the points list never is. */
export const LIST_CAP = PROJECT_POINT_LIMIT

/** A whole list read page by page; `cut` when the cap stopped it with rows left on the server. */
export interface ListRead<T> {
  rows: T[]
  /** The route's own count, or null when it sends none. */
  total: number | null
  cut: boolean
}

/** One page of a list route as it answers (`pageReader` in app/utils/api.ts). */
export type PageReader = (url: string, signal?: AbortSignal) => Promise<unknown>

/**
 * Follows a list route's offset until its rows are all read (a short page, or
 * the route's `total` reached), stopping at `cap` rows. `pick` takes the rows out
 * of a reply (`r => r.points`).
 */
export async function readAllPages<R, T>(
  read: PageReader,
  url: string,
  pick: (reply: R) => T[],
  options: { signal?: AbortSignal, cap?: number, page?: number } = {},
): Promise<ListRead<T>> {
  const cap = options.cap ?? LIST_CAP
  const page = options.page ?? LIST_PAGE
  const join = url.includes('?') ? '&' : '?'
  const rows: T[] = []
  let total: number | null = null
  let more = false
  for (let offset = 0; ; offset += page) {
    const limit = Math.min(page, cap - rows.length)
    const reply = await read(`${url}${join}limit=${limit}&offset=${offset}`, options.signal) as R
    const got = pick(reply)
    rows.push(...got)
    const t = (reply as { total?: unknown }).total
    total = typeof t === 'number' ? t : null
    more = got.length === limit && (total === null || rows.length < total)
    if (!more || rows.length >= cap) break
  }
  return { rows, total, cut: more }
}

/** The line a cut list shows ("Showing the first 20,000 of 23,100 oedometer tests."), empty when it is whole. */
export function cutNote(list: Pick<ListRead<unknown>, 'rows' | 'total' | 'cut'> | null | undefined, noun: string): string {
  if (!list?.cut) return ''
  const n = formatCount(list.rows.length)
  return list.total === null
    ? `Showing the first ${n} ${noun}; more were not read.`
    : `Showing the first ${n} of ${formatCount(list.total)} ${noun}.`
}
