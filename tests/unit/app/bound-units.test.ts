// Range messages of the schemas (which check SI values) read in the units the person typed.
import { describe, expect, it } from 'vitest'
import { IntervalInputSchema, PointInputSchema, StratumInputSchema, VaneInputSchema } from '../../../shared/schemas/investigation'
import { OedometerTestInputSchema } from '../../../shared/schemas/lab'
import { CreateSettlementRunSchema } from '../../../shared/schemas/settlement-runs'
import { boundMessage, boundText, messageInUnits } from '../../../shared/units/bounds'
import { useModelUnits } from '../../../app/composables/useModelUnits'
import { fieldIssues, issueMessage } from '../../../app/utils/formNumbers'
import { MODEL_QUANTITIES } from '../../../app/utils/siteModelEdits'
import { SiteModelDefinitionSchema } from '../../../shared/site-model/definition'
import { emptyRow, validateDraft } from '../../../app/utils/logDraft'

describe('bounds in the typed units', () => {
  it('rounds a converted bound inwards, so the number quoted is itself allowed', () => {
    // 500 m = 1640.4199… ft (1 ft = 0.3048 m exactly): "at most 1640.41 ft", not 1640.42 which is above 500 m.
    expect(boundText(500, 'length', 'US', true)).toBe('1640.41 ft')
    expect(boundText(0, 'length', 'US', false)).toBe('0 ft')
    // 5 kN/m³ = 31.83 pcf: a lower bound rounds up.
    expect(boundText(5, 'unitWeight', 'US', false)).toBe('31.9 pcf')
    expect(boundText(500, 'length', 'SI', true)).toBe('500 m')
  })

  it('rewrites the bound a schema quotes in m, and writes one where zod quoted none', () => {
    const r = IntervalInputSchema.safeParse({ top: 600, bottom: -1 })
    const [top, bottom] = r.error!.issues
    expect(boundMessage(top!, 'length', 'US')).toBe('Top must be at most 1640.41 ft')
    expect(boundMessage(bottom!, 'length', 'US')).toBe('Bottom must be 0 ft or deeper')
    expect(boundMessage(top!, 'length', 'SI')).toBe('Top must be at most 500 m')
    const depth = PointInputSchema.safeParse({ identifier: 'BH-01', kind: 'borehole', easting: 0, northing: 0, groundElevation: 0, finalDepth: 900 }).error!.issues[0]!
    expect(depth.message).toMatch(/^Too big/)
    expect(boundMessage(depth, 'length', 'US')).toBe('must be at most 1640.41 ft')
    expect(boundMessage(depth, 'length', 'SI')).toBe('must be at most 500 m')
  })

  it('gives a form\'s field messages in the project\'s units (ft, pcf, tsf)', () => {
    const us = useModelUnits('US', 'tsf')
    const point = PointInputSchema.safeParse({ identifier: 'BH-01', kind: 'borehole', easting: 0, northing: 0, groundElevation: 0, finalDepth: 900 })
    expect(fieldIssues(point.error!, { finalDepth: 'Final depth' }, us.typed({ finalDepth: 'length' })).finalDepth).toBe('Final depth must be at most 1640.41 ft')
    const stratum = StratumInputSchema.safeParse({ code: 'EST', name: 'Estuarine clay', colour: 'c', pattern: 'p', unitWeight: 2, unitWeightSaturated: 16 })
    expect(fieldIssues(stratum.error!, { unitWeight: 'Unit weight above water' }, us.typed({ unitWeight: 'unitWeight' })).unitWeight).toBe('Unit weight above water must be at least 31.9 pcf')
    // Without the typed units the message stays as the schema wrote it.
    expect(fieldIssues(stratum.error!, { unitWeight: 'Unit weight above water' }).unitWeight).toBe('Unit weight above water must be at least 5 kN/m³')
  })

  it('names a nested stage stress by its own key (the oedometer form)', () => {
    const r = OedometerTestInputSchema.safeParse({ sampleId: '00000000-0000-4000-8000-000000000000', label: 'T1', testType: 'IL', specimenHeight: 20, initialWaterContent: null, specificGravity: null, e0: 1, convention: 'void-ratio', stages: [{ stress: 200_000, value: 1 }] })
    const us = useModelUnits('US', 'tsf')
    const issues = fieldIssues(r.error!, { stages: 'Stages' }, us.typed({ stress: 'stress' }))
    // 100 000 kPa = 1044.27… tsf (1 tsf = 2000 lbf/ft²).
    expect(issues.stages).toBe('Stages σ\' must be at most 1044.27 tsf')
  })

  it('gives a stress model definition\'s bounds by each number\'s own key (the model page\'s check before saving)', () => {
    const def = { schemaVersion: 2, groundwater: { waterTableDepth: 600, piezometers: [] }, strata: [{ code: 'EST', name: 'Estuarine clay', thickness: 12, unitWeight: 40, unitWeightSaturated: 16, compressible: false }] }
    const r = SiteModelDefinitionSchema.safeParse(def)
    const typed = useModelUnits('US', 'psf').typed(MODEL_QUANTITIES)
    const messages = r.error!.issues.map(i => issueMessage(i, String(i.path[0]), typed))
    expect(messages).toEqual(['must be at most 1640.41 ft', 'must be at most 190.9 pcf'])
  })

  it('quotes the log table\'s depth bounds in feet on a US project', () => {
    const row = { ...emptyRow(), top: '0', bottom: '2000', description: 'Soft grey clay' }
    const { errors } = validateDraft([row], 600, 'ft')
    expect(errors[0]!.bottom).toBe('Bottom must be at most 1640.41 ft')
    expect(validateDraft([row], 600, 'm').errors[0]!.bottom).toBe('Bottom must be at most 500 m')
  })

  it('reads the quantity from the unit a run editor message quotes', () => {
    const r = CreateSettlementRunSchema.safeParse({ name: 'x', model: { modelId: '00000000-0000-4000-8000-000000000000', version: 1 }, loads: [{ id: 'a', shape: 'uniform', pressure: 1e9 }], points: [{ label: 'P', x: 9e9, y: 0 }] })
    const messages = r.error!.issues.map(i => `${i.path.join('.')}: ${messageInUnits(i, 'US', { usStress: 'psf' })}`)
    expect(messages.some(m => /^points\.0\.x: .*at most 3280839\.89 ft$/.test(m))).toBe(true)
    expect(messages.join('\n')).not.toMatch(/\d m\b|kPa/)
  })

  it('leaves messages with units of their own (mm) and vane readings in SI alone on an SI project', () => {
    expect(boundMessage({ code: 'too_small', minimum: 2, inclusive: true, message: 'must be at least 2 mm' }, 'length', 'US')).toBe('must be at least 2 mm')
    const vane = VaneInputSchema.safeParse({ depth: 4, peak: -5, remoulded: null })
    const issue = vane.error!.issues[0]!
    expect(boundMessage(issue, 'stress', 'SI')).toBe('must be above 0 kPa')
    expect(boundMessage(issue, 'stress', 'US', { usStress: 'psf' })).toBe('must be above 0 psf')
  })
})
