import { buildOpenApiDocument } from '../services/openapi'

let cached: ReturnType<typeof buildOpenApiDocument> | undefined

/** The OpenAPI 3.1 document of the compute API (public, no sign-in needed). */
export default defineEventHandler(() => {
  cached ??= buildOpenApiDocument()
  return cached
})
