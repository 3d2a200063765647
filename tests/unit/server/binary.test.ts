import { describe, expect, it } from 'vitest'
import { decodeFloat8Array, encodeFloat8Array } from '../../../server/db/binary'

describe('float8[] in PostgreSQL\'s binary format', () => {
  it('lays out the array header and each element as array_send does', () => {
    const buf = encodeFloat8Array([1.5, -2])
    expect(buf.length).toBe(20 + 2 * 12)
    // dimensions 1, no nulls, element type float8 (oid 701), length 2, lower bound 1
    expect([0, 4, 8, 12, 16].map(o => buf.readInt32BE(o))).toEqual([1, 0, 701, 2, 1])
    expect(buf.readInt32BE(20)).toBe(8)
    expect(buf.readDoubleBE(24)).toBe(1.5)
    expect(buf.readInt32BE(32)).toBe(8)
    expect(buf.readDoubleBE(36)).toBe(-2)
  })

  it('round-trips negatives, zero signs, tiny and huge values bit for bit', () => {
    const values = [0, -0, -1.25, 0.1, 1e-310, -Number.MAX_VALUE, Number.MIN_VALUE, 123456.789, -9.81]
    const back = decodeFloat8Array(encodeFloat8Array(values))
    expect(back.length).toBe(values.length)
    values.forEach((v, i) => expect(Object.is(back[i], v)).toBe(true))
  })

  it('round-trips a 500 000-value typed array, including a subarray view', () => {
    const n = 500_000
    const big = new Float64Array(n + 10)
    for (let i = 0; i < big.length; i++) big[i] = (i % 2 ? -1 : 1) * i * 0.0001
    const view = big.subarray(10)
    const back = decodeFloat8Array(encodeFloat8Array(view))
    expect(back.length).toBe(n)
    expect(back[0]).toBe(view[0])
    expect(back[n - 1]).toBe(view[n - 1])
    let mismatches = 0
    for (let i = 0; i < n; i++) if (back[i] !== view[i]) mismatches++
    expect(mismatches).toBe(0)
  })

  it('writes an empty array as zero dimensions and refuses what is not a float8[]', () => {
    const empty = encodeFloat8Array([])
    expect([0, 4, 8].map(o => empty.readInt32BE(o))).toEqual([0, 0, 701])
    expect(decodeFloat8Array(empty)).toEqual(new Float64Array(0))
    const wrong = encodeFloat8Array([1])
    wrong.writeInt32BE(23, 8)
    expect(() => decodeFloat8Array(wrong)).toThrow('not a float8[] value')
  })
})
