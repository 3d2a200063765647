/**
 * SPT blows as they are written on a field log, read into the increments of the
 * test. Source: BS EN ISO 22476-3:2005 (Standard penetration test): a seating
 * drive of 150 mm and a test drive of 300 mm, blows counted per 75 mm increment
 * (two seating increments, four test increments); N is the number of blows of the
 * test drive over its full 300 mm. When a drive stops short (the blow limit was
 * reached first) the blows and the penetration reached are recorded instead.
 * Writing blows per 150 mm (one seating count, two test counts) is the older
 * common practice and is read too.
 *
 * What is read:
 * - `2 3 / 4 5 6 7` — seating then test drive, 75 mm each (commas work as spaces);
 * - `2 / 4 5`, `2 4 5` — per 150 mm (one seating count, two test counts);
 * - `2 3 4 5 6 7` — six counts of 75 mm;
 * - `25/75 50/40`, `2 3 / 10 20 50/40mm` — an increment written blows/penetration (mm)
 *   stopped short; it ends its drive;
 * - `50/100mm` — only the test drive's result given (seating not recorded); `/ 4 5 6 7` too;
 * - `23` — N alone (one 300 mm test drive, seating not recorded);
 * - `6,8/8,9,9,9` — the reported form with one slash between the drives; a trailing
 *   `N=35` is checked against the counts.
 * Errors are plain sentences for the person typing.
 */

/** Nominal lengths of the drives and of an increment, mm (BS EN ISO 22476-3:2005). */
export const SPT_SEATING_MM = 150
export const SPT_TEST_MM = 300
export const SPT_INCREMENT_MM = 75
/** Upper bound of one increment's count (input bound, not a rule of the test). */
export const SPT_MAX_BLOWS = 500
/** Upper bound of the written text. */
export const SPT_TEXT_MAX = 120

export interface SptIncrement {
  blows: number
  /** Penetration of this increment, mm. */
  penetration: number
}

export interface SptBlows {
  /** Increments of the seating drive (empty when not recorded). */
  seating: SptIncrement[]
  /** Increments of the test drive (at least one). */
  test: SptIncrement[]
  /** N: blows of the test drive over its full 300 mm; null when it stopped short. */
  n: number | null
  /** True when the test drive stopped short of 300 mm. */
  refusal: boolean
  seatingBlows: number
  seatingPenetration: number
  testBlows: number
  testPenetration: number
  totalBlows: number
  totalPenetration: number
}

export type SptParse = { ok: true, value: SptBlows } | { ok: false, error: string }

interface Token { blows: number, penetration: number | null }

const fail = (error: string): SptParse => ({ ok: false, error })

function readToken(raw: string): Token | string {
  const m = /^(\d+)(?:\/(\d+)(mm)?)?$/.exec(raw)
  if (!m) return `“${raw}” is not a blow count: write whole numbers such as 4, or blows/mm such as 50/100mm.`
  const blows = Number(m[1])
  if (blows > SPT_MAX_BLOWS) return `${blows} blows in one increment is more than ${SPT_MAX_BLOWS}.`
  return { blows, penetration: m[2] === undefined ? null : Number(m[2]) }
}

function readList(text: string): Token[] | string {
  const parts = text.split(/[\s,]+/).filter(Boolean)
  const out: Token[] = []
  for (const p of parts) {
    const t = readToken(p)
    if (typeof t === 'string') return t
    out.push(t)
  }
  return out
}

/** One drive from its written increments: full counts share the drive's length evenly, or are 75 mm each before one stopped short. */
function drive(tokens: Token[], length: number, name: string): SptIncrement[] | string {
  const partialAt = tokens.findIndex(t => t.penetration !== null)
  if (partialAt >= 0 && partialAt !== tokens.length - 1) return `In the ${name}, only the last increment can be written as blows/mm (it stopped short).`
  const full = partialAt >= 0 ? tokens.slice(0, -1) : tokens
  let each: number
  if (partialAt >= 0) {
    each = SPT_INCREMENT_MM
  }
  else {
    each = length / full.length
    if (![SPT_INCREMENT_MM, 150, 300].includes(each) || each > length) {
      const counts = length === SPT_SEATING_MM ? 'one count (150 mm) or two (75 mm each)' : 'one count (300 mm), two (150 mm each) or four (75 mm each)'
      return `The ${name} has ${full.length} counts: give ${counts}, or write the last as blows/mm if it stopped short.`
    }
  }
  const incs: SptIncrement[] = full.map(t => ({ blows: t.blows, penetration: each }))
  const last = tokens[partialAt]
  if (last && last.penetration !== null) incs.push({ blows: last.blows, penetration: last.penetration })
  const reached = incs.reduce((s, i) => s + i.penetration, 0)
  if (reached > length) return `The ${name} adds up to ${reached} mm, more than its ${length} mm.`
  return incs
}

function sum(list: readonly SptIncrement[], key: keyof SptIncrement): number {
  return list.reduce((s, i) => s + i[key], 0)
}

/** The derived values of a test from its increments. */
export function sptFromIncrements(seating: SptIncrement[], test: SptIncrement[]): SptBlows {
  const testPenetration = sum(test, 'penetration')
  const testBlows = sum(test, 'blows')
  const refusal = testPenetration < SPT_TEST_MM
  return {
    seating,
    test,
    n: refusal ? null : testBlows,
    refusal,
    seatingBlows: sum(seating, 'blows'),
    seatingPenetration: sum(seating, 'penetration'),
    testBlows,
    testPenetration,
    totalBlows: sum(seating, 'blows') + testBlows,
    totalPenetration: sum(seating, 'penetration') + testPenetration,
  }
}

/** Fills the seating drive, then the test drive, from one list written without the slash between them. */
function sequence(tokens: Token[]): { seating: SptIncrement[], test: SptIncrement[] } | string {
  const seating: SptIncrement[] = []
  const test: SptIncrement[] = []
  let current = seating
  let length = SPT_SEATING_MM
  let reached = 0
  for (const t of tokens) {
    if (current === test && reached >= SPT_TEST_MM) return 'There are more counts than the seating and test drives hold.'
    const pen = t.penetration ?? SPT_INCREMENT_MM
    if (reached + pen > length) return `The ${current === seating ? 'seating drive' : 'test drive'} adds up to ${reached + pen} mm, more than its ${length} mm.`
    current.push({ blows: t.blows, penetration: pen })
    reached += pen
    if (current === seating && (reached >= SPT_SEATING_MM || t.penetration !== null)) {
      current = test
      length = SPT_TEST_MM
      reached = 0
    }
    else if (current === test && t.penetration !== null) {
      reached = SPT_TEST_MM
    }
  }
  if (!test.length) return 'Give the test drive\'s blows after the seating drive (for example 2 3 / 4 5 6 7).'
  if (reached < SPT_TEST_MM) {
    return `The test drive has ${reached} mm of its ${SPT_TEST_MM} mm: give the remaining counts, or write the last as blows/mm if it stopped short.`
  }
  return { seating, test }
}

/** Reads the blows of one SPT as written on the log. */
export function parseSptBlows(input: string): SptParse {
  if (input.length > SPT_TEXT_MAX) return fail(`Too long: keep the blows under ${SPT_TEXT_MAX} characters.`)
  let text = input.trim().toLowerCase().replace(/(\d)\s*mm\b/g, '$1mm').replace(/\s*\/\s*(?=\d)/g, m => (/\s/.test(m) ? ' / ' : '/'))
  let stated: number | null = null
  const nMatch = /\s*,?\s*n\s*=\s*(\d+)\s*$/.exec(text)
  if (nMatch) {
    stated = Number(nMatch[1])
    text = text.slice(0, nMatch.index).trim()
  }
  if (!text) return fail('Nothing written: write the blows as counted, for example 2 3 / 4 5 6 7, or 25/75 50/40 when the drive stopped short.')
  // The reported form "6,8/8,9,9,9": one slash between two comma lists of counts.
  const reported = /^(\d+(?:,\d+)*)\/(\d+(?:,\d+)*)$/.exec(text)
  if (reported && text.includes(',')) text = `${reported[1]} / ${reported[2]}`
  if (/\/\s*$/.test(text) || /\/\s*\//.test(text)) return fail('Give the test drive\'s blows after the slash (for example 2 3 / 4 5 6 7).')

  let result: { seating: SptIncrement[], test: SptIncrement[] } | string
  const halves = text.split(/\s\/\s|^\/\s*/)
  if (halves.length > 2) return fail('Write one slash between the seating and the test drive, for example 2 3 / 4 5 6 7.')
  if (halves.length === 2) {
    const seatTokens = readList(halves[0] ?? '')
    if (typeof seatTokens === 'string') return fail(seatTokens)
    const testTokens = readList(halves[1] ?? '')
    if (typeof testTokens === 'string') return fail(testTokens)
    if (!testTokens.length) return fail('Give the test drive\'s blows after the slash (for example 2 3 / 4 5 6 7).')
    const seating = seatTokens.length ? drive(seatTokens, SPT_SEATING_MM, 'seating drive') : []
    if (typeof seating === 'string') return fail(seating)
    const test = drive(testTokens, SPT_TEST_MM, 'test drive')
    if (typeof test === 'string') return fail(test)
    result = { seating, test }
  }
  else {
    const tokens = readList(text)
    if (typeof tokens === 'string') return fail(tokens)
    const [t0] = tokens
    if (tokens.length === 1 && t0) {
      // One value alone is the test drive's result: N, or blows/mm when it stopped short.
      const t = t0
      if (t.penetration !== null && t.penetration > SPT_TEST_MM) return fail(`The test drive adds up to ${t.penetration} mm, more than its ${SPT_TEST_MM} mm.`)
      result = { seating: [], test: [{ blows: t.blows, penetration: t.penetration ?? SPT_TEST_MM }] }
    }
    else if (t0 && tokens.length === 3 && tokens.every(t => t.penetration === null)) {
      result = { seating: [{ blows: t0.blows, penetration: 150 }], test: tokens.slice(1).map(t => ({ blows: t.blows, penetration: 150 })) }
    }
    else {
      result = sequence(tokens)
    }
  }
  if (typeof result === 'string') return fail(result)
  const value = sptFromIncrements(result.seating, result.test)
  if (value.testPenetration === 0 && value.testBlows === 0) return fail('The test drive has no blows and no penetration.')
  if (stated !== null && stated !== value.n) {
    return fail(value.n === null
      ? `N=${stated} is written, but the test drive stopped short at ${value.testPenetration} mm, so N is not defined.`
      : `N=${stated} is written, but the test drive's blows add up to ${value.n}.`)
  }
  return { ok: true, value }
}

/** The increments as Pastload writes them back (a text `parseSptBlows` reads to the same increments). */
export function sptBlowsText(value: Pick<SptBlows, 'seating' | 'test'>): string {
  const inc = (list: SptIncrement[], length: number) => {
    const reached = list.reduce((s, i) => s + i.penetration, 0)
    if (reached >= length) return list.map(i => String(i.blows)).join(' ')
    // Stopped short: full increments of 75 mm, then the last as blows/mm; otherwise the drive as one total.
    if (list.slice(0, -1).every(i => i.penetration === SPT_INCREMENT_MM)) return list.map((i, k) => (k === list.length - 1 ? `${i.blows}/${i.penetration}mm` : String(i.blows))).join(' ')
    return `${list.reduce((s, i) => s + i.blows, 0)}/${reached}mm`
  }
  const test = inc(value.test, SPT_TEST_MM)
  if (!value.seating.length) return value.test.length === 1 ? test : `/ ${test}`
  return `${inc(value.seating, SPT_SEATING_MM)} / ${test}`
}

/**
 * The result as it is reported: "N 23" style numbers are left to the caller; this
 * gives N as a number's text, or blows over the penetration for a drive that
 * stopped short ("50/100 mm").
 */
export function sptResultText(value: Pick<SptBlows, 'n' | 'testBlows' | 'testPenetration'>): string {
  return value.n !== null ? String(value.n) : `${value.testBlows}/${value.testPenetration} mm`
}

/** What a stored SPT row holds: blows and mm per increment, how many belong to the seating drive, the test drive's blows and its penetration when short. */
export interface SptStored {
  blows: number[]
  penetrations: number[]
  seating: number
  /** Blows of the test drive (N when `penetration` is null). */
  n: number
  /** Penetration of the test drive when it stopped short of 300 mm; null for a full drive. */
  penetration: number | null
}

export function sptStored(value: SptBlows): SptStored {
  const all = [...value.seating, ...value.test]
  return {
    blows: all.map(i => i.blows),
    penetrations: all.map(i => i.penetration),
    seating: value.seating.length,
    n: value.testBlows,
    penetration: value.refusal ? value.testPenetration : null,
  }
}

/**
 * The increments of a stored row. Rows stored before increments were kept hold
 * three counts per 150 mm (seating, then the two halves of the test drive) and
 * the test drive's penetration when it stopped short.
 */
export function sptFromStored(row: { blows: readonly number[], n: number, penetration?: number | null, penetrations?: readonly number[] | null, seating?: number | null }): SptBlows {
  const pens = row.penetrations
  if (pens && pens.length === row.blows.length && row.seating !== null && row.seating !== undefined) {
    const all = row.blows.map((b, i) => ({ blows: b, penetration: pens[i] ?? 0 }))
    return sptFromIncrements(all.slice(0, row.seating), all.slice(row.seating))
  }
  const [seat = 0, first = 0, second = 0] = row.blows
  const p = row.penetration ?? null
  const test = p === null
    ? [{ blows: first, penetration: 150 }, { blows: second, penetration: 150 }]
    : p <= 150 ? [{ blows: first + second, penetration: p }] : [{ blows: first, penetration: 150 }, { blows: second, penetration: p - 150 }]
  return sptFromIncrements([{ blows: seat, penetration: 150 }], test)
}

/** An SPT as the API takes it: the written blows, or three counts per 150 mm with the test drive's penetration when it stopped short. */
export function sptFromInput(blows: string | readonly number[], penetration: number | null = null): SptParse {
  if (typeof blows === 'string') return parseSptBlows(blows)
  const [seat = 0, first = 0, second = 0] = blows
  return { ok: true, value: sptFromStored({ blows: [seat, first, second], n: first + second, penetration }) }
}
