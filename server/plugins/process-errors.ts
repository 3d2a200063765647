import { logServerError } from '../utils/error-log'

type Listener = (err: unknown) => void
type ProcessErrorEvent = 'unhandledRejection' | 'uncaughtException'

const mine: Record<ProcessErrorEvent, Listener> = {
  unhandledRejection: err => logServerError('unhandled rejection', err),
  uncaughtException: err => logServerError('uncaught exception', err),
}

/**
 * Makes the redacted log the only one for errors nobody awaited. Nitro's server
 * entry traps them too, printing the raw error (a failed query's parameters
 * with it), after the plugins have run: its listeners are replaced here once
 * the entry has finished, and again on the first request in case it has not.
 * Like Nitro's, these listeners keep the server running.
 */
function claimProcessErrors() {
  for (const type of ['unhandledRejection', 'uncaughtException'] as const) {
    const listeners = (): Listener[] => process.listeners(type) as unknown as Listener[]
    for (const listener of listeners()) {
      if (listener !== mine[type]) process.removeListener(type, listener)
    }
    if (!listeners().includes(mine[type])) process.on(type, mine[type])
  }
}

export default defineNitroPlugin((nitroApp) => {
  claimProcessErrors()
  setImmediate(claimProcessErrors)
  let claimed = false
  nitroApp.hooks.hook('request', () => {
    if (claimed) return
    claimed = true
    claimProcessErrors()
  })
})
