/**
 * Marks the page (`data-hydrated` on `<html>`) once the app has taken over what the server sent: until then a
 * control on it shows but does nothing (the page is painted before it is hydrated, `paint-first.client.ts`).
 * The browser tests wait for the mark before they use a control of a page the server rendered.
 */
export default defineNuxtPlugin({
  name: 'hydrated-mark',
  setup(nuxtApp) {
    nuxtApp.hooks.hookOnce('app:suspense:resolve', () => {
      document.documentElement.dataset.hydrated = ''
    })
  },
})
