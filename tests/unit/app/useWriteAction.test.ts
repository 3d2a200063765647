import { describe, expect, it } from 'vitest'
import { useWriteAction } from '../../../app/composables/useWriteAction'

/** A failed $fetch as ofetch shapes it: the server's JSON error on `data`. */
function fetchError(statusCode: number, message: string, data?: unknown) {
  return Object.assign(new Error(`[PATCH] ${statusCode}`), { statusCode, data: { statusCode, message, data } })
}

describe('useWriteAction', () => {
  it('holds busy while the write runs, then shows the notice built from its result', async () => {
    const w = useWriteAction()
    w.error.value = 'an earlier failure'
    let release!: (v: { n: number }) => void
    const pending = w.run(() => new Promise<{ n: number }>((resolve) => { release = resolve }), { done: r => `N = ${r.n}.` })
    expect(w.busy.value).toBe(true)
    expect(w.error.value).toBe('')
    release({ n: 12 })
    expect(await pending).toBe(true)
    expect(w.busy.value).toBe(false)
    expect(w.notice.value).toBe('N = 12.')
  })

  it('puts the server\'s message in error and clears the last notice when a write fails', async () => {
    const w = useWriteAction()
    w.notice.value = 'Sample U1 added.'
    const ok = await w.run(() => Promise.reject(fetchError(422, 'The depth (12 m) is below the hole\'s final depth (10 m).')), { done: 'never shown' })
    expect(ok).toBe(false)
    expect(w.error.value).toBe('The depth (12 m) is below the hole\'s final depth (10 m).')
    expect(w.notice.value).toBe('')
    expect(w.busy.value).toBe(false)
  })

  it('leaves error empty when the caller handles the failure (a stale write), and not otherwise', async () => {
    const w = useWriteAction()
    const seen: number[] = []
    const onError = (err: unknown) => {
      const status = (err as { statusCode: number }).statusCode
      seen.push(status)
      return status === 409
    }
    expect(await w.run(() => Promise.reject(fetchError(409, 'changed by someone else', { current: { version: 3 } })), { onError })).toBe(false)
    expect(w.error.value).toBe('')
    expect(await w.run(() => Promise.reject(fetchError(403, 'Your role cannot do this.')), { onError })).toBe(false)
    expect(w.error.value).toBe('Your role cannot do this.')
    expect(seen).toEqual([409, 403])
  })
})
