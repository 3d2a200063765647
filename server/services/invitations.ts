import { and, count, desc, eq, gt, isNull, sql } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import { ROLE_LABELS, type ProjectRole } from '#shared/auth/roles'
import type { SessionUser } from '#shared/schemas/auth'
import type { AcceptInvitationInput } from '#shared/schemas/people'
import type { AcceptInvitationReply, ServerInvitationList, ServerInvitationPreview, ServerInviteReply, ServerPendingInvitation } from '#shared/types/people'
import { type Database, type Tx, useDb } from '../db/client'
import { invitations, projectMembers, projects, users } from '../db/schema'
import { returnedRow } from '../db/rows'
import { isUniqueViolation } from '../utils/db-errors'
import { hashPassword } from '../utils/password'
import { recordAudit } from './audit'
import { hashLinkToken, linkState, newLinkToken, workingLink } from './link-tokens'
import { publishLiveEvent } from './live-events'
import { notify, sendAccountMail } from './notify'

/** How long an invitation link works. */
export const INVITATION_DAYS = 7
const DAY_MS = 24 * 60 * 60 * 1000
/** Invitations one project (or the site) may send in 24 hours: a typo loop or a script stops here. */
export const INVITATIONS_PER_DAY = 50

const GONE = {
  used: 'This invitation has already been used. Sign in with the account it created.',
  revoked: 'This invitation was withdrawn. Ask the person who invited you for a new one.',
  expired: 'This invitation has expired. Ask the person who invited you for a new one.',
}
const UNKNOWN = 'This invitation link is not valid. Check that the whole link was copied, or ask for a new invitation.'

type ProjectRef = Pick<typeof projects.$inferSelect, 'id' | 'jobNumber' | 'name'>

const inviter = alias(users, 'inviter')
const PENDING_COLUMNS = {
  id: invitations.id,
  email: invitations.email,
  role: invitations.role,
  expiresAt: invitations.expiresAt,
  createdAt: invitations.createdAt,
  invitedByName: inviter.displayName,
}

const pendingWhere = (projectId: string | null) => and(
  projectId ? eq(invitations.projectId, projectId) : isNull(invitations.projectId),
  isNull(invitations.acceptedAt),
  isNull(invitations.revokedAt),
  gt(invitations.expiresAt, sql`now()`),
)

/** The invitations of a project (or of the site, `projectId` null) still waiting for an answer, newest first. */
export async function listPendingInvitations(projectId: string | null): Promise<ServerInvitationList> {
  const rows = await useDb().select(PENDING_COLUMNS).from(invitations)
    .leftJoin(inviter, eq(inviter.id, invitations.invitedBy))
    .where(pendingWhere(projectId))
    .orderBy(desc(invitations.createdAt))
    .limit(500)
  return { invitations: rows }
}

async function accountByEmail(db: Database | Tx, email: string) {
  const [row] = await db.select({ id: users.id, email: users.email, displayName: users.displayName })
    .from(users).where(sql`lower(${users.email}) = ${email.toLowerCase()}`).limit(1)
  return row
}

/** 429 once the project (or the site) has sent its day's share of invitations. */
async function checkDailyBound(tx: Tx, projectId: string | null): Promise<void> {
  const [sent] = await tx.select({ n: count() }).from(invitations).where(and(
    projectId ? eq(invitations.projectId, projectId) : isNull(invitations.projectId),
    gt(invitations.createdAt, sql`now() - interval '1 day'`),
  ))
  if ((sent?.n ?? 0) >= INVITATIONS_PER_DAY) {
    throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `At most ${INVITATIONS_PER_DAY} invitations a day can be sent from here; try again tomorrow.` })
  }
}

/**
 * Writes one invitation (a fresh link; an earlier pending one to the same address and place
 * is withdrawn, so only the newest link works) and its e-mail, in the caller's transaction.
 */
async function writeInvitation(tx: Tx, args: { actor: SessionUser, project: ProjectRef | null, email: string, role: ProjectRole | null }): Promise<ServerPendingInvitation> {
  const { actor, project, email, role } = args
  const projectId = project?.id ?? null
  await checkDailyBound(tx, projectId)
  await tx.update(invitations).set({ revokedAt: new Date() }).where(and(pendingWhere(projectId), sql`lower(${invitations.email}) = ${email}`))
  const { token, hash } = newLinkToken()
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * DAY_MS)
  const row = returnedRow(await tx.insert(invitations).values({ projectId, email, role, tokenHash: hash, invitedBy: actor.id, expiresAt })
    .returning({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt }))
  await recordAudit({ actorId: actor.id, projectId, action: 'invite', entity: 'invitation', entityId: row.id, after: { email, role, expiresAt } }, tx)
  const until = expiresAt.toISOString().slice(0, 10)
  await sendAccountMail({
    kind: 'invitation',
    to: email,
    projectId,
    title: project ? `${actor.displayName} invites you to ${project.jobNumber} ${project.name} on Pastload` : `${actor.displayName} invites you to Pastload`,
    body: project
      ? `${actor.displayName} invites you to the project ${project.jobNumber} ${project.name} as ${ROLE_LABELS[role ?? 'viewer'].toLowerCase()}. Open the link to choose your name and password. The link works once, until ${until}.`
      : `${actor.displayName} invites you to Pastload. Open the link to choose your name and password. The link works once, until ${until}.`,
    link: `/invitations/${token}`,
  }, tx)
  return { ...row, invitedByName: actor.displayName }
}

/**
 * An owner invites an address to the project with a role: an existing account (any case of
 * the address) becomes a member at once and is told; anyone else gets a one-time link by
 * e-mail. Already a member: 409.
 */
export async function inviteToProject(args: { actor: SessionUser, project: ProjectRef, email: string, role: ProjectRole }): Promise<ServerInviteReply> {
  const { actor, project, email, role } = args
  try {
    return await useDb().transaction(async (tx): Promise<ServerInviteReply> => {
      const account = await accountByEmail(tx, email)
      if (!account) {
        const invitation = await writeInvitation(tx, { actor, project, email, role })
        await publishLiveEvent({ type: 'member.changed', projectId: project.id, entityId: invitation.id }, tx)
        return { outcome: 'invited', invitation }
      }
      const [existing] = await tx.select({ role: projectMembers.role }).from(projectMembers)
        .where(and(eq(projectMembers.projectId, project.id), eq(projectMembers.userId, account.id)))
      if (existing) {
        throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${account.displayName} is already a member (${ROLE_LABELS[existing.role].toLowerCase()}).` })
      }
      const member = returnedRow(await tx.insert(projectMembers).values({ projectId: project.id, userId: account.id, role }).returning())
      await recordAudit({ actorId: actor.id, projectId: project.id, action: 'create', entity: 'project-member', entityId: account.id, after: member }, tx)
      await notify({
        kind: 'member-added',
        projectId: project.id,
        recipients: [account.id],
        actorId: actor.id,
        title: `${actor.displayName} added you to ${project.jobNumber} ${project.name}`,
        body: `You are ${ROLE_LABELS[role].toLowerCase()} in ${project.jobNumber} ${project.name}.`,
        link: `/projects/${project.id}`,
      }, tx)
      await publishLiveEvent({ type: 'member.changed', projectId: project.id, entityId: account.id }, tx)
      return { outcome: 'member-added', member: { userId: account.id, email: account.email, displayName: account.displayName, role } }
    })
  }
  catch (err) {
    // Two owners adding the same person at once: the second finds the membership taken.
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${email} is already a member.` })
    throw err
  }
}

/** A site admin invites an address to the site (no project); an address that has an account is 409. */
export async function inviteToSite(args: { actor: SessionUser, email: string }): Promise<ServerPendingInvitation> {
  return useDb().transaction(async (tx) => {
    const account = await accountByEmail(tx, args.email)
    if (account) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `An account already uses ${args.email}.` })
    return writeInvitation(tx, { actor: args.actor, project: null, email: args.email, role: null })
  })
}

/** Withdraws a pending invitation of the project (or of the site): its link stops working. */
export async function revokeInvitation(args: { actorId: string, projectId: string | null, invitationId: string }): Promise<void> {
  const { actorId, projectId, invitationId } = args
  await useDb().transaction(async (tx) => {
    const [row] = await tx.select().from(invitations).where(and(
      eq(invitations.id, invitationId),
      projectId ? eq(invitations.projectId, projectId) : isNull(invitations.projectId),
    )).for('update')
    if (!row) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Invitation not found.' })
    const state = linkState(row)
    if (state) {
      const why = state === 'used' ? 'was already accepted' : state === 'revoked' ? 'was already withdrawn' : 'has already expired'
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `This invitation ${why}.` })
    }
    await tx.update(invitations).set({ revokedAt: new Date() }).where(eq(invitations.id, row.id))
    await recordAudit({ actorId, projectId, action: 'revoke', entity: 'invitation', entityId: row.id, before: { email: row.email, role: row.role } }, tx)
    if (projectId) await publishLiveEvent({ type: 'member.changed', projectId, entityId: row.id }, tx)
  })
}

async function invitationByToken(db: Database | Tx, token: string, lock: boolean) {
  const q = db.select().from(invitations).where(eq(invitations.tokenHash, hashLinkToken(token))).limit(1)
  const [row] = lock ? await q.for('update') : await q
  return workingLink(row, UNKNOWN, GONE)
}

/** What an invitation link is for (public): the address, the project and role, who sent it. */
export async function previewInvitation(token: string): Promise<ServerInvitationPreview> {
  const db = useDb()
  const row = await invitationByToken(db, token, false)
  const [project] = row.projectId
    ? await db.select({ id: projects.id, jobNumber: projects.jobNumber, name: projects.name }).from(projects).where(eq(projects.id, row.projectId))
    : []
  const [by] = row.invitedBy ? await db.select({ name: users.displayName }).from(users).where(eq(users.id, row.invitedBy)) : []
  return { email: row.email, role: row.role, project: project ?? null, invitedByName: by?.name ?? null, expiresAt: row.expiresAt }
}

const HAS_ACCOUNT = (email: string) => `An account already uses ${email}: sign in with it instead (use "Forgot password?" if needed), and ask to be added to the project.`

/**
 * Accepts an invitation: creates the account with the invitee's name and password, makes it a
 * member with the invited role (and of every other project whose invitation to the same address
 * is still pending), and marks the link used, in one transaction. The caller then signs them in.
 * The address already has an account: 409.
 */
export async function acceptInvitation(token: string, input: AcceptInvitationInput): Promise<AcceptInvitationReply> {
  const db = useDb()
  const first = await invitationByToken(db, token, false)
  if (await accountByEmail(db, first.email)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: HAS_ACCOUNT(first.email) })
  // The slow hash before the transaction, so no lock is held while it runs.
  const passwordHash = await hashPassword(input.password)
  try {
    return await db.transaction(async (tx) => {
      const inv = await invitationByToken(tx, token, true)
      const user = returnedRow(await tx.insert(users).values({ email: inv.email, displayName: input.displayName, passwordHash })
        .returning({ id: users.id, email: users.email, displayName: users.displayName, isSiteAdmin: users.isSiteAdmin }))
      await recordAudit({ actorId: user.id, action: 'accept', entity: 'invitation', entityId: inv.id, after: { userId: user.id } }, tx)
      await recordAudit({ actorId: user.id, action: 'create', entity: 'user', entityId: user.id, after: { email: user.email, displayName: user.displayName, invitedBy: inv.invitedBy } }, tx)
      const now = new Date()
      await tx.update(invitations).set({ acceptedAt: now, acceptedBy: user.id }).where(eq(invitations.id, inv.id))
      // Other projects' invitations to the same address, still pending, are honoured with this account.
      const others = await tx.select().from(invitations).where(and(
        sql`lower(${invitations.email}) = ${inv.email.toLowerCase()}`,
        sql`${invitations.projectId} is not null`,
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, sql`now()`),
      )).for('update')
      const joined = [inv, ...others].filter(i => i.projectId && i.role)
      const seen = new Set<string>()
      for (const i of joined) {
        if (!i.projectId || !i.role || seen.has(i.projectId)) continue
        seen.add(i.projectId)
        const member = returnedRow(await tx.insert(projectMembers).values({ projectId: i.projectId, userId: user.id, role: i.role }).returning())
        await recordAudit({ actorId: user.id, projectId: i.projectId, action: 'create', entity: 'project-member', entityId: user.id, after: member }, tx)
        await publishLiveEvent({ type: 'member.changed', projectId: i.projectId, entityId: user.id }, tx)
      }
      for (const o of others) await tx.update(invitations).set({ acceptedAt: now, acceptedBy: user.id }).where(eq(invitations.id, o.id))
      return { user, projectId: inv.projectId, next: inv.projectId ? `/projects/${inv.projectId}` : '/' }
    })
  }
  catch (err) {
    // The account was made between the check above and the insert (another tab, an admin).
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: HAS_ACCOUNT(first.email) })
    throw err
  }
}
