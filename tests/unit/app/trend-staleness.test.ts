import { describe, expect, it } from 'vitest'
import { trendStaleness, type DisplayFitState } from '../../../app/utils/stressHistory'

// A saved POP trend of the soft clay (invented values of the demo site's kind): POP 18 kPa from five points.
const saved = { includedPointIds: ['oed:1', 'oed:2', 'cpt:3', 'cpt:4', 'vane:5'], parameters: { pop: 18 } }
const today = ['cpt:4', 'oed:1', 'vane:5', 'oed:2', 'cpt:3']
const fit = (key: string, pop: number | null, pending = false): DisplayFitState => ({ key, answer: pop === null ? null : { parameters: { pop } }, pending })

describe('a saved trend against today\'s points (the fit panel\'s stale note)', () => {
  it('is not stale when today\'s refit of the same points lands within 0.05 of each parameter', () => {
    expect(trendStaleness(saved, today, fit('k2', 18.04), 'k2')).toEqual({ ids: false, parameters: false })
  })

  it('reads σ\'v0 as changed when a settled refit of today\'s inputs moves a parameter by more than 0.05', () => {
    expect(trendStaleness(saved, today, fit('k2', 18.2), 'k2')).toEqual({ ids: false, parameters: true })
    expect(trendStaleness(saved, today, fit('k2', 17.9), 'k2')).toEqual({ ids: false, parameters: true })
  })

  it('says nothing of the parameters while the refit of today\'s inputs is pending, whatever the answer on hand', () => {
    // The answer on hand is an earlier ask's (fewer points, say): it is no evidence against the saved trend.
    expect(trendStaleness(saved, today, fit('k2', 12.5, true), 'k2')).toEqual({ ids: false, parameters: false })
  })

  it('says nothing of the parameters when the answer on hand was asked with other inputs, or there is none', () => {
    expect(trendStaleness(saved, today, fit('k1', 12.5), 'k2')).toEqual({ ids: false, parameters: false })
    expect(trendStaleness(saved, today, fit('k2', null), 'k2')).toEqual({ ids: false, parameters: false })
    expect(trendStaleness(saved, today, undefined, 'k2')).toEqual({ ids: false, parameters: false })
  })

  it('reads the points as changed when one is added, dropped or swapped, in any order', () => {
    expect(trendStaleness(saved, [...today, 'oed:6'], fit('k2', 18), 'k2').ids).toBe(true)
    expect(trendStaleness(saved, today.slice(1), fit('k2', 18), 'k2').ids).toBe(true)
    expect(trendStaleness(saved, ['oed:1', 'oed:2', 'cpt:3', 'cpt:4', 'vane:9'], fit('k2', 18), 'k2').ids).toBe(true)
  })

  it('compares only the parameters both share, with a tolerance relative to large values', () => {
    const linear = { includedPointIds: ['a'], parameters: { top: 40_000, gradient: 1.5 } }
    // 40 000 kPa·1e-6 = 0.04 + 0.05: a difference of 0.08 is inside, 0.1 outside.
    expect(trendStaleness(linear, ['a'], { key: 'k', answer: { parameters: { top: 40_000.08, gradient: 1.5, extra: 9 } }, pending: false }, 'k').parameters).toBe(false)
    expect(trendStaleness(linear, ['a'], { key: 'k', answer: { parameters: { top: 40_000.1, gradient: 1.5 } }, pending: false }, 'k').parameters).toBe(true)
  })
})
