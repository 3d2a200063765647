import { OedometerTestInputSchema } from '#shared/schemas/lab'
import { oedometerTests } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { prepareSpecimen, requireProjectSample, testJson } from '~~/server/services/lab'

/** A new oedometer test on a sample of the project; stages converted to void ratios from the chosen convention. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const body = await validateBody(event, OedometerTestInputSchema)
  const prepared = prepareSpecimen(body)
  const created = await useDb().transaction(async (tx) => {
    const { sample, point } = await requireProjectSample(project.id, body.sampleId, tx)
    const [test] = await tx.insert(oedometerTests).values({
      sampleId: sample.id,
      label: body.label,
      testType: body.testType,
      specimenHeight: body.specimenHeight,
      initialWaterContent: body.initialWaterContent,
      specificGravity: body.specificGravity,
      e0: prepared.e0,
      convention: body.convention,
      stages: prepared.stages,
      remarks: body.remarks,
    }).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'oedometer-test', entityId: test!.id, after: test }, tx)
    return { test: test!, sample, point }
  })
  setResponseStatus(event, 201)
  return { test: testJson(created), e0Computed: prepared.e0Computed, notes: prepared.notes }
})
