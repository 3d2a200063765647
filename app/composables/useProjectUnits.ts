/**
 * The open project's units (SI or US, and psf or tsf for US stresses) for every page under
 * /projects/:projectId: `format(v, 'length')`, `heading('Depth', 'length')`, `read(typed, 'stress')`…
 * Reads the project the parent page already loaded (`useProject()`), so it costs no request.
 */
export function useProjectUnits() {
  const { data } = useProject()
  return useModelUnits(() => data.value?.project.unitSystem, () => data.value?.project.usStressUnit)
}
