// Where the browser goes after signing in, and the words of a failed sign-in (shared/auth/sign-in.ts).
import { describe, expect, it } from 'vitest'
import { isSignInFailure, SIGN_IN_FAILURES, signInNext, throttledMessage } from '../../shared/auth/sign-in'

describe('signInNext', () => {
  it('follows a path of this site, query and fragment included', () => {
    expect(signInNext('/account')).toBe('/account')
    expect(signInNext('/projects/abc/models/def?x=1#y')).toBe('/projects/abc/models/def?x=1#y')
  })

  it('does not follow another site, a relative or malformed address, or a value that is not one string', () => {
    for (const next of ['//elsewhere.example', '/\\elsewhere.example', 'https://elsewhere.example/', 'projects', '', '/a\nb', '/a\u007Fb', `/${'a'.repeat(2000)}`, undefined, null, ['/account'], 42]) {
      expect(signInNext(next), String(next)).toBe('/')
    }
  })
})

describe('the words of a failed sign-in', () => {
  it('knows its four codes and nothing else', () => {
    expect(Object.keys(SIGN_IN_FAILURES).sort()).toEqual(['disabled', 'incomplete', 'throttled', 'wrong'])
    expect(isSignInFailure('wrong')).toBe(true)
    expect(isSignInFailure('toString')).toBe(false)
    expect(isSignInFailure(undefined)).toBe(false)
  })

  it('rounds the throttle\'s wait up to whole minutes, at least one', () => {
    expect(throttledMessage(900)).toBe('Too many failed sign-ins. Try again in 15 minute(s).')
    expect(throttledMessage(61)).toBe('Too many failed sign-ins. Try again in 2 minute(s).')
    expect(throttledMessage(0)).toBe('Too many failed sign-ins. Try again in 1 minute(s).')
  })
})
