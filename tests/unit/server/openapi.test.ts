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

  it('carries the plausibility bounds of the schemas (the 400 a client gets is documented)', () => {
    const doc = buildOpenApiDocument()
    type Node = { properties: Record<string, Node>, items: Node, anyOf?: Node[], oneOf?: Node[], minimum?: number, maximum?: number, maxLength?: number }
    const settlement = doc.components.schemas.SettlementRequest as unknown as Node
    const layer = settlement.properties.layers!.items
    expect(layer.properties.thickness!.maximum).toBe(500)
    expect([layer.properties.unitWeight!.minimum, layer.properties.unitWeight!.maximum]).toEqual([5, 30])
    expect(layer.properties.cc!.maximum).toBe(10)
    expect(layer.properties.cr!.maximum).toBe(5)
    expect(layer.properties.e0!.maximum).toBe(15)
    expect(layer.properties.cv!.maximum).toBe(10_000)
    expect(layer.properties.name!.maxLength).toBe(80)
    const loads = (settlement.properties.load!.oneOf ?? settlement.properties.load!.anyOf)!
    for (const load of loads) expect(load.properties.pressure!.maximum).toBe(10_000)
  })
})
