/** What a token may do: everything its user may, or only read (GET/HEAD and the compute routes). */
export type ApiTokenScope = 'read-write' | 'read-only'

/** One of the caller's API tokens as listed on the account page (never the secret or its hash). */
export interface ApiTokenRow {
  id: string
  name: string
  prefix: string
  scope: ApiTokenScope
  createdAt: string
  expiresAt: string
  lastUsedAt: string | null
  revokedAt: string | null
}

/** GET /api/account/tokens */
export interface ApiTokenListReply {
  tokens: ApiTokenRow[]
}

/** POST /api/account/tokens (201): the secret `token` is in this reply only. */
export interface ApiTokenCreatedReply {
  token: Omit<ApiTokenRow, 'lastUsedAt' | 'revokedAt'> & { token: string }
}
