import { afterAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../helpers/server'
import { tcpRelay } from '../helpers/relay'
import { baseUrl } from '../helpers/http'

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

/** Health answers 503 with this body, and the app itself keeps serving. */
async function expectDegraded(server: RunningServer, body: unknown) {
  const down = await fetch(`${server.url}/api/health`)
  expect(down.status).toBe(503)
  expect(await down.json()).toEqual(body)
  expect(server.child.exitCode).toBeNull()
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
    const link = await tcpRelay(process.env.DATABASE_URL!)
    server = await startServer({ DATABASE_URL: link.url, PASTLOAD_SEED: 'none' })
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200)

    await link.cut()
    await expectDegraded(server, { status: 'degraded', db: 'down', storage: 'ok' })

    await link.open()
    expect((await healthUntil(server.url, 200)).status).toBe(200)
  })

  it('answers 503 with storage "down" while the object store is unreachable, and recovers without a restart', async () => {
    const link = await tcpRelay(process.env.PASTLOAD_S3_ENDPOINT!)
    storageServer = await startServer({ PASTLOAD_S3_ENDPOINT: `http://127.0.0.1:${link.port}`, PASTLOAD_SEED: 'none' })
    const up = await fetch(`${storageServer.url}/api/health`)
    expect(up.status).toBe(200)
    expect(await up.json()).toEqual({ status: 'ok', db: 'ok', storage: 'ok' })

    await link.cut()
    await expectDegraded(storageServer, { status: 'degraded', db: 'ok', storage: 'down' })

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
