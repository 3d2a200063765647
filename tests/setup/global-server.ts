// Starts one built Pastload server (.output) against the test database for a
// test project (api or e2e) and hands its URL to the tests via `inject('baseUrl')`.
// `npm test` builds the app and starts the test PostgreSQL first (scripts/test.mjs).
import type { TestProject } from 'vitest/node'
import { startServer } from '../helpers/server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

export default async function setup(project: TestProject) {
  const server = await startServer()
  project.provide('baseUrl', server.url)
  return () => server.stop()
}
