import { and, asc, count, eq, ilike, isNull, ne, or, sql } from 'drizzle-orm'
import type { SessionUser } from '#shared/schemas/auth'
import type { AdminUserUpdateInput } from '#shared/schemas/people'
import type { ServerPeopleList, ServerPersonRow } from '#shared/types/people'
import { type Tx, useDb } from '../db/client'
import { projectMembers, sessions, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { recordAudit } from './audit'

const projectCount = sql<number>`(select count(*)::int from ${projectMembers} where ${projectMembers.userId} = ${users.id})`

const PERSON_COLUMNS = {
  id: users.id,
  email: users.email,
  displayName: users.displayName,
  isSiteAdmin: users.isSiteAdmin,
  disabledAt: users.disabledAt,
  createdAt: users.createdAt,
  projects: projectCount,
}

/** `%`, `_` and `\` typed in the search box match themselves. */
const likePattern = (q: string) => `%${q.replace(/[\\%_]/g, c => `\\${c}`)}%`

/** Every account for the people page: name, e-mail, site admin, disabled, how many projects; optionally filtered. */
export async function listPeople(args: { limit: number, offset: number, q?: string }): Promise<ServerPeopleList> {
  const db = useDb()
  const where = args.q ? or(ilike(users.displayName, likePattern(args.q)), ilike(users.email, likePattern(args.q))) : undefined
  const rows = await db.select(PERSON_COLUMNS).from(users).where(where)
    .orderBy(asc(users.displayName), asc(users.id)).limit(args.limit).offset(args.offset)
  const [total] = await db.select({ n: count() }).from(users).where(where)
  return { users: rows, total: total?.n ?? 0, limit: args.limit, offset: args.offset }
}

async function personRow(tx: Tx, userId: string): Promise<ServerPersonRow> {
  return returnedRow(await tx.select(PERSON_COLUMNS).from(users).where(eq(users.id, userId)))
}

const conflict = (message: string) => createError({ statusCode: 409, statusMessage: 'Conflict', message })

/**
 * A site admin disables or enables an account, or grants or revokes site admin. A disabled
 * account's sessions are deleted in the same transaction (its API tokens are refused while it
 * stays disabled, see api-tokens.ts). The site always keeps an enabled site admin (409), and
 * nobody disables their own account (409). The site-admin rows are locked first, so two admins
 * revoking each other at once cannot both succeed.
 */
export async function updatePerson(args: { actor: SessionUser, userId: string, change: AdminUserUpdateInput }): Promise<ServerPersonRow> {
  const { actor, userId, change } = args
  return useDb().transaction(async (tx) => {
    await tx.select({ id: users.id }).from(users).where(eq(users.isSiteAdmin, true)).orderBy(asc(users.id)).for('update')
    const [target] = await tx.select().from(users).where(eq(users.id, userId)).for('update')
    if (!target) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Account not found.' })
    const disable = change.disabled === true && !target.disabledAt
    const enable = change.disabled === false && !!target.disabledAt
    if (disable && target.id === actor.id) throw conflict('You cannot disable your own account.')
    const staysAdmin = (change.isSiteAdmin ?? target.isSiteAdmin) && !(change.disabled ?? !!target.disabledAt)
    if (target.isSiteAdmin && !target.disabledAt && !staysAdmin) {
      const [others] = await tx.select({ n: count() }).from(users)
        .where(and(eq(users.isSiteAdmin, true), isNull(users.disabledAt), ne(users.id, target.id)))
      if ((others?.n ?? 0) === 0) throw conflict('This is the last enabled site admin: make someone else site admin first.')
    }
    const set: Partial<typeof users.$inferInsert> = {}
    if (disable) set.disabledAt = new Date()
    if (enable) set.disabledAt = null
    if (change.isSiteAdmin !== undefined && change.isSiteAdmin !== target.isSiteAdmin) set.isSiteAdmin = change.isSiteAdmin
    if (Object.keys(set).length === 0) return personRow(tx, target.id)
    set.updatedAt = new Date()
    await tx.update(users).set(set).where(eq(users.id, target.id))
    if (disable) await tx.delete(sessions).where(eq(sessions.userId, target.id))
    const before = { isSiteAdmin: target.isSiteAdmin, disabledAt: target.disabledAt }
    const after = { isSiteAdmin: set.isSiteAdmin ?? target.isSiteAdmin, disabledAt: 'disabledAt' in set ? set.disabledAt : target.disabledAt }
    const action = disable ? 'disable' : enable ? 'enable' : 'update'
    await recordAudit({ actorId: actor.id, action, entity: 'user', entityId: target.id, before, after }, tx)
    return personRow(tx, target.id)
  })
}
