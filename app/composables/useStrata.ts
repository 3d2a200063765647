import type { StratumInput } from '#shared/schemas/investigation'
import type { StratumRow, StrataReply } from '#shared/types/investigation'

/** The project's strata in display order, with the writes the strata editor needs. */
export function useStrata(projectId: MaybeRefOrGetter<string>) {
  const base = () => `/api/projects/${toValue(projectId)}/strata`
  const res = useApi<StrataReply>(() => `strata-${toValue(projectId)}`, base, () => ({ strata: [], cptDerivation: [] }))

  async function create(input: StratumInput): Promise<StratumRow> {
    const { stratum } = await api<{ stratum: StratumRow }>(base(), { method: 'POST', body: input })
    await res.refresh()
    return stratum
  }

  /** Sends only the changed fields with the version read; 409 when someone else saved first. */
  async function send(row: StratumRow, patch: Partial<StratumInput>): Promise<StratumRow> {
    const { stratum } = await api<{ stratum: StratumRow }>(`${base()}/${row.id}`, { method: 'PATCH', body: { ...patch, version: row.version } })
    return stratum
  }

  /** `send`, then the list read again, so every user of the list sees the edit. */
  async function update(row: StratumRow, patch: Partial<StratumInput>): Promise<StratumRow> {
    const stratum = await send(row, patch)
    await res.refresh()
    return stratum
  }

  /** "Derive σ'p from CPT and vane" in a stratum: true or false, or null to follow its logged symbols. */
  async function setCptDerivation(row: StratumRow, cptDerivation: boolean | null): Promise<StratumRow> {
    const { stratum } = await api<{ stratum: StratumRow }>(`${base()}/${row.id}/cpt-derivation`, { method: 'PUT', body: { cptDerivation, version: row.version } })
    await res.refresh()
    return stratum
  }

  async function remove(row: StratumRow): Promise<void> {
    await api(`${base()}/${row.id}`, { method: 'DELETE' })
    await res.refresh()
  }

  /**
   * Moves a stratum one place up or down. Orders are renumbered in steps of 10 so that equal
   * orders (the default 0) still sort as shown; only rows whose order changes are sent.
   */
  async function move(row: StratumRow, direction: -1 | 1): Promise<void> {
    const list = [...res.data.value.strata]
    const from = list.findIndex(s => s.id === row.id)
    const to = from + direction
    if (from < 0 || to < 0 || to >= list.length) return
    const [moved] = list.splice(from, 1)
    list.splice(to, 0, moved!)
    try {
      for (const [i, s] of list.entries()) {
        const order = (i + 1) * 10
        if (s.displayOrder !== order) await send(s, { displayOrder: order })
      }
    }
    finally {
      await res.refresh()
    }
  }

  return { ...res, create, update, remove, move, setCptDerivation }
}
