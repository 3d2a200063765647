/**
 * What a failed sign-in tells the person, in one place: the JSON route's messages and the sign-in page's (whose form
 * the browser sends itself and which learns the outcome from its address: `/login?failed=<code>`).
 */
export const SIGN_IN_FAILURES = {
  /** An unknown e-mail and a wrong password get the same answer. */
  wrong: 'E-mail or password is wrong.',
  throttled: 'Too many failed sign-ins. Try again in a few minutes.',
  disabled: 'This account is disabled. Ask a site admin to enable it.',
  incomplete: 'Enter your e-mail address and password.',
} as const
export type SignInFailure = keyof typeof SIGN_IN_FAILURES

export function isSignInFailure(code: unknown): code is SignInFailure {
  return typeof code === 'string' && Object.hasOwn(SIGN_IN_FAILURES, code)
}

/** The throttle's message with its wait (seconds), rounded up to minutes. */
export function throttledMessage(waitSeconds: number): string {
  return `Too many failed sign-ins. Try again in ${Math.max(1, Math.ceil(waitSeconds / 60))} minute(s).`
}

/**
 * Where to go after signing in: a path of this site (`/projects/…`), else the start page. An address of another
 * site (`//host`, `/\host`, `https://…`) or anything too long or with control characters is not followed.
 */
export function signInNext(next: unknown): string {
  if (typeof next !== 'string' || next.length > 2000 || !next.startsWith('/')) return '/'
  if (next.startsWith('//') || next.startsWith('/\\') || [...next].some(c => c.charCodeAt(0) < 0x20 || c.charCodeAt(0) === 0x7F)) return '/'
  return next
}
