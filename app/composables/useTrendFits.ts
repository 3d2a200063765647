import { toRaw } from 'vue'
import { trendFromFit } from '#shared/site-model/definition-plain'
import type { SiteModelDefinition, StratumTrend } from '#shared/site-model/definition'
import { setTrend } from '~/utils/siteModelEdits'
import {
  assignBands, fitInput, reviewerExcluded, stressAt, trendStaleness,
  type DisplayFitState, type PointFlag,
} from '~/utils/stressHistory'
import { stratumTrendProblems, unacceptedProblems, type TrendProblem } from '#shared/site-model/trend-checks'
import type { ProfilePoint, TrendFitReply } from '#shared/types/calc'
import type { PreconsolidationPointRow } from '#shared/types/lab'
import type { EditorSnapshot, FitChoiceState } from '~/stores/modelEditor'
import { TREND_MODEL_LABELS } from '#shared/site-model/trend-words'
import { untilReady, type Readiness } from '~/utils/untilReady'

export type FitChoice = StratumTrend['model'] | 'auto'

export const FIT_LABELS: Record<FitChoice, string> = { auto: 'Best by AICc (auto)', ...TREND_MODEL_LABELS }

/** How the workspace writes into the session (null when read-only). */
export interface WorkspaceEditor {
  edit: (label: string, fn: (d: SiteModelDefinition, pending: Record<string, string[]>) => SiteModelDefinition | EditorSnapshot, opts?: { gesture?: string }) => boolean
  startGesture: () => string
  pendingExcluded: () => Record<string, string[]>
  /** The session's definition right now (props follow it only at the next render). */
  current: () => SiteModelDefinition
  /** The model chosen for a stratum's next fit (by code), if the engineer chose one. */
  fitChoice: (code: string) => FitChoiceState | undefined
  setFitChoice: (code: string, state: FitChoiceState) => void
}

/** A band's fit: what it was asked with (to know when it no longer matches the draft), its answer or error. */
export interface BandFit extends DisplayFitState {
  answer: TrendFitReply | null
  error: string | null
}

/**
 * σ'p trend fits per band through POST /api/calc/trend-fit: the fits the engineer
 * asks for (written into the draft's trend with the ids fitted and left out), and
 * a display fit of each saved trend against today's points and σ'v0, for its 95 %
 * band and to tell when the saved trend has gone stale.
 */
export function useTrendFits(args: {
  definition: () => SiteModelDefinition
  profile: () => readonly ProfilePoint[]
  points: () => readonly PreconsolidationPointRow[]
  flags: () => ReadonlyMap<string, readonly PointFlag[]>
  editor: () => WorkspaceEditor | null
  /**
   * Whether σ'v0 and the points on screen are those of the definition's stresses now (`true`), are still
   * being worked out after an edit (`false`), or cannot be (the reason). CPT and vane σ'p follow the stresses.
   */
  inputsReady: () => Readiness
}) {
  // While editing, read the session itself: an edit followed at once by a fit must see the edit.
  const definition = () => args.editor()?.current() ?? args.definition()
  const bands = computed(() => assignBands(args.points(), args.definition()))
  const flaggedOut = computed(() => reviewerExcluded(args.flags()))
  const pending = () => args.editor()?.pendingExcluded() ?? {}
  const fits = shallowRef<Record<number, BandFit>>({})
  const fitError = ref<{ band: number, message: string } | null>(null)

  function inputOf(i: number) {
    const def = definition()
    return fitInput(i, def, args.points(), def === args.definition() ? bands.value : assignBands(args.points(), def), pending(), flaggedOut.value, args.profile())
  }

  function requestKey(i: number, model: string, logSpace: boolean, inp: ReturnType<typeof inputOf>) {
    // σ'v0 and σ'p to 0.1 kPa: a change smaller than that does not move a fit.
    return `${i}|${model}|${logSpace}|${inp.included.map(p => `${p.id}@${Math.round(p.effectiveStress! * 10)}/${Math.round(p.preconsolidation * 10)}`).join(',')}`
  }

  async function ask(i: number, model: FitChoice, logSpace: boolean): Promise<{ answer: TrendFitReply, included: string[], excluded: string[] }> {
    // A fit asked just after an edit of the stresses waits for that edit's σ'v0 and σ'p: one of the edit before would be saved as the trend.
    await untilReady(args.inputsReady, 20_000, 'σ\'v0 and σ\'p for the latest edit have not arrived yet. Fit again in a moment.')
    const inp = inputOf(i)
    if (!inp.included.length) throw new Error('No points left to fit in this stratum.')
    const answer = await api<TrendFitReply>('/api/calc/trend-fit', {
      method: 'POST',
      body: {
        model,
        logSpace,
        points: inp.included.map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: p.effectiveStress! })),
      },
    })
    fits.value = { ...fits.value, [i]: { key: requestKey(i, answer.model, logSpace, inp), answer, error: null, pending: false } }
    return { answer, included: inp.included.map(p => p.id), excluded: inp.excludedIds }
  }

  /** Fits band `i` and writes the trend (the pending exclusions of its stratum move into it). */
  async function fitBand(i: number, model: FitChoice, logSpace: boolean, gesture?: string): Promise<TrendFitReply | null> {
    const editor = args.editor()
    const s = definition().strata[i]
    if (!editor || !s) return null
    fitError.value = null
    try {
      const { answer, included, excluded } = await ask(i, model, logSpace)
      const code = s.code
      editor.edit(`Fit ${code}: ${FIT_LABELS[answer.model]}`, (d, p) => {
        const next = { ...p }
        delete next[code]
        return { draft: setTrend(d, i, trendFromFit(answer, logSpace, included, excluded)), pendingExcluded: next }
      }, { gesture })
      return answer
    }
    catch (err) {
      fitError.value = { band: i, message: apiErrorMessage(err) }
      return null
    }
  }

  /**
   * Leaves points out of (or takes them back into) their bands' fits. Reviewer
   * exclusions stay out whatever is asked. A band with a fitted trend is refitted
   * with its model, in the same undo step.
   */
  async function setExcluded(ids: readonly string[], exclude: boolean) {
    const editor = args.editor()
    if (!editor || !ids.length) return
    const def = definition()
    const pts = args.points()
    const byBand = new Map<number, string[]>()
    const index = new Map(pts.map((p, k) => [p.id, k]))
    for (const id of ids) {
      const k = index.get(id)
      if (k === undefined) continue
      const b = bands.value[k]!
      if (b < 0 || flaggedOut.value.has(id)) continue
      byBand.set(b, [...(byBand.get(b) ?? []), id])
    }
    if (!byBand.size) return
    const g = editor.startGesture()
    const n = [...byBand.values()].reduce((a, l) => a + l.length, 0)
    editor.edit(`${exclude ? 'Leave out' : 'Take back'} ${n} point${n === 1 ? '' : 's'}`, (d, pend) => {
      const out = structuredClone(toRaw(d))
      const pendOut = { ...pend }
      for (const [b, list] of byBand) {
        const s = out.strata[b]
        if (!s) continue
        const current = new Set(s.trend ? s.trend.excludedPointIds : pendOut[s.code] ?? [])
        for (const id of list) {
          if (exclude) current.add(id)
          else current.delete(id)
        }
        if (s.trend) {
          s.trend.excludedPointIds = [...current]
          const gone = new Set(current)
          const all = pts.filter((_p, k) => bands.value[k] === b).map(p => p.id)
          s.trend.includedPointIds = all.filter(id => !gone.has(id) && !flaggedOut.value.has(id))
          if (s.trend.manual) s.trend.n = s.trend.includedPointIds.length
        }
        else {
          pendOut[s.code] = [...current]
        }
      }
      return { draft: out, pendingExcluded: pendOut }
    }, { gesture: g })
    for (const b of byBand.keys()) {
      const t = def.strata[b]?.trend
      if (t && !t.manual) await fitBand(b, t.model, t.logSpace, g)
    }
  }

  /**
   * Display fits of the saved trends, asked again when their points or σ'v0 change.
   * Each band's answer lands only while its request key is still the band's (a
   * newer ask of the same band replaces it), so no fit is aborted half-way.
   */
  const displayFits = useLatestRequest(async () => {
    const def = args.definition()
    // Fitted to a mix of one edit's σ'v0 and another's σ'p, a saved trend would read as stale for a moment.
    if (!args.profile().length || !args.points().length || args.inputsReady() !== true) return
    const jobs: Promise<{ i: number, key: string, fit: BandFit }>[] = []
    const asked: Record<number, BandFit> = {}
    def.strata.forEach((s, i) => {
      const t = s.trend
      if (!t || t.manual) return
      const inp = inputOf(i)
      const key = requestKey(i, t.model, t.logSpace, inp)
      if (fits.value[i]?.key === key || !inp.included.length) return
      asked[i] = { key, answer: fits.value[i]?.answer ?? null, error: null, pending: true }
      jobs.push(api<TrendFitReply>('/api/calc/trend-fit', {
        method: 'POST',
        body: { model: t.model, logSpace: t.logSpace, points: inp.included.map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: p.effectiveStress! })) },
      }).then(
        answer => ({ i, key, fit: { key, answer, error: null, pending: false } }),
        (err: unknown) => ({ i, key, fit: { key, answer: null, error: apiErrorMessage(err), pending: false } }),
      ))
    })
    if (!jobs.length) return
    fits.value = { ...fits.value, ...asked }
    // The bands' answers land together: one change of the fits (one redraw of the tracks and panels), not one per band.
    // Each lands only while its request key is still the band's (a newer ask of the same band replaces it).
    const done = await Promise.all(jobs)
    const next = { ...fits.value }
    let changed = false
    for (const { i, key, fit } of done) {
      if (next[i]?.key !== key) continue
      next[i] = fit
      changed = true
    }
    if (changed) fits.value = next
  }, 250)
  function refreshDisplayFits() {
    displayFits.schedule()
  }

  /** Whether a band's saved trend no longer matches its points (ids or σ'v0) — the engineer should refit. */
  function stale(i: number): { ids: boolean, parameters: boolean } {
    const s = args.definition().strata[i]
    const t = s?.trend
    // Before the points (or the profile) arrive nothing can be compared.
    if (!t || t.manual || !args.points().length || !args.profile().length) return { ids: false, parameters: false }
    const inp = inputOf(i)
    // The parameters are compared only once σ'v0 and σ'p are both of the stresses on screen.
    const fit = args.inputsReady() === true ? fits.value[i] : undefined
    return trendStaleness(t, inp.included.map(p => p.id), fit, requestKey(i, t.model, t.logSpace, inp))
  }

  /**
   * Each band's trend problems against the profile on screen (R² < 0, σ'p below σ'v0 or at
   * or below 0), and those its reason does not cover yet: a version is not saved with those.
   */
  const problems = computed((): { all: TrendProblem[], open: TrendProblem[] }[] => {
    const def = args.definition()
    const prof = args.profile()
    return def.strata.map((s, i) => {
      if (!prof.length || !s.trend || s.trend.manual) return { all: [], open: [] }
      try {
        const all = stratumTrendProblems(def, i, z => stressAt(prof, z)?.effectiveStress ?? Number.NaN)
        return { all, open: unacceptedProblems(s, all) }
      }
      catch {
        // A trend missing a parameter cannot be evaluated; the fit panel shows the fit's own error.
        return { all: [], open: [] }
      }
    })
  })

  return { bands, flaggedOut, fits, fitError, inputsReady: args.inputsReady, inputOf, fitBand, setExcluded, refreshDisplayFits, stale, problems }
}

export type TrendFits = ReturnType<typeof useTrendFits>
