import { databaseReady } from '../utils/ready'

// Hold requests until migrations have run (see server/utils/ready.ts).
export default defineEventHandler(async () => {
  await databaseReady
})
