import { describe, expect, it } from 'vitest'
import { cutNote, readAllPages, type PageReader } from '../../../app/utils/listPages'

/** A list route over `n` rows that answers `limit`/`offset` like the project list routes. */
function route(n: number, withTotal = true) {
  const asked: string[] = []
  const read: PageReader = async (url) => {
    asked.push(url)
    const q = new URL(url, 'http://x').searchParams
    const limit = Number(q.get('limit'))
    const offset = Number(q.get('offset'))
    const rows = Array.from({ length: Math.max(0, Math.min(limit, n - offset)) }, (_v, i) => offset + i)
    return withTotal ? { rows, total: n } : { rows }
  }
  return { read, asked }
}

describe('readAllPages', () => {
  it('follows the offset until every row is read', async () => {
    const { read, asked } = route(1203)
    const list = await readAllPages(read, '/api/things?kind=cpt', (r: { rows: number[] }) => r.rows, { page: 500 })
    expect(list.rows).toHaveLength(1203)
    expect(list.rows[1202]).toBe(1202)
    expect(list.total).toBe(1203)
    expect(list.cut).toBe(false)
    expect(asked).toEqual([
      '/api/things?kind=cpt&limit=500&offset=0',
      '/api/things?kind=cpt&limit=500&offset=500',
      '/api/things?kind=cpt&limit=500&offset=1000',
    ])
  })

  it('stops after a full last page when the total says it is done', async () => {
    const { read, asked } = route(1000)
    const list = await readAllPages(read, '/api/things', (r: { rows: number[] }) => r.rows, { page: 500 })
    expect(list.rows).toHaveLength(1000)
    expect(list.cut).toBe(false)
    expect(asked).toHaveLength(2)
  })

  it('without a total, asks once more after a full page and finds it empty', async () => {
    const { read, asked } = route(1000, false)
    const list = await readAllPages(read, '/api/things', (r: { rows: number[] }) => r.rows, { page: 500 })
    expect(list.rows).toHaveLength(1000)
    expect(list.total).toBeNull()
    expect(list.cut).toBe(false)
    expect(asked).toHaveLength(3)
  })

  it('stops at the cap and says the list is cut', async () => {
    const { read, asked } = route(1203)
    const list = await readAllPages(read, '/api/things', (r: { rows: number[] }) => r.rows, { page: 500, cap: 700 })
    expect(list.rows).toHaveLength(700)
    expect(list.cut).toBe(true)
    expect(asked[1]).toBe('/api/things?limit=200&offset=500')
    expect(cutNote(list, 'oedometer tests')).toBe('Showing the first 700 of 1,203 oedometer tests.')
  })

  it('a cut list without a total says more were not read', async () => {
    const { read } = route(900, false)
    const list = await readAllPages(read, '/api/things', (r: { rows: number[] }) => r.rows, { page: 500, cap: 500 })
    expect(list.cut).toBe(true)
    expect(cutNote(list, 'flags')).toBe('Showing the first 500 flags; more were not read.')
  })

  it('a whole list has no note', async () => {
    const { read } = route(3)
    expect(cutNote(await readAllPages(read, '/api/things', (r: { rows: number[] }) => r.rows), 'flags')).toBe('')
    expect(cutNote(null, 'flags')).toBe('')
  })
})
