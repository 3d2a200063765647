import { SptUpdateSchema } from '#shared/schemas/investigation'
import { sptValues } from '~~/server/services/spt'

export default pointRowUpdateHandler('spt', 'logs.write', SptUpdateSchema, sptValues)
