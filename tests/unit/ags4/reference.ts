/**
 * Where the AGS4 reference files live for the tests: ../shared/ags4/ beside
 * the project (see its README.md: test data and standard dictionaries of the
 * AGS Data Format Working Group's reference library, used read-only), or the
 * folder PASTLOAD_AGS4_REFERENCE_DIR names. A clone without that folder skips
 * these tests and says so; under CI=true reference-present.test.ts fails instead.
 */
import { existsSync, readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { decodeAgs } from '../../../shared/ags4/parse'

export const REFERENCE_DIR = process.env.PASTLOAD_AGS4_REFERENCE_DIR
  ? resolve(process.env.PASTLOAD_AGS4_REFERENCE_DIR)
  : resolve(import.meta.dirname, '../../../../shared/ags4')
export const hasReference = existsSync(REFERENCE_DIR)

/** Says once, in the test output, why the reference-file tests did not run. */
export function noteIfMissing(what: string): void {
  if (!hasReference) console.warn(`[ags4] ${REFERENCE_DIR} is absent: ${what} skipped (see the reference files' README)`)
}

/** A reference file decoded as an upload would be (UTF-8, else Windows-1252). */
export function readReference(relativePath: string): string {
  return decodeAgs(readFileSync(resolve(REFERENCE_DIR, relativePath)))
}

/** Defers a read to the first test that needs it, so a skipped suite (folder absent) never touches the disk. */
export function lazy<T>(make: () => T): () => T {
  let value: { v: T } | null = null
  return () => {
    value ??= { v: make() }
    return value.v
  }
}
