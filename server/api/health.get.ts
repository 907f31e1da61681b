import { pendingMigrations } from '../database/migrator'

/** Liveness and readiness in one answer: the app's version, whether MariaDB answers, whether its schema is current. */
export default defineEventHandler(async (event) => {
  const version = useRuntimeConfig().public.appVersion
  try {
    const db = useDb()
    await db.authenticate()
    const pending = await pendingMigrations(db)
    const healthy = pending.length === 0
    if (!healthy) setResponseStatus(event, 503)
    return {
      status: healthy ? 'ok' : 'degraded',
      version,
      database: { reachable: true, migrationsCurrent: healthy, pendingMigrations: pending },
    }
  }
  catch (error) {
    console.error('[health] database check failed:', (error as Error).message)
    setResponseStatus(event, 503)
    setResponseHeader(event, 'Retry-After', DB_RETRY_AFTER_SECONDS)
    return {
      status: 'unavailable',
      version,
      message: 'The database is unreachable.',
      database: { reachable: false, migrationsCurrent: false, pendingMigrations: [] },
    }
  }
})
