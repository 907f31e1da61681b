// MariaDB stopped and started again under the server's feet while requests keep coming.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demo } from '../support/api'
import { postEnquiry, signInAt, sleep, startChildServer, startPrivateDb, waitUntil } from '../support/instance'
import type { ChildServer, PrivateDb } from '../support/instance'

interface Outcome { kind: 'read' | 'write', status: number, message?: string, retryAfter: string | null, subject?: string, at: number }

const readMessage = 'The database is not reachable just now. Try again in a minute.'
const writeMessage = 'The database is not reachable just now; nothing was saved. Try again in a minute.'

describe('a database outage', () => {
  let db: PrivateDb
  let server: ChildServer
  let officer = ''
  let specifier = ''

  beforeAll(async () => {
    db = await startPrivateDb()
    await db.prepare()
    server = await startChildServer({ ...db.env, NUXT_MAIL_URL: 'smtp://127.0.0.1:1', NUXT_UPLOAD_DIR: `${db.varDir}/uploads` })
    officer = await signInAt(server.base, demo.officer)
    // Writes come from a signed-in specifier: the anonymous form allows one address 60 an hour.
    specifier = await signInAt(server.base, demo.specA)
  })
  afterAll(async () => {
    await server?.stop()
    await db?.destroy()
  })

  it('answers 503 with a plain message during the outage, recovers by itself and leaves nothing half-written', async () => {
    const outcomes: Outcome[] = []
    let stopped = false
    let seq = 0
    const started = Date.now()

    async function worker(n: number) {
      while (!stopped) {
        const write = (seq++ % 2) === 0
        const subject = `Outage probe ${n}-${seq}`
        const res = write
          ? await postEnquiry(server.base, subject, specifier)
          : await fetch(`${server.base}/api/enquiries?pageSize=5`, { headers: { cookie: officer, accept: 'application/json' } })
        const body = await res.json().catch(() => null) as { message?: string } | null
        outcomes.push({ kind: write ? 'write' : 'read', status: res.status, message: body?.message, retryAfter: res.headers.get('retry-after'), subject: write ? subject : undefined, at: Date.now() - started })
        await sleep(20)
      }
    }

    const workers = [1, 2, 3, 4].map(worker)
    await sleep(1_500)
    const beforeOutage = outcomes.length
    await db.stop()
    const outageFrom = Date.now() - started

    const health = await fetch(`${server.base}/api/health`)
    expect(health.status).toBe(503)
    const healthBody = await health.json() as { status: string, message: string, database: { reachable: boolean } }
    expect(healthBody.status).toBe('unavailable')
    expect(healthBody.database.reachable).toBe(false)
    expect(healthBody.message).toBe('The database is unreachable.')
    await sleep(3_000)

    await db.start()
    const restartedAt = Date.now() - started
    // Recovery without a restart of the app: both reads and writes succeed again.
    await waitUntil('a read and a write to succeed after MariaDB is back', () =>
      outcomes.some(o => o.at > restartedAt && o.kind === 'read' && o.status === 200)
      && outcomes.some(o => o.at > restartedAt && o.kind === 'write' && o.status === 201), 30_000)
    await sleep(1_000)
    stopped = true
    await Promise.all(workers)

    expect(beforeOutage).toBeGreaterThan(10)
    const statuses = [...new Set(outcomes.map(o => o.status))].sort()
    // Nothing else than success or "database unavailable": no 500 at any moment of the outage.
    expect(statuses).toEqual([200, 201, 503])
    const unavailable = outcomes.filter(o => o.status === 503)
    expect(unavailable.filter(o => o.at >= outageFrom).length).toBeGreaterThan(10)
    for (const o of unavailable) {
      expect(o.message).toBe(o.kind === 'write' ? writeMessage : readMessage)
      expect(o.retryAfter).toBe('30')
    }
    expect((await fetch(`${server.base}/api/health`)).status).toBe(200)

    // Every write that was answered 201 is whole (enquiry, its first event, its acknowledgement in the
    // outbox), and every write that was answered 503 left no trace.
    const probes = await db.query<{ subject: string, events: number, outbox: number }>(
      `SELECT e.subject,
        (SELECT COUNT(*) FROM enquiry_events v WHERE v.enquiry_id = e.id) AS events,
        (SELECT COUNT(*) FROM outbox_messages m WHERE m.enquiry_id = e.id) AS outbox
       FROM enquiries e WHERE e.subject LIKE 'Outage probe %'`,
    )
    const saved = new Map(probes.map(p => [p.subject, p]))
    const writes = outcomes.filter(o => o.kind === 'write')
    const accepted = writes.filter(o => o.status === 201)
    const refused = writes.filter(o => o.status === 503)
    expect(accepted.length).toBeGreaterThan(5)
    expect(refused.length).toBeGreaterThan(5)
    for (const o of accepted) expect(saved.get(o.subject!), o.subject).toMatchObject({ events: 1, outbox: 1 })
    for (const o of refused) expect(saved.has(o.subject!), `${o.subject} was answered 503 but saved`).toBe(false)
    expect(saved.size).toBe(accepted.length)
    const [orphans] = await db.query<{ n: number }>(
      `SELECT (SELECT COUNT(*) FROM projects p WHERE p.name = 'Fault drill' AND NOT EXISTS (SELECT 1 FROM enquiries e WHERE e.project_id = p.id)) AS n`,
    )
    expect(orphans!.n).toBe(0)
  })
})
