import type { UnitSystem } from '#shared/units'
import { useSettlementDraftStore } from '../stores/settlementDraft'

/** What the run editor gives each part of the draft: the project's unit system, the draft's issues by path, and whether it is only shown. */
export interface RunDraftPartProps {
  system: UnitSystem
  issues: Record<string, string>
  readonly?: boolean
}

/** A part of the run editor: the draft's store and the units it shows values in (psf or tsf as the project chose). */
export function useRunDraftPart(props: { system: UnitSystem }) {
  return { store: useSettlementDraftStore(), units: useModelUnits(() => props.system, useProjectUnits().stressUnit) }
}
