// A loopback TCP relay to a test service (PostgreSQL, the object store) that a test can
// cut and restore, to take the service away from a server started through it.
import { Socket, createServer, type Server } from 'node:net'
import { freePort } from './server'

export interface Relay {
  port: number
  /** The service's URL through the relay. */
  url: string
  open: () => Promise<void>
  /** Drops every connection and refuses new ones until `open`. */
  cut: () => Promise<void>
}

export async function tcpRelay(serviceUrl: string): Promise<Relay> {
  const target = new URL(serviceUrl)
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
    const s = server
    server = null
    if (s) s.close(() => res())
    else res()
  })
  await open()
  const via = new URL(target)
  via.port = String(port)
  return { port, url: via.toString(), open, cut }
}
