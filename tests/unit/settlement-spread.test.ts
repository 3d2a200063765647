// @vitest-environment happy-dom
// Probabilistic settlement on the pages: the limit read off an exceedance curve, the histogram,
// exceedance and tornado scenes, and the run editor's probability inputs (draft ⇄ request, store).
import { describe, expect, it } from 'vitest'
import { useSettlementDraftStore } from '../../app/stores/settlementDraft'
import { exceedanceScene, histogramScene, tornadoScene, SPREAD_INK } from '../../shared/plots/settlement-spread'
import { CreateSettlementRunSchema, RUN_PROBABILISTIC_DEFAULTS } from '../../shared/schemas/settlement-runs'
import { defaultProbabilistic, draftFromRun, emptyDraft, newLoad, normalizeDraft, requestOf, withVariation, type SettlementDraft } from '../../shared/settlement-run/draft'
import { exceedanceAt, formatCov, formatProbability, isAssumedScatter, SPREAD_VARIABLE_LABELS } from '../../shared/settlement-run/spread'
import { lognormalExceedance, lognormalQuantile, lognormalSpread, spreadSetup } from '../helpers/spread-fixture'
import { useFreshStores } from '../helpers/stores'

const MODEL = { modelId: '7a1e2c9b-4d1f-4a55-9a0e-2f6c1b3d8e10', version: 1 }
// The yard embankment's centre: 400 mm at the median, COV 25 % (a lognormal settlement, see the fixture).
const MEDIAN = 0.4
const COV = 0.25

describe('the probability of exceeding a typed limit', () => {
  it('interpolates linearly between the two curve points around the limit', () => {
    const curve = { settlement: [0.3, 0.4, 0.5], probability: [0.9, 0.5, 0.1] }
    expect(exceedanceAt(curve, 0.45)).toEqual({ probability: expect.closeTo(0.3, 12), bound: null })
    expect(exceedanceAt(curve, 0.4)).toEqual({ probability: 0.5, bound: null })
    expect(exceedanceAt(curve, 0.5)).toEqual({ probability: 0.1, bound: null })
    expect(exceedanceAt(curve, 0.3)).toEqual({ probability: 0.9, bound: null })
    // 0.325 m: a quarter of the way from 0.9 to 0.5.
    expect(exceedanceAt(curve, 0.325)?.probability).toBeCloseTo(0.8, 12)
  })

  it('outside the curve gives its end value and the side (at least / at most); nothing for an empty curve or no number', () => {
    const curve = { settlement: [0.3, 0.4, 0.5], probability: [0.998, 0.5, 0.002] }
    expect(exceedanceAt(curve, 0.1)).toEqual({ probability: 0.998, bound: 'atLeast' })
    expect(exceedanceAt(curve, 0.9)).toEqual({ probability: 0.002, bound: 'atMost' })
    expect(exceedanceAt({ settlement: [], probability: [] }, 0.4)).toBeNull()
    expect(exceedanceAt(curve, Number.NaN)).toBeNull()
  })

  it('reads a lognormal settlement\'s exceedance within the curve\'s interpolation error', () => {
    const r = lognormalSpread({ median: MEDIAN, cov: COV })
    // Linear interpolation of a smooth curve errs by at most h²/8 · max|f''| (the interpolation remainder
    // of numerical analysis). Here 41 points over 0.178–0.897 m give h = 18.0 mm, and the lognormal's
    // survival function has |f''| ≤ 35.6 /m² there (its steepest bend, by finite differences in 0.1 mm
    // steps), so the reading is within 1.44e-3 of the closed form.
    const h = (r.exceedanceCurve.settlement[40]! - r.exceedanceCurve.settlement[0]!) / 40
    const tolerance = h * h / 8 * 35.6
    expect(tolerance).toBeLessThan(1.44e-3)
    for (const limit of [0.3, 0.4, 0.45, 0.5, 0.6, 0.7]) {
      const read = exceedanceAt(r.exceedanceCurve, limit)
      expect(read?.bound).toBeNull()
      expect(Math.abs(read!.probability - lognormalExceedance(limit, MEDIAN, COV))).toBeLessThanOrEqual(tolerance)
    }
    // At the median, one in two; at P95, one in twenty (closed form of the lognormal).
    expect(Math.abs(exceedanceAt(r.exceedanceCurve, MEDIAN)!.probability - 0.5)).toBeLessThanOrEqual(tolerance)
    expect(Math.abs(exceedanceAt(r.exceedanceCurve, lognormalQuantile(0.95, MEDIAN, COV))!.probability - 0.05)).toBeLessThanOrEqual(tolerance)
  })

  it('words a probability and a COV as percentages', () => {
    expect(formatProbability(0.0512)).toBe('5.1 %')
    expect(formatProbability(0.004)).toBe('0.40 %')
    expect(formatProbability(0.9995)).toBe('99.95 %')
    expect(formatProbability(1)).toBe('100.0 %')
    expect(formatCov(0.22)).toBe('22 %')
    expect(formatCov(0.08)).toBe('8.0 %')
  })

  it('marks a COV as an assumption when it is a default or rests on fewer than 3 tests, never when typed', () => {
    expect(isAssumedScatter({ source: 'default', n: 0 })).toBe(true)
    expect(isAssumedScatter({ source: 'data', n: 2 })).toBe(true)
    expect(isAssumedScatter({ source: 'data', n: 3 })).toBe(false)
    expect(isAssumedScatter({ source: 'entered', n: 0 })).toBe(false)
  })
})

describe('the histogram scene', () => {
  const r = lognormalSpread({ median: MEDIAN, cov: COV })

  it('draws one bar per bin with heights in proportion to the counts, and bars that tile the settlement axis', () => {
    const s = histogramScene({ result: r, unitSystem: 'SI', width: 600, height: 260 })
    expect(s.bars).toHaveLength(20)
    expect(s.total).toBe(r.histogram.counts.reduce((a, c) => a + c, 0))
    // The lognormal's bins round to a total within a few of 5000 realisations.
    expect(Math.abs(s.total - 5000)).toBeLessThanOrEqual(10)
    const tallest = s.bars.reduce((a, b) => (b.count > a.count ? b : a))
    for (const b of s.bars) expect(b.height / tallest.height).toBeCloseTo(b.count / tallest.count, 9)
    for (let i = 1; i < s.bars.length; i++) expect(s.bars[i]!.x).toBeGreaterThan(s.bars[i - 1]!.x)
    expect(s.bars[0]!.x).toBeGreaterThanOrEqual(s.margin.left)
    const last = s.bars[s.bars.length - 1]!
    expect(last.x + last.width).toBeLessThanOrEqual(600 - s.margin.right + 1e-9)
    expect(s.xLabel).toBe('Final primary settlement (mm)')
    expect(s.yLabel).toBe('Share of realisations (%)')
  })

  it('marks P5, P50, P95 and the adopted figure in mm (SI) or inches (US), in order along the axis', () => {
    const si = histogramScene({ result: r, unitSystem: 'SI', width: 600 })
    const byKey = Object.fromEntries(si.marks.map(m => [m.key, m]))
    // P50 = 400 mm; P95 = 0.4·exp(1.645·0.2462) = 599.9 mm; P5 = 0.4·exp(−1.645·0.2462) = 266.7 mm.
    expect(byKey.p50!.label).toBe('P50 400')
    expect(byKey.p95!.label).toBe('P95 600')
    expect(byKey.p05!.label).toBe('P5 267')
    expect(byKey.p05!.at).toBeLessThan(byKey.p50!.at)
    expect(byKey.p50!.at).toBeLessThan(byKey.deterministic!.at)
    expect(byKey.deterministic!.at).toBeLessThan(byKey.p95!.at)
    expect(byKey.p50!.colour).toBe(SPREAD_INK.median)
    // "adopted 412" and "P50 400" lie 12 mm apart: their labels take different rows; none of a row overlap.
    expect(byKey.p50!.row).not.toBe(byKey.deterministic!.row)
    const span = (m: typeof si.marks[number]): [number, number] => {
      const w = m.label.length * 5.6 + 4
      return m.anchor === 'start' ? [m.at, m.at + w] : m.anchor === 'end' ? [m.at - w, m.at] : [m.at - w / 2, m.at + w / 2]
    }
    for (const a of si.marks) {
      for (const b of si.marks) {
        if (a === b || a.row !== b.row) continue
        const [a0, a1] = span(a)
        const [b0, b1] = span(b)
        expect(a1 <= b0 || b1 <= a0).toBe(true)
      }
    }
    const us = histogramScene({ result: r, unitSystem: 'US', width: 600 })
    // 400 mm = 15.75 in.
    expect(us.marks.find(m => m.key === 'p50')!.label).toBe('P50 15.75')
    expect(us.xLabel).toBe('Final primary settlement (in)')
  })
})

describe('the exceedance scene', () => {
  const r = lognormalSpread({ median: MEDIAN, cov: COV })

  it('runs from top left (all exceed) to bottom right (none), and puts the limit on the curve', () => {
    const limit = 0.5
    const p = lognormalExceedance(limit, MEDIAN, COV)
    const s = exceedanceScene({ curve: r.exceedanceCurve, limit: { settlement: limit, probability: p }, unitSystem: 'SI', width: 500, height: 260 })
    const nums = s.d.replace(/^M/, '').split(/[LM]/).map(pt => pt.split(',').map(Number))
    expect(nums).toHaveLength(41)
    const [x0, y0] = nums[0]!
    const [x1, y1] = nums[nums.length - 1]!
    expect(x0).toBeCloseTo(s.margin.left, 6)
    expect(x1).toBeCloseTo(500 - s.margin.right, 6)
    // P(S > 0.19 m) ≈ 0.9995 at the top, P(S > 0.87 m) ≈ 0.0005 at the bottom.
    expect(y0).toBeCloseTo(s.margin.top + (260 - s.margin.bottom - s.margin.top) * 0.0005, 0)
    expect(y1).toBeCloseTo(260 - s.margin.bottom, 0)
    // P(S > 500 mm) = 1 − Φ(ln 1.25 / 0.2462) = 1 − Φ(0.906) = 0.182.
    expect(p).toBeCloseTo(0.182, 3)
    const yOf = (q: number) => 260 - s.margin.bottom - (260 - s.margin.bottom - s.margin.top) * q
    expect(s.limit!.y).toBeCloseTo(yOf(p), 9)
    expect(s.limit!.label).toBe('500 mm')
    expect(s.yLabel).toBe('Chance of more than s (%)')
  })

  it('leaves the limit out when it is off the axis', () => {
    const s = exceedanceScene({ curve: r.exceedanceCurve, limit: { settlement: 2, probability: 0 }, unitSystem: 'SI', width: 500 })
    expect(s.limit).toBeNull()
  })
})

describe('the tornado scene', () => {
  const r = lognormalSpread({ median: MEDIAN, cov: COV })
  const names = { EST: 'Estuarine clay', GLA: 'Older glacial clay' }

  it('ranks the parameters by |rank correlation|, largest at the top, positive to the right of the centre', () => {
    const s = tornadoScene({ sensitivity: r.sensitivity, names, labels: SPREAD_VARIABLE_LABELS, width: 600 })
    expect(s.rows.map(x => x.label)).toEqual(['Estuarine clay · Cc', 'Estuarine clay · σ\'p', 'Older glacial clay · Cc', 'Estuarine clay · e0'])
    for (let i = 1; i < s.rows.length; i++) expect(s.rows[i]!.y).toBeGreaterThan(s.rows[i - 1]!.y)
    const [cc, sp] = s.rows
    // ρ from −1 to +1 across the plot: a bar's length is |ρ| of half the width.
    const half = (600 - s.margin.right - s.margin.left) / 2
    expect(cc!.x).toBeCloseTo(s.centre, 9)
    expect(cc!.width).toBeCloseTo(0.83 * half, 9)
    expect(cc!.colour).toBe(SPREAD_INK.positive)
    expect(sp!.x + sp!.width).toBeCloseTo(s.centre, 9)
    expect(sp!.width).toBeCloseTo(0.41 * half, 9)
    expect(sp!.colour).toBe(SPREAD_INK.negative)
    expect(s.xTicks.map(t => t.label)).toEqual(['-1.0', '-0.5', '0', '0.5', '1.0'])
    // Long bars carry their figure inside their far end; short ones just beyond it.
    expect(cc!.valueInside).toBe(true)
    expect(cc!.valueX).toBeCloseTo(cc!.x + cc!.width - 4, 9)
    expect(cc!.valueAnchor).toBe('end')
    expect(sp!.valueInside).toBe(true)
    expect(sp!.valueX).toBeCloseTo(sp!.x + 4, 9)
    expect(sp!.valueAnchor).toBe('start')
    const e0 = s.rows[3]!
    expect(e0.valueInside).toBe(false)
    expect(e0.valueX).toBeCloseTo(e0.x - 4, 9)
    expect(e0.valueAnchor).toBe('end')
    // The labels' column fits the longest, "Older glacial clay · Cc" (23 characters at about 6 px, and a gap).
    expect(s.margin.left).toBe(23 * 6 + 12)
  })

  it('keeps at most the rows asked for, and names a stratum by its code when no name is known', () => {
    const s = tornadoScene({ sensitivity: r.sensitivity, labels: SPREAD_VARIABLE_LABELS, width: 360, maxRows: 2 })
    expect(s.rows.map(x => x.label)).toEqual(['EST · Cc', 'EST · σ\'p'])
    // "EST · σ'p" needs little room.
    expect(s.margin.left).toBe(Math.round(9 * 6 + 12))
    // A long label on a phone takes at most 45 % of the width.
    const long = tornadoScene({ sensitivity: [{ stratum: 'EST', variable: 'preconsolidation', rankCorrelation: 0.5 }], names: { EST: 'Estuarine clay with shell fragments, lower' }, labels: SPREAD_VARIABLE_LABELS, width: 320 })
    expect(long.margin.left).toBe(Math.round(320 * 0.45))
  })
})

describe('the run editor\'s probability inputs', () => {
  useFreshStores()

  function yardDraft(): SettlementDraft {
    return {
      ...emptyDraft(),
      name: 'Yard, how sure',
      model: MODEL,
      loads: [{ ...newLoad('a', 'embankment', { x: 0, y: 0 }, 'E1'), height: 4.5 }],
      points: [{ id: 'p', label: 'Centre', x: 0, y: 0 }],
    }
  }

  it('starts off, "from the data", with the contract\'s defaults, and sends nothing while off', () => {
    expect(defaultProbabilistic()).toEqual({ on: false, realizations: 5000, seed: 1, fromData: true, ccE0Correlation: 0.5, limit: null, layers: {} })
    expect(RUN_PROBABILISTIC_DEFAULTS.realizations).toBe(5000)
    expect(requestOf(yardDraft()).options).not.toHaveProperty('probabilistic')
  })

  it('sends the inputs switched on, which the request schema takes, and reads them back from the run ("Run again with changes")', () => {
    const d = yardDraft()
    const layers = withVariation(withVariation({}, 'EST', 'cc', { cov: 0.3 }), 'GLA', 'cv', { cov: 0.5, correlationLength: 2 })
    const on = { ...d, probabilistic: { ...d.probabilistic, on: true, realizations: 2000, seed: 42, limit: 0.45, ccE0Correlation: 0.6, layers } }
    const body = requestOf(on)
    expect(body.options.probabilistic).toEqual({
      realizations: 2000, seed: 42, fromData: true, ccE0Correlation: 0.6, limit: 0.45,
      layers: { EST: { cc: { cov: 0.3 } }, GLA: { cv: { cov: 0.5, correlationLength: 2 } } },
    })
    const parsed = CreateSettlementRunSchema.parse(body)
    const back = draftFromRun({ ...parsed, grid: parsed.grid ?? null }, () => 'id')
    expect(back.probabilistic).toEqual(on.probabilistic)
    expect(back.options).not.toHaveProperty('probabilistic')
    // No limit: none sent.
    expect(requestOf({ ...on, probabilistic: { ...on.probabilistic, limit: null } }).options.probabilistic).not.toHaveProperty('limit')
  })

  it('refuses a COV above 2 and realisations below 100 at the field\'s path', () => {
    const d = yardDraft()
    const bad = { ...d, probabilistic: { ...d.probabilistic, on: true, realizations: 50, layers: { EST: { cc: { cov: 2.5 } } } } }
    const r = CreateSettlementRunSchema.safeParse(requestOf(bad))
    expect(r.success).toBe(false)
    const paths = r.success ? [] : r.error.issues.map(i => i.path.join('.'))
    expect(paths).toContain('options.probabilistic.realizations')
    expect(paths).toContain('options.probabilistic.layers.EST.cc.cov')
  })

  it('clears a typed COV back to the data\'s and drops a stratum left with none', () => {
    const one = withVariation({}, 'EST', 'cc', { cov: 0.3 })
    const two = withVariation(one, 'EST', 'e0', { cov: 0.1 })
    expect(withVariation(two, 'EST', 'cc', null)).toEqual({ EST: { e0: { cov: 0.1 } } })
    expect(withVariation(one, 'EST', 'cc', null)).toEqual({})
  })

  it('brings a draft kept before the probability inputs existed up to date (off)', () => {
    const { probabilistic: _p, ...old } = yardDraft()
    expect(normalizeDraft(old).probabilistic).toEqual(defaultProbabilistic())
  })

  it('in the store: switching on and typing a COV are steps undo takes back one at a time', () => {
    const store = useSettlementDraftStore()
    store.open('3c1f9a52-7d7e-4b0e-9f57-1a2b3c4d5e6f')
    store.setProbabilistic({ on: true })
    store.setVariation('EST', 'cc', { cov: 0.3 })
    expect(store.draft.probabilistic.on).toBe(true)
    expect(store.draft.probabilistic.layers).toEqual({ EST: { cc: { cov: 0.3 } } })
    expect(store.undoLabel).toBe('Type a scatter')
    store.undo()
    expect(store.draft.probabilistic.layers).toEqual({})
    expect(store.draft.probabilistic.on).toBe(true)
    store.undo()
    expect(store.draft.probabilistic.on).toBe(false)
  })
})

describe('the set-up fixture the run page shows', () => {
  it('marks the crust\'s Cc on two tests as an assumption, and nothing else', () => {
    const assumed = spreadSetup().strata.flatMap(s => s.variables.filter(v => !v.trend && isAssumedScatter(v)).map(v => `${s.code}.${v.variable}`))
    expect(assumed).toEqual(['CRUST.cc'])
  })
})
