import { applyBearerToken } from '../services/api-tokens'

/**
 * Puts the caller on `event.context`: a Lucia session from the cookie (renewed
 * when Lucia extends it) or a personal API token from `Authorization: Bearer`.
 */
export default defineEventHandler(async (event) => {
  event.context.user = null
  event.context.authVia = null
  const header = getRequestHeader(event, 'authorization')
  if (header?.startsWith('Bearer ')) {
    await applyBearerToken(event, header.slice(7).trim())
    return
  }
  const lucia = useLucia()
  const { token, present } = sessionTokenFromCookie(event)
  if (!present) return
  // Only the token's hash is stored: look the hash up, answer with the token.
  const { session, user } = token ? await lucia.validateSession(sessionIdFromToken(token)) : { session: null, user: null }
  if (!session || !token) {
    writeSessionCookie(event, lucia.createBlankSessionCookie())
    return
  }
  // A disabled account's sessions are deleted when it is disabled; one that slipped in since ends here.
  if (user.disabledAt) {
    await lucia.invalidateUserSessions(user.id)
    writeSessionCookie(event, lucia.createBlankSessionCookie())
    return
  }
  if (session.fresh) writeSessionCookie(event, lucia.createSessionCookie(token))
  event.context.user = { id: user.id, email: user.email, displayName: user.displayName, isSiteAdmin: user.isSiteAdmin }
  event.context.sessionId = session.id
  event.context.authVia = 'session'
})
