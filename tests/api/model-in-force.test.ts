// The model in force over real HTTP: the first model becomes the project's design model, who may
// name another (owner or engineer), and σ'v0 of an oedometer test follows the design model's latest
// approved version — else its latest saved one — never a draft or another model. Approval is set in
// the database here (the review routes have their own tests). Also: identical open flags are refused,
// and CPT- and vane-derived σ'p points can be flagged, each change recorded for live pages.
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { cptPointId } from '../../shared/review/flags'
import { type Client, createUser, signedInDemo } from '../helpers/http'
import { testBody } from '../helpers/lab'
import { createPoint, createProject, must } from '../helpers/project'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
afterAll(() => pool.end())

interface ModelDraft { schemaVersion: number, groundwater: { waterTableDepth: number }, [k: string]: unknown }
interface ModelReply { model: { id: string, version: number, draft: ModelDraft } }
interface InForce { modelId: string | null, modelName?: string, version?: number, status?: string, approvedAt?: string | null, approvedBy?: string | null }
interface StressModel { source: string, modelId: string | null, version: number | null, status: string | null, description: string }
interface Interpretation { stressModel: StressModel & { effectiveStress: number | null }, methods: { method: string, ocr: number | null }[], sampleQuality: { class: string } | null, warnings: string[] }

/** A reviewer's approval of a version, as the review routes record it (status, who, when); the older approval superseded. */
async function approve(modelId: string, version: number, reviewerId: string): Promise<void> {
  await pool.query(`update site_model_versions set superseded_at = now(), superseded_by = $2 where model_id = $1 and status = 'approved' and superseded_at is null`, [modelId, version])
  const r = await pool.query(`update site_model_versions set status = 'approved', decided_by = $3, decided_at = now(), decision_comment = 'Fine' where model_id = $1 and version = $2`, [modelId, version, reviewerId])
  expect(r.rowCount).toBe(1)
}

async function userId(c: Client): Promise<string> {
  return (await must('who am I', c.get<{ user: { id: string } }>('/api/auth/me'))).user.id
}

describe('the design model', () => {
  const { owner, engineer, geologist, reviewer } = signedInDemo('owner', 'engineer', 'geologist', 'reviewer')
  let base: string
  let first: string
  let second: string

  beforeAll(async () => {
    base = (await createProject(owner, 'DM', 'Design model site', ['engineer', 'geologist', 'reviewer'])).base
  })

  it('is none in a new project, then the first model created, which a second model does not replace', async () => {
    expect((await must('project', owner.get<{ project: { designModelId: string | null } }>(base))).project.designModelId).toBeNull()
    expect(await must('model in force', owner.get<InForce>(`${base}/model-in-force`))).toEqual({ modelId: null })
    first = (await must('first model', engineer.post<ModelReply>(`${base}/models`, { name: 'Yard model' }), 201)).model.id
    second = (await must('second model', engineer.post<ModelReply>(`${base}/models`, { name: 'Scratch' }), 201)).model.id
    expect((await must('project', owner.get<{ project: { designModelId: string | null } }>(base))).project.designModelId).toBe(first)
  })

  it('can be changed by the owner or an engineer only, to a model of this project', async () => {
    for (const c of [geologist, reviewer]) {
      const r = await c.patch<{ message: string }>(base, { designModelId: second })
      expect(r.status).toBe(403)
      expect(r.body.message).toContain('cannot do this')
    }
    const r = await engineer.patch<{ project: { designModelId: string } }>(base, { designModelId: second })
    expect(r.status).toBe(200)
    expect(r.body.project.designModelId).toBe(second)
    // The engineer may name the design model, not edit the project's details.
    expect((await engineer.patch(base, { name: 'Renamed' })).status).toBe(403)
    expect((await engineer.patch(base, { designModelId: first, name: 'Renamed' })).status).toBe(403)
    expect((await owner.patch<{ project: { designModelId: string } }>(base, { designModelId: first })).body.project.designModelId).toBe(first)

    const unknown = await engineer.patch<{ message: string, data: { code: string } }>(base, { designModelId: '00000000-0000-4000-8000-000000000000' })
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.code).toBe('unknown-model')
    expect(unknown.body.message).toContain('one of this project')
    const other = await createProject(owner, 'DM2', 'Another site', ['engineer'])
    const elsewhere = (await must('model elsewhere', engineer.post<ModelReply>(`${other.base}/models`, { name: 'Elsewhere' }), 201)).model.id
    expect((await engineer.patch(base, { designModelId: elsewhere })).status).toBe(422)
    expect((await engineer.patch(base, { designModelId: 'not-a-uuid' })).status).toBe(400)
    expect((await must('project', owner.get<{ project: { designModelId: string } }>(base))).project.designModelId).toBe(first)
  })
})

describe('the model in force', () => {
  const { owner, engineer, geologist, reviewer } = signedInDemo('owner', 'engineer', 'geologist', 'reviewer')
  let base: string
  let testUrl: string
  let design: { id: string, url: string }
  let reviewerId: string

  async function inForce(): Promise<InForce> {
    return must('model in force', geologist.get<InForce>(`${base}/model-in-force`))
  }
  async function interpretation(): Promise<Interpretation> {
    return must('interpretation', geologist.get<Interpretation>(`${testUrl}/interpretation`))
  }
  /** Moves a model's draft water table to `depth` m (a draft edit, nothing saved). */
  async function editDraft(url: string, depth: number): Promise<void> {
    const m = (await must('model', engineer.get<ModelReply>(url))).model
    await must('draft edit', engineer.request('PUT', `${url}/draft`, { draft: { ...m.draft, groundwater: { ...m.draft.groundwater, waterTableDepth: depth } }, version: m.version }))
  }
  async function saveVersion(url: string): Promise<void> {
    const m = (await must('model', engineer.get<ModelReply>(url))).model
    await must('saving a version', engineer.post(`${url}/versions`, { message: 'Saved', version: m.version }), 201)
  }

  beforeAll(async () => {
    const project = await createProject(owner, 'MIF', 'Model in force site', ['engineer', 'geologist', 'reviewer'])
    base = project.base
    reviewerId = await userId(reviewer)
    // One clay stratum, γ = γsat = 18 kN/m³, logged 0–20 m, standing water at 1.0 m; a sample at 4.5–5.0 m.
    const st = await must('stratum', geologist.post<{ stratum: { id: string } }>(`${base}/strata`, { code: 'CLAY', name: 'Soft clay', colour: 'c', pattern: 'p', unitWeight: 18, unitWeightSaturated: 18 }), 201)
    const pointUrl = `${base}/points/${await createPoint(geologist, project.id, { identifier: 'BH-M1' })}`
    await must('log', geologist.request('PUT', `${pointUrl}/intervals`, { intervals: [{ top: 0, bottom: 20, description: 'Soft grey CLAY', uscs: 'CH', stratumId: st.stratum.id }] }))
    await must('groundwater', geologist.post(`${pointUrl}/groundwater`, { kind: 'standing', observedAt: '2025-03-04T08:00:00Z', depth: 1 }), 201)
    const s = await must('sample', geologist.post<{ sample: { id: string } }>(`${pointUrl}/samples`, { identifier: 'U1', top: 4.5, bottom: 5, type: 'thin-walled-tube' }), 201)
    const t = await must('test', geologist.post<{ test: { id: string } }>(`${base}/tests/oedometer`, testBody(s.sample.id, 'OED-M1')), 201)
    testUrl = `${base}/tests/oedometer/${t.test.id}`
  })

  it('is none while the design model has no saved version: σ\'v0, OCR and sample quality are unavailable, never computed from a draft', async () => {
    const created = await must('design model', engineer.post<ModelReply>(`${base}/models`, { name: 'Yard model' }), 201)
    design = { id: created.model.id, url: `${base}/models/${created.model.id}` }
    await editDraft(design.url, 2)
    expect(await inForce()).toEqual({ modelId: null })

    const interp = await interpretation()
    expect(interp.stressModel).toMatchObject({ source: 'none', modelId: null, version: null, effectiveStress: null })
    expect(interp.stressModel.description).toContain('No saved version of the design model')
    expect(interp.methods.every(m => m.ocr === null)).toBe(true)
    expect(interp.sampleQuality).toBeNull()
    expect(interp.warnings.join(' ')).toContain('No saved version of the design model')

    const list = await must('tests', geologist.get<{ tests: { effectiveStress: number | null, reading: { qualityClass: string | null } }[], stressModel: StressModel }>(`${base}/tests/oedometer`))
    expect(list.stressModel.source).toBe('none')
    expect(list.tests.map(t => [t.effectiveStress, t.reading.qualityClass])).toEqual([[null, null]])
    const sigma = await must('σ\'p points', geologist.get<{ stressModel: StressModel, points: unknown[] }>(`${base}/preconsolidation-points`))
    expect(sigma.stressModel.source).toBe('none')
  })

  it('is the latest saved version until one is approved, marked as not approved', async () => {
    await editDraft(design.url, 1)
    await saveVersion(design.url)
    expect(await inForce()).toEqual({ modelId: design.id, modelName: 'Yard model', version: 1, status: 'saved', approvedAt: null, approvedBy: null })
    const interp = await interpretation()
    // σ'v0(4.75 m) = 18 × 4.75 − 9.81 × (4.75 − 1.0) = 48.7125 kPa (hand calculation).
    expect(interp.stressModel).toMatchObject({ source: 'version', modelId: design.id, version: 1, status: 'saved' })
    expect(interp.stressModel.effectiveStress).toBeCloseTo(48.7125, 3)
    expect(interp.stressModel.description).toBe('Version 1 of site model "Yard model", not yet approved.')
    expect(interp.sampleQuality).not.toBeNull()
  })

  it('switches only on approval: drafts, other models and unapproved versions leave σ\'v0 as it is', async () => {
    await approve(design.id, 1, reviewerId)
    const v1 = await inForce()
    expect(v1).toMatchObject({ modelId: design.id, version: 1, status: 'approved', approvedBy: 'Priya Natarajan' })
    expect(Date.parse(v1.approvedAt!)).toBeGreaterThan(Date.now() - 10 * 60_000)
    const before = await interpretation()
    expect(before.stressModel.description).toBe('Version 1 of site model "Yard model", approved.')

    // A scratch model with its own edits and a saved version, and the design model's draft moved, then saved as v2.
    const scratch = await must('scratch model', engineer.post<ModelReply>(`${base}/models`, { name: 'Scratch' }), 201)
    const scratchUrl = `${base}/models/${scratch.model.id}`
    await editDraft(scratchUrl, 4)
    await saveVersion(scratchUrl)
    await editDraft(design.url, 3)
    await saveVersion(design.url)
    expect(await inForce()).toMatchObject({ modelId: design.id, version: 1, status: 'approved' })
    const after = await interpretation()
    expect(after.stressModel.effectiveStress).toBe(before.stressModel.effectiveStress)
    expect(after.sampleQuality).toEqual(before.sampleQuality)

    await approve(design.id, 2, reviewerId)
    expect(await inForce()).toMatchObject({ modelId: design.id, version: 2, status: 'approved', approvedBy: 'Priya Natarajan' })
    // Water table at 3.0 m: σ'v0(4.75 m) = 85.5 − 9.81 × 1.75 = 68.3325 kPa (hand calculation).
    expect((await interpretation()).stressModel.effectiveStress).toBeCloseTo(68.3325, 3)
  })

  it('follows the design model when another is named', async () => {
    const scratch = (await must('models', engineer.get<{ models: { id: string, name: string }[] }>(`${base}/models`))).models.find(m => m.name === 'Scratch')!
    await must('naming the design model', engineer.patch(base, { designModelId: scratch.id }))
    expect(await inForce()).toMatchObject({ modelId: scratch.id, modelName: 'Scratch', version: 1, status: 'saved', approvedBy: null })
    // Scratch's water table at 4.0 m: σ'v0(4.75 m) = 85.5 − 9.81 × 0.75 = 78.1425 kPa (hand calculation).
    expect((await interpretation()).stressModel.effectiveStress).toBeCloseTo(78.1425, 3)
    await must('naming it back', engineer.patch(base, { designModelId: design.id }))
  })

  it('is read by members only: someone outside the project gets 404', async () => {
    const outsider = await createUser(owner, 'mif-outsider')
    expect((await outsider.client.get(`${base}/model-in-force`)).status).toBe(404)
  })
})

describe('flags on derived σ\'p points', () => {
  const { owner, reviewer } = signedInDemo('owner', 'reviewer')
  let projectId: string
  let base: string
  let cptTarget: string
  let vaneTarget: string

  async function liveEvents(entityId: string): Promise<string[]> {
    const r = await pool.query<{ type: string }>('select type from live_events where project_id = $1 and entity_id = $2 order by id', [projectId, entityId])
    return r.rows.map(x => x.type)
  }

  beforeAll(async () => {
    const p = await createProject(owner, 'FLG', 'Flag site', ['reviewer'])
    projectId = p.id
    base = p.base
    const cpt = await createPoint(owner, projectId, { identifier: 'CPT-F1', kind: 'cpt' })
    cptTarget = cptPointId(cpt, 6.25)
    const vanePoint = await createPoint(owner, projectId, { identifier: 'VT-F1' })
    const row = await must('vane reading', owner.post<{ row: { id: string } }>(`${base}/points/${vanePoint}/vane`, { depth: 5, peak: 20 }), 201)
    vaneTarget = `vane:${row.row.id}`
  })

  it('flags a CPT-derived point, and records the change for live pages', async () => {
    const r = await reviewer.post<{ flag: { id: string, targetType: string, targetId: string, verdict: string } }>(`${base}/flags`, { targetType: 'cpt-point', targetId: cptTarget, verdict: 'questionable', comment: 'Spike in qc at 6.25 m' })
    expect(r.status).toBe(201)
    expect(r.body.flag).toMatchObject({ targetType: 'cpt-point', targetId: cptTarget, verdict: 'questionable' })
    expect(await liveEvents(r.body.flag.id)).toEqual(['flag.changed'])
    const reply = await owner.post(`${base}/flags/${r.body.flag.id}/replies`, { body: 'Rechecking the cone record.' })
    expect(reply.status).toBe(201)
    expect(await liveEvents(r.body.flag.id)).toEqual(['flag.changed', 'flag.reply'])
    const listed = await must('flags', reviewer.get<{ flags: { id: string }[] }>(`${base}/flags?targetType=cpt-point`))
    expect(listed.flags.map(f => f.id)).toContain(r.body.flag.id)
  })

  it('refuses an identical open flag (same target, verdict and author) with 409, and allows what differs', async () => {
    const body = { targetType: 'vane-reading', targetId: vaneTarget, verdict: 'exclude', comment: 'Vane rods bent' }
    const first = await reviewer.post<{ flag: { id: string, version: number } }>(`${base}/flags`, body)
    expect(first.status).toBe(201)
    const again = await reviewer.post<{ message: string, data: { flagId: string } }>(`${base}/flags`, { ...body, comment: 'Said twice' })
    expect(again.status).toBe(409)
    expect(again.body.message).toContain('already have an open flag')
    expect(again.body.data.flagId).toBe(first.body.flag.id)
    // Another verdict, or another reviewer, is a flag of its own.
    expect((await reviewer.post(`${base}/flags`, { ...body, verdict: 'questionable' })).status).toBe(201)
    expect((await owner.post(`${base}/flags`, body)).status).toBe(201)
    // Once the first is resolved, the same flag may be raised again.
    const resolved = await reviewer.patch(`${base}/flags/${first.body.flag.id}`, { status: 'resolved', version: first.body.flag.version })
    expect(resolved.status).toBe(200)
    expect(await liveEvents(first.body.flag.id)).toEqual(['flag.changed', 'flag.changed'])
    expect((await reviewer.post(`${base}/flags`, body)).status).toBe(201)
  })
})
