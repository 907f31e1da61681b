// Sweeps for waiting-on-you reminders every NUXT_REMINDER_SWEEP_MS (5 minutes by default; 0 turns it off).
export default defineNitroPlugin((nitroApp) => {
  if (import.meta.prerender) return
  const every = Number(useRuntimeConfig().reminderSweepMs)
  if (!Number.isFinite(every) || every <= 0) return
  const timer = setInterval(() => {
    void sendDueReminders().catch(error => console.error('reminders: sweep failed', error))
  }, every)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
