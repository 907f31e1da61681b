/**
 * Re-reads the signed-in person on every API call and page request that carries a session, so that a
 * deactivated account loses its session on its very next request (currentCaller clears the cookie).
 */
export default defineEventHandler(async (event) => {
  if (event.path.startsWith('/_nuxt/') || event.path.startsWith('/__nuxt')) return
  const cookieName = useRuntimeConfig().session?.name || 'nuxt-session'
  if (!getCookie(event, cookieName)) return
  try {
    await currentCaller(event)
  }
  catch (error) {
    // A database outage must not take down public pages; API routes report it themselves.
    if (event.path.startsWith('/api/')) throw error
  }
})
