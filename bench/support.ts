// What the API benches share: the 100,000-enquiry database, the built server started against it, a
// signed-in cookie and a timer reporting nearest-rank percentiles.
import { execFileSync, spawn } from 'node:child_process'
import { createServer } from 'node:net'
import { performance } from 'node:perf_hooks'
import * as mariadb from 'mariadb'

export const root = new URL('..', import.meta.url).pathname
const env = { ...process.env, NUXT_DB_NAME: 'perpend_bench' }
const sh = (cmd: string) => execFileSync('bash', ['-c', `source scripts/env.sh && ${cmd}`], { cwd: root, env, stdio: ['ignore', 'pipe', 'inherit'] }).toString()

export const benchDb = {
  host: '127.0.0.1', port: Number(process.env.NUXT_DB_PORT || 3307), user: process.env.NUXT_DB_USER || 'perpend',
  password: process.env.NUXT_DB_PASSWORD || 'perpend-local', database: 'perpend_bench',
}

export function runsFromArgs(fallback: number): number {
  return Number(process.argv[process.argv.indexOf('--runs') + 1]) || fallback
}

/** Nearest-rank percentile of a sorted list. */
export function percentile(sorted: number[], p: number): number {
  return sorted[Math.max(0, Math.ceil((p / 100) * sorted.length) - 1)]!
}

/** p50 and p95 of `runs` sequential calls, after a warm-up. */
export async function time(fn: () => Promise<unknown>, runs: number) {
  for (let i = 0; i < 10; i++) await fn()
  const samples: number[] = []
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    await fn()
    samples.push(performance.now() - t)
  }
  samples.sort((a, b) => a - b)
  return { p50: percentile(samples, 50), p95: percentile(samples, 95) }
}

export async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
  })
}

/** Makes sure perpend_bench holds 100,000 enquiries (seeding it once, about 40 s); returns the count. */
export async function ensureBenchData(): Promise<number> {
  sh('bash scripts/db.sh start >/dev/null')
  const probe = await mariadb.createConnection({ ...benchDb, database: undefined })
  const [{ n: existing }] = await probe.query('SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ? AND table_name = ?', ['perpend_bench', 'enquiries']) as [{ n: bigint }]
  await probe.end()
  let count = 0
  if (Number(existing)) {
    const c = await mariadb.createConnection(benchDb)
    count = Number((await c.query('SELECT COUNT(*) AS n FROM enquiries'))[0].n)
    await c.end()
  }
  if (count < 100_000) {
    console.log('Seeding perpend_bench with 100,000 enquiries (about 40 s)…')
    sh('bash scripts/db.sh recreate perpend_bench && npx tsx scripts/migrate.ts && npx tsx scripts/seed.ts --enquiries 100000')
    count = 100_006
  }
  else sh('npx tsx scripts/migrate.ts')
  return count
}

/** The built server on a free port against perpend_bench, signed in as `email`; `extraEnv` adds settings. */
export async function startBenchServer(email: string, extraEnv: Record<string, string> = {}) {
  const port = await freePort()
  const server = spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    env: { ...env, PORT: String(port), HOST: '127.0.0.1', NUXT_SESSION_PASSWORD: 'b'.repeat(40), NUXT_MAIL_URL: 'smtp://127.0.0.1:1', ...extraEnv },
    stdio: 'ignore',
  })
  const base = `http://127.0.0.1:${port}`
  for (let i = 0; i < 100; i++) {
    try { if ((await fetch(`${base}/api/health`)).ok) break }
    catch { /* not up yet */ }
    await new Promise(r => setTimeout(r, 200))
  }
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'origin': base },
    body: JSON.stringify({ email, password: 'corrstone-demo-2026' }),
  })
  const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!
  return { base, cookie, pid: server.pid!, stop: () => server.kill() }
}
