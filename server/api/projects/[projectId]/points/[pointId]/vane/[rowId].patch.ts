import { VaneUpdateSchema } from '#shared/schemas/investigation'

export default pointRowUpdateHandler('vane', 'tests.write', VaneUpdateSchema)
