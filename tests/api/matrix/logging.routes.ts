import { ALL, freshAgsUpload, freshPoint, freshRow, freshSample, freshStratum, freshUpload, LOG_WRITERS, MODEL_WRITERS, next, ok, type RouteCase } from './types'

const CPT_BODY = { areaRatio: 0.8, depth: [0.02, 0.04], qc: [300, 310], fs: [5, 5], u2: [1, 2] }

/** Points, logs, samples, in-situ rows, CPT, imports, exports and strata. */
export const ROUTES: RouteCase[] = [  // Investigation points and their logs
  { method: 'GET', path: '/api/projects/:projectId/points', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/points', allowed: LOG_WRITERS, ok: 201, prepare: async () => ({ body: { identifier: `BH-${next()}`, kind: 'borehole', easting: 0, northing: 0, groundElevation: 1, finalDepth: 10 } }) },
  { method: 'GET', path: '/api/projects/:projectId/points/:pointId', allowed: ALL, ok: 200, prepare: async ctx => ({ path: (await freshPoint(ctx)).url }) },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const p = await freshPoint(ctx); return { path: p.url, body: { remarks: 'checked', version: p.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshPoint(ctx)).url }) },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/intervals', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/intervals`, body: { intervals: [{ top: 0, bottom: 1 }] } }) },
  { method: 'POST', path: '/api/projects/:projectId/points/:pointId/samples', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/samples`, body: { identifier: 'U2', top: 1, bottom: 1.45, type: 'piston' } }) },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const s = await freshSample(ctx); return { path: s.url, body: { recovery: 90, version: s.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshSample(ctx)).url }) },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/samples/:sampleId/index-test', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshSample(ctx)).url}/index-test`, body: { liquidLimit: 60, plasticLimit: 25 } }) },
  // In-situ rows: SPT and groundwater are log writes (logs.write), vane readings test writes (tests.write): the same three roles.
  { method: 'POST', path: '/api/projects/:projectId/points/:pointId/spt', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/spt`, body: { depth: 3, blows: [2, 3, 4] } }) },
  { method: 'POST', path: '/api/projects/:projectId/points/:pointId/groundwater', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/groundwater`, body: { kind: 'strike', observedAt: '2025-03-03T10:00:00Z', depth: 1.6 } }) },
  { method: 'POST', path: '/api/projects/:projectId/points/:pointId/vane', allowed: LOG_WRITERS, ok: 201, prepare: async ctx => ({ path: `${(await freshPoint(ctx)).url}/vane`, body: { depth: 3, peak: 18 } }) },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId/spt/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshRow(ctx, 'spt')).url }) },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId/groundwater/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshRow(ctx, 'groundwater')).url }) },
  { method: 'DELETE', path: '/api/projects/:projectId/points/:pointId/vane/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshRow(ctx, 'vane')).url }) },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/spt/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const r = await freshRow(ctx, 'spt'); return { path: r.url, body: { depth: 5, blows: [2, 2, 2], version: r.version } } } },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/groundwater/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const r = await freshRow(ctx, 'groundwater'); return { path: r.url, body: { kind: 'standing', observedAt: '2025-04-02T09:00:00Z', depth: 1.7, version: r.version } } } },
  { method: 'PATCH', path: '/api/projects/:projectId/points/:pointId/vane/:rowId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const r = await freshRow(ctx, 'vane'); return { path: r.url, body: { depth: 6, peak: 22, remoulded: 7, version: r.version } } } },
  { method: 'PUT', path: '/api/projects/:projectId/points/:pointId/cpt', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${(await freshPoint(ctx, 'cpt')).url}/cpt`, body: CPT_BODY }) },
  {
    method: 'GET', path: '/api/projects/:projectId/points/:pointId/cpt', allowed: ALL, ok: 200,
    prepare: async (ctx) => { const p = await freshPoint(ctx, 'cpt'); await ok(ctx.owner.request('PUT', `${p.url}/cpt`, CPT_BODY), 200); return { path: `${p.url}/cpt` } },
  },
  // Imports: a JSON body reaching an allowed caller is 400 (the route wants multipart), which shows the guard let it through.
  { method: 'POST', path: '/api/projects/:projectId/imports', allowed: LOG_WRITERS, ok: 400 },
  { method: 'GET', path: '/api/projects/:projectId/imports/:importId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await freshUpload(ctx)}?target=points` }) },
  { method: 'POST', path: '/api/projects/:projectId/imports/:importId/commit', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await freshUpload(ctx)}/commit`, body: { target: 'points', mapping: { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth' }, dryRun: true } }) },
  // An AGS4 file imported whole (logs.write); a dry run writes nothing, so the fixture can be reused by every caller.
  { method: 'POST', path: '/api/projects/:projectId/imports/:importId/commit-ags', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: `${await freshAgsUpload(ctx)}/commit-ags`, body: { dryRun: true } }) },
  // Exports
  { method: 'GET', path: '/exports/:projectId/logs.xlsx', allowed: ALL, ok: 200 },
  // Strata
  { method: 'GET', path: '/api/projects/:projectId/strata', allowed: ALL, ok: 200 },
  { method: 'POST', path: '/api/projects/:projectId/strata', allowed: LOG_WRITERS, ok: 201, prepare: async () => ({ body: { code: `N${next()}`.slice(0, 16), name: 'New', colour: 'c', pattern: 'p', unitWeight: 17, unitWeightSaturated: 18 } }) },
  { method: 'PATCH', path: '/api/projects/:projectId/strata/:stratumId', allowed: LOG_WRITERS, ok: 200, prepare: async (ctx) => { const s = await freshStratum(ctx); return { path: s.url, body: { name: 'Renamed', version: s.version } } } },
  // The σ'p switch is an interpretation choice (interpretation.write: owner and engineer).
  { method: 'PUT', path: '/api/projects/:projectId/strata/:stratumId/cpt-derivation', allowed: MODEL_WRITERS, ok: 200, prepare: async (ctx) => { const s = await freshStratum(ctx); return { path: `${s.url}/cpt-derivation`, body: { cptDerivation: false, version: s.version } } } },
  { method: 'DELETE', path: '/api/projects/:projectId/strata/:stratumId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: (await freshStratum(ctx)).url }) },
]
