import { beforeAll, describe, expect, it } from 'vitest'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, demoEmail, signIn } from '../helpers/http'

interface Flag { id: string, version: number, status: string, verdict: string, targetId: string }

describe('reviewer flags', () => {
  let reviewer: Client
  let engineer: Client
  let projectId: string
  let pointId: string
  let intervals: { id: string, top: number, bottom: number, uscs: string | null }[]

  // A copy of the demo site of this file's own; each test flags an interval of BH-02 no other test touches.
  beforeAll(async () => {
    reviewer = await signIn(demoEmail('reviewer'))
    engineer = await signIn(demoEmail('engineer'))
    projectId = await createDemoCopy('REV')
    const pts = await reviewer.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${projectId}/points?q=BH-02`)
    pointId = pts.body.points.find(p => p.identifier === 'BH-02')!.id
    const d = await reviewer.get<{ intervals: { id: string, top: number, bottom: number, uscs: string | null }[] }>(`/api/projects/${projectId}/points/${pointId}`)
    intervals = d.body.intervals
    expect(intervals.length).toBeGreaterThanOrEqual(4)
  })

  it('flags a log interval, threads replies, resolves and reopens, with the audit trail', async () => {
    const intervalId = intervals[0]!.id
    const f = await reviewer.post<{ flag: Flag }>(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'questionable', comment: 'Description says shells but the sample log does not.' })
    expect(f.status).toBe(201)
    const flag = f.body.flag
    expect((await engineer.post(`/api/projects/${projectId}/flags/${flag.id}/replies`, { body: 'Checked the core photos: shells present, log is right.' })).status).toBe(201)
    expect((await reviewer.post(`/api/projects/${projectId}/flags/${flag.id}/replies`, { body: 'Agreed.' })).status).toBe(201)
    const thread = await engineer.get<{ replies: { body: string, author: string }[] }>(`/api/projects/${projectId}/flags/${flag.id}`)
    expect(thread.body.replies.map(r => r.author)).toEqual(['Tomas Lindqvist', 'Priya Natarajan'])

    const resolved = await reviewer.patch<{ flag: Flag }>(`/api/projects/${projectId}/flags/${flag.id}`, { status: 'resolved', version: flag.version })
    expect(resolved.body.flag.status).toBe('resolved')
    const stale = await reviewer.patch(`/api/projects/${projectId}/flags/${flag.id}`, { status: 'open', version: flag.version })
    expect(stale.status).toBe(409)
    const reopened = await reviewer.patch<{ flag: Flag }>(`/api/projects/${projectId}/flags/${flag.id}`, { status: 'open', version: resolved.body.flag.version })
    expect(reopened.body.flag.status).toBe('open')

    const list = await engineer.get<{ flags: (Flag & { replyCount: number })[] }>(`/api/projects/${projectId}/flags?targetType=log-interval&status=open`)
    expect(list.body.flags.find(x => x.id === flag.id)!.replyCount).toBe(2)
  })

  it('lists a flagged interval with its hole and depths, so the list needs no look-up per hole; other targets carry none', async () => {
    const interval = intervals[1]!
    const intervalId = interval.id
    const made = await reviewer.post<{ flag: Flag }>(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'questionable', comment: 'Base of the unit looks high.' })
    expect(made.status).toBe(201)
    const test = (await reviewer.get<{ tests: { id: string }[] }>(`/api/projects/${projectId}/tests/oedometer?limit=1`)).body.tests[0]!
    const onTest = await reviewer.post<{ flag: Flag }>(`/api/projects/${projectId}/flags`, { targetType: 'oedometer-test', targetId: test.id, verdict: 'questionable', comment: 'Check the seating load.' })
    expect(onTest.status).toBe(201)
    const list = await reviewer.get<{ flags: (Flag & { targetType: string, interval?: { pointId: string, pointIdentifier: string, top: number, bottom: number, uscs: string | null } | null })[] }>(`/api/projects/${projectId}/flags?limit=500`)
    const onInterval = list.body.flags.filter(f => f.targetType === 'log-interval' && f.targetId === intervalId)
    expect(onInterval.map(f => f.id)).toEqual([made.body.flag.id])
    for (const f of onInterval) expect(f.interval).toEqual(expect.objectContaining({ pointId, pointIdentifier: 'BH-02', top: interval.top, bottom: interval.bottom, uscs: interval.uscs }))
    const others = list.body.flags.filter(f => f.targetType !== 'log-interval')
    expect(others.map(f => f.id)).toContain(onTest.body.flag.id)
    for (const f of others) expect(f).not.toHaveProperty('interval')
  })

  it('an engineer cannot flag (403) but can reply; a target outside the project is 404; a reason is required (400)', async () => {
    const intervalId = intervals[2]!.id
    expect((await engineer.post(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'exclude', comment: 'engineer tries' })).status).toBe(403)
    expect((await reviewer.post(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: '00000000-0000-4000-8000-000000000000', verdict: 'exclude', comment: 'not here' })).status).toBe(404)
    expect((await reviewer.post(`/api/projects/${projectId}/flags`, { targetType: 'cpt-point', targetId: 'cpt:garbage', verdict: 'exclude', comment: 'bad id' })).status).toBe(404)
    expect((await reviewer.post(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'exclude', comment: '' })).status).toBe(400)
  })

  it('a saved model version records the flags in force', async () => {
    const intervalId = intervals[3]!.id
    const f = await reviewer.post<{ flag: Flag }>(`/api/projects/${projectId}/flags`, { targetType: 'log-interval', targetId: intervalId, verdict: 'exclude', comment: 'Exclude while the log is rechecked.' })
    const m = await engineer.post<{ model: { id: string, version: number } }>(`/api/projects/${projectId}/models`, { name: `Flag check ${Date.now().toString(36)}` })
    const v = await engineer.post<{ version: { definition: { flagsInForce: { flagId: string, verdict: string }[] } } }>(`/api/projects/${projectId}/models/${m.body.model.id}/versions`, { message: 'With the exclusion', version: m.body.model.version })
    expect(v.body.version.definition.flagsInForce).toContainEqual(expect.objectContaining({ flagId: f.body.flag.id, verdict: 'exclude' }))
  })
})
