export default defineEventHandler(async (event) => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  return { project, role }
})
