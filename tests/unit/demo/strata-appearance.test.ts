import { describe, expect, it } from 'vitest'
import {
  FALLBACK_APPEARANCE,
  STRATUM_COLOURS,
  STRATUM_COLOUR_KEYS,
  STRATUM_PATTERNS,
  STRATUM_PATTERN_KEYS,
  defaultAppearanceFor,
  isStratumColourKey,
  isStratumPatternKey,
  stratumColour,
  stratumPattern,
} from '../../../shared/strata/appearance'
import { USCS_GROUP_SYMBOLS, isUscsGroupSymbol, uscsFamily } from '../../../shared/strata/uscs'

/** Relative luminance (WCAG 2), to check the palette stays muted and the inks contrast with their fills. */
function luminance(hex: string): number {
  const v = Number.parseInt(hex.slice(1), 16)
  const lin = (c: number): number => {
    const s = c / 255
    return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4
  }
  return 0.2126 * lin((v >> 16) & 0xff) + 0.7152 * lin((v >> 8) & 0xff) + 0.0722 * lin(v & 0xff)
}

function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number]
  return (hi + 0.05) / (lo + 0.05)
}

describe('stratum palette', () => {
  it('has about ten named colours with unique keys and #rrggbb values', () => {
    expect(STRATUM_COLOURS.length).toBeGreaterThanOrEqual(10)
    expect(STRATUM_COLOURS.map(c => c.key)).toEqual([...STRATUM_COLOUR_KEYS])
    expect(new Set(STRATUM_COLOURS.map(c => c.hex)).size).toBe(STRATUM_COLOURS.length)
    for (const c of STRATUM_COLOURS) {
      expect(c.hex).toMatch(/^#[0-9a-f]{6}$/)
      expect(c.ink).toMatch(/^#[0-9a-f]{6}$/)
      expect(c.label.length).toBeGreaterThan(3)
    }
  })

  it('is muted: no near-white or near-black fills, no saturated primaries; black text stays readable', () => {
    for (const c of STRATUM_COLOURS) {
      const v = Number.parseInt(c.hex.slice(1), 16)
      const channels = [(v >> 16) & 0xff, (v >> 8) & 0xff, v & 0xff]
      expect(Math.max(...channels) - Math.min(...channels), c.key).toBeLessThan(110)
      expect(luminance(c.hex), c.key).toBeGreaterThan(0.08)
      expect(luminance(c.hex), c.key).toBeLessThan(0.7)
      expect(contrast(c.hex, c.ink), c.key).toBeGreaterThan(2.5)
    }
  })

  it('keeps greyscale copies apart: most fills differ in luminance from their neighbours in the list', () => {
    const sorted = STRATUM_COLOURS.map(c => luminance(c.hex)).sort((a, b) => a - b)
    const distinct = sorted.filter((l, i) => i === 0 || l - sorted[i - 1]! > 0.005).length
    expect(distinct).toBeGreaterThanOrEqual(STRATUM_COLOURS.length - 2)
  })
})

describe('stratum patterns', () => {
  it('has the product\'s patterns with unique keys, labels and positive tile sizes', () => {
    expect(STRATUM_PATTERNS.map(p => p.key)).toEqual([...STRATUM_PATTERN_KEYS])
    for (const key of ['made-ground', 'clay', 'silt', 'sand', 'gravel', 'peat', 'organic-clay', 'rock'] as const) expect(isStratumPatternKey(key)).toBe(true)
    for (const p of STRATUM_PATTERNS) {
      expect(p.size).toBeGreaterThan(0)
      expect(p.label.length).toBeGreaterThan(2)
    }
  })

  it('tiles hold only <path>/<circle> marks in currentColor, with no fixed colours or scripts', () => {
    for (const p of STRATUM_PATTERNS) {
      if (p.key === 'plain') {
        expect(p.svg).toBe('')
        continue
      }
      const elements = p.svg.match(/<[a-z]+/g) ?? []
      expect(elements.length, p.key).toBeGreaterThan(0)
      for (const e of elements) expect(['<path', '<circle']).toContain(e)
      expect(p.svg).not.toMatch(/#[0-9a-f]{3,6}|rgb\(|script|href/i)
      expect(p.svg).toContain('currentColor')
      // Every element closes itself.
      expect((p.svg.match(/\/>/g) ?? []).length).toBe(elements.length)
    }
  })

  it('keeps circles inside the tile, so tiles join without clipped marks', () => {
    for (const p of STRATUM_PATTERNS) {
      for (const m of p.svg.matchAll(/<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"/g)) {
        const [cx, cy, r] = [Number(m[1]), Number(m[2]), Number(m[3])]
        expect(cx - r, p.key).toBeGreaterThanOrEqual(0)
        expect(cy - r, p.key).toBeGreaterThanOrEqual(0)
        expect(cx + r, p.key).toBeLessThanOrEqual(p.size)
        expect(cy + r, p.key).toBeLessThanOrEqual(p.size)
      }
    }
  })

  it('looks up colours and patterns by key and rejects unknown keys', () => {
    expect(stratumColour('clay-grey')?.hex).toMatch(/^#/)
    expect(stratumColour('no-such-colour')).toBeUndefined()
    expect(stratumPattern('peat')?.key).toBe('peat')
    expect(stratumPattern('no-such-pattern')).toBeUndefined()
    expect(isStratumColourKey('fill-ochre')).toBe(true)
    expect(isStratumColourKey('FILL-OCHRE')).toBe(false)
  })
})

describe('USCS symbols and default appearance', () => {
  it('knows the group symbols, ignores case and spaces, rejects others', () => {
    expect(USCS_GROUP_SYMBOLS).toContain('CH')
    expect(USCS_GROUP_SYMBOLS).toContain('SP-SM')
    expect(isUscsGroupSymbol(' ch ')).toBe(true)
    for (const bad of ['', 'HC', 'CI', 'C', 'CH-OH', 'GRAVEL']) expect(isUscsGroupSymbol(bad), bad).toBe(false)
    expect(uscsFamily('GW-GC')).toBe('gravel')
    expect(uscsFamily('PT')).toBe('peat')
    expect(uscsFamily('XX')).toBeNull()
  })

  it('suggests a colour and pattern per soil family, dual symbols by their first half', () => {
    expect(defaultAppearanceFor('GW')).toEqual({ colour: 'gravel-rust', pattern: 'gravel' })
    expect(defaultAppearanceFor('SP-SM')).toEqual({ colour: 'sand-straw', pattern: 'sand' })
    expect(defaultAppearanceFor('ML')).toEqual({ colour: 'silt-sage', pattern: 'silt' })
    expect(defaultAppearanceFor('ch')).toEqual({ colour: 'clay-grey', pattern: 'clay' })
    expect(defaultAppearanceFor('OH')).toEqual({ colour: 'organic-olive', pattern: 'organic-clay' })
    expect(defaultAppearanceFor('PT')).toEqual({ colour: 'peat-brown', pattern: 'peat' })
  })

  it('every valid symbol maps to palette and pattern keys; unknown symbols get the neutral fallback', () => {
    for (const s of USCS_GROUP_SYMBOLS) {
      const a = defaultAppearanceFor(s)
      expect(isStratumColourKey(a.colour)).toBe(true)
      expect(isStratumPatternKey(a.pattern)).toBe(true)
      expect(a).not.toEqual(FALLBACK_APPEARANCE)
    }
    expect(defaultAppearanceFor('fill')).toEqual(FALLBACK_APPEARANCE)
    expect(defaultAppearanceFor('')).toEqual(FALLBACK_APPEARANCE)
  })
})
