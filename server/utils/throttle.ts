import type { H3Event } from 'h3'
import { takeScopedAttempt } from '../services/login-throttle'

/**
 * What each public door allows from one IP address in 15 minutes (and per e-mail from one
 * address where a subject is given). Generous for a person, tight for a script.
 */
const DOORS = {
  'password-reset': { perIp: 20, perPair: 5 },
  'link': { perIp: 40 },
} as const

/** Takes one attempt at a public door for the caller's IP, or answers 429 with Retry-After. */
export async function throttleDoor(event: H3Event, door: keyof typeof DOORS, subject = ''): Promise<void> {
  const wait = await takeScopedAttempt(door, clientIp(event), DOORS[door], subject)
  if (wait > 0) {
    setResponseHeader(event, 'Retry-After', wait)
    throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `Too many attempts from your address. Try again in ${Math.ceil(wait / 60)} minute(s).` })
  }
}
