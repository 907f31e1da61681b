import type { H3Error } from 'h3'

/**
 * One place for what every route answers while MariaDB is down: 503, Retry-After and a plain message.
 * Nitro calls the `error` hooks synchronously just before its error handler renders the response, so
 * reshaping the error here is what the caller gets. The pool reconnects on its own once MariaDB is back:
 * Sequelize validates each pooled connection before handing it out and opens new ones as needed.
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error, { event }) => {
    const failure = event ? databaseFailure(error) : null
    if (event && failure) answerAsDatabaseOutage(error as H3Error, event, failure)
  })
})
