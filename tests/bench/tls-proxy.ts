// Starts the bench's HTTPS, HTTP/2 stand-in for a deployment's reverse proxy (tls-proxy-server.ts) as a process of
// its own, in front of the app at `upstream`.
import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'

export async function startTlsProxy(upstream: string): Promise<{ url: string, stop: () => Promise<void> }> {
  const script = fileURLToPath(new URL('./tls-proxy-server.ts', import.meta.url))
  const child = spawn(process.execPath, ['--import', 'tsx', script, upstream], { stdio: ['ignore', 'pipe', 'inherit'] })
  const url = await new Promise<string>((resolve, reject) => {
    let seen = ''
    const timer = setTimeout(() => { child.kill(); reject(new Error('the TLS proxy did not start')) }, 30_000)
    child.stdout!.on('data', (chunk: Buffer) => {
      seen += chunk.toString()
      const line = seen.split('\n').find(l => l.startsWith('{'))
      if (!line) return
      clearTimeout(timer)
      resolve((JSON.parse(line) as { url: string }).url)
    })
    child.once('exit', (code) => { clearTimeout(timer); reject(new Error(`the TLS proxy stopped (${code})`)) })
  })
  const stop = async () => {
    if (child.exitCode !== null) return
    const exited = new Promise<void>(resolve => child.once('exit', () => resolve()))
    child.kill('SIGTERM')
    await exited
  }
  return { url, stop }
}
