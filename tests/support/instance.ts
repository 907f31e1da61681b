// What the fault tests stand on: a MariaDB instance of their own (never the shared test database, which they
// stop and start), its schema and demo data, and the built server as a child process they can kill.
import { execFile, spawn } from 'node:child_process'
import type { ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'
import * as mariadb from 'mariadb'
import { DEMO_PASSWORD } from './api'
import { rootDir } from './server'

const run = promisify(execFile)

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    }).on('error', reject)
  })
}

export const sleep = (ms: number) => new Promise(resolve => setTimeout(resolve, ms))

/** Polls until `check` returns something truthy, or fails after `timeoutMs` naming what was awaited. */
export async function waitUntil<T>(what: string, check: () => Promise<T> | T, timeoutMs = 30_000, everyMs = 200): Promise<NonNullable<T>> {
  const until = Date.now() + timeoutMs
  let last: unknown
  while (Date.now() < until) {
    try {
      const value = await check()
      if (value) return value as NonNullable<T>
    }
    catch (error) { last = error }
    await sleep(everyMs)
  }
  throw new Error(`Timed out after ${timeoutMs} ms waiting for ${what}${last ? ` (last error: ${(last as Error).message})` : ''}`)
}

export interface PrivateDb {
  port: number
  name: string
  varDir: string
  /** NUXT_* and PERPEND_VAR for scripts and servers pointed at this instance. */
  env: Record<string, string>
  start: () => Promise<void>
  stop: () => Promise<void>
  /** Applies the migrations and the demo data (scripts/migrate.ts, scripts/seed.ts). */
  prepare: () => Promise<void>
  query: <T = Record<string, unknown>>(sql: string, values?: unknown[]) => Promise<T[]>
  /** Stops the instance and deletes its folder. */
  destroy: () => Promise<void>
}

/** A fresh MariaDB of its own: datadir in a temporary folder, a free port, scripts/db.sh to start and stop it. */
export async function startPrivateDb(name = 'perpend_fault'): Promise<PrivateDb> {
  const varDir = mkdtempSync(join(tmpdir(), 'perpend-fault-'))
  const port = await freePort()
  const env: Record<string, string> = {
    PERPEND_VAR: varDir,
    NUXT_DB_HOST: '127.0.0.1',
    NUXT_DB_PORT: String(port),
    NUXT_DB_NAME: name,
    NUXT_DB_USER: 'perpend',
    NUXT_DB_PASSWORD: 'perpend-local',
    NUXT_SESSION_PASSWORD: 'f'.repeat(40),
  }
  const childEnv = { ...process.env, ...env, PATH: `/usr/sbin:${process.env.PATH}` }
  const db = (action: string) => run('bash', ['scripts/db.sh', action], { cwd: rootDir, env: childEnv }).then(() => {})
  let pool: mariadb.Pool | null = null
  const connect = () => (pool ??= mariadb.createPool({ host: '127.0.0.1', port, user: 'perpend', password: 'perpend-local', database: name, connectionLimit: 2, bigIntAsNumber: true }))
  await db('start')
  return {
    port,
    name,
    varDir,
    env,
    start: () => db('start'),
    async stop() {
      await pool?.end().catch(() => {})
      pool = null
      await db('stop')
    },
    async prepare() {
      await run('npx', ['tsx', 'scripts/migrate.ts'], { cwd: rootDir, env: childEnv })
      await run('npx', ['tsx', 'scripts/seed.ts'], { cwd: rootDir, env: childEnv })
    },
    query: <T>(sql: string, values: unknown[] = []) => connect().query(sql, values) as Promise<T[]>,
    async destroy() {
      await pool?.end().catch(() => {})
      pool = null
      await db('stop').catch(() => {})
      rmSync(varDir, { recursive: true, force: true })
    },
  }
}

export interface ChildServer {
  base: string
  pid: number
  /** Everything the server printed so far. */
  output: () => string
  /** kill -9: no shutdown hooks, no finally blocks, open requests cut off. */
  kill: () => Promise<void>
  stop: () => Promise<void>
}

function exited(child: ChildProcess): Promise<void> {
  return child.exitCode !== null || child.signalCode !== null ? Promise.resolve() : new Promise(resolve => child.once('exit', () => resolve()))
}

/** The built server (.output) as a child process on a free port, answering /api/health before this resolves. */
export async function startChildServer(env: Record<string, string>): Promise<ChildServer> {
  const port = await freePort()
  const child = spawn(process.execPath, ['.output/server/index.mjs'], {
    cwd: rootDir,
    env: { PATH: process.env.PATH, HOME: process.env.HOME, ...env, HOST: '127.0.0.1', PORT: String(port) },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  child.stdout!.on('data', (c: Buffer) => { output += c.toString() })
  child.stderr!.on('data', (c: Buffer) => { output += c.toString() })
  const base = `http://127.0.0.1:${port}`
  await waitUntil('the server to answer /api/health', async () => {
    if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}: ${output.slice(-2000)}`)
    return (await fetch(`${base}/api/health`)).ok
  }, 60_000)
  return {
    base,
    pid: child.pid!,
    output: () => output,
    async kill() {
      child.kill('SIGKILL')
      await exited(child)
    },
    async stop() {
      child.kill('SIGTERM')
      await exited(child)
    },
  }
}

/** Signs in through the API and returns the session cookie for a Cookie header. */
export async function signInAt(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': base },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}`)
  return res.headers.getSetCookie().find(c => c.startsWith('perpend-session='))!.split(';')[0]!
}

/** An anonymous enquiry as the public form sends it (JSON, no drawings); `subject` makes it findable. */
export function anonymousEnquiry(subject: string) {
  return {
    requester: { name: 'Fionnuala Test', organisation: 'Outage Checks Ltd', email: 'fionnuala@outage.example', phone: '+353 1 555 0199' },
    project: { name: 'Fault drill', region: 'Dublin', stage: 'planning', storeys: 2 },
    topic: 'thermal',
    subject,
    question: 'What U-value does the 215 mm block give with 100 mm graphite EPS?',
    priority: 'normal',
  }
}

/** An enquiry sent anonymously, or by the signed-in caller whose cookie is given (not held by the anonymous limit). */
export async function postEnquiry(base: string, subject: string, cookie?: string): Promise<Response> {
  return fetch(`${base}/api/enquiries`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'origin': base, 'accept': 'application/json', ...(cookie ? { cookie } : {}) },
    body: JSON.stringify(anonymousEnquiry(subject)),
  })
}
