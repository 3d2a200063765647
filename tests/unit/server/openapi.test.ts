import { Validator } from '@seriousme/openapi-schema-validator'
import { describe, expect, it } from 'vitest'
import { buildOpenApiDocument } from '../../../server/services/openapi'

describe('OpenAPI document of the compute API', () => {
  it('validates against the OpenAPI 3.1 schema', async () => {
    const doc = buildOpenApiDocument()
    const validator = new Validator()
    const result = await validator.validate(doc)
    expect(result.errors ?? []).toEqual([])
    expect(result.valid).toBe(true)
    expect(validator.version).toBe('3.1')
  })

  it('documents the four compute routes with the contract field names', () => {
    const doc = buildOpenApiDocument()
    expect(Object.keys(doc.paths).filter(p => p.startsWith('/api/calc/')).sort()).toEqual([
      '/api/calc/preconsolidation', '/api/calc/settlement', '/api/calc/stress-profile', '/api/calc/trend-fit',
    ])
    expect(doc.paths['/api/calc/stress-profile'].post.requestBody.content['application/json'].schema).toEqual({ $ref: '#/components/schemas/StressProfileRequest' })
    const body = doc.components.schemas.StressProfileRequest as { properties: Record<string, unknown>, required: string[] }
    expect(Object.keys(body.properties).sort()).toEqual(['depths', 'gammaW', 'groundwater', 'layers', 'surcharge'])
    expect(body.required.sort()).toEqual(['groundwater', 'layers'])
    const settlement = doc.components.schemas.SettlementRequest as { properties: Record<string, unknown> }
    expect(Object.keys(settlement.properties)).toEqual(expect.arrayContaining(['layers', 'load', 'sublayers', 'time', 'groundwater']))
  })
})
