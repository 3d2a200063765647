/**
 * The server-rendered page is painted before the app takes it over: hydrating a page is one long piece of
 * work (hundreds of milliseconds on a phone) during which the browser cannot paint, so without this pause the
 * page the server sent stays blank until hydration ends. The app waits for the next frame to be painted (or
 * 100 ms at most, for a page opened in a background tab, where frames do not come), then hydrates.
 */
export default defineNuxtPlugin({
  name: 'paint-first',
  enforce: 'post',
  async setup() {
    await new Promise<void>((resolve) => {
      const timer = setTimeout(resolve, 100)
      requestAnimationFrame(() => setTimeout(() => { clearTimeout(timer); resolve() }, 0))
    })
  },
})
