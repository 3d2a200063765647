import { GroundwaterInputSchema } from '#shared/schemas/investigation'

export default pointRowCreateHandler('groundwater', 'logs.write', GroundwaterInputSchema)
