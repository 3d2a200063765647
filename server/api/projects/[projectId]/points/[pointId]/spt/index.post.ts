import { SptInputSchema } from '#shared/schemas/investigation'
import { sptValues } from '~~/server/services/spt'

export default pointRowCreateHandler('spt', 'logs.write', SptInputSchema, sptValues)
