import type { AdoptionHistoryReply, OedometerInterpretationReply, OedometerListItem, OedometerTestReply, PreconsolidationPointsReply, StressModelInfo } from '#shared/types/lab'
import { pageReader } from '~/utils/api'
import { readAllPages } from '~/utils/listPages'

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
        return { ok: true, data: await api<OedometerTestReply>(url(), undefined, fetcher) }
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
        return (await api<AdoptionHistoryReply>(`${url()}/adoptions`, undefined, fetcher)).history
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
