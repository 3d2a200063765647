/**
 * A sounding's behaviour index Ic per reading, through the stress model in force (the CPT
 * interpretation route); null without a sounding or when the stresses are not there yet.
 */
export function useCptBehaviour(projectId: MaybeRefOrGetter<string>, pointId: MaybeRefOrGetter<string>, hasSounding: MaybeRefOrGetter<boolean>) {
  return useAsyncData<{ depth: number[], ic: (number | null)[] } | null>(
    () => `cpt-ic-${toValue(projectId)}-${toValue(pointId)}`,
    async () => {
      if (!toValue(hasSounding)) return null
      const r = await api<{ rows: { depth: number[], ic: (number | null)[] } }>(`/api/projects/${toValue(projectId)}/points/${toValue(pointId)}/cpt/interpretation`)
      return r.rows.ic.some(v => v !== null) ? { depth: r.rows.depth, ic: r.rows.ic } : null
    },
    { server: false, default: () => null, watch: [() => toValue(hasSounding)] },
  )
}
