import { VaneInputSchema } from '#shared/schemas/investigation'

export default pointRowCreateHandler('vane', 'tests.write', VaneInputSchema)
