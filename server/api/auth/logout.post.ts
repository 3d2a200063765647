import { recordAudit } from '~~/server/services/audit'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const lucia = useLucia()
  if (event.context.sessionId) await lucia.invalidateSession(event.context.sessionId)
  writeSessionCookie(event, lucia.createBlankSessionCookie())
  await recordAudit({ actorId: user.id, action: 'logout', entity: 'session' })
  return { ok: true }
})
