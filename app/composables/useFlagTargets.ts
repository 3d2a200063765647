import type { FlagTarget } from '#shared/review/flags'
import type { OedometerListItem, PreconsolidationPointRow } from '#shared/types/lab'
import type { PointListItem } from '#shared/types/investigation'
import type { ReviewFlag } from '#shared/types/review'
import { pageReader } from '~/utils/api'
import { cutNote, readAllPages } from '~/utils/listPages'

/** What a flag is about, in words, and where that record lives. */
export interface FlagTargetInfo {
  text: string
  detail: string
  to: string | null
}

export function flagTargetKey(type: FlagTarget, id: string): string {
  return `${type}|${id}`
}

function clip(text: string, n = 110): string {
  const t = text.trim()
  return t.length > n ? `${t.slice(0, n - 1)}…` : t
}

/**
 * Describes flagged records for the review list ("Log interval · BH-02 3.25–6.90 m")
 * with a link to their page. It reads only the sources the flags need (lab tests,
 * σ'p points, the points list), once each, in the browser — a flagged interval
 * comes with its hole from the flag list itself; the lab lists are also what the reviewer picks new targets from.
 */
export function useFlagTargets(projectId: MaybeRefOrGetter<string>, flags: Readonly<Ref<readonly ReviewFlag[]>>) {
  // Depths and stresses in the project's units ("BH-02 10.66–22.64 ft", "σ'p 1,250 psf").
  const units = useProjectUnits()
  const stress = (v: number) => units.format(v, 'stress', Math.abs(units.show(v, 'stress')) >= 10 ? 0 : undefined)
  const depth = (v: number) => units.format(v, 'length')
  const info = shallowRef(new Map<string, FlagTargetInfo>())
  const describing = ref(false)
  const tests = shallowRef<OedometerListItem[] | null>(null)
  const sigma = shallowRef<PreconsolidationPointRow[] | null>(null)
  /** Said when the tests list stopped at its cap (a test past it reads as no longer in the project). */
  const testsNote = ref('')
  let points: PointListItem[] | null = null

  const base = () => `/api/projects/${toValue(projectId)}`

  async function loadTests() {
    if (!tests.value) {
      const list = await readAllPages(pageReader(), `${base()}/tests/oedometer`, (r: { tests: OedometerListItem[] }) => r.tests)
      testsNote.value = cutNote(list, 'oedometer tests')
      tests.value = list.rows
    }
    return tests.value
  }
  async function loadSigma() {
    sigma.value ??= (await api<{ points: PreconsolidationPointRow[] }>(`${base()}/preconsolidation-points`)).points
    return sigma.value
  }
  async function loadPoints() {
    points ??= (await readAllPages(pageReader(), `${base()}/points`, (r: { points: PointListItem[] }) => r.points)).rows
    return points
  }
  function describe(f: ReviewFlag): FlagTargetInfo {
    const pid = toValue(projectId)
    const dataPage = `/projects/${pid}/preconsolidation`
    if (f.targetType === 'log-interval') {
      const iv = f.interval
      if (!iv) return { text: 'Log interval · no longer in the log', detail: 'The interval was changed or removed after it was flagged.', to: null }
      return {
        text: `Log interval · ${iv.pointIdentifier} ${units.number(iv.top, 'length')}–${depth(iv.bottom)}`,
        detail: clip([iv.uscs, iv.description].filter(Boolean).join(' · ')),
        to: `/projects/${pid}/points/${iv.pointId}`,
      }
    }
    if (f.targetType === 'oedometer-test') {
      const t = tests.value?.find(x => x.id === f.targetId)
      if (!t) return { text: 'Oedometer test · no longer in the project', detail: '', to: null }
      const quality = t.reading.qualityClass ? `${qualityLabel(t.reading.qualityClass)} sample quality` : 'Sample quality not assessed'
      return {
        text: `Oedometer test ${t.label} · ${t.point.identifier} ${depth(t.depth)}`,
        detail: `Sample ${t.sample.identifier} · ${quality} · ${t.adoption ? `σ'p ${stress(t.adoption.value)} adopted` : 'no σ\'p adopted'}`,
        to: `/projects/${pid}/tests/oedometer/${t.id}`,
      }
    }
    const p = sigma.value?.find(x => x.id === f.targetId)
    if (f.targetType === 'preconsolidation-point') {
      if (!p) return { text: 'σ\'p point · an adoption since replaced', detail: 'The engineer adopted another value for this test after the flag was raised.', to: dataPage }
      return {
        text: `σ'p point · ${p.pointIdentifier} ${depth(p.depth)} · ${pointMethodLabel(p.method)} ${stress(p.preconsolidation)}`,
        detail: [p.stratumCode ? `Stratum ${p.stratumCode}` : '', p.qualityClass ? `${qualityLabel(p.qualityClass)} sample quality` : ''].filter(Boolean).join(' · '),
        to: dataPage,
      }
    }
    if (f.targetType === 'cpt-point') {
      if (p) return { text: `CPT σ'p · ${p.pointIdentifier} ${depth(p.depth)} · ${stress(p.preconsolidation)}`, detail: p.stratumCode ? `Stratum ${p.stratumCode} · k·qnet` : 'k·qnet', to: dataPage }
      const m = /^cpt:([0-9a-f-]{36}):(\d+)$/i.exec(f.targetId)
      const point = m ? points?.find(x => x.id === m[1]) : undefined
      return { text: `CPT σ'p · ${point?.identifier ?? 'a sounding'} ${m ? depth(Number(m[2]) / 1000) : ''}`.trim(), detail: 'Not among the current resampled points (the spacing or the sounding changed).', to: point ? `/projects/${pid}/points/${point.id}` : dataPage }
    }
    if (p) return { text: `Field vane σ'p · ${p.pointIdentifier} ${depth(p.depth)} · ${stress(p.preconsolidation)}`, detail: pointMethodLabel(p.method), to: dataPage }
    return { text: 'Field vane σ\'p · reading no longer recorded', detail: '', to: null }
  }

  async function resolve() {
    if (import.meta.server) return
    const list = flags.value
    if (!list.length) {
      info.value = new Map()
      return
    }
    describing.value = true
    try {
      const types = new Set(list.map(f => f.targetType))
      await Promise.all([
        types.has('oedometer-test') ? loadTests() : null,
        types.has('preconsolidation-point') || types.has('cpt-point') || types.has('vane-reading') ? loadSigma() : null,
        types.has('cpt-point') ? loadPoints() : null,
      ])
    }
    catch {
      // A source that cannot be read leaves its flags with the plain fallback wording.
    }
    finally {
      describing.value = false
    }
    info.value = new Map(list.map(f => [flagTargetKey(f.targetType, f.targetId), describe(f)]))
  }

  onMounted(() => void resolve())
  watch(flags, () => void resolve())

  /** Lab records a reviewer can flag from the review page. */
  async function labTargets() {
    const [t, s] = await Promise.all([loadTests(), loadSigma()])
    return { tests: t, adoptions: s.filter(p => p.source === 'oedometer') }
  }

  return { info, describing, labTargets, testsNote }
}
