import type { OedometerLoop, OedometerPoint, OedometerResult, SampleQuality } from '#shared/geotech/oedometer'
import type { OedometerTestType } from '#shared/investigation/types'
import type { StageConvention, TimeReading } from '#shared/lab/stages'
import type { SecondaryResult, TaylorResult } from '#shared/lab/time-curve'
import type { AdoptionMethod, PreconsolidationPoint, PreconsolidationSource } from '#shared/schemas/lab'
import { pageReader } from '~/utils/api'
import { readAllPages } from '~/utils/listPages'

/** Rows of the laboratory API as they arrive in JSON (dates as strings). */
export interface OedometerStage {
  stress: number
  entered: number
  voidRatio: number
  readings?: TimeReading[]
}

export interface OedometerTest {
  id: string
  sampleId: string
  label: string
  testType: OedometerTestType
  specimenHeight: number
  initialWaterContent: number | null
  specificGravity: number | null
  e0: number
  convention: StageConvention
  stages: OedometerStage[]
  remarks: string
  version: number
  createdAt: string
  updatedAt: string
  sample: { id: string, identifier: string, top: number, bottom: number, type: string }
  point: { id: string, identifier: string, kind: string }
  depth: number
  e0Check: { fromWaterContent: number | null, saturation: number | null }
}

export interface AdoptionRow {
  id: string
  oedometerTestId: string
  method: AdoptionMethod
  value: number
  reason: string
  deltaEOverE0: number | null
  qualityClass: string | null
  effectiveStress: number | null
  adoptedBy: string | null
  adoptedByName: string | null
  adoptedAt: string
  supersededAt: string | null
}

export interface StressModelInfo {
  source: 'draft' | 'logs'
  modelId: string | null
  modelName: string | null
  description: string
}

export interface OedometerListItem extends Omit<OedometerTest, 'stages'> {
  stageCount: number
  stratumCode: string | null
  effectiveStress: number | null
  reading: { casagrande: number | null, deltaEOverE0: number | null, qualityClass: string | null, error: string | null }
  adoption: AdoptionRow | null
}

export type MethodResult = OedometerResult & { ocr: number | null, pop: number | null }

export interface StageTimeAnalysis {
  stage: number
  stress: number
  readings: number
  drainagePath: number
  ok: boolean
  reason: string | null
  taylor: TaylorResult | null
  secondary: SecondaryResult | null
  notes: string[]
}

export interface OedometerInterpretationReply {
  test: OedometerTest
  stressModel: StressModelInfo & { depth: number, effectiveStress: number | null, totalStress: number | null, porePressure: number | null, modelStratum: string | null }
  e0: number
  cc: number
  cr: number
  recompressionBasis: 'unload-reload-loop' | 'unloading' | 'early-loading'
  virginLine: { slope: number, intercept: number, points: OedometerPoint[] }
  loading: OedometerPoint[]
  loops: OedometerLoop[]
  methods: MethodResult[]
  sampleQuality: SampleQuality | null
  timeCurves: {
    method: 'taylor-sqrt-t'
    reference: string
    stages: StageTimeAnalysis[]
    summary: { virgin: { cv: number | null, calpha: number | null, stages: number }, recompression: { cv: number | null, calpha: number | null, stages: number } }
    calphaOverCc: number | null
  }
  ccCheck: { liquidLimit: number, sampleIdentifier: string, sameSample: boolean, estimate: number, ratio: number, flagged: boolean, message: string, reference: string } | null
  warnings: string[]
  adoption: AdoptionRow | null
  history: AdoptionRow[]
  caution: string
}

/** One σ'p point as GET …/preconsolidation-points sends it. */
export type PreconsolidationPointRow = PreconsolidationPoint

export interface PreconsolidationPointsReply {
  points: PreconsolidationPointRow[]
  counts: Record<PreconsolidationSource, number>
  vaneStratumPi: Record<string, number>
  warnings: string[]
  spacing: number
  stressModel: StressModelInfo
  caution: string
}

/** A reply or the server's refusal, so a 422 from the engine is shown on the page rather than thrown. */
export type Outcome<T> = { ok: true, data: T } | { ok: false, status: number, message: string }

function statusOf(err: unknown): number {
  const e = err as { statusCode?: number, status?: number, response?: { status?: number } }
  return e?.statusCode ?? e?.status ?? e?.response?.status ?? 500
}

export function labBase(projectId: string): string {
  return `/api/projects/${projectId}/tests/oedometer`
}

/** The project's oedometer tests, every page of them (refresh by key after a write); `cut` when the list stopped at its cap. */
export function useOedometerTests(projectId: MaybeRefOrGetter<string>) {
  const read = pageReader(useRequestFetch())
  return useAsyncData(
    () => `oedometer-tests-${toValue(projectId)}`,
    async (_nuxtApp, { signal }) => {
      let stressModel: StressModelInfo | null = null
      const list = await readAllPages(read, labBase(toValue(projectId)), (r: { tests: OedometerListItem[], stressModel: StressModelInfo | null }) => {
        stressModel = r.stressModel
        return r.tests
      }, { signal })
      return { tests: list.rows, total: list.total ?? list.rows.length, cut: list.cut, stressModel }
    },
    { default: () => ({ tests: [] as OedometerListItem[], total: 0, cut: false, stressModel: null as StressModelInfo | null }) },
  )
}

/** One test and its interpretation; the interpretation may be refused (422 for a curve with no yield). */
export function useOedometerInterpretation(projectId: MaybeRefOrGetter<string>, testId: MaybeRefOrGetter<string>) {
  const fetcher = useRequestFetch()
  const url = () => `${labBase(toValue(projectId))}/${toValue(testId)}`
  const test = useAsyncData(
    () => `oedometer-test-${toValue(testId)}`,
    async (): Promise<Outcome<{ test: OedometerTest, adoption: AdoptionRow | null }>> => {
      try {
        return { ok: true, data: await api<{ test: OedometerTest, adoption: AdoptionRow | null }>(url(), undefined, fetcher) }
      }
      catch (err) {
        return { ok: false, status: statusOf(err), message: apiErrorMessage(err) }
      }
    },
    { default: () => null },
  )
  const interpretation = useAsyncData(
    () => `oedometer-interpretation-${toValue(testId)}`,
    async (): Promise<Outcome<OedometerInterpretationReply>> => {
      try {
        return { ok: true, data: await api<OedometerInterpretationReply>(`${url()}/interpretation`, undefined, fetcher) }
      }
      catch (err) {
        return { ok: false, status: statusOf(err), message: apiErrorMessage(err) }
      }
    },
    { default: () => null },
  )
  const history = useAsyncData(
    () => `oedometer-adoptions-${toValue(testId)}`,
    async (): Promise<AdoptionRow[]> => {
      try {
        return (await api<{ history: AdoptionRow[] }>(`${url()}/adoptions`, undefined, fetcher)).history
      }
      catch {
        return []
      }
    },
    { default: () => [] as AdoptionRow[] },
  )
  async function refreshAll() {
    await Promise.all([test.refresh(), interpretation.refresh(), history.refresh()])
  }
  return { test, interpretation, history, refreshAll }
}

/** Every σ'p point of the project from all sources. */
export function usePreconsolidationList(projectId: MaybeRefOrGetter<string>) {
  return useApi<PreconsolidationPointsReply | null>(
    () => `preconsolidation-points-${toValue(projectId)}`,
    () => `/api/projects/${toValue(projectId)}/preconsolidation-points`,
    () => null,
  )
}
