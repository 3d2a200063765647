import type { ApiTokenListReply } from '#shared/types/api-tokens'
import { listApiTokens } from '~~/server/services/api-tokens'

/** The caller's API tokens, newest first, with scope and expiry (never the secret or its hash). */
export default defineEventHandler(async (event): Promise<ApiTokenListReply> => {
  const user = requireSessionUser(event, 'Listing API tokens')
  return { tokens: await listApiTokens(user.id) }
})
