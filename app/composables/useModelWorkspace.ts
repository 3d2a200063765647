import type { ComputedRef, InjectionKey, Ref, ShallowRef } from 'vue'
import type * as d3 from 'd3'
import { stratumBounds } from '#shared/site-model/definition-plain'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { StratumRow } from '#shared/types/investigation'
import type { DenseLayer } from '~/composables/usePreconsolidationPoints'
import type { ReferenceHole, UnitWeightReading, WaterReading } from '#shared/investigation/reference'
import type { ProfileError } from '~/composables/useStressProfile'
import type { TrendFits, WorkspaceEditor } from '~/composables/useTrendFits'
import type { ModelUnits } from '~/composables/useModelUnits'
import type { FlaggedTest, PointFlag } from '~/utils/stressHistory'
import type { ProfilePoint } from '#shared/types/calc'
import type { CptBehaviourTrace, PreconsolidationPointRow } from '#shared/types/lab'

/** The plotting band of the drawing (px from its top) that every track and the depth scale share. */
export const MODEL_PLOT = { top: 44, bottom: 604 } as const

/** Where a track sits in the drawing, px. */
export interface TrackFrame { x: number, width: number }

export type CanvasTool = 'pan' | 'lasso' | 'flag'

/** What the tracks of one workspace share: the definition, the depth scale, data, selection and the way to edit. */
export interface ModelWorkspace {
  definition: ComputedRef<SiteModelDefinition>
  readOnly: ComputedRef<boolean>
  editor: ComputedRef<WorkspaceEditor | null>
  units: ModelUnits
  y: ComputedRef<d3.ScaleLinear<number, number>>
  /** The plotting band (top and bottom, px) all tracks share. */
  plot: ComputedRef<{ top: number, bottom: number }>
  profile: ShallowRef<ProfilePoint[]>
  profileError: Ref<ProfileError | null>
  profileWarnings: Ref<string[]>
  strata: ComputedRef<StratumRow[]>
  points: ShallowRef<PreconsolidationPointRow[]>
  flags: ShallowRef<Map<string, PointFlag[]>>
  /** Flagged oedometer tests with no adopted σ'p: marked at their depth, never fitted. */
  flaggedTests: ShallowRef<FlaggedTest[]>
  dense: ShallowRef<DenseLayer>
  /** Each CPT's behaviour index Ic through the same stresses, for the guide beside the strata. */
  behaviour?: ShallowRef<CptBehaviourTrace[]>
  fits: TrendFits
  holes: ComputedRef<ReferenceHole[]>
  unitWeights: ComputedRef<UnitWeightReading[]>
  water: ComputedRef<WaterReading[]>
  /** Holes whose logged boundaries are shown (ids), and whether a dragged break snaps to them. */
  boundaryHoles: Ref<string[]>
  snap: Ref<boolean>
  /** Date range of the groundwater reference marks (ISO dates, '' for open). */
  waterFrom: Ref<string>
  waterTo: Ref<string>
  selectedBand: Ref<number>
  selectedPiezometer: Ref<number | null>
  selectedKnot: Ref<number | null>
  tool: Ref<CanvasTool>
  /** Whether the caller may raise review flags (the Flag tool: a click on a σ'p point opens the flag form). */
  canFlag: ComputedRef<boolean>
  flagPoint: (point: PreconsolidationPointRow) => void
  lassoExcludes: Ref<boolean>
  /** A readout for screen readers and tests, e.g. after a drag. */
  announce: (text: string) => void
}

const KEY: InjectionKey<ModelWorkspace> = Symbol('model-workspace')

export function provideModelWorkspace(ws: ModelWorkspace) {
  provide(KEY, ws)
}

export function useModelWorkspace(): ModelWorkspace {
  const ws = inject(KEY, null)
  if (!ws) throw new Error('A model track must sit inside a ModelWorkspace.')
  return ws
}

/** Water readings inside the chosen date range. */
export function filterWater(list: readonly WaterReading[], from: string, to: string): WaterReading[] {
  return list.filter((w) => {
    const day = w.observedAt.slice(0, 10)
    return (!from || day >= from) && (!to || day <= to)
  })
}

/**
 * What most tracks and panels read of the workspace: the definition shown, its
 * bands' depth bounds, and whether the caller may edit it (a draft, not read-only).
 */
export function useModelDefinition() {
  const ws = useModelWorkspace()
  const def = computed(() => ws.definition.value)
  const bounds = computed(() => stratumBounds(def.value))
  const editable = computed(() => !ws.readOnly.value && !!ws.editor.value)
  return { ws, def, bounds, editable }
}
