import type { AdoptionHistoryReply, AdoptionRow, OedometerInterpretationReply, OedometerListItem, OedometerTestReply, PreconsolidationPointsReply, StressModelInfo } from '#shared/types/lab'

/** A reply or the server's refusal, so a 422 from the engine is shown on the page rather than thrown. */
export type Outcome<T> = { ok: true, data: T } | { ok: false, status: number, message: string }

function statusOf(err: unknown): number {
  const e = err as { statusCode?: number, status?: number, response?: { status?: number } }
  return e?.statusCode ?? e?.status ?? e?.response?.status ?? 500
}

export function labBase(projectId: string): string {
  return `/api/projects/${projectId}/tests/oedometer`
}

/** The project's oedometer tests (refresh by key after a write). */
export function useOedometerTests(projectId: MaybeRefOrGetter<string>) {
  return useApi<{ tests: OedometerListItem[], total: number, stressModel: StressModelInfo | null }>(
    () => `oedometer-tests-${toValue(projectId)}`,
    () => `${labBase(toValue(projectId))}?limit=500`,
    () => ({ tests: [], total: 0, stressModel: null }),
  )
}

/** One test and its interpretation; the interpretation may be refused (422 for a curve with no yield). */
export function useOedometerInterpretation(projectId: MaybeRefOrGetter<string>, testId: MaybeRefOrGetter<string>) {
  const fetcher = useRequestFetch() as unknown as (url: string) => Promise<unknown>
  const url = () => `${labBase(toValue(projectId))}/${toValue(testId)}`
  const test = useAsyncData(
    () => `oedometer-test-${toValue(testId)}`,
    async (): Promise<Outcome<OedometerTestReply>> => {
      try {
        return { ok: true, data: await fetcher(url()) as OedometerTestReply }
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
        return { ok: true, data: await fetcher(`${url()}/interpretation`) as OedometerInterpretationReply }
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
        return ((await fetcher(`${url()}/adoptions`)) as AdoptionHistoryReply).history
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
