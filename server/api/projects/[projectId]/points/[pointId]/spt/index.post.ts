import { SptInputSchema } from '#shared/schemas/investigation'

export default pointRowCreateHandler('spt', 'logs.write', SptInputSchema, body => ({ ...body, n: body.blows[1] + body.blows[2] }))
