// Review and approval of saved model versions over real HTTP: submit to reviewers,
// return with a comment, approve (separation of duties, open flags and their override),
// superseding, the approval's content hash, the export's approval and the notices written
// for the people concerned (inbox and outbox rows, read back from the test database).
import { createHash } from 'node:crypto'
import pg from 'pg'
import { stringify } from 'safe-stable-stringify'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, createUser, signedInDemo } from '../helpers/http'
import { createTrendVersion } from '../helpers/project'

interface Model { id: string, version: number, draft: SiteModelDefinition, basedOn: number | null }
interface Version {
  id: string
  version: number
  status: string
  savedFrom: number | null
  submittedBy: string | null
  decidedBy: string | null
  decidedAt: string | null
  decisionComment: string | null
  approvalHash: string | null
  approvalOverride: string | null
  approvalFlags: { flagId: string }[] | null
  supersededAt: string | null
  supersededBy: number | null
  definition: SiteModelDefinition
}
interface VersionReply {
  version: Version
  review: { superseded: boolean, submittedBy: string | null, decidedBy: string | null, reviewers: { userId: string, displayName: string }[], timeline: { kind: string, actor: string | null, comment: string }[], blockingFlags: { flagId: string }[] }
}
interface SigmaPoint { id: string, source: string, stratumCode: string | null }

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

/** The canonical-JSON SHA-256 an approval records (safe-stable-stringify: keys sorted at every level). */
const sha256OfCanonical = (v: unknown) => createHash('sha256').update(stringify(v) ?? 'null').digest('hex')

describe('version review and approval', () => {
  const { owner, engineer: eng, reviewer: rev } = signedInDemo('owner', 'engineer', 'reviewer')
  let projectId: string
  let base: string
  const ids: Record<string, string> = {}
  let outsiderId: string
  let points: SigmaPoint[]
  let seq = 0

  beforeAll(async () => {
    projectId = await createDemoCopy('APR')
    base = `/api/projects/${projectId}/models`
    const members = await owner.get<{ members: { userId: string, role: string }[] }>(`/api/projects/${projectId}/members`)
    for (const m of members.body.members) ids[m.role] = m.userId
    outsiderId = (await createUser(owner, 'outsider')).id
    points = (await eng.get<{ points: SigmaPoint[] }>(`/api/projects/${projectId}/preconsolidation-points`)).body.points
    expect(points.filter(p => p.source === 'oedometer').length).toBeGreaterThan(2)
    expect(points.filter(p => p.source === 'cpt').length).toBeGreaterThan(2)
  })

  /** A model saved as version 1 by `by`, its estuarine trend fitted to `included` (σ'p point ids). */
  async function savedVersion(by: Client = eng, included: string[] = []): Promise<{ model: Model, url: string }> {
    seq += 1
    return createTrendVersion<Model>(by, base, `Review study ${Date.now().toString(36)}-${seq}`, { n: included.length, includedPointIds: included })
  }

  async function submit(url: string, version = 1, by: Client = eng, reviewerIds = [ids.reviewer!]) {
    return by.post<{ version: Version, message?: string, data?: { issues: { path: string, message: string }[] } }>(`${url}/${version}/submit`, { message: 'Ready for a check', reviewerIds })
  }

  async function outbox(kind: string, link: string) {
    const r = await pool.query<{ to_user_id: string, subject: string, text_body: string }>('select to_user_id, subject, text_body from mail_outbox where kind = $1 and text_body like $2 order by id', [kind, `%${link}%`])
    return r.rows
  }
  async function inbox(kind: string, link: string) {
    const r = await pool.query<{ user_id: string, title: string, body: string }>('select user_id, title, body from notifications where kind = $1 and link = $2 order by created_at', [kind, link])
    return r.rows
  }

  it('sends a saved version to a reviewer: status, reviewers, timeline, audit, and an inbox and outbox row for the reviewer only', async () => {
    const { model, url } = await savedVersion()
    const r = await submit(url)
    expect(r.status).toBe(200)
    expect(r.body.version.status).toBe('submitted')
    expect(r.body.version.submittedBy).toBe(ids.engineer)
    const got = (await rev.get<VersionReply>(`${url}/1`)).body
    expect(got.review.reviewers).toEqual([{ userId: ids.reviewer, displayName: 'Priya Natarajan' }])
    expect(got.review.submittedBy).toBe('Tomas Lindqvist')
    expect(got.review.timeline).toEqual([expect.objectContaining({ kind: 'submitted', actor: 'Tomas Lindqvist', comment: 'Ready for a check' })])
    const link = `/projects/${projectId}/models/${model.id}/versions/1`
    const mail = await outbox('review-requested', link)
    expect(mail.map(m => m.to_user_id)).toEqual([ids.reviewer])
    expect(mail[0]!.subject).toContain('version 1')
    expect((await inbox('review-requested', link)).map(n => n.user_id)).toEqual([ids.reviewer])
    const audit = await pool.query('select 1 from audit_events where entity = $1 and entity_id = $2 and after->>\'status\' = $3', ['site-model-version', r.body.version.id, 'submitted'])
    expect(audit.rowCount).toBe(1)
    // Sent already: a second submission is refused.
    expect((await submit(url)).status).toBe(409)
    // The list carries the status for its badges.
    const detail = await eng.get<{ versions: { version: number, status: string, superseded: boolean }[] }>(`${base}/${model.id}`)
    expect(detail.body.versions).toEqual([expect.objectContaining({ version: 1, status: 'submitted', superseded: false })])
  })

  it('refuses reviewers who are not members, whose role cannot review, or who saved the version (422 naming them), and no reviewer at all (400)', async () => {
    const { url } = await savedVersion()
    const outsider = await submit(url, 1, eng, [ids.reviewer!, outsiderId])
    expect(outsider.status).toBe(422)
    expect(outsider.body.message).toContain(outsiderId)
    expect(outsider.body.data!.issues).toEqual([{ path: 'reviewerIds.1', message: `${outsiderId} is not a member of this project` }])
    const geologist = await submit(url, 1, eng, [ids.geologist!])
    expect(geologist.status).toBe(422)
    expect(geologist.body.message).toContain(ids.geologist)
    expect(geologist.body.message).toMatch(/geologist.*cannot review/)
    const ownerSaved = await savedVersion(owner)
    const ownSelf = await submit(ownerSaved.url, 1, owner, [ids.owner!])
    expect(ownSelf.status).toBe(422)
    expect(ownSelf.body.message).toMatch(/saved this version/)
    expect((await submit(url, 1, eng, [])).status).toBe(400)
    expect((await eng.post(`${url}/1/submit`, { message: 'x', reviewerIds: Array.from({ length: 21 }, () => ids.reviewer) })).status).toBe(400)
    expect((await eng.post(`${url}/1/submit`, { message: 'x'.repeat(2001), reviewerIds: [ids.reviewer] })).status).toBe(400)
    // The reviewer role may not send versions for review.
    expect((await submit(url, 1, rev)).status).toBe(403)
    // Nothing was written by the refusals.
    expect((await eng.get<VersionReply>(`${url}/1`)).body.version.status).toBe('saved')
    expect((await submit(url, 99)).status).toBe(404)
  })

  it('decides only on a submitted version (409), needs a comment to return it (400), and the saver cannot approve (403)', async () => {
    const { url } = await savedVersion(owner)
    expect((await rev.post(`${url}/1/decision`, { decision: 'approve', comment: '' })).status).toBe(409)
    expect((await submit(url, 1, owner)).status).toBe(200)
    expect((await rev.post(`${url}/1/decision`, { decision: 'return', comment: 'no' })).status).toBe(400)
    expect((await rev.post(`${url}/1/decision`, { decision: 'return' })).status).toBe(400)
    const self = await owner.post<{ message: string }>(`${url}/1/decision`, { decision: 'approve', comment: 'fine' })
    expect(self.status).toBe(403)
    expect(self.body.message).toMatch(/You saved version 1, so you cannot approve it/)
    expect((await eng.post(`${url}/1/decision`, { decision: 'return', comment: 'engineers do not review' })).status).toBe(403)
    expect((await rev.get<VersionReply>(`${url}/1`)).body.version.status).toBe('submitted')
  })

  it('returns with a comment to the submitter and the engineers; a returned version is resubmitted as a new version saved from it', async () => {
    const { model, url } = await savedVersion()
    await submit(url)
    const r = await rev.post<{ version: Version }>(`${url}/1/decision`, { decision: 'return', comment: 'The crust trend ignores CPT-03; refit.' })
    expect(r.status).toBe(200)
    expect(r.body.version.status).toBe('returned')
    expect(r.body.version.decidedBy).toBe(ids.reviewer)
    expect(r.body.version.decisionComment).toBe('The crust trend ignores CPT-03; refit.')
    const link = `/projects/${projectId}/models/${model.id}/versions/1`
    const mail = await outbox('version-returned', link)
    expect(mail.map(m => m.to_user_id)).toEqual([ids.engineer])
    expect(mail[0]!.text_body).toContain('The crust trend ignores CPT-03; refit.')
    const got = (await eng.get<VersionReply>(`${url}/1`)).body
    expect(got.review.timeline.map(e => [e.kind, e.actor, e.comment])).toEqual([
      ['submitted', 'Tomas Lindqvist', 'Ready for a check'],
      ['returned', 'Priya Natarajan', 'The crust trend ignores CPT-03; refit.'],
    ])
    expect((await submit(url)).status).toBe(409)
    expect((await rev.post(`${url}/1/decision`, { decision: 'approve', comment: '' })).status).toBe(409)
    // Refit (here: a new POP), save version 2 from it and send that one.
    const m = (await eng.get<{ model: Model }>(`${base}/${model.id}`)).body.model
    const refit = { ...m.draft, strata: m.draft.strata.map(s => (s.code === 'EST' && s.trend ? { ...s, trend: { ...s.trend, parameters: { pop: 24 } } } : s)) }
    const put = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft: refit, version: m.version })
    expect(put.status).toBe(200)
    expect((await eng.post(`${url}`, { message: 'Refitted with CPT-03', version: put.body.model.version })).status).toBe(201)
    const v2 = (await eng.get<VersionReply>(`${url}/2`)).body.version
    expect(v2.savedFrom).toBe(1)
    expect(v2.status).toBe('saved')
    expect((await submit(url, 2)).status).toBe(200)
    expect((await eng.get<VersionReply>(`${url}/1`)).body.version.status).toBe('returned')
  })

  it('refuses approval while open exclude/questionable flags stand on fitted points (409 with the flags); an override approves and records them', async () => {
    const oed = points.find(p => p.source === 'oedometer')!
    const cpt = points.filter(p => p.source === 'cpt')
    const { model, url } = await savedVersion(eng, [oed.id, cpt[0]!.id, cpt[1]!.id])
    await submit(url)
    // A flag on a CPT point the estuarine trend fitted, and one on a point it did not fit.
    const onFitted = (await rev.post<{ flag: { id: string } }>(`/api/projects/${projectId}/flags`, { targetType: 'cpt-point', targetId: cpt[0]!.id, verdict: 'exclude', comment: 'Spike at a sand lens.' })).body.flag
    const elsewhere = points.filter(p => p.source === 'cpt').at(-1)!
    await rev.post(`/api/projects/${projectId}/flags`, { targetType: 'cpt-point', targetId: elsewhere.id, verdict: 'exclude', comment: 'Not fitted: does not block.' })
    const blocked = await rev.post<{ message: string, data: { code: string, flags: { flagId: string }[] } }>(`${url}/1/decision`, { decision: 'approve', comment: 'Looks right' })
    expect(blocked.status).toBe(409)
    expect(blocked.body.data.code).toBe('open-flags')
    expect(blocked.body.data.flags.map(f => f.flagId)).toEqual([onFitted.id])
    expect((await rev.get<VersionReply>(`${url}/1`)).body.review.blockingFlags.map(f => f.flagId)).toEqual([onFitted.id])
    // A questionable flag on the oedometer test whose adopted σ'p the trend fitted blocks too.
    const tests = (await rev.get<{ tests: { id: string, adoption: { id: string } | null }[] }>(`/api/projects/${projectId}/tests/oedometer?limit=500`)).body.tests
    const test = tests.find(t => t.adoption?.id === oed.id)!
    const onTest = (await rev.post<{ flag: { id: string } }>(`/api/projects/${projectId}/flags`, { targetType: 'oedometer-test', targetId: test.id, verdict: 'questionable', comment: 'Seating load?' })).body.flag
    const both = await rev.post<{ data: { flags: { flagId: string }[] } }>(`${url}/1/decision`, { decision: 'approve', comment: 'Looks right' })
    expect(both.body.data.flags.map(f => f.flagId).sort()).toEqual([onFitted.id, onTest.id].sort())
    expect((await rev.post(`${url}/1/decision`, { decision: 'approve', comment: '', override: 'ok' })).status).toBe(400)
    const approved = await rev.post<{ version: Version }>(`${url}/1/decision`, { decision: 'approve', comment: 'Looks right', override: 'Both points checked against the cone log; the fit barely moves.' })
    expect(approved.status).toBe(200)
    expect(approved.body.version.status).toBe('approved')
    expect(approved.body.version.approvalOverride).toBe('Both points checked against the cone log; the fit barely moves.')
    expect(approved.body.version.approvalFlags!.map(f => f.flagId).sort()).toEqual([onFitted.id, onTest.id].sort())
    const link = `/projects/${projectId}/models/${model.id}/versions/1`
    expect((await outbox('version-approved', link)).map(m => m.to_user_id)).toEqual([ids.engineer])
  })

  it('approves with the content hash of the definition, supersedes the previous approval, and the export carries the approval', async () => {
    const { model, url } = await savedVersion()
    await submit(url)
    const a1 = await rev.post<{ version: Version }>(`${url}/1/decision`, { decision: 'approve', comment: 'Agreed.' })
    expect(a1.status).toBe(200)
    const v1 = (await eng.get<VersionReply>(`${url}/1`)).body
    expect(v1.version.approvalHash).toMatch(/^[0-9a-f]{64}$/)
    expect(v1.version.approvalHash).toBe(sha256OfCanonical(v1.version.definition))
    // Key order does not change it: the same definition with its keys reversed hashes the same.
    const reversed = JSON.parse(JSON.stringify(v1.version.definition, (_k, v) => (v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v)))
    expect(sha256OfCanonical(reversed)).toBe(v1.version.approvalHash)
    expect(v1.review.decidedBy).toBe('Priya Natarajan')
    const exp1 = await eng.get<{ approval: { by: string, at: string, hash: string } | null }>(`${url}/1/export`)
    expect(exp1.body.approval).toEqual({ by: 'Priya Natarajan', at: a1.body.version.decidedAt, hash: v1.version.approvalHash })

    // A second interpretation: the water table 0.1 m lower (a version must change something).
    const m = (await eng.get<{ model: Model }>(`${base}/${model.id}`)).body.model
    const put = await eng.request<{ model: Model }>('PUT', `${base}/${model.id}/draft`, { draft: { ...m.draft, groundwater: { ...m.draft.groundwater, waterTableDepth: m.draft.groundwater.waterTableDepth + 0.1 } }, version: m.version })
    expect(put.status).toBe(200)
    expect((await eng.post(url, { message: 'Second interpretation', version: put.body.model.version })).status).toBe(201)
    expect((await eng.get<{ approval: unknown }>(`${url}/2/export`)).body.approval).toBeNull()
    await submit(url, 2)
    expect((await rev.post(`${url}/2/decision`, { decision: 'approve', comment: '' })).status).toBe(200)
    const after = (await eng.get<VersionReply>(`${url}/1`)).body
    expect(after.version.status).toBe('approved')
    expect(after.version.supersededBy).toBe(2)
    expect(after.review.superseded).toBe(true)
    expect(after.review.timeline.map(e => e.kind)).toEqual(['submitted', 'approved', 'superseded'])
    // The hash stays what it was.
    expect(after.version.approvalHash).toBe(v1.version.approvalHash)
    const list = await eng.get<{ versions: { version: number, status: string, superseded: boolean }[] }>(`${base}/${model.id}`)
    expect(list.body.versions.map(v => [v.version, v.status, v.superseded])).toEqual([[2, 'approved', false], [1, 'approved', true]])
    const models = await eng.get<{ models: { id: string, approved: { version: number } | null }[] }>(base)
    expect(models.body.models.find(x => x.id === model.id)!.approved!.version).toBe(2)
  })
})
