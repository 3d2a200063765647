import { OedometerTestInputSchema } from '#shared/schemas/lab'
import { createTest } from '~~/server/services/oedometer-tests'

/** A new oedometer test on a sample of the project; stages converted to void ratios from the chosen convention. */
export default projectCreateHandler('tests.write', OedometerTestInputSchema, createTest)
