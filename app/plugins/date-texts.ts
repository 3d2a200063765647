import { providePageDateTexts, rememberViewerZone, validZone, VIEWER_ZONE_COOKIE } from '~/utils/dates'

/**
 * Dates rendered by the server travel with the page (see app/utils/dates.ts): on the server the viewer's zone
 * comes from the `pastload_tz` cookie and every date text is kept in the payload; in the browser, while the
 * page hydrates, formatDate reads them back instead of loading the locale's calendar data.
 */
export default defineNuxtPlugin((nuxtApp) => {
  if (import.meta.server) nuxtApp.payload.viewerZone = validZone(useCookie(VIEWER_ZONE_COOKIE).value)
  // A page the server wrote without the viewer's zone (the first after signing in on the sign-in page, which has no
  // scripts): the zone is kept once the page is up, and the next pages come with their dates in it.
  else if (typeof nuxtApp.payload.viewerZone !== 'string') onNuxtReady(rememberViewerZone)
  providePageDateTexts(() => {
    const app = tryUseNuxtApp()
    if (!app) return null
    if (import.meta.server) {
      // Without the viewer's zone the server formats as it always did and sends no texts.
      const zone = app.payload.viewerZone
      if (typeof zone !== 'string') return null
      const texts = (app.payload.dateTexts ??= {}) as Record<string, string>
      return { zone, texts, recording: true }
    }
    if (!app.isHydrating || typeof app.payload.viewerZone !== 'string') return null
    return { zone: app.payload.viewerZone, texts: (app.payload.dateTexts ?? {}) as Record<string, string>, recording: false }
  })
})
