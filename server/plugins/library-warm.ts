/**
 * Reads and indexes the detail library right after start-up, so the first visitor's search does not wait the
 * second or more the build takes. It goes through a request of its own because the content is read with
 * queryCollection, which needs an event. A failure only logs: the first real search then builds the index.
 */
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender) return
  const timer = setTimeout(() => {
    const started = Date.now()
    nitroApp.localFetch('/api/library/search?q=warm&limit=1')
      .then((res) => {
        if (res.ok) console.info(`library: index ready in ${Date.now() - started} ms`)
        else console.error(`library: warm-up search answered ${res.status}`)
      })
      .catch(error => console.error('library: warm-up search failed', error))
  }, 0)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearTimeout(timer))
})
