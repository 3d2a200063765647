import { SAMPLE_QUALITY_CLASSES, type SampleQualityClass } from '#shared/geotech/oedometer'
import type { AdoptionMethod } from '#shared/schemas/lab'
import { formatDate } from './dates'

/** Names of the sample-quality classes of Lunne, Berre & Strandvik (1997). */
export const QUALITY_LABELS: Record<SampleQualityClass, string> = {
  'very-good-to-excellent': 'Very good to excellent',
  'good-to-fair': 'Good to fair',
  'poor': 'Poor',
  'very-poor': 'Very poor',
}

/** Badge classes per quality class: green, blue-green, ochre, red; grey when not assessed. */
export const QUALITY_BADGE: Record<SampleQualityClass | 'none', string> = {
  'very-good-to-excellent': 'bg-good-50 text-good-700 ring-good-500/40',
  'good-to-fair': 'bg-tide-50 text-tide-800 ring-tide-400/50',
  'poor': 'bg-ochre-50 text-ochre-800 ring-ochre-400/60',
  'very-poor': 'bg-alert-50 text-alert-700 ring-alert-500/50',
  'none': 'bg-silt-100 text-silt-700 ring-silt-300',
}

export function isQualityClass(v: string | null | undefined): v is SampleQualityClass {
  return !!v && (SAMPLE_QUALITY_CLASSES as readonly string[]).includes(v)
}

export function qualityLabel(v: string | null | undefined): string {
  return isQualityClass(v) ? QUALITY_LABELS[v] : 'Not assessed'
}

/**
 * How each σ'p construction is drawn: its own colour and dash pattern, used by the plot, the
 * legend and the table so a line can be matched to its row.
 */
export interface MethodStyle { colour: string, dash: string, label: string, short: string }
export const METHOD_STYLES: Record<'casagrande' | 'pachecoSilva' | 'work' | 'bilinear', MethodStyle> = {
  casagrande: { colour: '#1f5261', dash: '', label: 'Casagrande (1936)', short: 'Casagrande' },
  pachecoSilva: { colour: '#b4541a', dash: '7 4', label: 'Pacheco Silva (1970)', short: 'Pacheco Silva' },
  work: { colour: '#2e8b57', dash: '2 3', label: 'Work, strain energy (Becker et al. 1987)', short: 'Work' },
  bilinear: { colour: '#7b3f8c', dash: '10 3 2 3', label: 'Bilinear log(1+e) (Butterfield 1979; Onitsuka et al. 1995)', short: 'Bilinear' },
}
/** The adopted value and the draggable marker. */
export const ADOPTED_COLOUR = '#27231f'
export const MARKER_COLOUR = '#c0392b'

export const ADOPTION_LABELS: Record<AdoptionMethod, string> = {
  casagrande: 'Casagrande',
  pachecoSilva: 'Pacheco Silva',
  work: 'Work',
  bilinear: 'Bilinear',
  dragged: 'Marker on the plot',
  typed: 'Typed',
}

/** Labels of the σ'p points' methods (lab adoption methods, CPT and vane). */
export function pointMethodLabel(method: string): string {
  if (method in ADOPTION_LABELS) return ADOPTION_LABELS[method as AdoptionMethod]
  if (method === 'k-qnet') return 'k·qnet'
  if (method === 'pi-at-point') return 'μ from PI at the point'
  if (method === 'pi-of-stratum') return 'μ from the stratum\'s PI'
  if (method === 'uncorrected') return 'No μ correction'
  return method
}

/** kPa with sensible precision. */
export function kPa(v: number | null | undefined, digits = 1): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)} kPa`
}

export function shortDate(iso: string | null | undefined): string {
  if (!iso) return '—'
  const t = new Date(iso)
  return Number.isNaN(t.getTime()) ? iso : formatDate(t, 'dateTime', { utc: true })
}
