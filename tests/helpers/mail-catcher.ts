// An SMTP server embedded in the test process (smtp-server) that parses what it receives
// (mailparser), so a test reads back the subject, recipients, text, HTML and links of the
// messages the app delivered. It can be stopped and started again on the same port.
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { freePort } from './server'

export interface CaughtMessage {
  to: string[]
  subject: string
  text: string
  html: string
  /** Every http(s) URL in the plain text. */
  links: string[]
  headers: Map<string, unknown>
}

export class TestMailCatcher {
  readonly messages: CaughtMessage[] = []
  port = 0
  private server: SMTPServer | null = null

  async start(): Promise<number> {
    if (this.server) return this.port
    if (!this.port) this.port = await freePort()
    const server = new SMTPServer({
      authOptional: true,
      allowInsecureAuth: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onData: (stream, _session, callback) => {
        simpleParser(stream).then((mail) => {
          const to = (Array.isArray(mail.to) ? mail.to : mail.to ? [mail.to] : []).flatMap(a => a.value.map(v => v.address ?? ''))
          const text = mail.text ?? ''
          this.messages.push({ to, subject: mail.subject ?? '', text, html: typeof mail.html === 'string' ? mail.html : '', links: text.match(/https?:\/\/\S+/g) ?? [], headers: mail.headers })
          callback()
        }, (err: Error) => callback(err))
      },
    })
    // A sender that hangs up mid-session (the app's worker or a test server stopped, the catcher stopped under an
    // open connection) is reported as an 'error' event: without a listener it would end the test process.
    server.on('error', () => {})
    await new Promise<void>((resolve, reject) => {
      server.server.once('error', reject)
      server.listen(this.port, '127.0.0.1', () => resolve())
    })
    this.server = server
    return this.port
  }

  async stop(): Promise<void> {
    const server = this.server
    this.server = null
    if (server) await new Promise<void>(resolve => server.close(() => resolve()))
  }

  /** Messages to one address. */
  to(address: string): CaughtMessage[] {
    return this.messages.filter(m => m.to.includes(address))
  }

  /** Waits (polling, up to `ms`) until `predicate` holds, and says what was caught if it never does. */
  async waitFor(predicate: () => boolean, what: string, ms = 20_000): Promise<void> {
    const deadline = Date.now() + ms
    while (!predicate()) {
      if (Date.now() > deadline) throw new Error(`No ${what} within ${ms / 1000} s; caught: ${JSON.stringify(this.messages.map(m => ({ to: m.to, subject: m.subject })))}`)
      await new Promise(r => setTimeout(r, 100))
    }
  }
}
