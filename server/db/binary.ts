import { type SQL, sql } from 'drizzle-orm'
import type { Tx } from './client'

/**
 * Large numeric arrays in PostgreSQL's binary wire format. node-postgres sends a
 * Buffer parameter as binary, so a float8[] goes in as 12 bytes a value with no
 * number formatting on our side and no parsing on the server's; reads stay the
 * usual float8[] columns.
 */
const FLOAT8_OID = 701
const HEADER = 20

/** A plain array or a typed array of numbers. */
export type NumberList = ArrayLike<number> & Iterable<number>

/** array_send layout: dimensions, has-nulls flag, element type, then per dimension its length and lower bound, then (length, value) per element. */
export function encodeFloat8Array(values: NumberList): Buffer {
  const n = values.length
  if (n === 0) {
    const empty = Buffer.alloc(12)
    empty.writeInt32BE(FLOAT8_OID, 8)
    return empty
  }
  const buf = Buffer.allocUnsafe(HEADER + 12 * n)
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength)
  view.setInt32(0, 1)
  view.setInt32(4, 0)
  view.setInt32(8, FLOAT8_OID)
  view.setInt32(12, n)
  view.setInt32(16, 1)
  let o = HEADER
  for (const value of values) {
    view.setInt32(o, 8)
    view.setFloat64(o + 4, value)
    o += 12
  }
  return buf
}

/** The inverse of `encodeFloat8Array` (one dimension, no nulls), for binary reads and tests. */
export function decodeFloat8Array(buf: Uint8Array): Float64Array {
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength)
  const ndim = view.getInt32(0)
  if (view.getInt32(8) !== FLOAT8_OID) throw new Error('not a float8[] value')
  if (ndim === 0) return new Float64Array(0)
  if (ndim !== 1 || view.getInt32(4) !== 0) throw new Error('only one-dimensional float8[] values without nulls are read')
  const n = view.getInt32(12)
  const out = new Float64Array(n)
  let o = HEADER
  for (let i = 0; i < n; i++) {
    if (view.getInt32(o) !== 8) throw new Error(`float8[] element ${i + 1} is not 8 bytes`)
    out[i] = view.getFloat64(o + 4)
    o += 12
  }
  return out
}

/** A float8[] value for an insert or update, sent in binary. */
export function float8ArrayParam(values: NumberList): SQL {
  return sql`${encodeFloat8Array(values)}::float8[]`
}

let lz4Available: Promise<boolean> | undefined

/**
 * For the rest of the transaction, large values (an upload, a sounding's arrays)
 * are compressed with lz4 where the server is built with it: several times
 * faster to write than the default pglz. Values keep their method, so reads
 * need nothing.
 */
export async function preferFastCompression(tx: Tx): Promise<void> {
  lz4Available ??= tx.execute<{ ok: boolean }>(sql`select coalesce('lz4' = any(enumvals), false) as ok from pg_settings where name = 'default_toast_compression'`)
    .then(r => r.rows[0]?.ok === true, (err: unknown) => {
      lz4Available = undefined
      throw err
    })
  if (await lz4Available) await tx.execute(sql`set local default_toast_compression = 'lz4'`)
}
