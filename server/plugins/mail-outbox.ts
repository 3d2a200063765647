import pg from 'pg'
import { oneAtATime } from '#shared/one-at-a-time'
import { databaseUrl } from '../db/client'
import { createMailTransport, deliverDueMail } from '../services/mail-delivery'
import { MAIL_OUTBOX_CHANNEL, mailSettingsFromEnv } from '../services/mail-settings'
import { databaseReady } from '../utils/ready'

// Delivers the mail outbox from this app process: on a timer (PASTLOAD_MAIL_POLL_MS) and at once when a
// commit announces new mail on MAIL_OUTBOX_CHANNEL (LISTEN on a connection of its own, reconnected when
// lost). Several app processes may run it side by side: each round locks its rows (FOR UPDATE SKIP LOCKED).
// Logs carry outbox ids and counts only, never an address or a body.
export default defineNitroPlugin((nitro) => {
  const settings = mailSettingsFromEnv()
  if (!settings.worker) return
  const transport = createMailTransport(settings)
  let closed = false
  let timer: ReturnType<typeof setInterval> | undefined
  let listener: pg.Client | undefined
  let reconnect: ReturnType<typeof setTimeout> | undefined

  // One delivery round at a time; a full batch (20) goes again at once, as does a trigger during a round.
  const deliverRounds = oneAtATime(async () => {
    const r = await deliverDueMail(transport, settings)
    if (r.sent.length || r.retrying.length || r.failed.length) {
      const parts = [`${r.sent.length} sent`]
      if (r.retrying.length) parts.push(`${r.retrying.length} to retry (ids ${r.retrying.join(', ')})`)
      if (r.failed.length) parts.push(`${r.failed.length} failed for good (ids ${r.failed.join(', ')})`)
      console.info(`[pastload:mail] outbox: ${parts.join('; ')}`)
    }
    // A full batch: more may be due at once.
    return r.sent.length + r.retrying.length + r.failed.length >= 20
  }, () => closed)
  const round = async () => {
    if (closed) return
    try {
      await deliverRounds()
    }
    catch (err) {
      logServerError('mail outbox: delivery round skipped', err, { stack: false, level: 'warn' })
    }
  }

  const listen = async () => {
    if (closed) return
    const client = new pg.Client({ connectionString: databaseUrl(), connectionTimeoutMillis: 3000 })
    const retry = () => {
      if (closed || reconnect) return
      void client.end().catch(() => {})
      if (listener === client) listener = undefined
      reconnect = setTimeout(() => {
        reconnect = undefined
        void listen()
      }, 5_000)
      reconnect.unref()
    }
    client.on('error', retry)
    client.on('end', retry)
    client.on('notification', () => void round())
    try {
      await client.connect()
      await client.query(`LISTEN ${MAIL_OUTBOX_CHANNEL}`)
      listener = client
      // Mail committed while the connection was away is delivered now.
      void round()
    }
    catch {
      retry()
    }
  }

  databaseReady.then(() => {
    void listen()
    void round()
    timer = setInterval(() => void round(), settings.pollMs)
    timer.unref()
  }, () => { /* the database plugin stops the server */ })

  nitro.hooks.hook('close', async () => {
    closed = true
    if (timer) clearInterval(timer)
    if (reconnect) clearTimeout(reconnect)
    const l = listener
    listener = undefined
    if (l) {
      l.removeAllListeners('end')
      await l.end().catch(() => {})
    }
    transport.close()
  })
})
