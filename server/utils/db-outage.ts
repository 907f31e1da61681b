import type { H3Error, H3Event } from 'h3'

/**
 * Telling "MariaDB is not there" apart from every other failure, so that an outage answers 503 with a
 * message a person understands instead of a bare 500. Sequelize wraps the driver's error once or twice
 * (`parent`, `original`) and h3 wraps it again (`cause`), so the whole chain is looked at.
 */

const OUTAGE_ERROR_NAMES = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionAcquireTimeoutError',
  'SequelizeConnectionTimedOutError',
  'SequelizeHostNotFoundError',
  'SequelizeHostNotReachableError',
])

// Codes of the mariadb driver and of Node's sockets seen when the server is stopped, restarted or cut off.
const OUTAGE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH',
  'ER_GET_CONNECTION_TIMEOUT', 'ER_CONNECTION_TIMEOUT', 'ER_SOCKET_UNEXPECTED_CLOSE',
  'ER_CONNECTION_ALREADY_CLOSED', 'ER_CLOSING_POOL', 'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED',
  'ER_CMD_CONNECTION_CLOSED', 'ER_SOCKET_TIMEOUT', 'ER_POOL_ALREADY_CLOSED',
])

/** Seconds a client is asked to wait before trying again; a restart of MariaDB takes a few. */
export const DB_RETRY_AFTER_SECONDS = 30

interface ErrorLike { name?: unknown, code?: unknown, sqlState?: unknown, cause?: unknown, parent?: unknown, original?: unknown }

/** Waiting too long for a pooled connection: MariaDB may be up but overloaded, so the message says only that it did not answer. */
const TIMEOUT_NAMES = new Set(['SequelizeConnectionAcquireTimeoutError', 'SequelizeConnectionTimedOutError'])
const TIMEOUT_CODES = new Set(['ER_GET_CONNECTION_TIMEOUT', 'ER_CONNECTION_TIMEOUT', 'ETIMEDOUT', 'ER_SOCKET_TIMEOUT'])

export type DatabaseFailure = 'unreachable' | 'timeout'

export function isDatabaseOutage(error: unknown): boolean {
  return databaseFailure(error) !== null
}

export function databaseFailure(error: unknown): DatabaseFailure | null {
  const seen = new Set<unknown>()
  let fromDatabase = false
  const queue: unknown[] = [error]
  while (queue.length && seen.size < 12) {
    const e = queue.shift() as ErrorLike | null | undefined
    if (!e || typeof e !== 'object' || seen.has(e)) continue
    seen.add(e)
    const name = typeof e.name === 'string' ? e.name : ''
    if (OUTAGE_ERROR_NAMES.has(name)) return TIMEOUT_NAMES.has(name) ? 'timeout' : 'unreachable'
    // A socket code alone could come from the mail server or an outside call: count it only in the database's chain.
    if (name.startsWith('Sequelize') || e.sqlState !== undefined) fromDatabase = true
    if (fromDatabase && typeof e.code === 'string' && OUTAGE_CODES.has(e.code)) return TIMEOUT_CODES.has(e.code) ? 'timeout' : 'unreachable'
    queue.push(e.parent, e.original, e.cause)
  }
  return null
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

export function databaseOutageMessage(method: string, failure: DatabaseFailure = 'unreachable'): string {
  const what = failure === 'timeout' ? 'The database did not answer in time' : 'The database is not reachable just now'
  return SAFE_METHODS.has(method.toUpperCase())
    ? `${what}. Try again in a minute.`
    : `${what}; nothing was saved. Try again in a minute.`
}

let lastLogged = 0

/**
 * Turns the error h3 is about to answer with into a 503 "database unavailable". Writes run in transactions,
 * so a request cut off by the outage has been rolled back and "nothing was saved" is true.
 */
export function answerAsDatabaseOutage(error: H3Error, event: H3Event, failure: DatabaseFailure): void {
  error.statusCode = 503
  error.statusMessage = 'Database unavailable'
  error.message = databaseOutageMessage(event.method, failure)
  error.data = { retryAfterSeconds: DB_RETRY_AFTER_SECONDS }
  // An expected condition, not a bug: no stack trace per request, one line every ten seconds at most.
  error.unhandled = false
  setResponseHeader(event, 'Retry-After', DB_RETRY_AFTER_SECONDS)
  setResponseHeader(event, 'Cache-Control', 'no-store')
  const now = Date.now()
  if (now - lastLogged > 10_000) {
    lastLogged = now
    const cause = (error.cause as Error | undefined)?.message ?? error.message
    console.warn(`[db] database ${failure === 'timeout' ? 'not answering in time' : 'unreachable'}, answering 503: ${cause}`)
  }
}
