/**
 * Nitro does not wait for async plugins before listening, so requests wait on
 * this promise, settled by server/plugins/database.ts once migrations (and the
 * optional demo seed) are done.
 */
let resolveReady!: () => void
let rejectReady!: (err: unknown) => void
export const databaseReady: Promise<void> = new Promise((resolve, reject) => {
  resolveReady = resolve
  rejectReady = reject
})
// Avoid an unhandled rejection before any request awaits it.
databaseReady.catch(() => {})

export function markDatabaseReady() {
  resolveReady()
}

export function markDatabaseFailed(err: unknown) {
  rejectReady(err)
}
