// Throughput and latency under load: 50 connections for 30 s per route against the built server and the
// 100,000-enquiry database, beside a minimal h3 route hammered the same way (the ceiling of this machine and
// this HTTP stack), with the server's resident memory sampled throughout.
//   npx tsx bench/load.ts [--seconds 30] [--connections 50] [--passes 2]
// Memory: the server's RSS is read from /proc before, during and after. Node keeps the heap it grew to, so
// the first pass over the routes shows the working set being reached; growth from the end of one pass to
// the end of the next is what would show a leak.
// Every route must finish with zero errors and zero non-2xx answers; the bench exits 1 otherwise.
import { spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { loadavg } from 'node:os'
import { fileURLToPath } from 'node:url'
import autocannon from 'autocannon'
import * as mariadb from 'mariadb'
import { benchDb, ensureBenchData, freePort, percentile, startBenchServer } from './support'

const arg = (name: string, fallback: number) => Number(process.argv[process.argv.indexOf(name) + 1]) || fallback

if (process.argv.includes('--ceiling-app')) {
  // The ceiling: one h3 route returning a small JSON, nothing else (no Nitro, no middleware, no database).
  const { createApp, createRouter, defineEventHandler, toNodeListener } = await import('h3')
  const { createServer } = await import('node:http')
  const app = createApp()
  app.use(createRouter().get('/ping', defineEventHandler(() => ({ ok: true, at: 'ceiling' }))))
  createServer(toNodeListener(app)).listen(Number(process.env.PORT), '127.0.0.1', () => process.send?.('ready'))
}
else {
  await main()
}

interface RouteCase {
  name: string
  base: string
  request: autocannon.Request
  headers?: Record<string, string>
}

interface Measured {
  name: string
  pass: number
  requests: number
  rps: number
  p50: number
  p95: number
  p99: number
  errors: number
  timeouts: number
  non2xx: number
  statuses: Record<string, number>
  rssAfterMb: number
}

function rssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  return Number(/VmRSS:\s+(\d+) kB/.exec(status)![1]) / 1024
}

async function hammer(c: RouteCase, seconds: number, connections: number): Promise<Omit<Measured, 'rssAfterMb' | 'name' | 'pass'>> {
  const latencies: number[] = []
  const statuses: Record<string, number> = {}
  const instance = autocannon({
    url: c.base,
    connections,
    duration: seconds,
    headers: c.headers,
    requests: [c.request],
  })
  instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
    latencies.push(responseTime)
    statuses[statusCode] = (statuses[statusCode] ?? 0) + 1
  })
  const result = await instance
  latencies.sort((a, b) => a - b)
  return {
    requests: result.requests.total,
    rps: result.requests.total / (result.duration || seconds),
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    errors: result.errors,
    timeouts: result.timeouts,
    non2xx: result.non2xx,
    statuses,
  }
}

async function startCeiling(): Promise<{ base: string, stop: () => void }> {
  const port = await freePort()
  const child = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), '--ceiling-app'], {
    env: { ...process.env, PORT: String(port) },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  })
  await new Promise<void>((resolve, reject) => {
    child.once('message', () => resolve())
    child.once('exit', code => reject(new Error(`the ceiling app exited with ${code}`)))
  })
  return { base: `http://127.0.0.1:${port}`, stop: () => child.kill() }
}

async function main() {
  const seconds = arg('--seconds', 30)
  const connections = arg('--connections', 50)
  const passes = arg('--passes', 2)
  const count = await ensureBenchData()
  // Behind a load balancer every caller brings its own address; the bench does the same through
  // X-Forwarded-For so that the public calculator's per-address limit (60 a minute) meters callers, not the bench.
  const { base, cookie, pid, stop } = await startBenchServer('officer@corrstone.example', { NUXT_TRUST_PROXY: 'true' })
  const ceiling = await startCeiling()

  const conn = await mariadb.createConnection(benchDb)
  const refs = (await conn.query('SELECT ref FROM enquiries WHERE merged_into_id IS NULL ORDER BY RAND() LIMIT 2000')).map((r: { ref: string }) => r.ref) as string[]
  await conn.end()
  const pick = <T>(list: readonly T[]) => list[Math.floor(Math.random() * list.length)]!
  const searches = ['lintel', 'window head', 'eaves', 'anchor', 'fire barrier', 'plinth', 'thermal bridge', 'render']
  const wall = {
    layers: [
      { name: 'Gypsum plaster', thickness_mm: 13, lambda: 0.57 },
      { name: 'Lightweight block', thickness_mm: 215, lambda: 0.19, bridge: { lambda: 0.8, fraction: 0.0083 } },
      { name: 'Graphite EPS', thickness_mm: 150, lambda: 0.031 },
      { name: 'Base coat', thickness_mm: 5, lambda: 0.8 },
      { name: 'Silicone finish', thickness_mm: 1.5, lambda: 0.7 },
    ],
    pointBridges: [{ perM2: 6, chi: 0.002 }],
  }
  let caller = 0
  const callerAddress = () => {
    const n = Math.floor(caller++ / 50) // fifty calculations per invented caller, under the limit of sixty a minute
    return `10.${(n >> 16) & 255}.${(n >> 8) & 255}.${n & 255}`
  }

  const cases: RouteCase[] = [
    { name: 'minimal h3 route (ceiling)', base: ceiling.base, request: { method: 'GET', path: '/ping' } },
    { name: 'queue API', base, headers: { cookie, accept: 'application/json' }, request: { method: 'GET', path: '/api/enquiries?pageSize=25' } },
    {
      name: 'enquiry file', base, headers: { cookie, accept: 'application/json' },
      request: { method: 'GET', setupRequest: r => ({ ...r, path: `/api/enquiries/${pick(refs)}` }) },
    },
    {
      name: 'library search', base, headers: { accept: 'application/json' },
      request: { method: 'GET', setupRequest: r => ({ ...r, path: `/api/library/search?q=${encodeURIComponent(pick(searches))}` }) },
    },
    {
      name: 'U-value API', base, headers: { 'accept': 'application/json', 'content-type': 'application/json', 'origin': base },
      request: { method: 'POST', path: '/api/calc/u-value', body: JSON.stringify(wall), setupRequest: r => ({ ...r, headers: { ...r.headers, 'x-forwarded-for': callerAddress() } }) },
    },
  ]

  const rssSamples: number[] = []
  const sampler = setInterval(() => rssSamples.push(rssMb(pid)), 1_000)
  const rssStart = rssMb(pid)
  try {
    console.log(`\nWarming up every route for 5 s (server RSS at start ${rssStart.toFixed(0)} MB)…`)
    for (const c of cases) await hammer(c, 5, connections)
    const rssWarm = rssMb(pid)
    rssSamples.length = 0

    const measured: Measured[] = []
    const rssAfterPass: number[] = []
    for (let pass = 1; pass <= passes; pass++) {
      for (const c of cases) {
        const r = await hammer(c, seconds, connections)
        measured.push({ name: c.name, pass, ...r, rssAfterMb: c.base === base ? rssMb(pid) : Number.NaN })
      }
      rssAfterPass.push(rssMb(pid))
    }
    await new Promise(r => setTimeout(r, 10_000))
    const rssIdle = rssMb(pid)
    const rssPeak = Math.max(...rssSamples)

    console.log(`\n${connections} connections, ${seconds} s per route, ${passes} pass(es); ${count.toLocaleString('en-IE')} enquiries; load average ${loadavg().map(l => l.toFixed(1)).join(' ')} on ${(await import('node:os')).cpus().length} CPUs; latency in ms\n`)
    console.log('pass'.padEnd(5), 'route'.padEnd(28), 'requests'.padStart(9), 'req/s'.padStart(8), 'of ceiling'.padStart(11), 'p50'.padStart(7), 'p95'.padStart(7), 'p99'.padStart(7), 'errors'.padStart(7), 'non-2xx'.padStart(8), 'RSS after'.padStart(10))
    for (const m of measured) {
      const top = measured.find(x => x.pass === m.pass)!.rps
      console.log(
        String(m.pass).padEnd(5), m.name.padEnd(28), String(m.requests).padStart(9), m.rps.toFixed(0).padStart(8), `${(100 * m.rps / top).toFixed(1)} %`.padStart(11),
        m.p50.toFixed(0).padStart(7), m.p95.toFixed(0).padStart(7), m.p99.toFixed(0).padStart(7),
        String(m.errors + m.timeouts).padStart(7), String(m.non2xx).padStart(8),
        (Number.isNaN(m.rssAfterMb) ? '—' : `${m.rssAfterMb.toFixed(0)} MB`).padStart(10),
      )
    }
    const signed = (mb: number) => `${mb >= 0 ? '+' : ''}${mb.toFixed(0)} MB`
    console.log(`\nServer RSS: ${rssStart.toFixed(0)} MB at start, ${rssWarm.toFixed(0)} MB after warm-up, peak ${rssPeak.toFixed(0)} MB during the runs, ${rssIdle.toFixed(0)} MB after 10 s idle.`)
    console.log(`RSS at the end of each pass: ${rssAfterPass.map(r => `${r.toFixed(0)} MB`).join(', ')}${passes > 1 ? ` (${signed(rssAfterPass.at(-1)! - rssAfterPass[0]!)} from the first pass to the last)` : ''}.`)
    const failed = measured.filter(m => m.errors || m.timeouts || m.non2xx)
    for (const m of failed) console.log(`FAILED ${m.name}: ${m.errors} errors, ${m.timeouts} timeouts, statuses ${JSON.stringify(m.statuses)}`)
    console.log(failed.length ? '' : 'Every request of every route answered 2xx.')
    process.exitCode = failed.length ? 1 : 0
  }
  finally {
    clearInterval(sampler)
    ceiling.stop()
    stop()
  }
}
