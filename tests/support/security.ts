import { readdirSync, statSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { QueryTypes } from 'sequelize'
import { expect } from 'vitest'
import { testDb } from './db'
import { matrix } from './routes'
import type { Who } from './routes'

/**
 * What an answer to hostile input must never show: a stack frame, a path on the server, a module name, or
 * the SQL and driver errors behind it. (Sequelize writes MariaDB identifiers in backticks; the hostile
 * payloads never contain one, so generated SQL echoed back is told apart from a payload echoed back.)
 */
const leaks: [string, RegExp][] = [
  ['a stack frame', /\bat (?:async )?[\w.<>$[\]]+ \(?(?:file:|\/|node:)[^)\s]*:\d+:\d+\)?/],
  ['a file path of the server', /(?:\/work\/|\/\.output\/|\/server\/(?:api|utils|models)\/|file:\/\/\/)/],
  ['node_modules', /node_modules/],
  ['a stack property', /"stack"\s*:/],
  ['generated SQL', /\b(?:SELECT|INSERT INTO|UPDATE|DELETE FROM)\b[^\n]{0,200}`/i],
  ['a database error', /sqlMessage|\bER_[A-Z_]{3,}\b|SQLSTATE|SQL syntax|Sequelize\w*Error|\bsqlState\b/i],
]

/** Fails when a response body shows any of the leaks above. */
export function expectNoLeak(body: unknown, context: string) {
  const text = typeof body === 'string' ? body : JSON.stringify(body)
  for (const [what, pattern] of leaks) {
    expect(pattern.test(text), `${context}: the answer shows ${what}: ${text.slice(0, 400)}`).toBe(false)
  }
}

// The outbox worker retries due mail in the background (its rows change while we look); the rest only change
// when a request writes.
const COUNTED_ONLY = new Set(['outbox_messages'])

/** Row count of every table, and MariaDB's live checksum of all but the outbox: any write changes one. */
export async function databaseState(): Promise<Record<string, string>> {
  const tables = (await testDb().query<{ name: string }>(
    `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> 'sequelize_meta' ORDER BY table_name`,
    { type: QueryTypes.SELECT },
  )).map(t => t.name)
  const state: Record<string, string> = {}
  for (const table of tables) {
    const [count] = await testDb().query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${table}\``, { type: QueryTypes.SELECT })
    state[`${table} rows`] = String(count!.n)
    if (COUNTED_ONLY.has(table)) continue
    const [sum] = await testDb().query<{ Checksum: string | null }>(`CHECKSUM TABLE \`${table}\``, { type: QueryTypes.SELECT })
    state[`${table} checksum`] = String(sum!.Checksum)
  }
  return state
}

export const uploadRoot = () => resolve(process.env.NUXT_UPLOAD_DIR ?? 'var/uploads')

/** Every file and folder under the upload store, temporary folders included, as paths relative to it. */
export function uploadEntries(dir = uploadRoot(), prefix = ''): string[] {
  let names: string[]
  try { names = readdirSync(dir) }
  catch { return [] }
  return names.flatMap((name) => {
    const full = join(dir, name)
    const rel = `${prefix}${name}`
    return statSync(full).isDirectory() ? [`${rel}/`, ...uploadEntries(full, `${rel}/`)] : [rel]
  })
}

/**
 * The least-privileged caller who gets past a route's access check, by the access matrix: the one whose
 * empty body is answered 400 (or, for routes that read no body, whatever the route's own answer is).
 */
const reachOrder: Who[] = ['anon', 'specA', 'officer', 'manager', 'admin']
export function reachingCaller(key: string): Who {
  const expected = matrix[key]!.expect
  return reachOrder.find(w => expected[w] === 400)
    ?? reachOrder.find(w => expected[w] !== 401 && expected[w] !== 403)
    ?? 'anon'
}

/** Nested arrays (or objects) `depth` deep, as JSON text. */
export const deepArrays = (depth: number) => `${'['.repeat(depth)}${']'.repeat(depth)}`
export const deepObjects = (depth: number) => `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`
