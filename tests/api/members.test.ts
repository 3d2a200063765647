import { beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { type Client, createUser, demoEmail, demoProjectId, signIn } from '../helpers/http'
import { createProject } from '../helpers/project'

interface Member { userId: string, email: string, role: string }

describe('projects and members', () => {
  let owner: Client
  let projectId: string

  beforeAll(async () => {
    owner = await signIn(demoEmail('owner'))
  })

  // A project of each test's own: one test steps the demo owner down, which must not reach the others.
  beforeEach(async () => {
    projectId = (await createProject(owner, 'T', 'Member test site', [], { client: 'Test client' })).id
  })

  it('lists the demo project for each demo member with their role', async () => {
    const geo = await signIn(demoEmail('geologist'))
    const r = await geo.get<{ projects: { jobNumber: string, role: string }[] }>('/api/projects')
    expect(r.body.projects.find(p => p.jobNumber === 'TRN-0417')?.role).toBe('geologist')
  })

  it('a PATCH changes only the fields it names', async () => {
    const before = await owner.get<{ project: { client: string, unitSystem: string, description: string } }>(`/api/projects/${projectId}`)
    const r = await owner.patch<{ project: { client: string, unitSystem: string, description: string } }>(`/api/projects/${projectId}`, { unitSystem: 'US' })
    expect(r.status).toBe(200)
    expect(r.body.project).toMatchObject({ unitSystem: 'US', client: before.body.project.client, description: before.body.project.description })
    const back = await owner.patch<{ project: { unitSystem: string, client: string } }>(`/api/projects/${projectId}`, { description: 'Now with a description' })
    expect(back.body.project).toMatchObject({ unitSystem: 'US', client: 'Test client' })
    expect((await owner.patch(`/api/projects/${projectId}`, {})).status).toBe(400)
  })

  it('refuses a duplicate job number with 409', async () => {
    const r = await owner.post('/api/projects', { jobNumber: 'TRN-0417', name: 'Copy' })
    expect(r.status).toBe(409)
  })

  it('refuses project creation by a non-admin with 403', async () => {
    const eng = await signIn(demoEmail('engineer'))
    expect((await eng.post('/api/projects', { jobNumber: 'X-1', name: 'Nope' })).status).toBe(403)
  })

  it('adds a member by e-mail, changes the role, and removes them', async () => {
    const { client: newcomer, email, id } = await createUser(owner, 'member')
    expect((await newcomer.get(`/api/projects/${projectId}`)).status).toBe(404)

    const add = await owner.post<{ member: Member }>(`/api/projects/${projectId}/members`, { email: email.toUpperCase(), role: 'viewer' })
    expect(add.status).toBe(201)
    expect(add.body.member.role).toBe('viewer')
    expect((await owner.post(`/api/projects/${projectId}/members`, { email, role: 'viewer' })).status).toBe(409)

    const seen = await newcomer.get<{ role: string }>(`/api/projects/${projectId}`)
    expect(seen.status).toBe(200)
    expect(seen.body.role).toBe('viewer')

    const patch = await owner.patch<{ member: { role: string } }>(`/api/projects/${projectId}/members/${id}`, { role: 'engineer' })
    expect(patch.status).toBe(200)
    expect((await newcomer.get<{ role: string }>(`/api/projects/${projectId}`)).body.role).toBe('engineer')

    expect((await owner.delete(`/api/projects/${projectId}/members/${id}`)).status).toBe(200)
    expect((await newcomer.get(`/api/projects/${projectId}`)).status).toBe(404)

    const audit = await owner.get<{ events: { entity: string, action: string, entityId: string }[] }>(`/api/projects/${projectId}/audit`)
    const mine = audit.body.events.filter(e => e.entity === 'project-member' && e.entityId === id).map(e => e.action)
    expect(mine).toEqual(['delete', 'update', 'create'])
  })

  it('answers 422 for an e-mail with no account', async () => {
    const r = await owner.post<{ message: string }>(`/api/projects/${projectId}/members`, { email: 'ghost@nowhere.example', role: 'viewer' })
    expect(r.status).toBe(422)
    expect(r.body.message).toMatch(/No Pastload account/)
  })

  it('never removes or demotes the last owner (409), but allows it once another owner exists', async () => {
    const me = await owner.get<{ user: { id: string } }>('/api/auth/me')
    const ownerId = me.body.user.id
    expect((await owner.delete(`/api/projects/${projectId}/members/${ownerId}`)).status).toBe(409)
    expect((await owner.patch(`/api/projects/${projectId}/members/${ownerId}`, { role: 'engineer' })).status).toBe(409)

    const { email, id } = await createUser(owner, 'coowner')
    expect((await owner.post(`/api/projects/${projectId}/members`, { email, role: 'owner' })).status).toBe(201)
    expect((await owner.patch(`/api/projects/${projectId}/members/${id}`, { role: 'reviewer' })).status).toBe(200)
    expect((await owner.patch(`/api/projects/${projectId}/members/${id}`, { role: 'owner' })).status).toBe(200)
    // Now the demo owner may step down; the co-owner remains.
    expect((await owner.patch(`/api/projects/${projectId}/members/${ownerId}`, { role: 'engineer' })).status).toBe(200)
    expect((await owner.get<{ role: string }>(`/api/projects/${projectId}`)).body.role).toBe('engineer')
  })

  it('answers 404 for a member id that is not in the project', async () => {
    const demo = await demoProjectId(owner)
    expect((await owner.patch(`/api/projects/${demo}/members/00000000-0000-4000-8000-000000000000`, { role: 'viewer' })).status).toBe(404)
  })
})
