// A fresh project holding the demo scenario's investigation, for test files that write:
// they change their own copy and never the seeded demo project, which read-only files share.
// Built through the public API only: the demo project's AGS4 export imported into a new
// project (strata, points, logs, samples, in-situ rows, CPT, groundwater, oedometer stages),
// then each oedometer test's label and time readings and the engineer's σ'p adoptions
// copied over, and the demo people added with their demo roles.
import { beforeAll } from 'vitest'
import { DEMO_PEOPLE } from '../../shared/demo/scenario'
import { type Client, demoEmail, demoProjectId, signIn } from './http'
import { createProject, createSavedModel, must } from './project'
import { upload } from './upload'

interface StoredStage { stress: number, entered: number, readings?: { minutes: number, dial: number }[] }
interface DemoTest { id: string, version: number, label: string, convention: string, stages: StoredStage[], point: { identifier: string }, sample: { identifier: string } }
interface Adoption { method: string, value: number, reason: string }


async function listTests(c: Client, projectId: string): Promise<{ id: string, point: { identifier: string }, sample: { identifier: string } }[]> {
  return (await must('listing oedometer tests', c.get<{ tests: { id: string, point: { identifier: string }, sample: { identifier: string } }[] }>(`/api/projects/${projectId}/tests/oedometer?limit=500`))).tests
}

async function oneTest(c: Client, projectId: string, testId: string): Promise<{ test: DemoTest, adoption: Adoption | null }> {
  return must('reading an oedometer test', c.get<{ test: DemoTest, adoption: Adoption | null }>(`/api/projects/${projectId}/tests/oedometer/${testId}`))
}

/**
 * Creates a project with the demo scenario's content (see the file comment) and returns its id.
 * The demo owner creates it (and owns it); the other demo people join with their demo roles.
 */
export async function createDemoCopy(tag: string): Promise<string> {
  const owner = await signIn(demoEmail('owner'))
  const engineer = await signIn(demoEmail('engineer'))
  const demoId = await demoProjectId(owner)
  const members = DEMO_PEOPLE.filter(p => p.email !== demoEmail('owner')).map(p => ({ email: p.email, role: p.role }))
  const { id: projectId, base } = await createProject(owner, tag, `Saltmarsh Lane copy (${tag})`, members)

  const res = await fetch(`${owner.base}/exports/${demoId}/logs.ags`, { headers: { cookie: owner.cookie } })
  if (res.status !== 200) throw new Error(`exporting the demo as AGS4: ${res.status}`)
  const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'saltmarsh-lane.ags', await res.text(), 'text/plain')
  if (up.status !== 201) throw new Error(`uploading the demo AGS4 file: ${up.status} ${JSON.stringify(up.body).slice(0, 400)}`)
  await must('importing the demo AGS4 file', owner.post(`${base}/imports/${up.body.importId}/commit-ags`, {}))
  // A design model from the logs with a saved version, so σ'v0 (sample quality, OCR, CPT σ'p) is there as in the demo.
  await createSavedModel(engineer, projectId)

  // Oedometer tests: the demo's labels and time readings, then its adoptions (by the engineer).
  const key = (t: { point: { identifier: string }, sample: { identifier: string } }) => `${t.point.identifier}/${t.sample.identifier}`
  const copies = new Map((await listTests(owner, projectId)).map(t => [key(t), t.id]))
  for (const listed of await listTests(owner, demoId)) {
    const { test, adoption } = await oneTest(owner, demoId, listed.id)
    const copyId = copies.get(key(test))
    if (!copyId) throw new Error(`the AGS4 copy has no oedometer test on ${key(test)}`)
    const copy = (await oneTest(owner, projectId, copyId)).test
    await must(`copying oedometer test ${test.label}`, owner.patch(`${base}/tests/oedometer/${copyId}`, {
      label: test.label,
      convention: test.convention,
      stages: test.stages.map(s => ({ stress: s.stress, value: s.entered, ...(s.readings ? { readings: s.readings } : {}) })),
      version: copy.version,
    }))
    if (adoption) await must(`adopting σ'p on ${test.label}`, engineer.post(`${base}/tests/oedometer/${copyId}/adoptions`, { method: adoption.method, value: adoption.value, reason: adoption.reason }), 201)
  }
  return projectId
}

/** A demo copy of the describe block's own, made by its `beforeAll`: `copy.id` once the tests run. */
export function useDemoCopy(tag: string): { readonly id: string } {
  const copy = { id: '' }
  beforeAll(async () => {
    copy.id = await createDemoCopy(tag)
  })
  return copy
}
