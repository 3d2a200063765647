import { describe, expect, it } from 'vitest'
import { strongestVerdict } from '../../../shared/review/flags'
import { flaggedUnadoptedTests, type ListedTest } from '../../../app/utils/stressHistory'

const test = (id: string, depth: number, adopted: boolean): ListedTest => ({ id, depth, stratumCode: 'EST', point: { identifier: `BH-0${id.length}` }, sample: { identifier: `U-${id}` }, reading: { qualityClass: 'very-poor' }, adoption: adopted ? { id: `a-${id}` } : null })
const flag = (id: string, targetId: string, verdict: 'exclude' | 'questionable' | 'accepted', targetType = 'oedometer-test', status = 'open') => ({ id, targetId, targetType, verdict, comment: `comment ${id}`, author: 'Priya Natarajan', status })

describe('flagged oedometer tests without an adopted σ\'p (canvas marks)', () => {
  it('keeps only open test flags on tests with no adoption, grouped per test and shallowest first', () => {
    const tests = [test('deep', 12.4, false), test('adopted', 6, true), test('shallow', 5.1, false), test('unflagged', 7, false)]
    const flags = [
      flag('f1', 'deep', 'exclude'),
      flag('f2', 'adopted', 'exclude'),
      flag('f3', 'shallow', 'questionable'),
      flag('f4', 'deep', 'questionable'),
      flag('f5', 'unflagged', 'exclude', 'oedometer-test', 'resolved'),
      flag('f6', 'unflagged', 'exclude', 'log-interval'),
    ]
    const out = flaggedUnadoptedTests(tests, flags)
    expect(out.map(t => [t.testId, t.depth, t.flags.map(f => f.id)])).toEqual([['shallow', 5.1, ['f3']], ['deep', 12.4, ['f1', 'f4']]])
    expect(out[1]).toMatchObject({ pointIdentifier: 'BH-04', sampleIdentifier: 'U-deep', qualityClass: 'very-poor', stratumCode: 'EST' })
    expect(out[1]!.flags[0]).toEqual({ id: 'f1', verdict: 'exclude', comment: 'comment f1', author: 'Priya Natarajan', targetType: 'oedometer-test' })
    expect(strongestVerdict(out[1]!.flags.map(f => f.verdict))).toBe('exclude')
    expect(strongestVerdict(out[0]!.flags.map(f => f.verdict))).toBe('questionable')
  })
})
