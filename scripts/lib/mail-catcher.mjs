// A local mail catcher for the demo and the tests: an SMTP server (`smtp-server`) on
// 127.0.0.1 that keeps every message it receives as an `.eml` file under
// `.data/<name>/`, and a read-only web inbox (a small page of our own, messages read
// back with `mailparser`) on 127.0.0.1. Run in a child process like the object
// store, so scripts that block in spawnSync keep it serving. Used by `npm start`,
// `npm run dev` and `npm test` unless PASTLOAD_SMTP_URL names a real SMTP server.
import { readdirSync, readFileSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:http'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { forkService, serviceFolder, stopper } from './child-service.mjs'
import { log } from './log.mjs'

const SELF = fileURLToPath(import.meta.url)
/** Messages larger than this are refused by the catcher (the product's own mail is a few KB). */
const MAX_MESSAGE_BYTES = 5 * 1024 * 1024

/** True when the environment names a real SMTP server, so no catcher is started. */
export function externalSmtp(env = process.env) {
  return Boolean(env.PASTLOAD_SMTP_URL)
}



/**
 * Starts the catcher: SMTP on 127.0.0.1:`port`, the web inbox on 127.0.0.1:`webPort`
 * (0: a free port each) and returns `{ env, stop, port, webUrl, directory }`: `env`
 * holds PASTLOAD_SMTP_PORT, PASTLOAD_MAIL_DIR and PASTLOAD_MAIL_WEB_URL for the app and the tests; `stop()`
 * (synchronous) stops it. `fresh` empties `.data/<name>` first and removes it on stop
 * (test runs). `optional`: when it cannot start, log why and return an empty env (the
 * app then keeps its messages in the outbox and retries).
 */
export async function startMailCatcher({ projectRoot, name, port, webPort, fresh = false, optional = false }) {
  try {
    const directory = serviceFolder(projectRoot, name, 'mail', fresh)
    return await launch(directory, port, webPort, fresh)
  }
  catch (err) {
    const why = err.code === 'EADDRINUSE' ? `port ${err.port ?? port} is in use by another program: choose others with PASTLOAD_SMTP_PORT and PASTLOAD_MAIL_WEB_PORT` : err.message
    if (!optional) throw new Error(`The local mail catcher did not start: ${why}`)
    log('mail', `The local mail catcher did not start (${why}): messages wait in the outbox until an SMTP server answers.`)
    return { env: {}, port: null, webUrl: null, directory: null, stop: () => {} }
  }
}

async function launch(directory, port, webPort, removeOnStop) {
  const { child, msg } = await forkService(SELF, ['--serve', directory, String(port ?? 0), String(webPort ?? 0)])
  const webUrl = `http://127.0.0.1:${msg.webPort}`
  log('mail', `Mail catcher: SMTP on 127.0.0.1:${msg.port}; read the messages at ${webUrl} (files in ${directory})`)
  const stop = stopper(child, directory, removeOnStop, () => log('mail', `Mail catcher on port ${msg.port} stopped`))
  return { env: { PASTLOAD_SMTP_PORT: String(msg.port), PASTLOAD_MAIL_DIR: directory, PASTLOAD_MAIL_WEB_URL: webUrl }, port: msg.port, webUrl, directory, stop }
}

// ---- the child process ----

const escapeHtml = s => String(s ?? '').replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)
/** Plain text with its http(s) addresses as links (opened in a new tab), so a demo user can follow a message's link. */
function linkify(text) {
  let out = ''
  let last = 0
  for (const m of String(text ?? '').matchAll(/https?:\/\/[^\s<>"]+/g)) {
    out += `${escapeHtml(text.slice(last, m.index))}<a href="${escapeHtml(m[0])}" target="_blank" rel="noopener noreferrer">${escapeHtml(m[0])}</a>`
    last = m.index + m[0].length
  }
  return out + escapeHtml(String(text ?? '').slice(last))
}
const PAGE_CSP = "default-src 'none'; style-src 'unsafe-inline'; frame-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'"
// A message's own HTML is shown in a sandboxed frame: no scripts, no forms, nothing fetched.
const MESSAGE_CSP = "sandbox allow-popups allow-popups-to-escape-sandbox; default-src 'none'; style-src 'unsafe-inline'; img-src data:; frame-ancestors 'self'"
const STYLE = `body{font:15px/1.45 system-ui,sans-serif;margin:0;color:#1f2a30;background:#f4f6f5}
header{background:#123b4a;color:#fff;padding:10px 18px}header b{font-size:17px}main{max-width:960px;margin:0 auto;padding:16px}
table{width:100%;border-collapse:collapse;background:#fff}td,th{padding:6px 8px;border-bottom:1px solid #dde3e1;text-align:left;vertical-align:top}
a{color:#0f5c73}pre{white-space:pre-wrap;overflow-wrap:anywhere;background:#fff;padding:12px;border:1px solid #dde3e1}iframe{width:100%;height:520px;border:1px solid #dde3e1;background:#fff}
.meta{color:#55646b;font-size:13px}`

function page(title, body) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(title)}</title><style>${STYLE}</style></head>`
    + `<body><header><b>Pastload mail catcher</b> · messages the local app sent (nothing leaves this machine)</header><main>${body}</main></body></html>`
}

async function serve(directory, port, webPort) {
  let smtp, http
  let seq = 0
  const files = () => readdirSync(directory).filter(f => /^[\w-]+\.eml$/.test(f)).sort().reverse()
  const read = async (id) => {
    if (!/^[\w-]+$/.test(id)) return null
    let raw
    try { raw = readFileSync(join(directory, `${id}.eml`)) }
    catch { return null }
    const { simpleParser } = await import('mailparser')
    return { raw, mail: await simpleParser(raw) }
  }
  try {
    const { SMTPServer } = await import('smtp-server')
    smtp = new SMTPServer({
      authOptional: true,
      allowInsecureAuth: true,
      disabledCommands: ['STARTTLS'],
      size: MAX_MESSAGE_BYTES,
      logger: false,
      banner: 'Pastload mail catcher',
      onAuth(auth, session, callback) { callback(null, { user: auth.username || 'catcher' }) },
      onData(stream, session, callback) {
        const chunks = []
        stream.on('data', c => chunks.push(c))
        stream.on('end', () => {
          if (stream.sizeExceeded) {
            callback(Object.assign(new Error('Message too large'), { responseCode: 552 }))
            return
          }
          const id = `${Date.now()}-${String(++seq).padStart(6, '0')}`
          writeFileSync(join(directory, `${id}.eml`), Buffer.concat(chunks))
          callback(null, `Kept as ${id}`)
        })
      },
    })
    // A sender that hangs up mid-session (the app stopped or restarted under an open connection) is reported as an
    // 'error' event: without a listener it would end the catcher. Nothing was received, so there is nothing to keep.
    smtp.on('error', () => {})
    await new Promise((resolve, reject) => {
      smtp.server.once('error', err => reject(Object.assign(err, { port })))
      smtp.listen(port, '127.0.0.1', resolve)
    })
    http = createServer((req, res) => {
      handle(req, res).catch(() => {
        res.writeHead(500, { 'content-type': 'text/plain' })
        res.end('Could not read the message.')
      })
    })
    const handle = async (req, res) => {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1')
      const headers = { 'cache-control': 'no-store', 'x-content-type-options': 'nosniff', 'referrer-policy': 'no-referrer' }
      if (req.method !== 'GET') {
        res.writeHead(405, { ...headers, 'content-type': 'text/plain' })
        res.end('The mail catcher is read-only.')
        return
      }
      if (url.pathname === '/api/messages') {
        const list = []
        for (const f of files().slice(0, 200)) {
          const m = await read(f.slice(0, -4))
          if (m) list.push({ id: f.slice(0, -4), subject: m.mail.subject ?? '', to: m.mail.to?.text ?? '', from: m.mail.from?.text ?? '', date: m.mail.date?.toISOString() ?? null, text: m.mail.text ?? '' })
        }
        res.writeHead(200, { ...headers, 'content-type': 'application/json' })
        res.end(JSON.stringify({ messages: list }))
        return
      }
      const one = /^\/messages\/([\w-]+)(\.eml|\/html)?$/.exec(url.pathname)
      if (one) {
        const m = await read(one[1])
        if (!m) {
          res.writeHead(404, { ...headers, 'content-type': 'text/plain' })
          res.end('No such message.')
          return
        }
        if (one[2] === '.eml') {
          res.writeHead(200, { ...headers, 'content-type': 'message/rfc822', 'content-disposition': `attachment; filename="${one[1]}.eml"` })
          res.end(m.raw)
          return
        }
        if (one[2] === '/html') {
          res.writeHead(200, { ...headers, 'content-type': 'text/html; charset=utf-8', 'content-security-policy': MESSAGE_CSP })
          res.end(m.mail.html || `<pre>${escapeHtml(m.mail.text)}</pre>`)
          return
        }
        const body = `<p><a href="/">← All messages</a></p><h1>${escapeHtml(m.mail.subject)}</h1>`
          + `<p class="meta">From ${escapeHtml(m.mail.from?.text)} · to ${escapeHtml(m.mail.to?.text)} · ${escapeHtml(m.mail.date?.toISOString())} · <a href="/messages/${one[1]}.eml">.eml file</a></p>`
          + (m.mail.html ? `<h2>As HTML</h2><iframe title="The message as HTML" sandbox="allow-popups allow-popups-to-escape-sandbox" src="/messages/${one[1]}/html"></iframe>` : '')
          + `<h2>As plain text</h2><pre>${linkify(m.mail.text ?? '')}</pre>`
        res.writeHead(200, { ...headers, 'content-type': 'text/html; charset=utf-8', 'content-security-policy': PAGE_CSP })
        res.end(page(m.mail.subject ?? 'Message', body))
        return
      }
      if (url.pathname === '/') {
        const rows = []
        for (const f of files().slice(0, 200)) {
          const m = await read(f.slice(0, -4))
          if (m) rows.push(`<tr><td class="meta">${escapeHtml(m.mail.date?.toISOString().replace('T', ' ').slice(0, 19))}</td><td>${escapeHtml(m.mail.to?.text)}</td><td><a href="/messages/${f.slice(0, -4)}">${escapeHtml(m.mail.subject || '(no subject)')}</a></td></tr>`)
        }
        const body = rows.length
          ? `<p class="meta">${rows.length} message(s), newest first. Reload to see new ones.</p><table><thead><tr><th>Received (UTC)</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows.join('')}</tbody></table>`
          : '<p>No messages yet. Mail the app sends (review requests, invitations, password resets) appears here.</p>'
        res.writeHead(200, { ...headers, 'content-type': 'text/html; charset=utf-8', 'content-security-policy': PAGE_CSP })
        res.end(page('Mail catcher', body))
        return
      }
      res.writeHead(404, { ...headers, 'content-type': 'text/plain' })
      res.end('Not found.')
    }
    await new Promise((resolve, reject) => {
      http.once('error', err => reject(Object.assign(err, { port: webPort })))
      http.listen(webPort, '127.0.0.1', resolve)
    })
  }
  catch (err) {
    const missing = err.code === 'ERR_MODULE_NOT_FOUND'
    process.send?.({ error: missing ? 'smtp-server or mailparser is not installed (devDependencies: run `npm ci` without --omit=dev)' : err.message, code: err.code, port: err.port })
    process.exit(1)
  }
  const close = () => {
    http.closeAllConnections()
    http.close()
    smtp.close(() => process.exit(0))
    setTimeout(() => process.exit(0), 2000).unref()
  }
  process.on('SIGTERM', close)
  process.on('SIGINT', close)
  // The parent went away (even by kill -9): its IPC channel closes, and so does the catcher.
  process.on('disconnect', close)
  process.send?.({ port: smtp.server.address().port, webPort: http.address().port })
}

if (process.argv[1] === SELF && process.argv[2] === '--serve') {
  void serve(process.argv[3], Number(process.argv[4]), Number(process.argv[5]))
}
