// Reads a Server-Sent Events stream with fetch (Node 20 has no EventSource): the test
// waits for the events it expects, then closes the stream.
import type { LiveEventMessage } from '../../shared/types/live'

export interface StreamEvent {
  id: string | null
  event: string
  data: string
}

export interface OpenStream {
  status: number
  /** Live events (not pings) in arrival order. */
  events: LiveEventMessage[]
  /** Resolves when an event matching `pred` has arrived (or rejects after `ms`). */
  waitFor: (pred: (m: LiveEventMessage) => boolean, ms?: number) => Promise<LiveEventMessage>
  /** Resolves when the server has ended the stream. */
  ended: Promise<void>
  close: () => void
}

export async function openEventStream(url: string, headers: Record<string, string> = {}): Promise<OpenStream> {
  const abort = new AbortController()
  const res = await fetch(url, { headers: { accept: 'text/event-stream', ...headers }, signal: abort.signal })
  const events: LiveEventMessage[] = []
  const waiters: { pred: (m: LiveEventMessage) => boolean, resolve: (m: LiveEventMessage) => void }[] = []
  let endedResolve: () => void = () => {}
  const ended = new Promise<void>((r) => { endedResolve = r })
  if (res.status !== 200 || !res.body) {
    await res.text().catch(() => '')
    endedResolve()
    return { status: res.status, events, waitFor: () => Promise.reject(new Error(`stream answered ${res.status}`)), ended, close: () => abort.abort() }
  }
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader()
  void (async () => {
    let buffer = ''
    try {
      for (;;) {
        const { value, done } = await reader.read()
        if (done) break
        buffer += value
        let cut: number
        while ((cut = buffer.indexOf('\n\n')) >= 0) {
          const block = buffer.slice(0, cut)
          buffer = buffer.slice(cut + 2)
          const ev: StreamEvent = { id: null, event: 'message', data: '' }
          for (const line of block.split('\n')) {
            const i = line.indexOf(':')
            const field = i < 0 ? line : line.slice(0, i)
            const v = i < 0 ? '' : line.slice(i + 1).replace(/^ /, '')
            if (field === 'id') ev.id = v
            else if (field === 'event') ev.event = v
            else if (field === 'data') ev.data += ev.data ? `\n${v}` : v
          }
          if (ev.event !== 'message' || !ev.data) continue
          const m = JSON.parse(ev.data) as LiveEventMessage
          events.push(m)
          for (const w of [...waiters]) {
            if (w.pred(m)) {
              waiters.splice(waiters.indexOf(w), 1)
              w.resolve(m)
            }
          }
        }
      }
    }
    catch { /* aborted */ }
    endedResolve()
  })()
  const waitFor = (pred: (m: LiveEventMessage) => boolean, ms = 10_000) => {
    const seen = events.find(pred)
    if (seen) return Promise.resolve(seen)
    return new Promise<LiveEventMessage>((resolve, reject) => {
      const t = setTimeout(() => reject(new Error(`no matching event within ${ms} ms; got ${JSON.stringify(events)}`)), ms)
      waiters.push({ pred, resolve: (m) => { clearTimeout(t); resolve(m) } })
    })
  }
  return { status: res.status, events, waitFor, ended, close: () => abort.abort() }
}
