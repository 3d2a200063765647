import { eq } from 'drizzle-orm'
import type { IntervalWords } from '#shared/investigation/intervals'
import { convert, formatQuantity, type UnitSystem, type UsStressUnit } from '#shared/units'
import { useDb } from '~~/server/db/client'
import { projects } from '~~/server/db/schema'

type Db = Pick<ReturnType<typeof useDb>, 'select'>

/** How server messages write numbers in a project's units (the one path every service uses). */
export interface ProjectWords {
  /** A depth: "12 m" on an SI project (the number as stored), "39.37 ft" on a US one. */
  depth: (metres: number) => string
  /** The same for the log's interval checks and the import log rules (`checkIntervals`, `depthPhrases`). */
  intervals: IntervalWords
  /** A stress: "120.0 kPa", "2506 psf" or "1.25 tsf" as the project chose (`formatQuantity`). */
  stress: (kPa: number) => string
}

/** The words of a unit system (pure: for a project read elsewhere, and for tests). */
export function unitWords(system: UnitSystem, usStress: UsStressUnit = 'psf'): ProjectWords {
  const stress = (kPa: number) => formatQuantity(kPa, 'stress', system, { usStress })
  if (system !== 'US') return { depth: m => `${m} m`, intervals: {}, stress }
  const number = (m: number) => convert(m, 'length', 'SI', 'US').toFixed(2)
  return { depth: m => `${number(m)} ft`, intervals: { number, unit: 'ft' }, stress }
}

/** The words of the project's units for its server messages. */
export async function projectDepthWords(projectId: string, db: Db = useDb()): Promise<ProjectWords> {
  const [row] = await db.select({ unitSystem: projects.unitSystem, usStressUnit: projects.usStressUnit }).from(projects).where(eq(projects.id, projectId)).limit(1)
  return unitWords(row?.unitSystem ?? 'SI', row?.usStressUnit ?? 'psf')
}
