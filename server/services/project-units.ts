import { eq } from 'drizzle-orm'
import type { IntervalWords } from '#shared/investigation/intervals'
import { convert } from '#shared/units'
import { useDb } from '~~/server/db/client'
import { projects } from '~~/server/db/schema'

type Db = Pick<ReturnType<typeof useDb>, 'select'>

/**
 * How a server message writes a depth in the project's units: "12 m" on an SI project (the number as stored),
 * "39.37 ft" on a US one; `intervals` is the same for the log's interval checks.
 */
export async function projectDepthWords(projectId: string, db: Db = useDb()): Promise<{ depth: (metres: number) => string, intervals: IntervalWords }> {
  const [row] = await db.select({ unitSystem: projects.unitSystem }).from(projects).where(eq(projects.id, projectId)).limit(1)
  if (row?.unitSystem !== 'US') return { depth: m => `${m} m`, intervals: {} }
  const number = (m: number) => convert(m, 'length', 'SI', 'US').toFixed(2)
  return { depth: m => `${number(m)} ft`, intervals: { number, unit: 'ft' } }
}
