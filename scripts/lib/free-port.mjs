import { createServer } from 'node:net'

/** A TCP port on 127.0.0.1 that nothing listens on right now (the OS picks it). */
export function freePort() {
  return new Promise((res, rej) => {
    const srv = createServer()
    srv.once('error', rej)
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address()
      srv.close(() => res(port))
    })
  })
}
