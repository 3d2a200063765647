import { logServerError } from '../utils/error-log'

const onRejection = (err: unknown) => logServerError('unhandled rejection', err)
const onException = (err: unknown) => logServerError('uncaught exception', err)

/**
 * Makes the redacted log the only one for errors nobody awaited. Nitro's server
 * entry traps them too, printing the raw error (a failed query's parameters
 * with it), after the plugins have run: its listeners are replaced here once
 * the entry has finished, and again on the first request in case it has not.
 * Like Nitro's, these listeners keep the server running.
 */
function claimProcessErrors() {
  for (const [type, mine] of [['unhandledRejection', onRejection], ['uncaughtException', onException]] as const) {
    for (const listener of process.listeners(type)) {
      if (listener !== mine) process.off(type, listener as (...args: unknown[]) => void)
    }
    if (!process.listeners(type).includes(mine)) process.on(type, mine)
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
