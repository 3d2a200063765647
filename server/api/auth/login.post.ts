import { LoginSchema } from '#shared/schemas/auth'
import { signInWithPassword } from '~~/server/services/sign-in'

/** Signs in with e-mail and password (JSON): `{ user }` and the session cookie; 401, 403 or 429 otherwise. */
export default defineEventHandler(async (event) => {
  const { email, password } = await validateBody(event, LoginSchema)
  return { user: await signInWithPassword(event, email, password) }
})
