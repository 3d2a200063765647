import { type Tx, useDb } from '../db/client'
import { auditEvents } from '../db/schema'

/** The actions the audit log records: row writes, imports, σ'p adoptions, review-flag state, sign-in and password events, invitations and accounts disabled or enabled. */
export type AuditAction
  = | 'create' | 'update' | 'delete'
    | 'import'
    | 'adopt' | 'withdraw'
    | 'resolve' | 'reopen'
    | 'login' | 'logout' | 'password-change'
    | 'invite' | 'revoke' | 'accept' | 'password-reset' | 'disable' | 'enable'

export interface AuditEntry {
  actorId: string | null
  projectId?: string | null
  action: AuditAction
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

/** Records one write; pass the transaction so the audit row commits or rolls back with it. */
export async function recordAudit(entry: AuditEntry, tx?: Tx): Promise<void> {
  const db = tx ?? useDb()
  await db.insert(auditEvents).values({
    actorId: entry.actorId,
    projectId: entry.projectId ?? null,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: redact(entry.before),
    after: redact(entry.after),
  })
}

/** Never write secrets into the audit log. */
function redact(value: unknown): unknown {
  if (!value || typeof value !== 'object') return value ?? null
  const copy: Record<string, unknown> = { ...(value as Record<string, unknown>) }
  for (const key of ['passwordHash', 'tokenHash', 'password']) {
    if (key in copy) copy[key] = '[redacted]'
  }
  return copy
}
