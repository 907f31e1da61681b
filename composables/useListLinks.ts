/**
 * Links in long lists (the library's results, the desk's queue) are plain `<a href>` elements with one
 * listener on the list, instead of a router link component per row. Each router link sets itself up when the
 * page hydrates (it resolves its route and watches for a pointer to prefetch): in a profile of the library
 * page at Lighthouse's 4× CPU slowdown, the router link's own code took 40–45 ms of the load, before the
 * route resolving it asks of the router. The list keeps what those links
 * gave: a plain left click moves within the app; a click with a modifier key, a middle click or a link to
 * another site is left to the browser; the page a row leads to is fetched when a pointer or focus first
 * enters the list.
 *
 *   const { follow, prefetch } = useListLinks('/library/sample')
 *   <ol @click="follow" @pointerover.once="prefetch" @focusin.once="prefetch">
 */
export function useListLinks(samplePath: string | (() => string | undefined)) {
  const router = useRouter()

  function follow(event: MouseEvent) {
    if (event.defaultPrevented || event.button !== 0 || event.metaKey || event.ctrlKey || event.shiftKey || event.altKey) return
    const link = (event.target as Element | null)?.closest?.('a')
    if (!link || (link.target && link.target !== '_self') || link.hasAttribute('download')) return
    const url = new URL(link.href, window.location.href)
    if (url.origin !== window.location.origin) return
    // Only a page of the app moves within it; a file (a PDF under /api/, say) is the browser's to open.
    const path = url.pathname + url.search + url.hash
    if (!router.resolve(path).matched.length) return
    event.preventDefault()
    void navigateTo(path)
  }

  function prefetch() {
    const path = typeof samplePath === 'function' ? samplePath() : samplePath
    if (path) void preloadRouteComponents(path)
  }

  return { follow, prefetch }
}
