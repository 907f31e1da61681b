// Delivers queued mail in the background: every few seconds, and straight after a commit that queued some.
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender) return
  const every = Number(useRuntimeConfig().mailPollMs) || 3000
  const timer = setInterval(() => { void deliverDueMail().catch(() => {}) }, every)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
