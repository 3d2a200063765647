// Inputs that could stall or exhaust the server are refused with a specific 4xx:
// workbooks that unpack too far (read in a worker thread meanwhile the server
// answers), tables with too many rows, chunked bodies past the body limit, and
// projects past the point limit; reads over more ids than one query may carry
// parameters still answer.
import { request } from 'node:http'
import { strToU8, zipSync } from 'fflate'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { type Client, baseUrl, demoEmail, signIn } from '../helpers/http'
import { createProject } from '../helpers/project'
import { upload } from '../helpers/upload'

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'

interface Refusal { message: string, data?: { code?: string } }
interface Uploaded { importId: string, preview: { rowCount: number, mapping: Record<string, string> | null } }

/** A minimal workbook of one sheet, assembled part by part so a large sheet costs little to make. */
function workbook(sheetXml: string): Uint8Array {
  const xml = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>'
  return zipSync({
    '[Content_Types].xml': strToU8(`${xml}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>`),
    '_rels/.rels': strToU8(`${xml}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`),
    'xl/workbook.xml': strToU8(`${xml}<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Points" sheetId="1" r:id="rId1"/></sheets></workbook>`),
    'xl/_rels/workbook.xml.rels': strToU8(`${xml}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/></Relationships>`),
    'xl/worksheets/sheet1.xml': strToU8(sheetXml),
  })
}

const HEADER_ROW = `<row>${['Point', 'Kind', 'Easting', 'Northing', 'Ground level', 'Final depth'].map(h => `<c t="inlineStr"><is><t>${h}</t></is></c>`).join('')}</row>`
/** The same six numbers on every row: a sheet of any length compresses to almost nothing. */
const SAME_ROW = `<row>${[1, 2, 3, 4, 5, 6].map(v => `<c><v>${v}</v></c>`).join('')}</row>`
const sheetOf = (rows: number) => `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${HEADER_ROW}${SAME_ROW.repeat(rows)}</sheetData></worksheet>`

/**
 * A multipart upload sent in two halves over one request: `between` runs after
 * the first half is on the wire, while the server still waits for the rest.
 */
function uploadInTwoHalves(c: Client, path: string, filename: string, content: Uint8Array, between: () => Promise<void>): Promise<{ status: number, body: Refusal }> {
  const boundary = `----pastload${Date.now().toString(36)}`
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: ${XLSX_TYPE}\r\n\r\n`)
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`)
  const body = Buffer.concat([head, Buffer.from(content), tail])
  const half = Math.floor(body.length / 2)
  return new Promise((resolve, reject) => {
    const req = request(c.base + path, { method: 'POST', headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(body.length), 'cookie': c.cookie, 'origin': c.origin ?? '' } }, (res) => {
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (d: string) => { text += d })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(text) as Refusal }))
    })
    req.on('error', reject)
    req.write(body.subarray(0, half), () => {
      between().then(() => req.end(body.subarray(half)), reject)
    })
  })
}

/**
 * POSTs an endless chunked body (no Content-Length) until the server answers.
 * `endedFirst` is true only if the server let the client send 256 MB without answering.
 */
function chunkedPost(url: string, headers: Record<string, string>): Promise<{ status: number, body: Refusal, endedFirst: boolean }> {
  const chunk = Buffer.alloc(64 * 1024, 0x20)
  return new Promise((resolve, reject) => {
    let answered = false
    let endedFirst = false
    let sent = 0
    const req = request(url, { method: 'POST', headers: { 'content-type': 'application/json', ...headers } }, (res) => {
      answered = true
      let text = ''
      res.setEncoding('utf8')
      res.on('data', (d: string) => { text += d })
      res.on('end', () => {
        req.destroy()
        resolve({ status: res.statusCode ?? 0, body: JSON.parse(text) as Refusal, endedFirst })
      })
    })
    // The server closes the connection soon after its answer; a write failing after it is expected.
    req.on('error', (err) => { if (!answered) reject(err) })
    const pump = () => {
      while (!answered) {
        if (sent >= 256 * 1024 * 1024) {
          endedFirst = true
          req.end()
          return
        }
        sent += chunk.length
        if (!req.write(chunk)) {
          req.once('drain', pump)
          return
        }
      }
    }
    req.write('{"email":"')
    pump()
  })
}

describe('input limits', () => {
  let owner: Client
  let geo: Client
  let base: string

  beforeAll(async () => {
    owner = await signIn(demoEmail('owner'))
    base = (await createProject(owner, 'LIM', 'Input limits site', ['geologist'])).base
    geo = await signIn(demoEmail('geologist'))
  })

  it('refuses a workbook that unpacks past 50 MB with its unpacked size, while health keeps answering', async () => {
    // About 63 MB of sheet XML (101 bytes a row) that compresses to a few hundred kilobytes.
    const bomb = workbook(sheetOf(650_000))
    expect(bomb.length).toBeLessThan(2 * 1024 * 1024)
    let healthDuringUpload = 0
    const r = await uploadInTwoHalves(geo, `${base}/imports`, 'bomb.xlsx', bomb, async () => {
      const h = await fetch(`${baseUrl()}/api/health`)
      healthDuringUpload = h.status
    })
    expect(healthDuringUpload).toBe(200)
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('bomb.xlsx unpacks to 63 MB; the limit for a workbook is 50 MB. Split it or save the sheet you need as CSV.')
    expect(r.body.data?.code).toBe('workbook-too-large')
  })

  it('reads a workbook in a worker thread: health answers while it is read, and the target row limit refuses it', async () => {
    const wb = workbook(sheetOf(20_001))
    const up = await upload<Uploaded>(geo, `${base}/imports`, 'points.xlsx', wb, XLSX_TYPE)
    expect(up.status).toBe(201)
    expect(up.body.preview.rowCount).toBe(20_001)
    const mapping = { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth' }
    let settled = false
    const commit = geo.post<Refusal>(`${base}/imports/${up.body.importId}/commit`, { target: 'points', mapping, dryRun: true }).finally(() => { settled = true })
    let healthWhileReading = 0
    while (!settled) {
      const h = await fetch(`${baseUrl()}/api/health`)
      if (!settled && h.status === 200) healthWhileReading++
    }
    const r = await commit
    expect(healthWhileReading).toBeGreaterThan(0)
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('points.xlsx has more than 20 000 data rows; an import of points takes at most 20 000. Split the file and import it in parts.')
  })

  it('refuses a CSV over the target row limit at commit, and one over every target\'s limit at upload', async () => {
    const rows = Array.from({ length: 20_001 }, (_, i) => `P-${i},borehole,${i},0,1,10`)
    const up = await upload<Uploaded>(geo, `${base}/imports`, 'many-points.csv', `Point,Kind,Easting,Northing,Ground level,Final depth\n${rows.join('\n')}\n`)
    expect(up.status).toBe(201)
    expect(up.body.preview.rowCount).toBe(20_001)
    const r = await geo.post<Refusal>(`${base}/imports/${up.body.importId}/commit`, { target: 'points', mapping: { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth' } })
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('many-points.csv has 20 001 data rows; an import of points takes at most 20 000. Split the file and import it in parts.')
    const points = await geo.get<{ points: unknown[] }>(`${base}/points`)
    expect(points.body.points).toHaveLength(0)

    const huge = await upload<Refusal>(geo, `${base}/imports`, 'huge.csv', `depth\n${'1\n'.repeat(250_001)}`)
    expect(huge.status).toBe(422)
    expect(huge.body.message).toBe('huge.csv has 250 001 data rows; an import takes at most 250 000. Split the file and import it in parts.')
  })

  it('refuses an AGS4 file over the line limit before parsing it', async () => {
    const ags = `"GROUP","PROJ"\r\n${'\r\n'.repeat(1_000_000)}`
    const r = await upload<Refusal>(geo, `${base}/imports`, 'long.ags', ags, 'text/plain')
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('long.ags has 1 000 001 lines; an AGS4 import takes at most 1 000 000. Split the file and import it in parts.')
  })

  it('answers 413 to a chunked body past the limit as it arrives, signed in or not', async () => {
    const login = await chunkedPost(`${baseUrl()}/api/auth/login`, { origin: baseUrl() })
    expect(login.endedFirst).toBe(false)
    expect(login.status).toBe(413)
    expect(login.body.message).toBe('The request body is larger than 1048576 bytes, the limit for this request.')

    const point = await chunkedPost(`${baseUrl()}${base}/points`, { origin: baseUrl(), cookie: geo.cookie })
    expect(point.endedFirst).toBe(false)
    expect(point.status).toBe(413)
    expect(point.body.message).toBe('The request body is larger than 1048576 bytes, the limit for this request.')

    // A multipart body sent to a route that reads data is held to the same limit.
    const asForm = await chunkedPost(`${baseUrl()}/api/auth/login`, { 'origin': baseUrl(), 'content-type': 'multipart/form-data; boundary=x' })
    expect(asForm.endedFirst).toBe(false)
    expect(asForm.status).toBe(413)
    expect(asForm.body.message).toBe('The request body is larger than 1048576 bytes, the limit for this request.')
  })

  it('answers a small chunked JSON body as usual', async () => {
    const body = JSON.stringify({ identifier: 'BH-CH', kind: 'borehole', easting: 1, northing: 2, groundElevation: 3, finalDepth: 12 })
    const r = await new Promise<{ status: number, body: { point?: { identifier: string } } }>((resolve, reject) => {
      const req = request(`${baseUrl()}${base}/points`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': baseUrl(), 'cookie': geo.cookie } }, (res) => {
        let text = ''
        res.setEncoding('utf8')
        res.on('data', (d: string) => { text += d })
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(text) as { point?: { identifier: string } } }))
      })
      req.on('error', reject)
      // Two writes without a Content-Length: Node sends the body chunked.
      req.write(body.slice(0, 10))
      req.end(body.slice(10))
    })
    expect(r.status).toBe(201)
    expect(r.body.point?.identifier).toBe('BH-CH')
  })
})

describe('projects with more points than one query may carry parameters', () => {
  const MANY = 66_000
  let db: pg.Client
  let geo: Client
  let base: string

  beforeAll(async () => {
    const owner = await signIn(demoEmail('owner'))
    const project = await createProject(owner, 'MANY', 'Many points site', ['engineer'])
    const projectId = project.id
    base = project.base
    geo = await signIn(demoEmail('engineer'))
    // Past the import limit on purpose (straight into the database): what such a project reads must still answer.
    db = new pg.Client({ connectionString: process.env.DATABASE_URL })
    await db.connect()
    await db.query(`insert into investigation_points (project_id, identifier, kind, easting, northing, ground_elevation, final_depth)
      select $1, 'CPT-' || g, 'cpt', g, 0, 1, 20 from generate_series(1, $2::int) g`, [projectId, MANY])
  }, 120_000)

  afterAll(async () => { await db?.end() })

  it('lists oedometer tests, σ\'p points and a starting model over all of its points', async () => {
    const tests = await geo.get<{ tests: unknown[] }>(`${base}/tests/oedometer`)
    expect(tests.status).toBe(200)
    expect(tests.body.tests).toEqual([])
    const sigma = await geo.get<{ points: unknown[] }>(`${base}/preconsolidation-points`)
    expect(sigma.status).toBe(200)
    const model = await geo.post<{ model: { id: string } }>(`${base}/models`, { name: 'From many logs' })
    expect(model.status).toBe(201)
  }, 120_000)

  it('exports its logs as AGS4', async () => {
    const r = await fetch(`${baseUrl()}/exports/${base.split('/').pop()}/logs.ags`, { headers: { cookie: geo.cookie } })
    expect(r.status).toBe(200)
    const text = await r.text()
    expect(text).toContain('"DATA","CPT-66000"')
  }, 120_000)

  it('refuses an import that would pass the project\'s point limit, naming the limit', async () => {
    const up = await upload<Uploaded>(geo, `${base}/imports`, 'one-more.csv', 'Point,Kind,Easting,Northing,Ground level,Final depth\nBH-NEW,borehole,1,1,1,10\n')
    expect(up.status).toBe(201)
    const r = await geo.post<Refusal>(`${base}/imports/${up.body.importId}/commit`, { target: 'points', mapping: { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth' } })
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('This import adds 1 point to the project\'s 66 000; a project holds at most 20 000 points. Nothing was imported.')
    const { rows } = await db.query<{ n: string }>(`select count(*) as n from investigation_points where identifier = 'BH-NEW' and project_id = $1`, [base.split('/').pop()])
    expect(Number(rows[0]!.n)).toBe(0)
  })

  it('refuses one more point created by hand in a full project, naming the limit', async () => {
    const r = await geo.post<Refusal>(`${base}/points`, { identifier: 'BH-HAND', kind: 'borehole', easting: 1, northing: 1, groundElevation: 1, finalDepth: 10 })
    expect(r.status).toBe(422)
    expect(r.body.message).toBe('A project holds at most 20 000 points and this one is full; BH-HAND was not added.')
    const { rows } = await db.query<{ n: string }>(`select count(*) as n from investigation_points where identifier = 'BH-HAND' and project_id = $1`, [base.split('/').pop()])
    expect(Number(rows[0]!.n)).toBe(0)
  })
})
