import { SptUpdateSchema } from '#shared/schemas/investigation'

export default pointRowUpdateHandler('spt', 'logs.write', SptUpdateSchema, values => ({ ...values, n: values.blows[1] + values.blows[2] }))
