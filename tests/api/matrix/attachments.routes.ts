import { attach, TINY_PDF, testPhoto } from '../../helpers/attach'
import { ALL, LOG_WRITERS, type Ctx, type RouteCase } from './types'

let photo: Buffer | undefined

/** A fresh attachment of the matrix project, uploaded by the owner; its URL. */
async function freshAttachment(ctx: Ctx, kind: 'pdf' | 'photo' = 'pdf'): Promise<string> {
  photo ??= await testPhoto(400, 300)
  const r = await attach<{ attachment: { id: string } }>(ctx.owner, ctx.projectId, kind === 'pdf' ? 'report.pdf' : 'box.png', kind === 'pdf' ? TINY_PDF : photo)
  if (r.status !== 201) throw new Error(`fixture attachment failed: ${r.status} ${JSON.stringify(r.body)}`)
  return `/api/projects/${ctx.projectId}/attachments/${r.body.attachment.id}`
}

/** Attachments: list, upload, download, thumbnail, delete. */
export const ROUTES: RouteCase[] = [
  { method: 'GET', path: '/api/projects/:projectId/attachments', allowed: ALL, ok: 200 },
  // A JSON body reaching an allowed caller is 400 (the route wants multipart), which shows the guard let it through.
  { method: 'POST', path: '/api/projects/:projectId/attachments', allowed: LOG_WRITERS, ok: 400 },
  { method: 'GET', path: '/api/projects/:projectId/attachments/:attachmentId/download', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${await freshAttachment(ctx)}/download` }) },
  { method: 'GET', path: '/api/projects/:projectId/attachments/:attachmentId/thumbnail', allowed: ALL, ok: 200, prepare: async ctx => ({ path: `${await freshAttachment(ctx, 'photo')}/thumbnail` }) },
  { method: 'DELETE', path: '/api/projects/:projectId/attachments/:attachmentId', allowed: LOG_WRITERS, ok: 200, prepare: async ctx => ({ path: await freshAttachment(ctx) }) },
]
