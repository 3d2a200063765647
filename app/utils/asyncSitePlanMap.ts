import SitePlanPlaceholder from '~/components/plan/SitePlanPlaceholder.vue'

/**
 * The site plan's drawing (D3) as an async component in a chunk of its own, loaded after the page's first paint, its
 * room held by `SitePlanPlaceholder` (`height()` px, the placeholder's default when undefined) from the server's page
 * until the chunk has come. Not suspensible: inside a page's resolved Suspense it would otherwise draw nothing, not
 * the placeholder, while its chunk loads.
 */
export function asyncSitePlanMap(height: () => number | undefined = () => undefined) {
  return defineAsyncComponent({
    loader: () => import('~/components/plan/SitePlanMap.vue'),
    loadingComponent: defineComponent(() => () => h(SitePlanPlaceholder, { height: height() })),
    delay: 0,
    suspensible: false,
  })
}
