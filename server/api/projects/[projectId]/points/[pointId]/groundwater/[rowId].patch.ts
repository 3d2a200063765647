import { GroundwaterUpdateSchema } from '#shared/schemas/investigation'

export default pointRowUpdateHandler('groundwater', 'logs.write', GroundwaterUpdateSchema)
