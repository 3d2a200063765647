import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { Client, baseUrl, createUser, demoEmail, signIn } from '../helpers/http'
import { uniqueJobNumber } from '../helpers/project'
import { openEventStream, type OpenStream } from '../helpers/event-stream'
import { startServer, type RunningServer } from '../helpers/server'

// Live updates fan out between app processes through PostgreSQL LISTEN/NOTIFY: a change
// written through a second server process reaches a stream held open by the first.

let second: RunningServer
let ownerHere: Client
let ownerThere: Client
const streams: OpenStream[] = []

async function signInAt(base: string, email: string, password: string): Promise<Client> {
  const c = new Client(base)
  const r = await c.post('/api/auth/login', { email, password })
  if (r.status !== 200) throw new Error(`sign-in as ${email} at ${base} failed: ${r.status}`)
  return c
}

async function newProject(c: Client, name: string): Promise<string> {
  const r = await c.post<{ project: { id: string } }>('/api/projects', { jobNumber: uniqueJobNumber('LIVE'), name })
  expect(r.status).toBe(201)
  return r.body.project.id
}

async function stream(base: string, projectId: string, c: Client, headers: Record<string, string> = {}, query = ''): Promise<OpenStream> {
  const s = await openEventStream(`${base}/api/projects/${projectId}/events${query}`, { cookie: c.cookie, ...headers })
  streams.push(s)
  return s
}

beforeAll(async () => {
  second = await startServer({ PASTLOAD_SEED: 'none', PASTLOAD_LIVE_PING_MS: '300' })
  ownerHere = await signIn(demoEmail('owner'))
  ownerThere = await signInAt(second.url, demoEmail('owner'), DEMO_PASSWORD)
})

afterAll(async () => {
  for (const s of streams) s.close()
  await second?.stop()
})

describe('project event stream', () => {
  it('is for signed-in members only: 401 signed out, 404 to a non-member, 400 for a malformed Last-Event-ID', async () => {
    const projectId = await newProject(ownerHere, 'Live access')
    expect((await stream(baseUrl(), projectId, new Client())).status).toBe(401)
    const outsider = await createUser(ownerHere, 'live-outsider')
    expect((await stream(baseUrl(), projectId, outsider.client)).status).toBe(404)
    const bad = await openEventStream(`${baseUrl()}/api/projects/${projectId}/events`, { cookie: ownerHere.cookie, 'last-event-id': 'yesterday' })
    expect(bad.status).toBe(400)
    expect((await openEventStream(`${baseUrl()}/api/projects/${projectId}/events?lastEventId=-3`, { cookie: ownerHere.cookie })).status).toBe(400)
  })

  it('delivers a change written through another app process, as ids only, and nothing of other projects', async () => {
    const projectId = await newProject(ownerHere, 'Live fan-out')
    const otherProject = await newProject(ownerHere, 'Live elsewhere')
    const watcher = await createUser(ownerHere, 'live-watcher')
    expect((await ownerHere.post(`/api/projects/${projectId}/members`, { email: watcher.email, role: 'reviewer' })).status).toBe(201)
    const s = await stream(baseUrl(), projectId, watcher.client)
    expect(s.status).toBe(200)

    const elsewhere = await createUser(ownerHere, 'live-elsewhere')
    expect((await ownerThere.post(`/api/projects/${otherProject}/members`, { email: elsewhere.email, role: 'viewer' })).status).toBe(201)
    const joiner = await createUser(ownerHere, 'live-joiner')
    expect((await ownerThere.post(`/api/projects/${projectId}/members`, { email: joiner.email, role: 'geologist' })).status).toBe(201)

    const m = await s.waitFor(e => e.type === 'member.changed' && e.entityId === joiner.id)
    expect(Object.keys(m).sort()).toEqual(['at', 'entityId', 'id', 'projectId', 'type'])
    expect(m.projectId).toBe(projectId)
    expect(Number.isSafeInteger(m.id) && m.id > 0).toBe(true)
    expect(s.events.some(e => e.entityId === elsewhere.id)).toBe(false)
  })

  it('replays what a reconnecting page missed after its Last-Event-ID, in order, by header or query', async () => {
    const projectId = await newProject(ownerHere, 'Live replay')
    const first = await createUser(ownerHere, 'live-first')
    const s = await stream(baseUrl(), projectId, ownerHere)
    expect((await ownerThere.post(`/api/projects/${projectId}/members`, { email: first.email, role: 'viewer' })).status).toBe(201)
    const seen = await s.waitFor(e => e.entityId === first.id)
    s.close()

    const missed = [await createUser(ownerHere, 'live-missed-a'), await createUser(ownerHere, 'live-missed-b')]
    for (const u of missed) expect((await ownerThere.post(`/api/projects/${projectId}/members`, { email: u.email, role: 'viewer' })).status).toBe(201)

    const again = await stream(baseUrl(), projectId, ownerHere, { 'last-event-id': String(seen.id) })
    await again.waitFor(e => e.entityId === missed[1]!.id)
    expect(again.events.map(e => e.entityId)).toEqual(missed.map(u => u.id))
    expect(again.events[0]!.id).toBeGreaterThan(seen.id)

    const byQuery = await stream(second.url, projectId, ownerThere, {}, `?lastEventId=${seen.id}`)
    await byQuery.waitFor(e => e.entityId === missed[1]!.id)
    expect(byQuery.events.map(e => e.entityId)).toEqual(missed.map(u => u.id))
  })

  it('ends the stream of a member who is removed from the project, and of a browser that signs out', async () => {
    const projectId = await newProject(ownerHere, 'Live leaving')
    const leaver = await createUser(ownerHere, 'live-leaver')
    expect((await ownerHere.post(`/api/projects/${projectId}/members`, { email: leaver.email, role: 'viewer' })).status).toBe(201)
    const s = await stream(baseUrl(), projectId, leaver.client)
    expect(s.status).toBe(200)
    expect((await ownerThere.request('DELETE', `/api/projects/${projectId}/members/${leaver.id}`)).status).toBe(200)
    await s.ended
    expect(s.events.some(e => e.type === 'member.changed' && e.entityId === leaver.id)).toBe(true)

    const viewer = await createUser(ownerHere, 'live-signout')
    expect((await ownerHere.post(`/api/projects/${projectId}/members`, { email: viewer.email, role: 'viewer' })).status).toBe(201)
    const there = await signInAt(second.url, viewer.email, 'correct-horse-battery-9')
    const t = await stream(second.url, projectId, there)
    expect(t.status).toBe(200)
    expect((await there.post('/api/auth/logout', {})).status).toBeLessThan(300)
    // The second server re-checks its streams every 300 ms (PASTLOAD_LIVE_PING_MS).
    await t.ended
  })
})
