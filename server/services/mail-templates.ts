import { NOTIFICATION_KIND_LABELS, OPTIONAL_NOTIFICATION_KINDS, type NotificationKind } from '#shared/notifications/kinds'

/** What one kind of message says around the event's own title and words. */
interface KindTemplate {
  /** The first line under the title. */
  intro: string
  /** The words of the link to the exact page. */
  action: string
}

/** One template per kind: the text and the HTML of a message are both drawn from it. */
export const MAIL_TEMPLATES: Record<NotificationKind, KindTemplate> = {
  'review-requested': { intro: 'A site-model version is waiting for your review.', action: 'Open the version to review it' },
  'version-approved': { intro: 'A site-model version you submitted or work on was approved.', action: 'Open the approved version' },
  'version-returned': { intro: 'A site-model version you submitted or work on was returned with a comment.', action: 'Open the returned version' },
  'flag-raised': { intro: 'A reviewer raised a flag on a test you adopted or an interval you logged.', action: 'Open the flag' },
  'flag-reply': { intro: 'Someone replied in a flag thread you are part of.', action: 'Open the thread' },
  'invitation': { intro: 'You are invited to work in Pastload. The link below works once and expires; it asks you for a name and a password.', action: 'Accept the invitation' },
  'password-reset': { intro: 'Someone asked to reset the password of your Pastload account. If it was not you, ignore this e-mail: your password stays as it is. The link works once and expires in an hour.', action: 'Choose a new password' },
  'member-added': { intro: 'You were added to a project in Pastload.', action: 'Open the project' },
}

export interface MailInput {
  kind: NotificationKind
  title: string
  /** The event's own words (a comment, a flag's text); may be empty. */
  body: string
  /** The app path of the exact page ("/projects/…"). */
  link: string
  /** The site's public origin, e.g. "https://pastload.example.org". */
  baseUrl: string
}

export interface RenderedMail {
  subject: string
  textBody: string
  htmlBody: string
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)
/** Subjects are one line: control characters (a folded header) become spaces. */
// eslint-disable-next-line no-control-regex -- control characters are exactly what is removed
const oneLine = (s: string) => s.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim()

/**
 * The absolute URL of an app path on this site. Anything that is not a path of this site (another
 * origin, `//host`, a `javascript:` URL) falls back to the site's home, so a message never links away.
 */
export function absoluteLink(link: string, baseUrl: string): string {
  const base = new URL(baseUrl)
  const home = `${base.origin}/`
  if (!link.startsWith('/') || link.startsWith('//')) return home
  try {
    const url = new URL(link, base.origin)
    return url.origin === base.origin ? url.href : home
  }
  catch {
    return home
  }
}

/** How to stop this kind of message (account mail cannot be turned off). */
function footer(kind: NotificationKind, baseUrl: string): string {
  const optional = (OPTIONAL_NOTIFICATION_KINDS as readonly NotificationKind[]).includes(kind)
  if (!optional) return 'You get this e-mail because someone asked for it on Pastload; it cannot be turned off. If you did not expect it, ignore it.'
  return `To stop e-mails like this one, set "${NOTIFICATION_KIND_LABELS[kind]}" to Off on your account page: ${absoluteLink('/account#notifications', baseUrl)} (the in-app inbox still lists it).`
}

/** Plain text and HTML of one message, from the kind's template. */
export function renderMail(m: MailInput): RenderedMail {
  const t = MAIL_TEMPLATES[m.kind]
  const url = absoluteLink(m.link, m.baseUrl)
  const subject = oneLine(m.title).slice(0, 200)
  const body = m.body.trim()
  const foot = footer(m.kind, m.baseUrl)
  const textBody = [
    subject,
    '',
    t.intro,
    ...(body ? ['', ...body.split(/\r?\n/).map(line => `> ${line}`)] : []),
    '',
    `${t.action}: ${url}`,
    '',
    '-- ',
    'Pastload · stress history from borehole to settlement',
    foot,
    '',
  ].join('\n')

  const e = escapeHtml
  const bodyHtml = body
    ? `<div style="margin:16px 0;padding:10px 14px;border-left:4px solid #dc9c38;background:#fcf7ec;color:#27231f;white-space:pre-wrap">${e(body)}</div>`
    : ''
  const htmlBody = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${e(subject)}</title></head>
<body style="margin:0;padding:0;background:#f8f7f4;font-family:'Source Sans 3','Segoe UI',Helvetica,Arial,sans-serif;color:#27231f">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:#f8f7f4"><tr><td align="center" style="padding:24px 12px">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:560px;background:#ffffff;border:1px solid #dfdacf;border-radius:8px">
<tr><td style="background:#183a44;color:#ffffff;padding:12px 20px;border-radius:8px 8px 0 0;font-weight:700;letter-spacing:0.5px">Pastload</td></tr>
<tr><td style="padding:20px">
<h1 style="margin:0 0 10px;font-size:20px;line-height:1.3;color:#183a44">${e(subject)}</h1>
<p style="margin:0;font-size:15px;line-height:1.5">${e(t.intro)}</p>
${bodyHtml}
<p style="margin:20px 0 6px"><a href="${e(url)}" style="display:inline-block;background:#246575;color:#ffffff;text-decoration:none;padding:10px 16px;border-radius:6px;font-weight:600">${e(t.action)}</a></p>
<p style="margin:0;font-size:12px;color:#675d4f;word-break:break-all">${e(url)}</p>
</td></tr>
<tr><td style="padding:14px 20px;border-top:1px solid #efede7;font-size:12px;line-height:1.5;color:#675d4f">Pastload · stress history from borehole to settlement<br>${e(foot)}</td></tr>
</table></td></tr></table>
</body></html>
`
  return { subject, textBody, htmlBody }
}
