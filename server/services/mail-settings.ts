/** How the app sends e-mail, read from the environment (README, Environment). */
export interface MailSettings {
  /** `PASTLOAD_SMTP_URL` (a real server), else the local catcher on 127.0.0.1:`PASTLOAD_SMTP_PORT`. */
  smtpUrl: string
  /** True when the SMTP server is the local catcher (plain SMTP on loopback, no STARTTLS). */
  local: boolean
  from: string
  /** Whether this process delivers the outbox (`PASTLOAD_MAIL_WORKER=off`: another process does). */
  worker: boolean
  /** The longest wait between two looks at the outbox; a commit that writes mail wakes the worker at once. */
  pollMs: number
  /** The first retry's wait; each further one doubles it, up to `retryMaxMs`. */
  retryBaseMs: number
  retryMaxMs: number
  /** After this many failed attempts a message is marked failed (a site admin can retry it). */
  maxAttempts: number
}

function whole(value: string | undefined, fallback: number, min: number, max: number): number {
  const n = Number(value)
  return value !== undefined && value !== '' && Number.isInteger(n) && n >= min && n <= max ? n : fallback
}

export function mailSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): MailSettings {
  const external = env.PASTLOAD_SMTP_URL?.trim()
  return {
    smtpUrl: external || `smtp://127.0.0.1:${whole(env.PASTLOAD_SMTP_PORT, 54332, 1, 65535)}`,
    local: !external,
    from: env.PASTLOAD_MAIL_FROM?.trim() || 'Pastload <pastload@localhost>',
    worker: env.PASTLOAD_MAIL_WORKER !== 'off',
    pollMs: whole(env.PASTLOAD_MAIL_POLL_MS, 5_000, 50, 3_600_000),
    retryBaseMs: whole(env.PASTLOAD_MAIL_RETRY_BASE_MS, 30_000, 10, 3_600_000),
    retryMaxMs: whole(env.PASTLOAD_MAIL_RETRY_MAX_MS, 3_600_000, 10, 86_400_000),
    maxAttempts: whole(env.PASTLOAD_MAIL_MAX_ATTEMPTS, 8, 1, 100),
  }
}

/**
 * The site's public origin for links in e-mail: `PASTLOAD_PUBLIC_URL`, else the address the
 * server listens on (127.0.0.1 when it listens on every interface).
 */
export function publicBaseUrl(env: NodeJS.ProcessEnv = process.env): string {
  const configured = env.PASTLOAD_PUBLIC_URL?.trim()
  if (configured) {
    try {
      return new URL(configured).origin
    }
    catch { /* fall back to the listening address */ }
  }
  const rawHost = env.NITRO_HOST || env.HOST || '127.0.0.1'
  const host = rawHost === '0.0.0.0' || rawHost === '::' ? '127.0.0.1' : rawHost.includes(':') ? `[${rawHost}]` : rawHost
  const port = env.NITRO_PORT || env.PORT || '3000'
  return `http://${host}:${port}`
}

/** Delay before retry number `attempt` (1-based): base, 2×base, 4×base … capped. */
export function retryDelayMs(attempt: number, s: Pick<MailSettings, 'retryBaseMs' | 'retryMaxMs'>): number {
  return Math.min(s.retryMaxMs, s.retryBaseMs * 2 ** Math.max(0, Math.min(30, attempt - 1)))
}

/** The PostgreSQL channel a commit that writes mail announces itself on, to wake the delivery worker. */
export const MAIL_OUTBOX_CHANNEL = 'pastload_mail_outbox'
