import { RESULT_CAUTION } from '#shared/caution'
import { DEFAULT_CONE_FACTOR } from '#shared/geotech/insitu'
import { CptInterpretationQuerySchema } from '#shared/schemas/lab'
import { stratumBounds } from '#shared/site-model/definition'
import { loggedIntervals, stressContext } from '~~/server/services/lab'
import { requirePoint } from '~~/server/services/points'
import { cptBehaviour, cptResampled, cptSoundingRows, cptThroughModel, derivedHere } from '~~/server/services/preconsolidation-points'
import { cptDerivationOff } from '~~/server/services/strata'
import { notFound } from '~~/server/services/http-errors'
import { PointParamsSchema } from '#shared/schemas/investigation'

/** Finite values rounded for the wire; NaN (a flagged row) becomes null. */
function wire(values: Float64Array, digits: number): (number | null)[] {
  const f = 10 ** digits
  return Array.from(values, v => (Number.isFinite(v) ? Math.round(v * f) / f : null))
}

/**
 * The sounding through the stress model in force: qt, qnet, Rf, Bq, σv0, u0, σ'v0, σ'p = k·qnet and
 * OCR per row (null where a row is flagged, with its status code), the behaviour index Ic (Robertson 2009;
 * null where undefined), and σ'p resampled at `spacing` in the strata where it is derived.
 */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { pointId } = validateParams(event, PointParamsSchema)
  const { spacing } = validateQuery(event, CptInterpretationQuerySchema)
  const point = await requirePoint(project.id, pointId)
  const [sounding] = await cptSoundingRows(project.id, point.id)
  if (!sounding) notFound('CPT sounding')
  const stress = await stressContext(project.id)
  const profile = runEngine(() => cptThroughModel(stress, sounding))
  const ic = runEngine(() => cptBehaviour(sounding, profile))
  const [intervals, off] = await Promise.all([loggedIntervals([point.id]), cptDerivationOff(project.id)])
  const bounds = stress.definition ? stratumBounds(stress.definition) : []
  return {
    pointId: point.id,
    pointIdentifier: point.identifier,
    areaRatio: sounding.areaRatio,
    count: profile.depth.length,
    stressModel: stress.info,
    coneFactors: (stress.definition?.strata ?? []).map((s, i) => ({ code: s.code, name: s.name, top: bounds[i]!.top, bottom: bounds[i]!.bottom, k: s.cptFactor ?? DEFAULT_CONE_FACTOR })),
    rows: {
      depth: Array.from(profile.depth),
      qt: wire(profile.qt, 1),
      qnet: wire(profile.qnet, 1),
      frictionRatio: wire(profile.frictionRatio, 3),
      porePressureRatio: wire(profile.porePressureRatio, 3),
      totalStress: wire(profile.totalStress, 2),
      porePressure: wire(profile.porePressure, 2),
      effectiveStress: wire(profile.effectiveStress, 2),
      preconsolidation: wire(profile.preconsolidation, 2),
      ocr: wire(profile.ocr, 3),
      ic: wire(ic, 3),
      status: Array.from(profile.status),
    },
    flaggedRows: profile.flaggedRows,
    spacing,
    // The resampled σ'p as listed elsewhere: only in strata whose "derive σ'p from CPT and vane" switch is on.
    resampled: cptResampled(stress, sounding, profile, spacing, intervals.get(point.id)).filter(derivedHere(off)),
    notDerivedIn: [...off],
    caution: RESULT_CAUTION,
  }
})
