import { count } from 'drizzle-orm'
import { generateDemoInvestigation } from '#shared/demo/generate'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PROJECT } from '#shared/demo/scenario'
import type { Database } from '../db/client'
import { projectMembers, projects, users } from '../db/schema'
import { present, returnedRow } from '../db/rows'
import { hashPassword } from '../utils/password'
import { recordAudit } from './audit'
import { seedDemoLab } from './demo-seed-lab'
import { writeInvestigation } from './investigation-writer'

/**
 * Seeds the invented demo scenario when the database has no users. One
 * transaction: a failure leaves the database empty, never half-seeded.
 * Returns false when there was already data.
 */
export async function seedDemoIfEmpty(db: Database): Promise<boolean> {
  const [row] = await db.select({ n: count() }).from(users)
  if ((row?.n ?? 0) > 0) return false
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await db.transaction(async (tx) => {
    const people = await tx.insert(users).values(DEMO_PEOPLE.map(p => ({
      email: p.email,
      displayName: p.displayName,
      isSiteAdmin: p.isSiteAdmin,
      passwordHash,
    }))).returning({ id: users.id, email: users.email })
    const personWith = (match: (d: typeof DEMO_PEOPLE[number]) => boolean) => present(people.find(p => p.email === DEMO_PEOPLE.find(match)?.email), 'A demo person')
    const admin = personWith(d => d.isSiteAdmin)
    const project = returnedRow(await tx.insert(projects).values({ ...DEMO_PROJECT, createdBy: admin.id }).returning())
    await tx.insert(projectMembers).values(DEMO_PEOPLE.map((p) => {
      const { id } = present(people.find(u => u.email === p.email), 'A demo person')
      return { projectId: project.id, userId: id, role: p.role }
    }))
    await recordAudit({ actorId: admin.id, projectId: project.id, action: 'create', entity: 'project', entityId: project.id, after: { seeded: 'demo' } }, tx)
    // The investigation, generated deterministically from the scenario's ground model.
    const investigation = generateDemoInvestigation()
    const written = await writeInvestigation(tx, project.id, investigation, new Map(), { oedometer: false })
    await seedDemoLab(tx, project.id, investigation, written.sampleIds, personWith(d => d.role === 'engineer').id)
    await recordAudit({ actorId: personWith(d => d.role === 'geologist').id, projectId: project.id, action: 'import', entity: 'investigation', after: { seeded: 'demo', points: investigation.points.length } }, tx)
  })
  return true
}
