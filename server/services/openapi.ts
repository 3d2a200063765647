import { z } from 'zod'
import {
  PreconsolidationRequestSchema,
  PreconsolidationResponseSchema,
  SettlementRequestSchema,
  SettlementResponseSchema,
  StressProfileRequestSchema,
  StressProfileResponseSchema,
  TrendFitRequestSchema,
  TrendFitResponseSchema,
} from '#shared/schemas/calc'
import { LoginSchema } from '#shared/schemas/auth'

type JsonSchema = Record<string, unknown>

/**
 * Every schema registered with `.meta({ id })` becomes a component: request
 * schemas in their input form (defaults optional), responses in their output form.
 */
function componentSchemas(): Record<string, JsonSchema> {
  const opts = { unrepresentable: 'any', target: 'draft-2020-12', uri: (id: string) => `#/components/schemas/${id}` } as const
  const inputs = z.toJSONSchema(z.globalRegistry, { ...opts, io: 'input' }).schemas as Record<string, JsonSchema>
  const outputs = z.toJSONSchema(z.globalRegistry, { ...opts, io: 'output' }).schemas as Record<string, JsonSchema>
  const out: Record<string, JsonSchema> = {}
  for (const id of Object.keys(outputs)) {
    const { $schema: _s, id: _id, ...schema } = (id.endsWith('Request') ? inputs[id] : outputs[id]) ?? {}
    out[id] = schema
  }
  return out
}

function refTo(schema: z.ZodType): JsonSchema {
  const id = z.globalRegistry.get(schema)?.id
  if (!id) throw new Error('Every schema in the OpenAPI document needs .meta({ id })')
  return { $ref: `#/components/schemas/${id}` }
}

const errorRef = { $ref: '#/components/schemas/ApiError' }

function errors(...codes: number[]) {
  const text: Record<number, string> = {
    400: 'The body does not have the documented shape: `data.issues` lists each path and message.',
    401: 'Not signed in: send the session cookie or `Authorization: Bearer <token>`.',
    403: 'Cross-origin request refused (a cookie request must send a matching Origin).',
    413: 'The body is larger than 1 MB.',
    422: 'Physically impossible input (e.g. σ\'v0 ≤ 0, zero thickness, e0 ≤ 0, a curve with no yield): `message` says what and where.',
    429: 'Too many attempts: see Retry-After.',
  }
  return Object.fromEntries(codes.map(c => [String(c), { description: text[c], content: { 'application/json': { schema: errorRef } } }]))
}

function calcPath(summary: string, description: string, request: z.ZodType, response: z.ZodType) {
  return {
    post: {
      summary,
      description,
      tags: ['compute'],
      security: [{ session: [] }, { bearer: [] }],
      requestBody: { required: true, content: { 'application/json': { schema: refTo(request) } } },
      responses: {
        200: { description: 'Result, SI units', content: { 'application/json': { schema: refTo(response) } } },
        ...errors(400, 401, 403, 413, 422),
      },
    },
  }
}

/** A path's operation with query parameters listed. */
function withQuery(path: ReturnType<typeof calcPath>, parameters: JsonSchema[]) {
  return { post: { ...path.post, parameters } }
}

/** The OpenAPI 3.1 document of the public compute API, generated from the shared zod schemas. */
export function buildOpenApiDocument(serverUrl = '/') {
  return {
    openapi: '3.1.0',
    info: {
      title: 'Pastload compute API',
      version: '1.0.0',
      description: 'Stress profiles, σ\'p interpretation, trend fits and 1-D consolidation settlement. SI units throughout (m, kPa, kN/m³, m²/year, years). Results are estimates for engineers to check; design follows local codes and is checked by a licensed engineer.',
    },
    servers: [{ url: serverUrl }],
    tags: [{ name: 'compute', description: 'Pure calculations: nothing is stored.' }, { name: 'auth' }],
    paths: {
      '/api/auth/login': {
        post: {
          summary: 'Sign in',
          tags: ['auth'],
          requestBody: { required: true, content: { 'application/json': { schema: refTo(LoginSchema) } } },
          responses: {
            200: { description: 'Signed in; the `pastload_session` cookie is set.' },
            ...errors(400, 401, 429),
          },
        },
      },
      '/api/calc/stress-profile': calcPath('In-situ stress profile', 'σv, u and σ\'v0 at every breakpoint (surface, layer boundaries, water table, piezometers) and at the requested depths, sorted by depth.', StressProfileRequestSchema, StressProfileResponseSchema),
      '/api/calc/settlement': withQuery(calcPath('1-D consolidation settlement', 'Primary consolidation settlement by sublayers (NC, OC, OC-NC cases), the load\'s stress increase with depth, a convergence check with sublayers halved, optional time rate (Terzaghi) and secondary compression.', SettlementRequestSchema, SettlementResponseSchema), [
        { name: 'sublayers', in: 'query', required: false, description: '`false` (or `0`) leaves the sublayer rows out of the answer; everything else is unchanged. Default `true`.', schema: { type: 'string', enum: ['true', 'false', '1', '0'], default: 'true' } },
      ]),
      '/api/calc/preconsolidation': calcPath('σ\'p from an oedometer curve', 'Casagrande, Pacheco Silva, work (Becker et al. 1987) and bilinear log(1+e)–log σ\' methods side by side, with Cc, Cr and sample quality (Lunne et al. 1997).', PreconsolidationRequestSchema, PreconsolidationResponseSchema),
      '/api/calc/trend-fit': calcPath('σ\'p trend with depth in one stratum', 'Least-squares fit of constant, linear, constant-POP, constant-OCR or crust models, or `auto` (lowest AICc), with R², RMSE, AIC and a 95 % confidence band.', TrendFitRequestSchema, TrendFitResponseSchema),
    },
    components: {
      schemas: componentSchemas(),
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'pastload_session' },
        bearer: { type: 'http', scheme: 'bearer', description: 'A personal API token from the account page (starts with plt_).' },
      },
    },
  }
}
