// The bench's stand-in for the reverse proxy a deployment puts in front of Pastload (docs/operations.md, "Two app
// processes behind a proxy"): it terminates HTTPS and speaks HTTP/2 to the browser (HTTP/1.1 to clients without
// it), and forwards each request over kept-alive HTTP/1.1 to the app with the X-Forwarded-* headers a proxy sets.
// Its certificate is made fresh for 127.0.0.1 each time, so only the bench's own browser, told to accept it, is
// ever pointed at it. It runs as a process of its own (`startTlsProxy` in tls-proxy.ts starts it, with the app's
// address as its argument, and reads its own address from its first line of output), so Lighthouse's work in the
// bench's process never holds up a page's requests.
import http from 'node:http'
import http2 from 'node:http2'
import type { AddressInfo } from 'node:net'
import selfsigned from 'selfsigned'

/** Headers that belong to one connection and must not cross the proxy (HTTP/2 refuses them outright). */
const HOP_BY_HOP = new Set(['connection', 'keep-alive', 'proxy-connection', 'transfer-encoding', 'upgrade', 'te', 'http2-settings'])

async function serve(upstream: string): Promise<string> {
  const target = new URL(upstream)
  const { private: key, cert } = await selfsigned.generate([{ name: 'commonName', value: '127.0.0.1' }], {
    notAfterDate: new Date(Date.now() + 24 * 3600_000),
    keyType: 'ec',
    curve: 'P-256',
    algorithm: 'sha256',
    extensions: [{ name: 'subjectAltName', altNames: [{ type: 7, ip: '127.0.0.1' }] }],
  })
  const agent = new http.Agent({ keepAlive: true, maxSockets: 64 })
  const server = http2.createSecureServer({ key, cert, allowHTTP1: true }, (req, res) => {
    const headers: http.OutgoingHttpHeaders = {}
    for (const [name, value] of Object.entries(req.headers)) {
      if (!name.startsWith(':') && !HOP_BY_HOP.has(name) && value !== undefined) headers[name] = value
    }
    const host = req.headers[':authority'] ?? req.headers.host ?? target.host
    headers.host = host
    headers['x-forwarded-host'] = host
    headers['x-forwarded-proto'] = 'https'
    headers['x-forwarded-for'] = req.socket.remoteAddress ?? '127.0.0.1'
    let answered = false
    const forward = http.request({ hostname: target.hostname, port: target.port, path: req.url, method: req.method, headers, agent }, (answer) => {
      answer.once('end', () => { answered = true })
      const out: http.OutgoingHttpHeaders = {}
      for (const [name, value] of Object.entries(answer.headers)) {
        if (!HOP_BY_HOP.has(name) && value !== undefined) out[name] = value
      }
      res.writeHead(answer.statusCode ?? 502, out)
      answer.pipe(res)
    })
    forward.on('error', () => {
      if (!res.headersSent) res.writeHead(502, { 'content-type': 'text/plain' })
      res.end()
    })
    // A page closed mid-stream (a live-event stream, say) ends the forwarded request too.
    res.on('close', () => { if (!answered) forward.destroy() })
    req.pipe(forward)
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => resolve())
  })
  const { port } = server.address() as AddressInfo
  return `https://127.0.0.1:${port}`
}

const upstream = process.argv[2]
if (!upstream) throw new Error('usage: tls-proxy-server.ts <app url>')
console.log(JSON.stringify({ url: await serve(upstream) }))
