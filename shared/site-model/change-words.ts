import { convert, unitLabel, type ConvertOptions, type Quantity, type UnitSystem } from '../units/index'
import { MODEL_NAMES } from '../geotech/trend-model'
import { COMPRESSIBILITY_KEYS, COMPRESSIBILITY_LABELS } from './definition-plain'
import type { Compressibility, ModelStratum, SiteModelDefinition, StratumTrend, TrendProblemCode } from './definition'
import { TREND_PARAMETERS, trendParameterLabel } from './trend-words'

/**
 * What changed between two site model definitions, as sentences a reviewer reads
 * ("EST unit weight 16.0 → 16.2 kN/m³", "water table 1.57 → 1.60 m",
 * "EST trend: constant POP 26.7 → 25.9 kPa") in the project's units. Strata are
 * paired by code (the k-th band of a code with the k-th of the same code), so a
 * band added above another does not read as every band below it changing. The
 * reviewer flags in force are left out: the compare page says so on its own line.
 */

export interface ChangeWordsOptions { units?: UnitSystem, convert?: ConvertOptions }

const DIGITS: Record<Quantity, number> = { length: 2, stress: 1, unitWeight: 1, coefficientOfConsolidation: 2 }

class Words {
  constructor(private readonly system: UnitSystem, private readonly options: ConvertOptions) {}
  /** A value in the display unit, without the unit. */
  num(v: number, q: Quantity): string {
    // US stress: psf whole, tsf to 0.01 (a tsf is 2000 psf).
    const d = this.system === 'US' && q === 'stress' ? (this.options.usStress === 'tsf' ? 2 : 0) : DIGITS[q]
    return convert(v, q, 'SI', this.system, this.options).toFixed(d)
  }

  unit(q: Quantity): string {
    return unitLabel(q, this.system, this.options)
  }

  /** "16.0 → 16.2 kN/m³". */
  change(a: number, b: number, q: Quantity): string {
    return `${this.num(a, q)} → ${this.num(b, q)} ${this.unit(q)}`
  }

  /** A trend parameter's unit ("kPa", "kPa/m", "" for OCR). */
  parameterUnit(key: string): string {
    const m = TREND_PARAMETERS[key]
    if (!m?.quantity) return ''
    return m.perDepth ? `${this.unit('stress')}/${this.unit('length')}` : this.unit(m.quantity)
  }

  /** A trend parameter's value with its unit ("26.7 kPa", "3.10 kPa/m", "2.40"). */
  parameter(key: string, v: number, withUnit = true): string {
    const m = TREND_PARAMETERS[key]
    if (!m?.quantity) return v.toFixed(2)
    if (m.perDepth) {
      const perLength = convert(v, 'stress', 'SI', this.system, this.options) / convert(1, 'length', 'SI', this.system, this.options)
      return `${perLength.toFixed(2)}${withUnit ? ` ${this.unit('stress')}/${this.unit('length')}` : ''}`
    }
    return `${this.num(v, m.quantity)}${withUnit ? ` ${this.unit(m.quantity)}` : ''}`
  }
}

const PROBLEM_WORDS: Record<TrendProblemCode, string> = {
  'negative-r2': 'R² below 0',
  'below-effective-stress': 'σ\'p below σ\'v0',
  'not-positive': 'σ\'p at or below 0',
}
const DRAINAGE_WORDS: Record<Compressibility['drainage'], string> = { double: 'top and base', top: 'top only', bottom: 'base only' }

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b)
const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`

function modelName(t: Pick<StratumTrend, 'model' | 'crustBelow'>): string {
  return t.model === 'crust' ? `crust over ${MODEL_NAMES[t.crustBelow ?? 'constant']}` : MODEL_NAMES[t.model]
}

/** "constant POP 26.7 kPa" or "σ'p linear in depth (σ'p at 0 m 12.0 kPa, gradient 3.10 kPa/m)". */
function trendText(t: StratumTrend, w: Words): string {
  if (t.manual) return `drawn by hand (${plural(t.manual.knots.length, 'knot')})`
  const entries = Object.entries(t.parameters).filter(([k]) => TREND_PARAMETERS[k])
  const log = t.logSpace ? ' on ln σ\'p' : ''
  if (entries.length === 1) return `${modelName(t)}${log} ${w.parameter(entries[0]![0], entries[0]![1])}`
  return `${modelName(t)}${log} (${entries.map(([k, v]) => `${trendParameterLabel(k, w.unit('length'))} ${w.parameter(k, v)}`).join(', ')})`
}

function trendChanges(code: string, a: StratumTrend | undefined, b: StratumTrend | undefined, w: Words): string[] {
  if (!a && !b) return []
  if (!a) return [`${code} trend: ${trendText(b!, w)}, new`]
  if (!b) return [`${code} trend removed (was ${trendText(a, w)})`]
  const out: string[] = []
  const sameForm = a.model === b.model && a.crustBelow === b.crustBelow && a.logSpace === b.logSpace && !a.manual && !b.manual
  if (!sameForm) {
    if (!same(a.manual, b.manual) || !same(a.parameters, b.parameters) || a.model !== b.model || a.logSpace !== b.logSpace) out.push(`${code} trend: ${trendText(a, w)} → ${trendText(b, w)}`)
    if (a.manual && b.manual && a.manual.reason !== b.manual.reason) out.push(`${code} reason for the hand-drawn trend: “${b.manual.reason}”`)
  }
  else {
    const keys = [...new Set([...Object.keys(a.parameters), ...Object.keys(b.parameters)])].filter(k => TREND_PARAMETERS[k])
    const changed = keys.filter(k => a.parameters[k] !== b.parameters[k] && (a.parameters[k] === undefined || b.parameters[k] === undefined || w.parameter(k, a.parameters[k]) !== w.parameter(k, b.parameters[k])))
    if (changed.length === 1 && keys.length === 1) {
      const k = changed[0]!
      const unit = w.parameterUnit(k)
      out.push(`${code} trend: ${modelName(b)}${b.logSpace ? ' on ln σ\'p' : ''} ${w.parameter(k, a.parameters[k]!, false)} → ${w.parameter(k, b.parameters[k]!, false)}${unit ? ` ${unit}` : ''}`)
    }
    else if (changed.length) {
      const part = (k: string) => `${trendParameterLabel(k, w.unit('length'))} ${a.parameters[k] === undefined ? '—' : w.parameter(k, a.parameters[k], false)} → ${b.parameters[k] === undefined ? '—' : w.parameter(k, b.parameters[k])}`
      out.push(`${code} trend: ${modelName(b)}, ${changed.map(part).join(', ')}`)
    }
  }
  if (!same([...a.includedPointIds].sort(), [...b.includedPointIds].sort())) {
    const sa = new Set(a.includedPointIds)
    const sb = new Set(b.includedPointIds)
    const added = b.includedPointIds.filter(x => !sa.has(x)).length
    const removed = a.includedPointIds.filter(x => !sb.has(x)).length
    out.push(`${code} trend fitted on ${a.includedPointIds.length} → ${b.includedPointIds.length} points (${added} taken in, ${removed} left out)`)
  }
  if (!b.manual && !a.manual && a.r2 !== b.r2 && a.r2 !== null && b.r2 !== null && a.r2.toFixed(2) !== b.r2.toFixed(2)) out.push(`${code} trend R² ${a.r2.toFixed(2)} → ${b.r2.toFixed(2)}`)
  if (!same(a.acceptedDespite, b.acceptedDespite)) {
    out.push(b.acceptedDespite
      ? `${code} trend kept despite ${b.acceptedDespite.problems.map(p => PROBLEM_WORDS[p]).join(' and ')}: “${b.acceptedDespite.reason}”`
      : `${code} trend no longer kept despite ${a.acceptedDespite!.problems.map(p => PROBLEM_WORDS[p]).join(' and ')}`)
  }
  return out
}

function compressibilityChanges(code: string, a: Compressibility | undefined, b: Compressibility | undefined, w: Words): string[] {
  if (!a && !b) return []
  if (!a) return [`${code} compressibility adopted: Cc ${b!.cc.toFixed(3)}, Cr ${b!.cr.toFixed(3)}, e0 ${b!.e0.toFixed(3)}`]
  if (!b) return [`${code} compressibility removed`]
  const out: string[] = []
  for (const key of COMPRESSIBILITY_KEYS) {
    const label = COMPRESSIBILITY_LABELS[key]
    const va = a[key]
    const vb = b[key]
    const show = (v: number | undefined) => (v === undefined ? '—' : key === 'cv' ? w.num(v, 'coefficientOfConsolidation') : v.toFixed(key === 'calpha' ? 4 : 3))
    if (va !== vb && show(va) !== show(vb)) out.push(`${code} ${label} ${show(va)} → ${show(vb)}${key === 'cv' ? ` ${w.unit('coefficientOfConsolidation')}` : ''}`)
    const ta = a.trends?.[key]
    const tb = b.trends?.[key]
    if (!ta && tb) out.push(`${code} ${label} now follows depth (fitted on ${plural(tb.n, 'test')})`)
    else if (ta && !tb) out.push(`${code} ${label} back to a constant`)
    else if (ta && tb && !same(ta, tb)) out.push(`${code} ${label} depth trend fitted again (${plural(ta.n, 'test')} → ${tb.n})`)
  }
  if (a.drainage !== b.drainage) out.push(`${code} drains through ${DRAINAGE_WORDS[a.drainage]} → ${DRAINAGE_WORDS[b.drainage]}`)
  if (a.source !== b.source) out.push(`${code} compressibility ${b.source === 'mean' ? `now the mean of ${plural(b.n ?? 0, 'test')}` : 'now typed'}`)
  else if (b.source === 'mean' && a.n !== b.n) out.push(`${code} compressibility the mean of ${a.n ?? 0} → ${plural(b.n ?? 0, 'test')}`)
  return out
}

function stratumChanges(a: ModelStratum, b: ModelStratum, w: Words): string[] {
  const code = b.code
  const out: string[] = []
  if (a.name !== b.name) out.push(`${code} name “${a.name}” → “${b.name}”`)
  if (w.num(a.thickness, 'length') !== w.num(b.thickness, 'length')) out.push(`${code} thickness ${w.change(a.thickness, b.thickness, 'length')}`)
  if (w.num(a.unitWeight, 'unitWeight') !== w.num(b.unitWeight, 'unitWeight')) out.push(`${code} unit weight ${w.change(a.unitWeight, b.unitWeight, 'unitWeight')}`)
  if (w.num(a.unitWeightSaturated, 'unitWeight') !== w.num(b.unitWeightSaturated, 'unitWeight')) out.push(`${code} saturated unit weight ${w.change(a.unitWeightSaturated, b.unitWeightSaturated, 'unitWeight')}`)
  if (a.compressible !== b.compressible) out.push(`${code} ${b.compressible ? 'now compressible' : 'no longer compressible'}`)
  if (a.cptFactor !== b.cptFactor) out.push(`${code} CPT cone factor k ${a.cptFactor.toFixed(2)} → ${b.cptFactor.toFixed(2)}`)
  out.push(...compressibilityChanges(code, a.compressibility, b.compressibility, w))
  out.push(...trendChanges(code, a.trend, b.trend, w))
  return out
}

/** Each band with the number of bands of its code above it, so bands pair by code and order. */
function keyed(strata: readonly ModelStratum[]): Map<string, ModelStratum> {
  const seen = new Map<string, number>()
  const out = new Map<string, ModelStratum>()
  for (const s of strata) {
    const k = seen.get(s.code) ?? 0
    seen.set(s.code, k + 1)
    out.set(`${s.code}#${k}`, s)
  }
  return out
}

/** The differences between two definitions as sentences, in the order a reviewer reads the model: site, water, strata top-down. */
export function describeChanges(a: SiteModelDefinition, b: SiteModelDefinition, opts: ChangeWordsOptions = {}): string[] {
  const w = new Words(opts.units ?? 'SI', opts.convert ?? {})
  const out: string[] = []
  if (w.num(a.surcharge, 'stress') !== w.num(b.surcharge, 'stress')) out.push(`surcharge ${w.change(a.surcharge, b.surcharge, 'stress')}`)
  if (a.gammaW !== b.gammaW) out.push(`unit weight of water ${w.change(a.gammaW, b.gammaW, 'unitWeight')}`)
  if (w.num(a.groundwater.waterTableDepth, 'length') !== w.num(b.groundwater.waterTableDepth, 'length')) out.push(`water table ${w.change(a.groundwater.waterTableDepth, b.groundwater.waterTableDepth, 'length')}`)
  if (!same(a.groundwater.piezometers, b.groundwater.piezometers)) {
    const list = (ps: SiteModelDefinition['groundwater']['piezometers']) => (ps.length ? ps.map(p => `u ${w.num(p.porePressure, 'stress')} at ${w.num(p.depth, 'length')}`).join(', ') : 'none')
    out.push(`pore pressure control points (${w.unit('stress')}, ${w.unit('length')}): ${list(a.groundwater.piezometers)} → ${list(b.groundwater.piezometers)}`)
  }
  const codes = (d: SiteModelDefinition) => d.strata.map(s => s.code).join(', ')
  if (codes(a) !== codes(b)) out.push(`strata ${codes(a)} → ${codes(b)}`)
  const ka = keyed(a.strata)
  const kb = keyed(b.strata)
  for (const [k, sb] of kb) {
    const sa = ka.get(k)
    if (!sa) out.push(`${sb.code} added: ${w.num(sb.thickness, 'length')} ${w.unit('length')} thick`)
    else out.push(...stratumChanges(sa, sb, w))
  }
  for (const [k, sa] of ka) if (!kb.has(k)) out.push(`${sa.code} removed (was ${w.num(sa.thickness, 'length')} ${w.unit('length')} thick)`)
  return out
}
