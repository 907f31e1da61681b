// Queue API speed with 100,000 enquiries, against the same queries sent straight through the mariadb driver.
//   npx tsx bench/desk.ts [--runs 200]
// Uses its own database (perpend_bench), seeded once with `seed.ts --enquiries 100000`, and the built server.
import * as mariadb from 'mariadb'
import { benchDb, ensureBenchData, runsFromArgs, startBenchServer, time as timeRuns } from './support'

const runs = runsFromArgs(200)
const time = (fn: () => Promise<unknown>) => timeRuns(fn, runs)
const count = await ensureBenchData()
const { base, cookie, stop } = await startBenchServer('officer@corrstone.example')
const me = (await (await fetch(`${base}/api/auth/me`, { headers: { cookie } })).json()).user.id as number

const pool = mariadb.createPool({ ...benchDb, connectionLimit: 5 })
const select = `SELECT e.*, a.id AS a_id, a.name AS a_name, o.name AS o_name, p.name AS p_name FROM enquiries e
  LEFT JOIN users a ON a.id = e.assignee_id LEFT JOIN organisations o ON o.id = e.organisation_id LEFT JOIN projects p ON p.id = e.project_id`
const cases = [
  {
    name: 'newest first, all statuses',
    api: '/api/enquiries?pageSize=25',
    sql: [`${select} WHERE e.merged_into_id IS NULL ORDER BY e.received_at DESC, e.id DESC LIMIT 25`,
      'SELECT status, COUNT(id) FROM enquiries WHERE merged_into_id IS NULL GROUP BY status'],
  },
  {
    name: 'open work by due time',
    api: '/api/enquiries?status=received&status=triaged&status=in_hand&status=reopened&sort=due-asc&pageSize=25',
    sql: [`${select} WHERE e.merged_into_id IS NULL AND e.status IN ('received','triaged','in_hand','reopened') ORDER BY e.next_due_at IS NULL, e.next_due_at, e.id LIMIT 25`,
      'SELECT status, COUNT(id) FROM enquiries WHERE merged_into_id IS NULL GROUP BY status'],
  },
  {
    name: 'mine, wind topic, free text',
    api: '/api/enquiries?assignee=me&topic=wind&q=anchor&pageSize=25',
    sql: [`${select} WHERE e.merged_into_id IS NULL AND e.assignee_id = ${me} AND e.topic IN ('wind') AND ${match('+anchor*', true)} ORDER BY e.received_at DESC, e.id DESC LIMIT 25`,
      `SELECT status, COUNT(id) FROM enquiries e WHERE e.merged_into_id IS NULL AND e.assignee_id = ${me} AND e.topic IN ('wind') AND ${match('+anchor*', true)} GROUP BY status`],
  },
]

/**
 * The queue's free-text test. With other filters it is wrapped (`IS TRUE`) so that MariaDB reads the rows
 * those filters pick and tests each against the one full-text search, rather than reading every row the
 * words match; bare, it is the access path itself.
 */
function match(expr: string, narrowed: boolean): string {
  const m = `MATCH (e.subject, e.question, e.requester_name, e.requester_organisation) AGAINST ('${expr}' IN BOOLEAN MODE)`
  return narrowed ? `(${m}) IS TRUE` : m
}

/** Both forms of the text test must pick the very same rows, whatever the words and filters. */
async function checkSameRows(): Promise<string> {
  const words = ['+anchor*', '+anchor', '+wind*', '+bulk*', '+demo* +anchor*', '+condensation*', '+lintel* +block*', '+sd*', '+zz*', '+the*', '+for*']
  const narrowings = [`e.assignee_id = ${me}`, `e.assignee_id = ${me} AND e.topic IN ('wind')`, `e.topic IN ('thermal')`, 'e.assignee_id IS NULL', 'e.organisation_id = (SELECT MIN(id) FROM organisations)']
  let compared = 0
  for (const w of words) {
    for (const n of narrowings) {
      const ids = async (narrowed: boolean) => (await pool.query(`SELECT e.id FROM enquiries e WHERE e.merged_into_id IS NULL AND ${n} AND ${match(w, narrowed)} ORDER BY e.id`) as { id: number }[]).map(r => r.id).join(',')
      const [bare, wrapped] = await Promise.all([ids(false), ids(true)])
      if (bare !== wrapped) throw new Error(`The two forms differ for ${w} where ${n}`)
      compared += 1
    }
  }
  return `${compared} word/filter combinations, identical rows`
}

console.log(`\nQueue API over ${count || 100_000} enquiries, ${runs} sequential requests per case (ms)\n`)
console.log('case'.padEnd(32), 'api p50'.padStart(8), 'api p95'.padStart(8), 'sql p50'.padStart(8), 'sql p95'.padStart(8), 'p95 ratio'.padStart(10))
try {
  for (const c of cases) {
    const api = await time(async () => {
      const res = await fetch(`${base}${c.api}`, { headers: { cookie } })
      if (!res.ok) throw new Error(`${c.api} answered ${res.status}`)
      await res.json()
    })
    const sql = await time(() => Promise.all(c.sql.map(q => pool.query(q))))
    console.log(c.name.padEnd(32), api.p50.toFixed(1).padStart(8), api.p95.toFixed(1).padStart(8), sql.p50.toFixed(1).padStart(8), sql.p95.toFixed(1).padStart(8), `${(api.p95 / sql.p95).toFixed(2)}×`.padStart(10))
  }
  const bare = await time(() => Promise.all(cases[2]!.sql.map(q => pool.query(q.replaceAll(match('+anchor*', true), match('+anchor*', false))))))
  console.log('  (the same two queries with the bare MATCH, as sent before:'.padEnd(32), `sql p50 ${bare.p50.toFixed(1)}, p95 ${bare.p95.toFixed(1)})`)
  console.log(`\nText test, wrapped against bare: ${await checkSameRows()}.`)
  console.log('\nGoal: API p95 under 50 ms and within 3× of the direct query.')
}
finally {
  stop()
  await pool.end()
}
