// Saving a site-model version over real HTTP: a version with nothing new is 409, a fit that could
// mislead needs the engineer's reason (422 without it), and two versions compare in words in the
// project's units.
import { beforeAll, describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { definitionTrendProblems } from '../../shared/site-model/trend-checks'
import { type Client, demoEmail, demoProjectId, signIn } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { scenarioDefinition } from '../helpers/scenario-definition'

interface Model { id: string, version: number, draft: SiteModelDefinition }

describe('saving site-model versions', () => {
  let owner: Client
  let eng: Client
  let si: { base: string }
  let us: { base: string }
  let seq = 0

  beforeAll(async () => {
    owner = await signIn(demoEmail('owner'))
    eng = await signIn(demoEmail('engineer'))
    const a = await createProject(owner, 'VCK', 'Version checks site', ['engineer'])
    const b = await createProject(owner, 'VCU', 'Version checks site (US)', ['engineer'], { unitSystem: 'US' })
    si = { base: `${a.base}/models` }
    us = { base: `${b.base}/models` }
  })

  /** A model of `where` whose draft is `draft`; its id and the draft revision to send back. */
  async function modelWith(where: { base: string }, draft: SiteModelDefinition): Promise<{ url: string, version: number }> {
    seq += 1
    const m = await must('creating a model', eng.post<{ model: Model }>(where.base, { name: `Checks ${Date.now().toString(36)}-${seq}` }), 201)
    const url = `${where.base}/${m.model.id}`
    const put = await must('saving the draft', eng.request<{ model: Model }>('PUT', `${url}/draft`, { draft, version: m.model.version }))
    return { url, version: put.model.version }
  }
  async function editDraft(url: string, change: (d: SiteModelDefinition) => SiteModelDefinition): Promise<number> {
    const m = (await must('reading the model', eng.get<{ model: Model }>(url))).model
    return (await must('saving the draft', eng.request<{ model: Model }>('PUT', `${url}/draft`, { draft: change(m.draft), version: m.version }))).model.version
  }

  it('answers 409 "nothing changed since version N" for a version identical to the last, and saves once the draft changes', async () => {
    const { url, version } = await modelWith(si, scenarioDefinition())
    expect((await eng.post(`${url}/versions`, { message: 'First interpretation', version })).status).toBe(201)
    const again = await eng.post<{ message: string }>(`${url}/versions`, { message: 'Same again', version: version + 1 })
    expect(again.status).toBe(409)
    expect(again.body.message).toContain('Nothing changed since version 1')
    const list = (await must('versions', eng.get<{ versions: { version: number }[] }>(url))).versions
    expect(list.map(v => v.version)).toEqual([1])

    const rev = await editDraft(url, d => ({ ...d, groundwater: { ...d.groundwater, waterTableDepth: 1.7 } }))
    expect((await eng.post(`${url}/versions`, { message: 'Water table at 1.7 m', version: rev })).status).toBe(201)
    const rev2 = (await must('model', eng.get<{ model: Model }>(url))).model.version
    const third = await eng.post<{ message: string }>(`${url}/versions`, { message: 'Nothing new', version: rev2 })
    expect(third.status).toBe(409)
    expect(third.body.message).toContain('Nothing changed since version 2')
  })

  it('refuses a version whose trend has R² < 0 or σ\'p below σ\'v0 without a reason (422), and records the reason when given', async () => {
    // EST with constant POP −5 kPa: σ'p 5 kPa below σ'v0 throughout; R² −0.32 as well.
    const def = scenarioDefinition()
    const est = def.strata.findIndex(s => s.code === 'EST')
    def.strata[est]!.trend = { ...def.strata[est]!.trend!, parameters: { pop: -5 }, r2: -0.32 }
    const { url, version } = await modelWith(si, def)
    const refused = await eng.post<{ message: string, data: { code: string, stratum: string, problems: string[] } }>(`${url}/versions`, { message: 'EST with a negative POP', version })
    expect(refused.status).toBe(422)
    expect(refused.body.message).toContain('The σ\'p trend of EST')
    expect(refused.body.message).toContain('R² is -0.32')
    expect(refused.body.message).toContain('below σ\'v0')
    expect(refused.body.data.problems).toEqual(['negative-r2', 'below-effective-stress'])

    // A reason covering only one of the two problems is not enough.
    const rev1 = await editDraft(url, (d) => {
      d.strata[est]!.trend!.acceptedDespite = { problems: ['negative-r2'], reason: 'Few points; the trend follows the geology.' }
      return d
    })
    const partly = await eng.post<{ message: string }>(`${url}/versions`, { message: 'EST with a reason for R² only', version: rev1 })
    expect(partly.status).toBe(422)
    expect(partly.body.message).not.toContain('R² is')

    const reason = 'Underconsolidated below the recent fill: the piezometers still read excess pore pressure.'
    const rev2 = await editDraft(url, (d) => {
      d.strata[est]!.trend!.acceptedDespite = { problems: ['negative-r2', 'below-effective-stress'], reason }
      return d
    })
    const saved = await eng.post<{ version: { version: number } }>(`${url}/versions`, { message: 'EST kept with a reason', version: rev2 })
    expect(saved.status).toBe(201)
    const v = (await must('version 1', eng.get<{ version: { definition: SiteModelDefinition } }>(`${url}/versions/${saved.body.version.version}`))).version
    expect(v.definition.strata[est]!.trend!.acceptedDespite).toEqual({ problems: ['negative-r2', 'below-effective-stress'], reason })
  })

  it('compares two versions in words, in the project\'s US units', async () => {
    const { url, version } = await modelWith(us, scenarioDefinition())
    expect((await eng.post(`${url}/versions`, { message: 'Scenario', version })).status).toBe(201)
    const rev = await editDraft(url, (d) => {
      d.groundwater.waterTableDepth = 1.75
      const est = d.strata.find(s => s.code === 'EST')!
      est.unitWeight = 16.2
      est.trend = { ...est.trend!, parameters: { pop: 24 } }
      return d
    })
    expect((await eng.post(`${url}/versions`, { message: 'Refitted', version: rev })).status).toBe(201)
    const cmp = await must('compare', eng.get<{ summary: string[], changes: { path: string }[] }>(`${url}/compare?a=1&b=2`))
    // 1.60 m = 5.25 ft, 1.75 m = 5.74 ft; 16.0 kN/m³ = 101.9 pcf, 16.2 = 103.1 pcf; 25 kPa = 522 psf, 24 kPa = 501 psf
    // (1 ft = 0.3048 m, 1 lbf = 4.448 N: NIST SP 811).
    expect(cmp.summary).toEqual([
      'water table 5.25 → 5.74 ft',
      'EST unit weight 101.9 → 103.1 pcf',
      'EST trend: constant POP 522 → 501 psf',
    ])
    // The field-by-field list stays for those who want it.
    expect(cmp.changes.map(c => c.path)).toContain('groundwater.waterTableDepth')
  })

  it('the demo\'s Yard model versions carry no trend that could mislead', async () => {
    const demo = await demoProjectId(owner)
    const models = (await must('demo models', eng.get<{ models: { id: string, name: string, versionCount: number }[] }>(`/api/projects/${demo}/models`))).models
    const yard = models.find(m => m.name === 'Yard model')!
    for (let n = 1; n <= yard.versionCount; n++) {
      const v = (await must(`version ${n}`, eng.get<{ version: { definition: SiteModelDefinition } }>(`/api/projects/${demo}/models/${yard.id}/versions/${n}`))).version
      expect(definitionTrendProblems(v.definition).map(p => [n, p.code, p.problems.map(q => q.code)])).toEqual([])
    }
  })
})
