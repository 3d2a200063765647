import { z } from 'zod'

/**
 * Text a client may send: no NUL character (PostgreSQL cannot store it in text)
 * and no unpaired surrogate (not Unicode; it cannot be stored or shown). Every
 * string in every schema starts here; callers add their own trim and bounds.
 * With the `u` flag a proper surrogate pair is one code point above U+FFFF and
 * passes; a lone one is matched by the class and refused.
 */
// eslint-disable-next-line no-control-regex -- NUL is the one control character refused here
const PLAIN_TEXT = /^[^\u0000\ud800-\udfff]*$/u
export const PLAIN_TEXT_MESSAGE = 'must not contain a NUL character or an unpaired surrogate'
export function isPlainText(v: string): boolean {
  return PLAIN_TEXT.test(v)
}

/** The one string type of every schema (see above); bounded by default, callers bound it tighter. */
export const str = (max = 10_000, error?: string) => z.string(error ? { error } : undefined)
  .refine(isPlainText, { message: PLAIN_TEXT_MESSAGE })
  .max(max, { message: `must be at most ${max} characters` })

/** Integers stored in PostgreSQL `integer` columns (int4): anything beyond is refused, never overflowed. */
export const INT32_MAX = 2_147_483_647
export const int = (min = -2_147_483_648, max = INT32_MAX) => z.number().int({ message: 'must be a whole number' })
  .min(min, { message: `must be at least ${min}` })
  .max(max, { message: `must be at most ${max}` })

/** A row's revision, as the client read it (stale: 409). */
export const VersionNumberSchema = int(1)

/**
 * Calendar dates and times a record may carry: 1900-01-01 to 2100-12-31 (common
 * practice for site records; year 0 does not exist in PostgreSQL and year 9999 is
 * a typing slip, not a record).
 */
export const EARLIEST_DATE = '1900-01-01'
export const LATEST_DATE = '2100-12-31'
const DATE_RANGE_MESSAGE = `must be between ${EARLIEST_DATE} and ${LATEST_DATE}`

export const IsoDateSchema = z.iso.date({ message: 'must be a date (YYYY-MM-DD)' })
  .refine(v => v >= EARLIEST_DATE && v <= LATEST_DATE, { message: DATE_RANGE_MESSAGE })

export const IsoDateTimeSchema = z.iso.datetime({ offset: true, message: 'must be a date and time (ISO 8601)' })
  .refine((v) => {
    const t = Date.parse(v)
    return Number.isFinite(t) && t >= Date.parse(`${EARLIEST_DATE}T00:00:00Z`) && t <= Date.parse(`${LATEST_DATE}T23:59:59Z`)
  }, { message: DATE_RANGE_MESSAGE })

/** Route params and paging shared by many routes. */
export const UuidSchema = z.uuid({ message: 'must be a valid id' })

export const ProjectParamsSchema = z.object({ projectId: UuidSchema })

export const PageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(100).default(50),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
})

export const EmailSchema = z.email({ message: 'must be an e-mail address' })
  .max(254)
  .transform(v => v.trim().toLowerCase())

export const PasswordSchema = str(256)
  .min(12, { message: 'must be at least 12 characters' })
  .max(256, { message: 'must be at most 256 characters' })
