import { Socket, createServer, type Server } from 'node:net'
import { afterAll, describe, expect, it } from 'vitest'
import { startServer, freePort, type RunningServer } from '../helpers/server'
import { baseUrl } from '../helpers/http'

/** A loopback TCP relay to a test service (PostgreSQL, the object store) that can be cut and restored. */
async function relay(target: URL) {
  const port = await freePort()
  const sockets = new Set<Socket>()
  let server: Server | null = null
  const open = () => new Promise<void>((res) => {
    server = createServer((client) => {
      const upstream = new Socket()
      upstream.connect(Number(target.port), target.hostname)
      client.pipe(upstream).pipe(client)
      for (const s of [client, upstream]) {
        sockets.add(s)
        s.on('error', () => {})
        s.on('close', () => sockets.delete(s))
      }
    })
    server.listen(port, '127.0.0.1', () => res())
  })
  const cut = () => new Promise<void>((res) => {
    for (const s of sockets) s.destroy()
    if (server) server.close(() => res())
    else res()
  })
  await open()
  return { port, open, cut }
}

async function healthUntil(url: string, status: number): Promise<{ status: number, body: unknown }> {
  let last = { status: 0, body: {} as unknown }
  for (let i = 0; i < 40; i++) {
    const r = await fetch(`${url}/api/health`)
    last = { status: r.status, body: await r.json() }
    if (last.status === status) break
    await new Promise(r => setTimeout(r, 250))
  }
  return last
}

describe('GET /api/health', () => {
  let server: RunningServer | undefined
  let storageServer: RunningServer | undefined
  afterAll(async () => {
    await server?.stop()
    await storageServer?.stop()
  })

  it('reports ok with the database up', async () => {
    const r = await fetch(`${baseUrl()}/api/health`)
    expect(r.status).toBe(200)
    expect(await r.json()).toEqual({ status: 'ok', db: 'ok', storage: 'ok' })
  })

  it('answers 503 with db "down" while the database is unreachable, and recovers', async () => {
    const dbUrl = new URL(process.env.DATABASE_URL!)
    const link = await relay(dbUrl)
    const viaRelay = new URL(dbUrl)
    viaRelay.port = String(link.port)
    server = await startServer({ DATABASE_URL: viaRelay.toString(), PASTLOAD_SEED: 'none' })
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200)

    await link.cut()
    const down = await fetch(`${server.url}/api/health`)
    expect(down.status).toBe(503)
    expect(await down.json()).toEqual({ status: 'degraded', db: 'down', storage: 'ok' })
    // The app itself keeps serving.
    expect(server.child.exitCode).toBeNull()

    await link.open()
    let status = 0
    for (let i = 0; i < 20 && status !== 200; i++) {
      status = (await fetch(`${server.url}/api/health`)).status
      if (status !== 200) await new Promise(r => setTimeout(r, 250))
    }
    expect(status).toBe(200)
  })

  it('answers 503 with storage "down" while the object store is unreachable, and recovers without a restart', async () => {
    const storeUrl = new URL(process.env.PASTLOAD_S3_ENDPOINT!)
    const link = await relay(storeUrl)
    storageServer = await startServer({ PASTLOAD_S3_ENDPOINT: `http://127.0.0.1:${link.port}`, PASTLOAD_SEED: 'none' })
    const up = await fetch(`${storageServer.url}/api/health`)
    expect(up.status).toBe(200)
    expect(await up.json()).toEqual({ status: 'ok', db: 'ok', storage: 'ok' })

    await link.cut()
    const down = await fetch(`${storageServer.url}/api/health`)
    expect(down.status).toBe(503)
    expect(await down.json()).toEqual({ status: 'degraded', db: 'ok', storage: 'down' })
    expect(storageServer.child.exitCode).toBeNull()

    await link.open()
    const back = await healthUntil(storageServer.url, 200)
    expect(back).toEqual({ status: 200, body: { status: 'ok', db: 'ok', storage: 'ok' } })
  })

  it('reports storage "unconfigured" without a bucket, which is not an outage', async () => {
    const bare = await startServer({ PASTLOAD_S3_BUCKET: '', PASTLOAD_SEED: 'none' })
    try {
      const r = await fetch(`${bare.url}/api/health`)
      expect(r.status).toBe(200)
      expect(await r.json()).toEqual({ status: 'ok', db: 'ok', storage: 'unconfigured' })
    }
    finally {
      await bare.stop()
    }
  })
})
