// The AGS4 conformance tests skip themselves on a clone without the reference files;
// under CI=true that must fail the run instead, so a green CI means they ran.
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { hasReference, REFERENCE_DIR } from './reference'

describe('the AGS4 reference files', () => {
  it('are present when the suite runs under CI=true', () => {
    const ci = process.env.CI === 'true'
    const message = `${REFERENCE_DIR} is absent: under CI=true the AGS4 conformance tests must run (set PASTLOAD_AGS4_REFERENCE_DIR or place the reference files there)`
    expect(ci && !hasReference, message).toBe(false)
    if (ci) {
      // The files the conformance tests read, not only the folder.
      expect(existsSync(resolve(REFERENCE_DIR, 'rules')), message).toBe(true)
    }
  })
})
