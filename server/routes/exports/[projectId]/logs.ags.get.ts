import { investigationToAgs } from '#shared/ags4/investigation'
import { exportName, loadInvestigationRecord } from '~~/server/services/exports/logs'

/** The project's investigation as an AGS4 transfer file, in the project's units (its UNIT row says which). */
export default defineEventHandler(async (event) => {
  const { project, user } = await requireProjectRole(event, 'export.read')
  const text = investigationToAgs(await loadInvestigationRecord(project), { producer: `Pastload (${user.displayName})`, description: `${project.jobNumber} ${project.name}: investigation data exported from Pastload`, units: { system: project.unitSystem, usStress: project.usStressUnit } })
  setResponseHeaders(event, {
    'content-type': 'text/plain; charset=utf-8',
    'content-disposition': `attachment; filename="${exportName(project, 'investigation', 'ags')}"`,
    'cache-control': 'no-store',
  })
  return text
})
