// Queue API speed with 100,000 enquiries, against the same queries sent straight through the mariadb driver.
//   npx tsx bench/desk.ts [--runs 200]
// Uses its own database (perpend_bench), seeded once with `seed.ts --enquiries 100000`, and the built server.
import { execFileSync, spawn } from 'node:child_process'
import { createServer } from 'node:net'
import { performance } from 'node:perf_hooks'
import * as mariadb from 'mariadb'

const root = new URL('..', import.meta.url).pathname
const runs = Number(process.argv[process.argv.indexOf('--runs') + 1]) || 200
const env = { ...process.env, NUXT_DB_NAME: 'perpend_bench' }
const sh = (cmd: string) => execFileSync('bash', ['-c', `source scripts/env.sh && ${cmd}`], { cwd: root, env, stdio: ['ignore', 'pipe', 'inherit'] }).toString()

const db = {
  host: '127.0.0.1', port: Number(process.env.NUXT_DB_PORT || 3307), user: process.env.NUXT_DB_USER || 'perpend',
  password: process.env.NUXT_DB_PASSWORD || 'perpend-local', database: 'perpend_bench',
}

function percentile(sorted: number[], p: number) {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
  })
}

async function time(fn: () => Promise<unknown>) {
  for (let i = 0; i < 10; i++) await fn() // warm-up
  const samples: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    await fn()
    samples.push(performance.now() - t)
  }
  samples.sort((a, b) => a - b)
  return { p50: percentile(samples, 50), p95: percentile(samples, 95) }
}

sh('bash scripts/db.sh start >/dev/null')
const probe = await mariadb.createConnection({ ...db, database: undefined })
const [{ n: existing }] = await probe.query('SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ? AND table_name = ?', ['perpend_bench', 'enquiries']) as [{ n: bigint }]
await probe.end()
let count = 0
if (Number(existing)) {
  const c = await mariadb.createConnection(db)
  count = Number((await c.query('SELECT COUNT(*) AS n FROM enquiries'))[0].n)
  await c.end()
}
if (count < 100_000) {
  console.log('Seeding perpend_bench with 100,000 enquiries (about 40 s)…')
  sh('bash scripts/db.sh recreate perpend_bench && npx tsx scripts/migrate.ts && npx tsx scripts/seed.ts --enquiries 100000')
}
else sh('npx tsx scripts/migrate.ts')

const port = await freePort()
const server = spawn('node', ['.output/server/index.mjs'], { cwd: root, env: { ...env, PORT: String(port), HOST: '127.0.0.1', NUXT_SESSION_PASSWORD: 'b'.repeat(40), NUXT_MAIL_URL: 'smtp://127.0.0.1:1' }, stdio: 'ignore' })
const base = `http://127.0.0.1:${port}`
for (let i = 0; i < 100; i++) {
  try { if ((await fetch(`${base}/api/health`)).ok) break }
  catch { /* not up yet */ }
  await new Promise(r => setTimeout(r, 200))
}
const signIn = await fetch(`${base}/api/auth/sign-in`, {
  method: 'POST', headers: { 'content-type': 'application/json', 'origin': base },
  body: JSON.stringify({ email: 'officer@corrstone.example', password: 'corrstone-demo-2026' }),
})
const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!
const me = (await (await fetch(`${base}/api/auth/me`, { headers: { cookie } })).json()).user.id as number

const pool = mariadb.createPool({ ...db, connectionLimit: 5 })
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
    sql: [`${select} WHERE e.merged_into_id IS NULL AND e.assignee_id = ${me} AND e.topic IN ('wind') AND MATCH (e.subject, e.question, e.requester_name, e.requester_organisation) AGAINST ('+anchor*' IN BOOLEAN MODE) ORDER BY e.received_at DESC, e.id DESC LIMIT 25`,
      `SELECT status, COUNT(id) FROM enquiries e WHERE e.merged_into_id IS NULL AND e.assignee_id = ${me} AND e.topic IN ('wind') AND MATCH (e.subject, e.question, e.requester_name, e.requester_organisation) AGAINST ('+anchor*' IN BOOLEAN MODE) GROUP BY status`],
  },
]

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
  console.log('\nGoal: API p95 under 50 ms and within 3× of the direct query.')
}
finally {
  server.kill()
  await pool.end()
}
