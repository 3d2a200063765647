import { describe, expect, it } from 'vitest'
import { NOTIFICATION_KINDS, NOTIFICATION_KIND_LABELS } from '../../../shared/notifications/kinds'
import { mailSettingsFromEnv, publicBaseUrl, retryDelayMs } from '../../../server/services/mail-settings'
import { absoluteLink, MAIL_TEMPLATES, renderMail } from '../../../server/services/mail-templates'

const BASE = 'https://pastload.example.org'

describe('mail templates', () => {
  it('every kind has its template, and text and HTML carry the title, the words and the absolute link to the exact page', () => {
    for (const kind of NOTIFICATION_KINDS) {
      const m = renderMail({ kind, title: `Title of ${kind}`, body: 'Line one\nLine two', link: '/projects/p1/models/m1/versions/3', baseUrl: BASE })
      const url = `${BASE}/projects/p1/models/m1/versions/3`
      expect(m.subject).toBe(`Title of ${kind}`)
      expect(m.textBody).toContain(MAIL_TEMPLATES[kind].intro)
      expect(m.textBody).toContain('> Line one\n> Line two')
      expect(m.textBody).toContain(`${MAIL_TEMPLATES[kind].action}: ${url}`)
      expect(m.htmlBody).toContain(`<a href="${url}"`)
      expect(m.htmlBody).toContain('Line one\nLine two')
      expect(m.htmlBody).toContain(`<h1 style="margin:0 0 10px;font-size:20px;line-height:1.3;color:#183a44">Title of ${kind}</h1>`)
    }
  })

  it('says how to turn an optional kind off, and that account mail cannot be', () => {
    const flag = renderMail({ kind: 'flag-raised', title: 'Flag', body: '', link: '/x', baseUrl: BASE })
    expect(flag.textBody).toContain(`set "${NOTIFICATION_KIND_LABELS['flag-raised']}" to Off on your account page: ${BASE}/account#notifications`)
    expect(flag.htmlBody).toContain(`${BASE}/account#notifications`)
    const reset = renderMail({ kind: 'password-reset', title: 'Reset', body: '', link: '/reset-password/abc', baseUrl: BASE })
    expect(reset.textBody).toContain('it cannot be turned off')
    expect(reset.textBody).toContain(`Choose a new password: ${BASE}/reset-password/abc`)
    // No body: no quoted block.
    expect(reset.textBody).not.toContain('\n> ')
  })

  it('escapes the title and the words in HTML and keeps them as typed in the text', () => {
    const m = renderMail({ kind: 'version-returned', title: 'Returned: <b>v3</b> & "more"', body: '<script>alert(1)</script> σ\'p < 80 kPa', link: '/projects/p?a=1&b=2', baseUrl: BASE })
    expect(m.htmlBody).not.toContain('<script>')
    expect(m.htmlBody).not.toContain('<b>v3</b>')
    expect(m.htmlBody).toContain('Returned: &#60;b&#62;v3&#60;/b&#62; &#38; &#34;more&#34;')
    expect(m.htmlBody).toContain('&#60;script&#62;alert(1)&#60;/script&#62; σ&#39;p &#60; 80 kPa')
    expect(m.htmlBody).toContain(`href="${BASE}/projects/p?a=1&#38;b=2"`)
    expect(m.textBody).toContain('> <script>alert(1)</script> σ\'p < 80 kPa')
    expect(m.subject).toBe('Returned: <b>v3</b> & "more"')
  })

  it('keeps the subject on one line (no header folding from a title)', () => {
    expect(renderMail({ kind: 'flag-reply', title: 'Reply\r\nBcc: someone@else.test', body: '', link: '/', baseUrl: BASE }).subject).toBe('Reply Bcc: someone@else.test')
  })

  it('links only to pages of this site', () => {
    expect(absoluteLink('/projects/1', BASE)).toBe(`${BASE}/projects/1`)
    expect(absoluteLink('https://elsewhere.test/x', BASE)).toBe(`${BASE}/`)
    expect(absoluteLink('//elsewhere.test/x', BASE)).toBe(`${BASE}/`)
    expect(absoluteLink('javascript:alert(1)', BASE)).toBe(`${BASE}/`)
    expect(absoluteLink('/a', 'http://127.0.0.1:3000/ignored/path')).toBe('http://127.0.0.1:3000/a')
  })
})

describe('mail settings', () => {
  it('uses the local catcher unless PASTLOAD_SMTP_URL names a server', () => {
    expect(mailSettingsFromEnv({})).toMatchObject({ smtpUrl: 'smtp://127.0.0.1:54332', local: true, worker: true, pollMs: 5000, maxAttempts: 8 })
    expect(mailSettingsFromEnv({ PASTLOAD_SMTP_PORT: '2525' }).smtpUrl).toBe('smtp://127.0.0.1:2525')
    expect(mailSettingsFromEnv({ PASTLOAD_SMTP_URL: 'smtps://u:p@mail.example.org:465' })).toMatchObject({ smtpUrl: 'smtps://u:p@mail.example.org:465', local: false })
    expect(mailSettingsFromEnv({ PASTLOAD_MAIL_WORKER: 'off' }).worker).toBe(false)
    // Nonsense falls back to the default rather than a zero interval.
    expect(mailSettingsFromEnv({ PASTLOAD_MAIL_POLL_MS: '0', PASTLOAD_MAIL_MAX_ATTEMPTS: 'many' })).toMatchObject({ pollMs: 5000, maxAttempts: 8 })
  })

  it('backs off exponentially up to the cap', () => {
    const s = { retryBaseMs: 30_000, retryMaxMs: 3_600_000 }
    expect([1, 2, 3, 4, 8, 9, 50].map(n => retryDelayMs(n, s))).toEqual([30_000, 60_000, 120_000, 240_000, 3_600_000, 3_600_000, 3_600_000])
  })

  it('builds links on PASTLOAD_PUBLIC_URL, else on the address the server listens on', () => {
    expect(publicBaseUrl({ PASTLOAD_PUBLIC_URL: 'https://pastload.example.org/' })).toBe('https://pastload.example.org')
    expect(publicBaseUrl({ NITRO_HOST: '127.0.0.1', NITRO_PORT: '3104' })).toBe('http://127.0.0.1:3104')
    expect(publicBaseUrl({ NITRO_HOST: '0.0.0.0', NITRO_PORT: '8080' })).toBe('http://127.0.0.1:8080')
    expect(publicBaseUrl({})).toBe('http://127.0.0.1:3000')
  })
})
