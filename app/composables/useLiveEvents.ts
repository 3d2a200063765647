import { oneAtATime } from '#shared/one-at-a-time'
import type { LiveEventMessage, LiveEventType } from '#shared/types/live'

type Kind = LiveEventType | 'resync'
type Handler = (m: LiveEventMessage) => void | Promise<void>

/** Who listens for which kind of change on this tab (client only: streams never open on the server). */
const listeners = new Map<Kind, Set<Handler>>()

function dispatch(m: LiveEventMessage) {
  for (const h of listeners.get(m.type) ?? []) {
    void Promise.resolve(h(m)).catch(() => { /* a failed refresh shows its own error where the data is shown */ })
  }
}

/** A burst of events is read as one change: wait this long after the first before refreshing. */
const SETTLE_MS = 150

/**
 * The handler run at most once at a time, shortly after an event, and once more after it if more
 * events came meanwhile. A refresh is never cut short by the next event, so a busy project (many
 * changes a second) still shows its latest state instead of starting over and over.
 */
function coalesced(handler: Handler): Handler {
  let last: LiveEventMessage | null = null
  const refresh = oneAtATime(async () => {
    await new Promise(r => setTimeout(r, SETTLE_MS))
    if (last) await handler(last)
  })
  return (m) => {
    last = m
    return refresh()
  }
}

/**
 * Runs `handler` whenever one of `types` arrives on the open project stream, while the
 * calling component is mounted. Handlers refresh their data by key (`refreshNuxtData`),
 * since events carry ids, never documents.
 */
export function useLiveEvent(types: Kind | readonly Kind[], handler: Handler) {
  if (import.meta.server) return
  const kinds = Array.isArray(types) ? types as readonly Kind[] : [types as Kind]
  handler = coalesced(handler)
  onMounted(() => {
    for (const k of kinds) {
      const set = listeners.get(k) ?? new Set<Handler>()
      set.add(handler)
      listeners.set(k, set)
    }
  })
  onBeforeUnmount(() => {
    for (const k of kinds) listeners.get(k)?.delete(handler)
  })
}

export type LiveStreamStatus = 'off' | 'connecting' | 'live'

/**
 * Keeps one Server-Sent Events stream of the project open while the calling component (the
 * project's parent page) is mounted. The browser reconnects by itself and sends
 * `Last-Event-ID`, so what happened in between is replayed; `resync` (a gap too large to
 * replay) refreshes everything on the page.
 */
export function useProjectLiveStream(projectId: MaybeRefOrGetter<string>) {
  const status = ref<LiveStreamStatus>('off')
  if (import.meta.server) return { status }
  const nuxtApp = useNuxtApp()
  let source: EventSource | null = null
  const close = () => {
    source?.close()
    source = null
    status.value = 'off'
  }
  const open = (id: string) => {
    close()
    if (!id || typeof EventSource === 'undefined') return
    status.value = 'connecting'
    source = new EventSource(`/api/projects/${encodeURIComponent(id)}/events`)
    source.onopen = () => {
      status.value = 'live'
    }
    source.onerror = () => {
      // EventSource retries on its own; a closed source (401/403/404) stays off.
      status.value = source?.readyState === EventSource.CLOSED ? 'off' : 'connecting'
    }
    source.onmessage = (e: MessageEvent<string>) => {
      let m: LiveEventMessage
      try {
        m = JSON.parse(e.data) as LiveEventMessage
      }
      catch {
        return
      }
      if (m.type === 'resync') void nuxtApp.runWithContext(() => refreshNuxtData())
      dispatch(m)
    }
  }
  onMounted(() => {
    watch(() => toValue(projectId), open, { immediate: true })
  })
  onBeforeUnmount(close)
  return { status }
}

/**
 * Refreshes every fetched entry of the page whose key starts with one of `prefixes`
 * (`model-versions:` …), for events that name a record but not the pages' exact keys.
 */
export function useRefreshByPrefix() {
  const nuxtApp = useNuxtApp()
  return async (prefixes: readonly string[]) => {
    const keys = Object.keys(nuxtApp.payload.data).filter(k => prefixes.some(p => k.startsWith(p)))
    if (keys.length) await nuxtApp.runWithContext(() => refreshNuxtData(keys))
  }
}
