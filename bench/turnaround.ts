// Speed of the manager's turnaround API over 100,000 enquiries.
//   npx tsx bench/turnaround.ts [--runs 100]
// Uses perpend_bench (seeded once with `seed.ts --enquiries 100000`, as bench/desk.ts does) and the built server.
import { execFileSync, spawn } from 'node:child_process'
import { createServer } from 'node:net'
import { performance } from 'node:perf_hooks'
import * as mariadb from 'mariadb'

const root = new URL('..', import.meta.url).pathname
const runs = Number(process.argv[process.argv.indexOf('--runs') + 1]) || 100
const env = { ...process.env, NUXT_DB_NAME: 'perpend_bench' }
const sh = (cmd: string) => execFileSync('bash', ['-c', `source scripts/env.sh && ${cmd}`], { cwd: root, env, stdio: ['ignore', 'pipe', 'inherit'] }).toString()

const db = {
  host: '127.0.0.1', port: Number(process.env.NUXT_DB_PORT || 3307), user: process.env.NUXT_DB_USER || 'perpend',
  password: process.env.NUXT_DB_PASSWORD || 'perpend-local', database: 'perpend_bench',
}

/** Nearest-rank percentile of a sorted list (the same definition as the figures themselves). */
function percentile(sorted: number[], p: number) {
  return sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)]!
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
  for (let i = 0; i < 5; i++) await fn() // warm-up
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
try {
  for (let i = 0; i < 100; i++) {
    try { if ((await fetch(`${base}/api/health`)).ok) break }
    catch { /* not up yet */ }
    await new Promise(r => setTimeout(r, 200))
  }
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'origin': base },
    body: JSON.stringify({ email: 'manager@corrstone.example', password: 'corrstone-demo-2026' }),
  })
  const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!

  const cases = [
    { name: 'last 4 weeks', api: '/api/turnaround?period=4-weeks' },
    { name: 'last 13 weeks', api: '/api/turnaround?period=quarter' },
    { name: 'last 13 weeks, one topic', api: '/api/turnaround?period=quarter&topic=thermal' },
  ]
  console.log(`\nTurnaround API over ${count || 100_000} enquiries, ${runs} sequential requests per case (ms)\n`)
  console.log('case'.padEnd(28), 'answered'.padStart(9), 'p50'.padStart(8), 'p95'.padStart(8))
  for (const c of cases) {
    let answered = 0
    const t = await time(async () => {
      const res = await fetch(`${base}${c.api}`, { headers: { cookie } })
      if (!res.ok) throw new Error(`${c.api} answered ${res.status}`)
      answered = (await res.json()).counts.answered
    })
    console.log(c.name.padEnd(28), String(answered).padStart(9), t.p50.toFixed(1).padStart(8), t.p95.toFixed(1).padStart(8))
  }
  console.log('\nGoal: p95 under 300 ms.')
}
finally {
  server.kill()
}
