import { VERDICT_LABELS, type FlagTarget, type FlagVerdict } from '#shared/review/flags'
import { formatDate } from './dates'

/**
 * How Pastload shows a reviewer's verdict: a short word, a ring glyph in the
 * verdict's colour (the same rings the σ'p canvas draws around flagged points:
 * a slash for "kept out of fits", a broken ring for "questionable", a tick for
 * "accepted") and the badge colours.
 */
export interface VerdictLook {
  /** The word on a badge. */
  short: string
  /** What choosing it does, as the flag dialog explains it. */
  means: string
  colour: string
  badge: string
}

export const VERDICT_LOOKS: Record<FlagVerdict, VerdictLook> = {
  exclude: {
    short: 'Out of fits',
    means: 'Drawn on every plot but left out of the σ\'p trend fits while the flag is open.',
    colour: '#c0392b',
    badge: 'bg-alert-50 text-alert-700 border-alert-500',
  },
  questionable: {
    short: 'Questioned',
    means: 'Needs a second look. It stays in the fits; the people who made it are asked to answer.',
    colour: '#ab621c',
    badge: 'bg-ochre-50 text-ochre-800 border-ochre-400',
  },
  accepted: {
    short: 'Accepted',
    means: 'Checked and sound as it stands, recorded so the check is not repeated.',
    colour: '#216641',
    badge: 'bg-good-50 text-good-700 border-good-500',
  },
}

/** Dialog and filter order: the everyday verdict first. */
export const VERDICT_ORDER: readonly FlagVerdict[] = ['questionable', 'exclude', 'accepted']

export function verdictLabel(v: FlagVerdict): string {
  return VERDICT_LABELS[v]
}

export const TARGET_LABELS: Record<FlagTarget, string> = {
  'preconsolidation-point': 'σ\'p point (lab)',
  'oedometer-test': 'Oedometer test',
  'log-interval': 'Log interval',
  'cpt-point': 'CPT σ\'p',
  'vane-reading': 'Field vane σ\'p',
}

export function flagDate(iso: string | null | undefined): string {
  if (!iso) return ''
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return ''
  return formatDate(d)
}

export function flagDateTime(iso: string | null | undefined): string {
  if (!iso) return ''
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return ''
  return formatDate(d, 'dateTime')
}
