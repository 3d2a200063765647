import { signInFromForm } from '~~/server/services/sign-in'

/**
 * The sign-in page's form, sent by the browser itself (`application/x-www-form-urlencoded`; the page has no
 * scripts): 303 to the form's `next` once signed in, or back to the sign-in page saying what went wrong. The
 * fields are checked by the service with the JSON route's schema; an unreadable body is the same as an empty one.
 */
export default defineEventHandler(async (event) => {
  const form: unknown = await readBody(event).catch((err: unknown) => {
    if (isError(err) && err.statusCode === 413) throw err
    return null
  })
  return sendRedirect(event, await signInFromForm(event, form), 303)
})
